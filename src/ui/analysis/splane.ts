/**
 * What the s-plane view says about a root of H(s) or a natural frequency:
 * its undamped natural frequency ω0 = |p|, the frequency f = ω0/2π, the
 * damping ratio ζ = −Re(p)/|p| and the quality factor Q = 1/(2ζ) (standard
 * second-order forms, common practice); and H(s) written out.
 */
import type { ComplexJson, TransferResult } from '../../model/graph';
import { formatSI } from '../../model/quantity';
import { csvComment } from '../../export/csvText';
import { csvOf } from './plotMath';
import type { PlotMark } from './Plot';

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

/** What a transfer answer says, as the s-plane's CSV and the sweep's pole marks read it. */
export type TransferLike = Omit<TransferResult, 'schema' | 'warnings'> & { seen: boolean[] };

/**
 * The s-plane view as CSV: one row per pole, zero and natural frequency (s in rad/s, ω0, f, ζ, Q, and whether
 * this input and output see it), after comment lines with H(s) and its polynomials. Numbers unrounded; an
 * undefined ζ or Q is an empty cell.
 */
export function sPlaneCsv(a: TransferLike): string {
  const head = [
    csvComment(`Coilwright transfer function from ${a.input} to ${a.output}; roots in rad/s; H(s) = gain · Π(s − zero) / Π(s − pole)`),
    csvComment('gain', String(a.gain)),
    csvComment('numerator, highest power first', a.numerator.join(' ')),
    csvComment('denominator, highest power first', a.denominator.join(' ')),
  ];
  const row = (kind: string, p: ComplexJson, seen: string): (number | string)[] => {
    const f = rootFacts(p);
    return [kind, p.re, p.im, f.omega0, f.hz, f.zeta ?? '', f.q ?? '', seen];
  };
  const rows = [
    ...a.poles.map((p) => row('pole', p, 'yes')),
    ...a.zeros.map((z) => row('zero', z, '')),
    ...a.naturalFrequencies.map((p, i) => row('natural frequency', p, a.seen[i] ? 'yes' : 'no')),
  ];
  return `${head.join('\n')}\n${csvOf(['root', 'sigma_per_s', 'omega_rad_per_s', 'omega0_rad_per_s', 'f_Hz', 'zeta', 'Q', 'seen_by_this_H'], rows)}`;
}

/**
 * The frequencies f = |p|/2π of the poles (one of each conjugate pair, a repeated pole once) between `lo` and
 * `hi` Hz, as vertical rules for the sweep's magnitude plot; a lightly damped pole's peak sits there (Q ≫ 1).
 */
export function poleMarks(a: TransferLike, lo: number, hi: number): PlotMark[] {
  const out: PlotMark[] = [];
  for (const p of a.poles) {
    if (p.im < 0) continue;
    const f = rootFacts(p);
    if (!(f.hz >= lo && f.hz <= hi)) continue;
    if (out.some((m) => Math.abs(m.x - f.hz) <= 1e-9 * f.hz)) continue;
    const q = f.q === null ? '' : `, Q ${num(f.q)}`;
    out.push({ x: f.hz, label: `pole ${formatSI(f.hz, 'Hz', 4)}${q}`, color: '#b8431d', kind: 'pole', shape: 'cross', rule: true });
  }
  return out.sort((m, n) => m.x - n.x);
}
