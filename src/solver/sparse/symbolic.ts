/** Symbolic analysis of the sparse LU: the checked pattern and its fill-reducing column order. */
import { amdAnalyze } from './amd';
import type { CscPattern } from './types';

export interface LuSymbolic {
  n: number;
  /** Column order: column k of the factors is column q[k] of A. */
  q: Int32Array;
  pattern: CscPattern;
  /**
   * Entries of strict L for the Cholesky pattern of A + A^T in the order q (from the ordering itself):
   * what L and U each hold when every pivot stays on the diagonal. It sizes the factors up front.
   */
  cholNnz?: number;
}

function checkPattern(pattern: CscPattern): void {
  const { n, colPtr, rowIdx } = pattern;
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`bad matrix order ${n}`);
  if (colPtr.length !== n + 1 || colPtr[0] !== 0) throw new RangeError('colPtr must have n+1 entries starting at 0');
  if (rowIdx.length < colPtr[n]) throw new RangeError('rowIdx shorter than colPtr[n]');
  for (let j = 0; j < n; j++) {
    let last = -1;
    for (let p = colPtr[j], e = colPtr[j + 1]; p < e; p++) {
      const i = rowIdx[p];
      if (i <= last || i >= n) throw new RangeError(`column ${j}: row indices must be ascending, unique and < n`);
      last = i;
    }
  }
}

/** Fill-reducing column order for the pattern (AMD on A + A^T), with the size of the factors it implies. */
export function analyze(pattern: CscPattern): LuSymbolic {
  checkPattern(pattern);
  const { perm, lnz } = amdAnalyze(pattern);
  return { n: pattern.n, q: perm, pattern, cholNnz: lnz };
}
