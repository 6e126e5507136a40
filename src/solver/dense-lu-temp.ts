// Temporary stand-in with the sparse LU's API until it lands.
import { SingularMatrixError, type CscPattern, type ComplexValues } from './sparse/types';
export interface LuSymbolic { n: number; q: Int32Array; pattern: CscPattern }
export function analyze(pattern: CscPattern): LuSymbolic {
  return { n: pattern.n, q: Int32Array.from({ length: pattern.n }, (_, i) => i), pattern };
}
export class ComplexSparseLU {
  private re = new Float64Array(0); private im = new Float64Array(0); private piv = new Int32Array(0);
  nnzL = 0; nnzU = 0;
  constructor(private sym: LuSymbolic) {}
  refactor(v: ComplexValues): boolean { this.factor(v); return true; }
  factor(v: ComplexValues): void {
    const n = this.sym.n, p = this.sym.pattern;
    const re = new Float64Array(n * n), im = new Float64Array(n * n);
    for (let j = 0; j < n; j++) for (let k = p.colPtr[j]; k < p.colPtr[j + 1]; k++) { re[p.rowIdx[k] * n + j] = v.re[k]; im[p.rowIdx[k] * n + j] = v.im[k]; }
    const piv = new Int32Array(n);
    for (let k = 0; k < n; k++) {
      let best = -1, bm = 0;
      for (let i = k; i < n; i++) { const m = Math.hypot(re[i * n + k], im[i * n + k]); if (m > bm) { bm = m; best = i; } }
      if (best < 0 || bm < 1e-300) throw new SingularMatrixError(k);
      piv[k] = best;
      if (best !== k) for (let j = 0; j < n; j++) { let t = re[k * n + j]; re[k * n + j] = re[best * n + j]; re[best * n + j] = t; t = im[k * n + j]; im[k * n + j] = im[best * n + j]; im[best * n + j] = t; }
      const pr = re[k * n + k], pi = im[k * n + k], d = pr * pr + pi * pi;
      for (let i = k + 1; i < n; i++) {
        const ar = re[i * n + k], ai = im[i * n + k];
        if (ar === 0 && ai === 0) continue;
        const lr = (ar * pr + ai * pi) / d, li = (ai * pr - ar * pi) / d;
        re[i * n + k] = lr; im[i * n + k] = li;
        for (let j = k + 1; j < n; j++) { const ur = re[k * n + j], ui = im[k * n + j]; re[i * n + j] -= lr * ur - li * ui; im[i * n + j] -= lr * ui + li * ur; }
      }
    }
    this.re = re; this.im = im; this.piv = piv;
  }
  solve(bRe: Float64Array, bIm: Float64Array): void {
    const n = this.sym.n, re = this.re, im = this.im;
    for (let k = 0; k < n; k++) { const p = this.piv[k]; if (p !== k) { let t = bRe[k]; bRe[k] = bRe[p]; bRe[p] = t; t = bIm[k]; bIm[k] = bIm[p]; bIm[p] = t; } }
    for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) { const lr = re[i * n + j], li = im[i * n + j]; bRe[i] -= lr * bRe[j] - li * bIm[j]; bIm[i] -= lr * bIm[j] + li * bRe[j]; }
    for (let i = n - 1; i >= 0; i--) {
      for (let j = i + 1; j < n; j++) { const ur = re[i * n + j], ui = im[i * n + j]; bRe[i] -= ur * bRe[j] - ui * bIm[j]; bIm[i] -= ur * bIm[j] + ui * bRe[j]; }
      const pr = re[i * n + i], pi = im[i * n + i], d = pr * pr + pi * pi, xr = bRe[i], xi = bIm[i];
      bRe[i] = (xr * pr + xi * pi) / d; bIm[i] = (xi * pr - xr * pi) / d;
    }
  }
}
