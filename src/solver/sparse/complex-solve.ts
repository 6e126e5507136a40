/**
 * Triangular solves and residuals of the complex sparse LU (P A Q = L U, values interleaved re, im).
 */

/** Factors of P A Q = L U as LuCore keeps them. */
export interface Factors {
  n: number;
  q: Int32Array;
  prow: Int32Array;
  Lp: Int32Array;
  Li: Int32Array;
  Lx: Float64Array;
  Up: Int32Array;
  Ui: Int32Array;
  Ux: Float64Array;
  Ud: Float64Array;
  x: Float64Array;
}

/** b = Q U^-1 L^-1 P b, in place (x is the zeroed work vector). */
export function solveFactors(f: Factors, bRe: Float64Array, bIm: Float64Array): void {
  const { n, q, prow, Lp, Li, Lx, Up, Ui, Ux, Ud, x } = f;
  for (let k = 0; k < n; k++) {
    const r = prow[k];
    x[2 * k] = bRe[r];
    x[2 * k + 1] = bIm[r];
  }
  for (let k = 0; k < n; k++) {
    const vr = x[2 * k];
    const vi = x[2 * k + 1];
    if (vr === 0 && vi === 0) continue;
    for (let p = Lp[k], pe = Lp[k + 1]; p < pe; p++) {
      const i2 = 2 * Li[p];
      const lr = Lx[2 * p];
      const li = Lx[2 * p + 1];
      x[i2] -= lr * vr - li * vi;
      x[i2 + 1] -= lr * vi + li * vr;
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const ar = x[2 * k];
    const ai = x[2 * k + 1];
    const dr = Ud[2 * k];
    const di = Ud[2 * k + 1];
    const d = dr * dr + di * di;
    const vr = (ar * dr + ai * di) / d;
    const vi = (ai * dr - ar * di) / d;
    x[2 * k] = vr;
    x[2 * k + 1] = vi;
    if (vr === 0 && vi === 0) continue;
    for (let p = Up[k], pe = Up[k + 1]; p < pe; p++) {
      const i2 = 2 * Ui[p];
      const ur = Ux[2 * p];
      const ui = Ux[2 * p + 1];
      x[i2] -= ur * vr - ui * vi;
      x[i2 + 1] -= ur * vi + ui * vr;
    }
  }
  for (let k = 0; k < n; k++) {
    const c = q[k];
    bRe[c] = x[2 * k];
    bIm[c] = x[2 * k + 1];
    x[2 * k] = 0;
    x[2 * k + 1] = 0;
  }
}

/**
 * b = P^T L^-T U^-T Q^T b in place: the solve with A^T (A^H, the conjugate transpose, when conj), from
 * A^T = Q U^T L^T P.
 */
export function solveFactorsT(f: Factors, bRe: Float64Array, bIm: Float64Array, conj: boolean): void {
  const { n, q, prow, Lp, Li, Lx, Up, Ui, Ux, Ud, x } = f;
  const s = conj ? -1 : 1; // sign of the imaginary parts of the factors
  for (let k = 0; k < n; k++) {
    const c = q[k];
    x[2 * k] = bRe[c];
    x[2 * k + 1] = bIm[c];
  }
  // U^T z = y, forward: U(:,k) holds row k of U^T
  for (let k = 0; k < n; k++) {
    let ar = x[2 * k];
    let ai = x[2 * k + 1];
    for (let p = Up[k], pe = Up[k + 1]; p < pe; p++) {
      const i2 = 2 * Ui[p];
      const ur = Ux[2 * p];
      const ui = s * Ux[2 * p + 1];
      const zr = x[i2];
      const zi = x[i2 + 1];
      ar -= ur * zr - ui * zi;
      ai -= ur * zi + ui * zr;
    }
    const dr = Ud[2 * k];
    const di = s * Ud[2 * k + 1];
    const d = dr * dr + di * di;
    x[2 * k] = (ar * dr + ai * di) / d;
    x[2 * k + 1] = (ai * dr - ar * di) / d;
  }
  // L^T w = z, backward (unit diagonal)
  for (let k = n - 1; k >= 0; k--) {
    let ar = x[2 * k];
    let ai = x[2 * k + 1];
    for (let p = Lp[k], pe = Lp[k + 1]; p < pe; p++) {
      const i2 = 2 * Li[p];
      const lr = Lx[2 * p];
      const li = s * Lx[2 * p + 1];
      const wr = x[i2];
      const wi = x[i2 + 1];
      ar -= lr * wr - li * wi;
      ai -= lr * wi + li * wr;
    }
    x[2 * k] = ar;
    x[2 * k + 1] = ai;
  }
  for (let k = 0; k < n; k++) {
    const r = prow[k];
    bRe[r] = x[2 * k];
    bIm[r] = x[2 * k + 1];
    x[2 * k] = 0;
    x[2 * k + 1] = 0;
  }
}

/**
 * r = b - op(A) x for the values a (op = identity, or the transpose, conjugated when conj). Returns the
 * normwise backward error max|r_i| / (max|a_ij| max|x_j| + max|b_i|) (N. J. Higham, "Accuracy and
 * Stability of Numerical Algorithms", 2nd ed., 2002, section 7.1), NaN when x is not finite; or, given the
 * work vector w, the componentwise one max_i |r_i| / (|op(A)| |x| + |b|)_i (W. Oettli, W. Prager, Numer.
 * Math. 6, 1964; Higham, ibid., section 7.2) with |z| taken as |re| + |im| (within a factor sqrt 2), which
 * does not change under row and column scaling as the normwise one does.
 */
export function residual(
  n: number,
  Ap: Int32Array,
  Ai: Int32Array,
  aRe: Float64Array,
  aIm: Float64Array,
  xRe: Float64Array,
  xIm: Float64Array,
  bRe: Float64Array,
  bIm: Float64Array,
  rRe: Float64Array,
  rIm: Float64Array,
  transposed: boolean,
  conj: boolean,
  w: Float64Array | null,
): number {
  let bmax2 = 0;
  let xmax2 = 0;
  let amax2 = 0;
  for (let i = 0; i < n; i++) {
    const br = bRe[i];
    const bi = bIm[i];
    rRe[i] = br;
    rIm[i] = bi;
    const b2 = br * br + bi * bi;
    if (b2 > bmax2) bmax2 = b2;
    if (w) w[i] = Math.abs(br) + Math.abs(bi);
  }
  for (let j = 0; j < n; j++) {
    const x2 = xRe[j] * xRe[j] + xIm[j] * xIm[j];
    if (!(x2 <= xmax2)) xmax2 = x2; // NaN propagates
  }
  const s = conj ? -1 : 1;
  for (let j = 0; j < n; j++) {
    if (transposed) {
      let sr = 0;
      let si = 0;
      let sw = 0;
      for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) {
        const i = Ai[p];
        const ar = aRe[p];
        const ai = s * aIm[p];
        const a2 = ar * ar + ai * ai;
        if (a2 > amax2) amax2 = a2;
        sr += ar * xRe[i] - ai * xIm[i];
        si += ar * xIm[i] + ai * xRe[i];
        if (w) sw += (Math.abs(ar) + Math.abs(ai)) * (Math.abs(xRe[i]) + Math.abs(xIm[i]));
      }
      rRe[j] -= sr;
      rIm[j] -= si;
      if (w) w[j] += sw;
      continue;
    }
    const vr = xRe[j];
    const vi = xIm[j];
    const xa = Math.abs(vr) + Math.abs(vi);
    for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) {
      const i = Ai[p];
      const ar = aRe[p];
      const ai = aIm[p];
      const a2 = ar * ar + ai * ai;
      if (a2 > amax2) amax2 = a2;
      rRe[i] -= ar * vr - ai * vi;
      rIm[i] -= ar * vi + ai * vr;
      if (w) w[i] += (Math.abs(ar) + Math.abs(ai)) * xa;
    }
  }
  let rmax2 = 0;
  let cw = 0;
  for (let i = 0; i < n; i++) {
    const r2 = rRe[i] * rRe[i] + rIm[i] * rIm[i];
    if (r2 > rmax2) rmax2 = r2;
    if (w && !(r2 === 0)) {
      const e = w[i] > 0 ? (Math.abs(rRe[i]) + Math.abs(rIm[i])) / w[i] : Infinity;
      if (!(e <= cw)) cw = e;
    }
  }
  if (w) return cw;
  const den = Math.sqrt(amax2 * xmax2) + Math.sqrt(bmax2);
  return den > 0 ? Math.sqrt(rmax2) / den : 0;
}
