/**
 * Numeric kernels of the complex sparse LU: values interleaved (re, im), one complex number per entry of
 * the patterns kept by LuCore. Each kernel is a small function of typed arrays (and the one LuCore shape),
 * called from the complex LU only, so that the engine compiles it early and for one shape. A column of
 * factor() is two calls (factorColumn before the pivot is chosen, finishColumn after), one of refactor()
 * is one (refactorColumn); both go through updateColumn, the sparse triangular solve of one column.
 *
 * The first call of a process still costs far more than a warm one (scripts/bench-lu.mjs, ladder of 10,000
 * unknowns, CPU ms: analyze + factor + solve 161-180 first, 7-10 warm): the engine's own compile work, which
 * its CPU time includes. A warm-up before the first large analysis (analyze, factor, refactor and solve on a
 * 12 x 12 grid MNA with branch unknowns, 24 rounds) brought that first factor down to 15-17 ms but cost
 * 340 ms of its own (228-309 ms for the smaller warm-ups tried: 6 x 6 three rounds, 8 x 8 six), so the first
 * call grew in every form; nor did the engine's tier-up flags (always-baseline, a smaller interrupt budget)
 * change it beyond the machine's noise. Hence no warm-up: the kernels stay small so that what compiles is
 * little and compiles once.
 *
 * out: [0] running growth max_j lmax2[j] |u_jk|^2 (read and updated), [1] largest candidate |x|^2,
 * [2] |x|^2 at the preferred diagonal row (-1 if not a candidate), [3] the column's scale for the singular
 * test (largest |a_ij|^2 or |u_jk|^2), [4] largest |a_ij|^2.
 */
import type { Kernels } from './lu-base';
import type { LuCore } from './structure';

/**
 * factor(), column k = q[col] before its pivot: x = A(:,col) by original row, the update with the columns
 * U(:,k) = Ui[u0..u1), then the pivot candidates of reach[top..n) (its rows not pivotal yet). Returns the
 * row of the largest candidate (-1 if none); see out above.
 */
export function factorColumn(c: LuCore, Axr: Float64Array, Axi: Float64Array, col: number, top: number, u0: number, u1: number, drow: number, out: Float64Array): number {
  const { x, Ap, Ai, reach, pinv, n } = c;
  let amax2 = 0;
  for (let p = Ap[col], pe = Ap[col + 1]; p < pe; p++) {
    const i2 = 2 * Ai[p];
    const vr = Axr[p];
    const vi = Axi[p];
    x[i2] = vr;
    x[i2 + 1] = vi;
    const a2 = vr * vr + vi * vi;
    if (a2 > amax2) amax2 = a2;
  }
  const umax2 = u1 > u0 ? updateColumn(c, c.prow, u0, u1, out) : 0;
  out[3] = umax2 > amax2 ? umax2 : amax2;
  out[4] = amax2;
  let cmax2 = 0;
  let ipiv = -1;
  let diag2 = -1;
  for (let t = top; t < n; t++) {
    const j = reach[t];
    if (pinv[j] >= 0) continue;
    const vr = x[2 * j];
    const vi = x[2 * j + 1];
    const a2 = vr * vr + vi * vi;
    if (a2 > cmax2 || ipiv < 0) {
      cmax2 = a2;
      ipiv = j;
    }
    if (j === drow) diag2 = a2;
  }
  out[1] = cmax2;
  out[2] = diag2;
  return ipiv;
}

/** factor(), column k after its pivot ipiv and the rows of L(:,k) are chosen: U(k,k), lmax2[k], L(:,k). */
export function finishColumn(c: LuCore, k: number, ipiv: number, cmax2: number, out: Float64Array): void {
  const { x, Ud } = c;
  const pr = x[2 * ipiv];
  const pi = x[2 * ipiv + 1];
  Ud[2 * k] = pr;
  Ud[2 * k + 1] = pi;
  x[2 * ipiv] = 0;
  x[2 * ipiv + 1] = 0;
  c.lmax2[k] = cmax2 / (pr * pr + pi * pi); // the multipliers are the candidates over the pivot
  if (cmax2 > out[0]) out[0] = cmax2; // lmax2[k] |u_kk|^2
  const ls = c.Lp[k];
  const le = c.Lp[k + 1];
  if (le > ls) storeL(x, c.Li, c.Lx, ls, le, Ud, k);
}

/**
 * refactor(), column k with the stored patterns: x = A(:,q[k]) by pivot position, the update, then the
 * reused pivot (at x[2k]) against the rest of the column L(:,k). Returns the largest candidate |x|^2 and
 * stores U(k,k), lmax2[k] and L(:,k); or -1, x cleared, when the pivot is zero, below tol2 of the largest
 * candidate (squared), or the column is singular (sing2 of its largest |a_ij|^2 or |u_jk|^2). out[0]: the
 * column's growth, out[4]: its largest |a_ij|^2.
 */
