/** Triangular solves and residuals of the real sparse LU (complex-solve.ts in real arithmetic). */
import type { Factors } from './complex-solve';

/** b = Q U^-1 L^-1 P b, in place. */
export function solveFactors(f: Factors, b: Float64Array): void {
  const { n, q, prow, Lp, Li, Lx, Up, Ui, Ux, Ud, x } = f;
  for (let k = 0; k < n; k++) x[k] = b[prow[k]];
  for (let k = 0; k < n; k++) {
    const v = x[k];
    if (v === 0) continue;
    for (let p = Lp[k], pe = Lp[k + 1]; p < pe; p++) x[Li[p]] -= Lx[p] * v;
  }
  for (let k = n - 1; k >= 0; k--) {
    const v = x[k] / Ud[k];
    x[k] = v;
    if (v === 0) continue;
    for (let p = Up[k], pe = Up[k + 1]; p < pe; p++) x[Ui[p]] -= Ux[p] * v;
  }
  for (let k = 0; k < n; k++) {
    b[q[k]] = x[k];
    x[k] = 0;
  }
}

/** b = P^T L^-T U^-T Q^T b in place: the solve with A^T. */
export function solveFactorsT(f: Factors, b: Float64Array): void {
  const { n, q, prow, Lp, Li, Lx, Up, Ui, Ux, Ud, x } = f;
  for (let k = 0; k < n; k++) x[k] = b[q[k]];
  for (let k = 0; k < n; k++) {
    let a = x[k];
    for (let p = Up[k], pe = Up[k + 1]; p < pe; p++) a -= Ux[p] * x[Ui[p]];
    x[k] = a / Ud[k];
  }
  for (let k = n - 1; k >= 0; k--) {
    let a = x[k];
    for (let p = Lp[k], pe = Lp[k + 1]; p < pe; p++) a -= Lx[p] * x[Li[p]];
    x[k] = a;
  }
  for (let k = 0; k < n; k++) {
    b[prow[k]] = x[k];
    x[k] = 0;
  }
}

/**
 * r = b - op(A) x (op = identity or transpose); returns the normwise backward error, or with the work vector
 * w the componentwise one (complex-solve.ts residual).
 */
export function residual(n: number, Ap: Int32Array, Ai: Int32Array, a: Float64Array, x: Float64Array, b: Float64Array, r: Float64Array, transposed: boolean, w: Float64Array | null): number {
  let bmax = 0;
  let xmax = 0;
  let amax = 0;
  for (let i = 0; i < n; i++) {
    r[i] = b[i];
    const v = Math.abs(b[i]);
    if (v > bmax) bmax = v;
    if (w) w[i] = v;
  }
  for (let j = 0; j < n; j++) {
    const v = Math.abs(x[j]);
    if (!(v <= xmax)) xmax = v; // NaN propagates
  }
  for (let j = 0; j < n; j++) {
    if (transposed) {
      let s = 0;
      let sw = 0;
      for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) {
        const v = a[p];
        if (Math.abs(v) > amax) amax = Math.abs(v);
        s += v * x[Ai[p]];
        if (w) sw += Math.abs(v) * Math.abs(x[Ai[p]]);
      }
      r[j] -= s;
      if (w) w[j] += sw;
      continue;
    }
    const xj = x[j];
    for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) {
      const v = a[p];
      if (Math.abs(v) > amax) amax = Math.abs(v);
      r[Ai[p]] -= v * xj;
      if (w) w[Ai[p]] += Math.abs(v) * Math.abs(xj);
    }
  }
  let rmax = 0;
  let cw = 0;
  for (let i = 0; i < n; i++) {
    const ri = Math.abs(r[i]);
    if (ri > rmax) rmax = ri;
    if (w && !(ri === 0)) {
      const e = w[i] > 0 ? ri / w[i] : Infinity;
      if (!(e <= cw)) cw = e;
    }
  }
  if (w) return cw;
  const den = amax * xmax + bmax;
  return den > 0 ? rmax / den : 0;
}
