/**
 * Contract of the complex sparse LU used by the MNA solver.
 *
 * Matrices are square, compressed sparse column (CSC): column j holds rows
 * rowIdx[colPtr[j] .. colPtr[j+1]-1], sorted ascending, no duplicates. The
 * pattern is fixed for a circuit's structure; values (re, im) are aligned
 * with rowIdx and change per frequency or per edited value.
 */
export interface CscPattern {
  n: number;
  colPtr: Int32Array;
  rowIdx: Int32Array;
}

export interface ComplexValues {
  re: Float64Array;
  im: Float64Array;
}

/** No acceptable pivot: `column` is the original column (unknown) index at fault. */
export class SingularMatrixError extends Error {
  readonly column: number;
  constructor(column: number) {
    super(`matrix is singular at unknown ${column}`);
    this.name = 'SingularMatrixError';
    this.column = column;
  }
}