export function refactorColumn(c: LuCore, Axr: Float64Array, Axi: Float64Array, k: number, tol2: number, sing2: number, out: Float64Array): number {
  const { x, Ap, Ai, pinv, Li, Ud } = c;
  const col = c.q[k];
  let amax2 = 0;
  for (let p = Ap[col], pe = Ap[col + 1]; p < pe; p++) {
    const i2 = 2 * pinv[Ai[p]];
    const vr = Axr[p];
    const vi = Axi[p];
    x[i2] = vr;
    x[i2 + 1] = vi;
    const a2 = vr * vr + vi * vi;
    if (a2 > amax2) amax2 = a2;
  }
  out[0] = 0;
  out[4] = amax2;
  const u0 = c.Up[k];
  const u1 = c.Up[k + 1];
  const umax2 = u1 > u0 ? updateColumn(c, c.ident, u0, u1, out) : 0;
  const scale2 = umax2 > amax2 ? umax2 : amax2;
  const ls = c.Lp[k];
  const le = c.Lp[k + 1];
  const pr = x[2 * k];
  const pi = x[2 * k + 1];
  x[2 * k] = 0;
  x[2 * k + 1] = 0;
  const d = pr * pr + pi * pi;
  let cmax2 = d;
  for (let t = ls; t < le; t++) {
    const i2 = 2 * Li[t];
    const a2 = x[i2] * x[i2] + x[i2 + 1] * x[i2 + 1];
    if (a2 > cmax2) cmax2 = a2;
  }
  if (d === 0 || d < tol2 * cmax2 || cmax2 <= sing2 * scale2) {
    for (let t = ls; t < le; t++) {
      x[2 * Li[t]] = 0;
      x[2 * Li[t] + 1] = 0;
    }
    return -1;
  }
  Ud[2 * k] = pr;
  Ud[2 * k + 1] = pi;
  c.lmax2[k] = cmax2 / d;
  storeL(x, Li, c.Lx, ls, le, Ud, k);
  return cmax2;
}

/**
 * Applies four consecutive columns j..j+3 of one supernode of L to the dense column x: a 4x4 unit
 * lower triangular solve for their pivot rows, then one pass over their common rows (half the index
 * loads and scattered x accesses of four single passes). Column j holds the pivot rows of j+1..j+3
 * first, then the rows of column j+3 in the same order; likewise j+1 and j+2. r0..r3 are the offsets
 * in x (2 * rowOf[j + c]) of the four pivot rows. Writes the four U entries to Ux from entry u, clears
 * them in x, updates the running growth out[0], and returns the largest squared magnitude among them.
 */
function update4(c: LuCore, rowOf: Int32Array, j: number, u: number, out: Float64Array): number {
  const { x, Lp, Li, Lx, Ux, lmax2 } = c;
  const r0 = 2 * rowOf[j];
  const r1 = 2 * rowOf[j + 1];
  const r2 = 2 * rowOf[j + 2];
  const r3 = 2 * rowOf[j + 3];
  const a0 = Lp[j];
  const a1 = Lp[j + 1];
  const a2 = Lp[j + 2];
  const a3 = Lp[j + 3];
  const a4 = Lp[j + 4];
  const v0r = x[r0];
  const v0i = x[r0 + 1];
  let lr = Lx[2 * a0];
  let li = Lx[2 * a0 + 1];
  const v1r = x[r1] - (lr * v0r - li * v0i);
  const v1i = x[r1 + 1] - (lr * v0i + li * v0r);
  lr = Lx[2 * a0 + 2];
  li = Lx[2 * a0 + 3];
  let mr = Lx[2 * a1];
  let mi = Lx[2 * a1 + 1];
  const v2r = x[r2] - (lr * v0r - li * v0i) - (mr * v1r - mi * v1i);
  const v2i = x[r2 + 1] - (lr * v0i + li * v0r) - (mr * v1i + mi * v1r);
  lr = Lx[2 * a0 + 4];
  li = Lx[2 * a0 + 5];
  mr = Lx[2 * a1 + 2];
  mi = Lx[2 * a1 + 3];
  const nr = Lx[2 * a2];
  const ni = Lx[2 * a2 + 1];
  const v3r = x[r3] - (lr * v0r - li * v0i) - (mr * v1r - mi * v1i) - (nr * v2r - ni * v2i);
  const v3i = x[r3 + 1] - (lr * v0i + li * v0r) - (mr * v1i + mi * v1r) - (nr * v2i + ni * v2r);
  x[r0] = 0;
  x[r0 + 1] = 0;
  x[r1] = 0;
  x[r1 + 1] = 0;
  x[r2] = 0;
  x[r2 + 1] = 0;
  x[r3] = 0;
  x[r3 + 1] = 0;
  const u2 = 2 * u;
  Ux[u2] = v0r;
  Ux[u2 + 1] = v0i;
  Ux[u2 + 2] = v1r;
  Ux[u2 + 3] = v1i;
  Ux[u2 + 4] = v2r;
  Ux[u2 + 5] = v2i;
  Ux[u2 + 6] = v3r;
  Ux[u2 + 7] = v3i;
  // common rows: L(:,j+3); column j+c holds them from offset 3-c
  const o0 = 2 * (a0 + 3 - a3);
  const o1 = 2 * (a1 + 2 - a3);
  const o2 = 2 * (a2 + 1 - a3);
  for (let t = a3; t < a4; t++) {
    const i2 = 2 * Li[t];
    const t2 = 2 * t;
    const b0r = Lx[t2 + o0];
    const b0i = Lx[t2 + o0 + 1];
    const b1r = Lx[t2 + o1];
    const b1i = Lx[t2 + o1 + 1];
    const b2r = Lx[t2 + o2];
    const b2i = Lx[t2 + o2 + 1];
    const b3r = Lx[t2];
    const b3i = Lx[t2 + 1];
    x[i2] -= b0r * v0r - b0i * v0i + (b1r * v1r - b1i * v1i) + (b2r * v2r - b2i * v2i) + (b3r * v3r - b3i * v3i);
    x[i2 + 1] -= b0r * v0i + b0i * v0r + (b1r * v1i + b1i * v1r) + (b2r * v2i + b2i * v2r) + (b3r * v3i + b3i * v3r);
  }
  const m0 = v0r * v0r + v0i * v0i;
  const m1 = v1r * v1r + v1i * v1i;
  const m2 = v2r * v2r + v2i * v2i;
  const m3 = v3r * v3r + v3i * v3i;
  out[0] = Math.max(out[0], lmax2[j] * m0, lmax2[j + 1] * m1, lmax2[j + 2] * m2, lmax2[j + 3] * m3);
  return Math.max(m0, m1, m2, m3);
}

