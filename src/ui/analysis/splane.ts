/**
 * What the s-plane view says about a root of H(s) or a natural frequency:
 * its undamped natural frequency ω0 = |p|, the frequency f = ω0/2π, the
 * damping ratio ζ = −Re(p)/|p| and the quality factor Q = 1/(2ζ) (standard
 * second-order forms, common practice); and H(s) written out.
 */
import type { ComplexJson } from '../../model/graph';
import { formatSI } from '../../model/quantity';

export interface RootFacts {
  omega0: number;
  hz: number;
  /** null at s = 0, where no damping ratio is defined */
  zeta: number | null;
  /** null when undamped, unstable or at s = 0 (Q is taken for damped roots only) */
  q: number | null;
}

export function rootFacts(p: ComplexJson): RootFacts {
  const omega0 = Math.hypot(p.re, p.im);
  if (omega0 === 0) return { omega0: 0, hz: 0, zeta: null, q: null };
  const zeta = p.re === 0 ? 0 : -p.re / omega0;
  return { omega0, hz: omega0 / (2 * Math.PI), zeta, q: zeta > 0 ? 1 / (2 * zeta) : null };
}

const num = (v: number) => formatSI(v, '', 4).trim();

/** "s", "(s + 1.2 k)", "(s − (−1.2 k + j31.4 k))" … one factor (s − r). */
export function factorText(r: ComplexJson): string {
  if (r.re === 0 && r.im === 0) return 's';
  if (r.im === 0) return r.re < 0 ? `(s + ${num(-r.re)})` : `(s − ${num(r.re)})`;
  return `(s − (${rootText(r)}))`;
}

/** a + jb with the sign written out. */
export function rootText(r: ComplexJson): string {
  if (r.im === 0) return num(r.re);
  const re = r.re === 0 ? '' : `${num(r.re)} `;
  return `${re}${r.im < 0 ? '−' : re ? '+' : ''} j${num(Math.abs(r.im))}`.trim();
}

/** H(s) = gain · Π(s − z) / Π(s − p). */
export function factoredText(gain: number, zeros: ComplexJson[], poles: ComplexJson[]): string {
  if (gain === 0) return 'H(s) = 0';
  const top = zeros.map(factorText).join('·') || '1';
  const bottom = poles.map(factorText).join('·');
  return `H(s) = ${num(gain)} · ${top}${bottom ? ` / ${bottom}` : ''}`;
}

/** A polynomial, highest power first: "2.5 M·s + 0". */
export function polynomialText(c: number[]): string {
  const n = c.length - 1;
  const terms = c.map((a, i) => ({ a, p: n - i })).filter((t) => t.a !== 0);
  if (!terms.length) return '0';
  return terms.map((t, i) => {
    const mag = Math.abs(t.a);
    const coef = mag === 1 && t.p > 0 ? '' : num(mag);
    const power = t.p === 0 ? '' : t.p === 1 ? 's' : `s^${t.p}`;
    const body = coef && power ? `${coef}·${power}` : coef || power;
    return `${i === 0 ? (t.a < 0 ? '−' : '') : t.a < 0 ? ' − ' : ' + '}${body}`;
  }).join('');
}
