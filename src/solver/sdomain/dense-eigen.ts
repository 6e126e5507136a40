/**
 * Eigenvalues of a dense real (non-symmetric) matrix: balanced by diagonal
 * similarity first (B. N. Parlett and C. Reinsch, "Balancing a matrix for
 * calculation of eigenvalues and eigenvectors", Numer. Math. 13, 1969; powers
 * of two, so the balancing itself rounds nothing), then the Hessenberg QR
 * algorithm of ml-matrix's EigenvalueDecomposition.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

/** Balances a (row-major n×n) in place: rows and columns scaled so their off-diagonal norms match. */
export function balance(a: Float64Array, n: number): void {
  const radix = 2;
  const radix2 = radix * radix;
  let done = false;
  for (let sweep = 0; !done && sweep < 100; sweep++) {
    done = true;
    for (let i = 0; i < n; i++) {
      let c = 0;
      let r = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        c += Math.abs(a[j * n + i]);
        r += Math.abs(a[i * n + j]);
      }
      if (c === 0 || r === 0) continue;
      let g = r / radix;
      let f = 1;
      const s = c + r;
      while (c < g) {
        f *= radix;
        c *= radix2;
      }
      g = r * radix;
      while (c > g) {
        f /= radix;
        c /= radix2;
      }
      if ((c + r) / f < 0.95 * s) {
        done = false;
        const inv = 1 / f;
        for (let j = 0; j < n; j++) a[i * n + j] *= inv;
        for (let j = 0; j < n; j++) a[j * n + i] *= f;
      }
    }
  }
}

/** All eigenvalues of the row-major n×n matrix a (a is balanced in place). */
export function denseEigenvalues(a: Float64Array, n: number): { re: Float64Array; im: Float64Array } {
  if (n === 0) return { re: new Float64Array(0), im: new Float64Array(0) };
  balance(a, n);
  const rows: Float64Array[] = [];
  for (let i = 0; i < n; i++) rows.push(a.subarray(i * n, i * n + n));
  const evd = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: false });
  return { re: Float64Array.from(evd.realEigenvalues), im: Float64Array.from(evd.imaginaryEigenvalues) };
}