/**
 * The column update shared by factor and refactor: x = L \ x over the columns Ui[p0..p1) of U(:,k)
 * (ascending pivot positions), writing U(:,k) to Ux. The pivot row of column j sits at x[2 * rowOf[j]]
 * (original rows while factoring, pivot positions after). Four consecutive columns of one supernode go
 * through update4. Updates the running growth out[0]; returns the largest |u_jk|^2.
 */
export function updateColumn(c: LuCore, rowOf: Int32Array, p0: number, p1: number, out: Float64Array): number {
  const { x, Lp, Li, Lx, Ui, Ux, sn, lmax2 } = c;
  let umax2 = 0;
  for (let p = p0; p < p1; p++) {
    const j = Ui[p];
    if (p + 3 < p1 && Ui[p + 3] === j + 3 && sn[j] === sn[j + 3]) {
      const u2 = update4(c, rowOf, j, p, out);
      if (u2 > umax2) umax2 = u2;
      p += 3;
      continue;
    }
    const j2 = 2 * rowOf[j];
    const vr = x[j2];
    const vi = x[j2 + 1];
    x[j2] = 0;
    x[j2 + 1] = 0;
    Ux[2 * p] = vr;
    Ux[2 * p + 1] = vi;
    const u2 = vr * vr + vi * vi;
    if (u2 > umax2) umax2 = u2;
    if (lmax2[j] * u2 > out[0]) out[0] = lmax2[j] * u2;
    if (vr === 0 && vi === 0) continue;
    for (let t = Lp[j], te = Lp[j + 1]; t < te; t++) {
      const i2 = 2 * Li[t];
      const lr = Lx[2 * t];
      const li = Lx[2 * t + 1];
      x[i2] -= lr * vr - li * vi;
      x[i2 + 1] -= lr * vi + li * vr;
    }
  }
  return umax2;
}

/** L(:,k) = x at rows Li[from..to) / U(k,k), clearing x there. */
function storeL(x: Float64Array, Li: Int32Array, Lx: Float64Array, from: number, to: number, Ud: Float64Array, k: number): void {
  const pr = Ud[2 * k];
  const pi = Ud[2 * k + 1];
  const d = pr * pr + pi * pi;
  const ir = pr / d;
  const ii = -pi / d;
  for (let t = from; t < to; t++) {
    const i2 = 2 * Li[t];
    const vr = x[i2];
    const vi = x[i2 + 1];
    Lx[2 * t] = vr * ir - vi * ii;
    Lx[2 * t + 1] = vr * ii + vi * ir;
    x[i2] = 0;
    x[i2 + 1] = 0;
  }
}

/** The kernels as SparseLuBase takes them. */
export const complexKernels: Kernels = { factorColumn, finishColumn, refactorColumn };
