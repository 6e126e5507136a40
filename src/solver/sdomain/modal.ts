/**
 * The minimal transfer function from its poles and residues (partial
 * fractions, standard complex analysis): H(s) = D + Σ R_p/(s − p) for a proper
 * H whose poles are simple. The circuit's natural frequencies come out of the
 * pencil accurate (they are semisimple); at each, the residue
 * R_p = (1/2πi)∮ H(s) ds is taken on a small circle by the trapezoid rule,
 * which converges geometrically for a function analytic on the circle (L. N.
 * Trefethen and J. A. C. Weideman, "The exponentially convergent trapezoidal
 * rule", SIAM Review 56(3), 2014). A mode the input does not reach or the
 * output does not see has R_p = 0 and drops out, so the poles left are
 * minimal with no matching of lists. The zeros are then the eigenvalues of a
 * small real matrix made from the modal realisation (below); a multiple zero
 * spreads there as it must, but the polynomial it makes stays exact to
 * rounding. Returns null where this does not apply (an improper H, a pole of
 * H of order two or more, a failed solve): the caller falls back to the system
 * matrix.
 */
import { denseEigenvalues } from './dense-eigen';
import type { Roots } from './pencil';
import type { C } from './polynomial';
import { newtonZero } from './minimal';


export type Evaluate = (s: C) => C | null;

/** H with the size of its terms (see minimal.ts), for Newton's method. */
export type Probe = (s: C) => { h: C; size: number } | null;

interface Pole { at: C; r: C }

/** Points on the circle for the residue; 0.2 of the distance to the next pole makes the rule exact to ~1e-14. */
const POINTS = 24;

/** ρ with H(s) ∝ s^(−ρ) far out, from three points a decade apart; null when the slopes disagree. */
function relativeDegree(h: Evaluate, far: number): number | null {
  const u = { re: Math.cos(1.1), im: Math.sin(1.1) };
  const mag = (t: number) => {
    const v = h({ re: t * u.re, im: t * u.im });
    return v ? Math.hypot(v.re, v.im) : NaN;
  };
  // a zero may lie far beyond every pole: go out until the slope settles, eight decades at most
  for (let tries = 0; tries < 8; tries++, far *= 10) {
    const a = mag(far);
    const b = mag(10 * far);
    const c = mag(100 * far);
    if (a === 0 && b === 0 && c === 0) return null;
    const o1 = Math.log10(b / a);
    const o2 = Math.log10(c / b);
    const n = Math.round(o1);
    if (Number.isFinite(o1) && Number.isFinite(o2) && Math.abs(o1 - n) < 0.05 && Math.abs(o2 - n) < 0.05) return -n;
  }
  return null;
}

