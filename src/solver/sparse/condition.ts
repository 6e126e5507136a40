/**
 * Estimates of ||A^-1||_1 from solves with A and A^T (A^H for complex): the method of W. W. Hager
 * ("Condition estimates", SIAM J. Sci. Stat. Comput. 5(2), 1984) as refined by N. J. Higham ("FORTRAN
 * codes for estimating the one-norm of a real or complex matrix, with applications to condition
 * estimation", ACM TOMS 14(4), 1988), the algorithm of LAPACK's DLACN2 and ZLACN2. Each estimate is the
 * 1-norm of A^-1 applied to some vector of 1-norm 1, so a lower bound of ||A^-1||_1; Higham reports it
 * within a factor 3 of the true value in nearly all cases. The one change from LAPACK: when the
 * iteration stops because the estimate stopped growing, the largest one seen is kept (LAPACK returns the
 * last), so that `column` always names the unit vector e_column whose image gave the estimate, unless
 * Higham's alternating-sign vector gives a larger one (then the estimate is that one's, the column still
 * the best unit vector's).
 */

const ITMAX = 5;

/** ||A^-1||_1 estimate and the column of A^-1 it was found in (e_column gave it; -1 for n = 0). */
export interface InverseNorm {
  est: number;
  column: number;
}

/** Real A: `solve` overwrites v with A^-1 v, `solveT` with A^-T v. x, sgn: work vectors of n. */
export function inverseNorm1Real(n: number, solve: (v: Float64Array) => void, solveT: (v: Float64Array) => void, x: Float64Array, sgn: Float64Array): InverseNorm {
  if (n === 0) return { est: 0, column: -1 };
  x.fill(1 / n);
  solve(x);
  if (n === 1) return { est: Math.abs(x[0]), column: 0 };
  let est = sum1(x, n);
  let best: InverseNorm = { est: 0, column: 0 };
  for (let i = 0; i < n; i++) sgn[i] = x[i] = x[i] >= 0 ? 1 : -1;
  solveT(x);
  let j = argmaxAbs(x, n);
  for (let iter = 2; ; iter++) {
    x.fill(0);
    x[j] = 1;
    solve(x);
    const estold = est;
    est = sum1(x, n);
    if (est > best.est) best = { est, column: j };
    let repeated = true;
    for (let i = 0; i < n; i++) {
      if ((x[i] >= 0 ? 1 : -1) !== sgn[i]) {
        repeated = false;
        break;
      }
    }
    if (repeated || est <= estold) break; // converged, or cycling
    for (let i = 0; i < n; i++) sgn[i] = x[i] = x[i] >= 0 ? 1 : -1;
    solveT(x);
    const jlast = j;
    j = argmaxAbs(x, n);
    if (!(x[jlast] !== Math.abs(x[j]) && iter < ITMAX)) break;
  }
  return alternating(n, x, null, () => solve(x), best);
}

/**
 * Complex A, vectors split re/im: `solve` overwrites (vr, vi) with A^-1 v, `solveH` with A^-H v.
 * xr, xi: work vectors of n.
 */
export function inverseNorm1Complex(
  n: number,
  solve: (vr: Float64Array, vi: Float64Array) => void,
  solveH: (vr: Float64Array, vi: Float64Array) => void,
  xr: Float64Array,
  xi: Float64Array,
): InverseNorm {
  if (n === 0) return { est: 0, column: -1 };
  xr.fill(1 / n);
  xi.fill(0);
  solve(xr, xi);
  if (n === 1) return { est: Math.hypot(xr[0], xi[0]), column: 0 };
  let est = sum1c(xr, xi, n);
  let best: InverseNorm = { est: 0, column: 0 };
  unitPhases(xr, xi, n);
  solveH(xr, xi);
  let j = argmaxAbsC(xr, xi, n);
  for (let iter = 2; ; iter++) {
    xr.fill(0);
    xi.fill(0);
    xr[j] = 1;
    solve(xr, xi);
    const estold = est;
    est = sum1c(xr, xi, n);
    if (est > best.est) best = { est, column: j };
    if (est <= estold) break;
    unitPhases(xr, xi, n);
    solveH(xr, xi);
    const jlast = j;
    j = argmaxAbsC(xr, xi, n);
    if (!(Math.hypot(xr[jlast], xi[jlast]) !== Math.hypot(xr[j], xi[j]) && iter < ITMAX)) break;
  }
  return alternating(n, xr, xi, () => solve(xr, xi), best);
}

/** Higham's extra vector x_i = (-1)^i (1 + i/(n-1)): 2 ||A^-1 x||_1 / (3n) guards against the rare misses. */
function alternating(n: number, x: Float64Array, xi: Float64Array | null, run: () => void, best: InverseNorm): InverseNorm {
  for (let i = 0; i < n; i++) x[i] = (i % 2 === 0 ? 1 : -1) * (1 + i / (n - 1));
  if (xi) xi.fill(0);
  run();
  const temp = (2 * (xi ? sum1c(x, xi, n) : sum1(x, n))) / (3 * n);
  return temp > best.est ? { est: temp, column: best.column } : best;
}

function sum1(x: Float64Array, n: number): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += Math.abs(x[i]);
  return s;
}

function sum1c(xr: Float64Array, xi: Float64Array, n: number): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += Math.hypot(xr[i], xi[i]);
  return s;
}

function argmaxAbs(x: Float64Array, n: number): number {
  let j = 0;
  for (let i = 1; i < n; i++) if (Math.abs(x[i]) > Math.abs(x[j])) j = i;
  return j;
}

function argmaxAbsC(xr: Float64Array, xi: Float64Array, n: number): number {
  let j = 0;
  let m = Math.hypot(xr[0], xi[0]);
  for (let i = 1; i < n; i++) {
    const a = Math.hypot(xr[i], xi[i]);
    if (a > m) {
      m = a;
      j = i;
    }
  }
  return j;
}

/** x_i = x_i / |x_i| (1 where x_i is zero or too small to divide by), as ZLACN2 does. */
function unitPhases(xr: Float64Array, xi: Float64Array, n: number): void {
  for (let i = 0; i < n; i++) {
    const a = Math.hypot(xr[i], xi[i]);
    if (a > Number.MIN_VALUE * 2 ** 52) {
      xr[i] /= a;
      xi[i] /= a;
    } else {
      xr[i] = 1;
      xi[i] = 0;
    }
  }
}
