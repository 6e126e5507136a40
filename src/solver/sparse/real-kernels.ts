/**
 * Numeric kernels of the real sparse LU: one number per entry of the patterns kept by LuCore. The same
 * steps as complex-kernels.ts, in real arithmetic (see there for what each one does and for `out`).
 */
import type { Kernels } from './lu-base';
import type { LuCore } from './structure';

/** factor(), column k before its pivot (complex-kernels.ts factorColumn). */
export function factorColumn(c: LuCore, Ax: Float64Array, _im: Float64Array, col: number, top: number, u0: number, u1: number, drow: number, out: Float64Array): number {
  const { x, Ap, Ai, reach, pinv, n } = c;
  let amax2 = 0;
  for (let p = Ap[col], pe = Ap[col + 1]; p < pe; p++) {
    const v = Ax[p];
    x[Ai[p]] = v;
    if (v * v > amax2) amax2 = v * v;
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
    const a2 = x[j] * x[j];
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

/** factor(), column k after its pivot (complex-kernels.ts finishColumn). */
export function finishColumn(c: LuCore, k: number, ipiv: number, cmax2: number, out: Float64Array): void {
  const { x, Ud } = c;
  const p = x[ipiv];
  Ud[k] = p;
  x[ipiv] = 0;
  c.lmax2[k] = cmax2 / (p * p);
  if (cmax2 > out[0]) out[0] = cmax2;
  const ls = c.Lp[k];
  const le = c.Lp[k + 1];
  if (le > ls) storeL(x, c.Li, c.Lx, ls, le, Ud, k);
}

/** refactor(), column k (complex-kernels.ts refactorColumn). */
export function refactorColumn(c: LuCore, Ax: Float64Array, _im: Float64Array, k: number, tol2: number, sing2: number, out: Float64Array): number {
  const { x, Ap, Ai, pinv, Li, Ud } = c;
  const col = c.q[k];
  let amax2 = 0;
  for (let p = Ap[col], pe = Ap[col + 1]; p < pe; p++) {
    const v = Ax[p];
    x[pinv[Ai[p]]] = v;
    if (v * v > amax2) amax2 = v * v;
  }
  out[0] = 0;
  out[4] = amax2;
  const u0 = c.Up[k];
  const u1 = c.Up[k + 1];
  const umax2 = u1 > u0 ? updateColumn(c, c.ident, u0, u1, out) : 0;
  const scale2 = umax2 > amax2 ? umax2 : amax2;
  const ls = c.Lp[k];
  const le = c.Lp[k + 1];
  const p = x[k];
  x[k] = 0;
  const d = p * p;
  let cmax2 = d;
  for (let t = ls; t < le; t++) {
    const v = x[Li[t]];
    if (v * v > cmax2) cmax2 = v * v;
  }
  if (d === 0 || d < tol2 * cmax2 || cmax2 <= sing2 * scale2) {
    for (let t = ls; t < le; t++) x[Li[t]] = 0;
    return -1;
  }
  Ud[k] = p;
  c.lmax2[k] = cmax2 / d;
  storeL(x, Li, c.Lx, ls, le, Ud, k);
  return cmax2;
}

/** Four consecutive columns j..j+3 of one supernode applied to x in one pass (complex-kernels.ts update4). */
function update4(c: LuCore, rowOf: Int32Array, j: number, u: number, out: Float64Array): number {
  const { x, Lp, Li, Lx, Ux, lmax2 } = c;
  const r0 = rowOf[j];
  const r1 = rowOf[j + 1];
  const r2 = rowOf[j + 2];
  const r3 = rowOf[j + 3];
  const a0 = Lp[j];
  const a1 = Lp[j + 1];
  const a2 = Lp[j + 2];
  const a3 = Lp[j + 3];
  const a4 = Lp[j + 4];
  const v0 = x[r0];
  const v1 = x[r1] - Lx[a0] * v0;
  const v2 = x[r2] - Lx[a0 + 1] * v0 - Lx[a1] * v1;
  const v3 = x[r3] - Lx[a0 + 2] * v0 - Lx[a1 + 1] * v1 - Lx[a2] * v2;
  x[r0] = 0;
  x[r1] = 0;
  x[r2] = 0;
  x[r3] = 0;
  Ux[u] = v0;
  Ux[u + 1] = v1;
  Ux[u + 2] = v2;
  Ux[u + 3] = v3;
  const o0 = a0 + 3 - a3;
  const o1 = a1 + 2 - a3;
  const o2 = a2 + 1 - a3;
  for (let t = a3; t < a4; t++) {
    x[Li[t]] -= Lx[t + o0] * v0 + Lx[t + o1] * v1 + (Lx[t + o2] * v2 + Lx[t] * v3);
  }
  const m0 = v0 * v0;
  const m1 = v1 * v1;
  const m2 = v2 * v2;
  const m3 = v3 * v3;
  out[0] = Math.max(out[0], lmax2[j] * m0, lmax2[j + 1] * m1, lmax2[j + 2] * m2, lmax2[j + 3] * m3);
  return Math.max(m0, m1, m2, m3);
}

/** x = L \ x over U(:,k) = Ui[p0..p1), shared by factor and refactor (complex-kernels.ts updateColumn). */
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
    const r = rowOf[j];
    const v = x[r];
    x[r] = 0;
    Ux[p] = v;
    const u2 = v * v;
    if (u2 > umax2) umax2 = u2;
    if (lmax2[j] * u2 > out[0]) out[0] = lmax2[j] * u2;
    if (v === 0) continue;
    for (let t = Lp[j], te = Lp[j + 1]; t < te; t++) x[Li[t]] -= Lx[t] * v;
  }
  return umax2;
}

/** L(:,k) = x at rows Li[from..to) / U(k,k), clearing x there. */
function storeL(x: Float64Array, Li: Int32Array, Lx: Float64Array, from: number, to: number, Ud: Float64Array, k: number): void {
  const inv = 1 / Ud[k];
  for (let t = from; t < to; t++) {
    const i = Li[t];
    Lx[t] = x[i] * inv;
    x[i] = 0;
  }
}

/** The kernels as SparseLuBase takes them. */
export const realKernels: Kernels = { factorColumn, finishColumn, refactorColumn };