export function modalTransfer(natural: Roots, systemRoots: Roots, probe: Probe, scale: number): { zeros: Roots; poles: Roots } | null {
  const h: Evaluate = (s) => probe(s)?.h ?? null;
  // pole locations on and above the real axis (semisimple multiples are one location)
  const locs: C[] = [];
  natural.re.forEach((re, i) => {
    const im = natural.im[i];
    if (im < 0) return;
    const c = { re, im };
    const size = Math.max(Math.hypot(re, im), 1e-9 * scale);
    if (!locs.some((l) => Math.hypot(l.re - c.re, l.im - c.im) <= 1e-8 * size)) locs.push(c);
  });
  const poles: Pole[] = [];
  for (const p of locs) {
    let d = p.im !== 0 ? 2 * Math.abs(p.im) : Infinity;
    for (const q of locs) {
      if (q === p) continue;
      d = Math.min(d, Math.hypot(q.re - p.re, q.im - p.im), Math.hypot(q.re - p.re, q.im + p.im));
    }
    if (!Number.isFinite(d)) d = Math.max(Math.hypot(p.re, p.im), scale);
    const r = 0.2 * d;
    let rr = 0;
    let ri = 0;
    let m1r = 0;
    let m1i = 0;
    let hmax = 0;
    for (let k = 0; k < POINTS; k++) {
      const th = (2 * Math.PI * (k + 0.5)) / POINTS;
      const zr = r * Math.cos(th);
      const zi = r * Math.sin(th);
      const v = h({ re: p.re + zr, im: p.im + zi });
      if (!v || !Number.isFinite(v.re) || !Number.isFinite(v.im)) return null;
      hmax = Math.max(hmax, Math.hypot(v.re, v.im));
      // (1/2πi)∮ H ds = mean of H·(s − p) over the circle; the next moment uses (s − p)²
      rr += v.re * zr - v.im * zi;
      ri += v.re * zi + v.im * zr;
      const z2r = zr * zr - zi * zi;
      const z2i = 2 * zr * zi;
      m1r += v.re * z2r - v.im * z2i;
      m1i += v.re * z2i + v.im * z2r;
    }
    const res = { re: rr / POINTS, im: ri / POINTS };
    const m1 = Math.hypot(m1r, m1i) / POINTS;
    // a higher-order pole leaves a second moment; this form holds only simple poles
    if (m1 > 1e-8 * hmax * r * r) return null;
    if (Math.hypot(res.re, res.im) <= 1e-10 * hmax * r) continue; // not a pole of H
    poles.push({ at: p, r: p.im === 0 ? { re: res.re, im: 0 } : res });
  }
  // far out: beyond every natural frequency and every confirmed root of the system matrix (a zero
  // can lie far beyond the poles; an unconfirmed huge one is a stray of its infinite roots)
  let far = 0;
  for (const p of locs) far = Math.max(far, Math.hypot(p.re, p.im));
  systemRoots.re.forEach((re, i) => {
    if (systemRoots.polished?.[i]) far = Math.max(far, Math.hypot(re, systemRoots.im[i]));
  });
  if (!(far > 0)) far = scale;
  const rho = relativeDegree(h, 30 * far);
  if (rho === null || rho < 0) return null;

  // the modal realisation: real poles as 1×1 blocks [p], b = 1, c = R; a pair a ± jb with residue α + jβ
  // as [[a, b], [−b, a]], b = [1, 0], c = [2α, 2β] (its two terms summed)
  const n = poles.reduce((x, p) => x + (p.at.im === 0 ? 1 : 2), 0);
  const A = new Float64Array(n * n);
  const B = new Float64Array(n);
  const Cv = new Float64Array(n);
  let t = 0;
  for (const p of poles) {
    if (p.at.im === 0) {
      A[t * n + t] = p.at.re;
      B[t] = 1;
      Cv[t] = p.r.re;
      t += 1;
    } else {
      const { re: a, im: b } = p.at;
      A[t * n + t] = a;
      A[t * n + t + 1] = b;
      A[(t + 1) * n + t] = -b;
      A[(t + 1) * n + t + 1] = a;
      B[t] = 1;
      Cv[t] = 2 * p.r.re;
      Cv[t + 1] = 2 * p.r.im;
      t += 2;
    }
  }
  const zeros: Roots = { re: [], im: [] };
  const polesOut: Roots = { re: [], im: [] };
  for (const p of poles) {
    polesOut.re.push(p.at.re);
    polesOut.im.push(p.at.im);
    if (p.at.im !== 0) {
      polesOut.re.push(p.at.re);
      polesOut.im.push(-p.at.im);
    }
  }
  if (n === 0) return { zeros, poles: polesOut };

  // zeros through s = σ + 1/w at a real σ off every pole: with F = (σI − A)⁻¹ the system in w is
  // A_w = −F, B_w = F·B, C_w = −C·F, D_w = H(σ), and its zeros are the eigenvalues of
  // A_w − B_w·C_w/D_w = −F + F·B·C·F/H(σ); the ρ of them at w = 0 are the zeros at infinity
  // σ amid the poles' magnitudes: a zero z comes back as σ + 1/w with relative error about
  // eps·(σ/|z| + |z|/σ), best balanced there
  const mags = poles.map((p) => Math.hypot(p.at.re, p.at.im)).filter((m) => m > 1e-9 * far);
  let sigma = 0.7071 * (mags.length ? Math.sqrt(Math.min(...mags) * Math.max(...mags)) : far);
  let hs: C | null = null;
  for (let tries = 0; tries < 6; tries++, sigma *= 1.37) {
    hs = h({ re: sigma, im: 0 });
    if (hs && Math.hypot(hs.re, hs.im) > 0) break;
  }
  if (!hs) return null;
  const dw = hs.re; // H is real on the real axis
  if (!(Math.abs(dw) > 0)) return null;
  const F = new Float64Array(n * n);
  t = 0;
  for (const p of poles) {
    if (p.at.im === 0) {
      F[t * n + t] = 1 / (sigma - p.at.re);
      t += 1;
    } else {
      // (σI − [[a, b], [−b, a]])⁻¹ = [[σ − a, b], [−b, σ − a]] / ((σ − a)² + b²)
      const x = sigma - p.at.re;
      const y = p.at.im;
      const den = x * x + y * y;
      F[t * n + t] = x / den;
      F[t * n + t + 1] = y / den;
      F[(t + 1) * n + t] = -y / den;
      F[(t + 1) * n + t + 1] = x / den;
      t += 2;
    }
  }
  const fb = new Float64Array(n);
  const cf = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      fb[i] += F[i * n + j] * B[j];
      cf[j] += Cv[i] * F[i * n + j];
    }
  }
  const Z = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Z[i * n + j] = -F[i * n + j] + (fb[i] * cf[j]) / dw;
  const w = denseEigenvalues(Z, n);
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => Math.hypot(w.re[i], w.im[i]) - Math.hypot(w.re[j], w.im[j]));
  const raw: C[] = [];
  for (let k = rho; k < n; k++) {
    const i = order[k];
    const m2 = w.re[i] * w.re[i] + w.im[i] * w.im[i];
    if (!(m2 > 0)) return null;
    // s = σ + 1/w
    raw.push({ re: sigma + w.re[i] / m2, im: -w.im[i] / m2 });
  }
  // each simple zero polished by Newton's method on H itself (quadratic from an eigensolver's answer);
  // a multiple one keeps the eigensolver's cluster, whose polynomial is exact to rounding
  for (let k = 0; k < raw.length; k++) {
    const z = raw[k];
    if (z.im < 0) continue;
    let gap = Infinity;
    for (let j = 0; j < raw.length; j++) if (j !== k) gap = Math.min(gap, Math.hypot(raw[j].re - z.re, raw[j].im - z.im));
    for (const p of poles) gap = Math.min(gap, Math.hypot(p.at.re - z.re, p.at.im - z.im), Math.hypot(p.at.re - z.re, p.at.im + z.im));
    const reach = Math.min(1e-4 * Math.max(Math.hypot(z.re, z.im), 1e-9 * scale), 0.1 * gap);
    const better = reach > 0 ? newtonZero(probe, z, reach) : null;
    if (!better) continue;
    const im = z.im === 0 ? 0 : better.im;
    const mate = z.im > 0 ? raw.findIndex((q, j) => j !== k && q.re === z.re && q.im === -z.im) : -1;
    raw[k] = { re: better.re, im };
    if (mate >= 0) raw[mate] = { re: better.re, im: -im };
  }
  for (const z of raw) {
    zeros.re.push(z.re);
    zeros.im.push(z.im);
  }
  return { zeros, poles: polesOut };
}

