import type { ComplexValues, CscPattern } from '../../../src/solver/sparse/types';

export interface CscMatrix {
  pattern: CscPattern;
  values: ComplexValues;
}

/** Dense complex [re, im] rows -> CSC; an entry is structural when `keep(i, j)` or it is nonzero. */
export function fromDense(re: number[][], im: number[][], keep?: (i: number, j: number) => boolean): CscMatrix {
  const n = re.length;
  const colPtr = new Int32Array(n + 1);
  const rows: number[] = [];
  const vr: number[] = [];
  const vi: number[] = [];
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      if (re[i][j] !== 0 || im[i][j] !== 0 || keep?.(i, j)) {
        rows.push(i);
        vr.push(re[i][j]);
        vi.push(im[i][j]);
      }
    }
    colPtr[j + 1] = rows.length;
  }
  return {
    pattern: { n, colPtr, rowIdx: Int32Array.from(rows) },
    values: { re: Float64Array.from(vr), im: Float64Array.from(vi) },
  };
}

/** Triplets (duplicates summed) -> CSC with sorted rows. */
export function fromTriplets(n: number, entries: Array<[number, number, number, number]>): CscMatrix {
  const cols: Array<Map<number, [number, number]>> = Array.from({ length: n }, () => new Map());
  for (const [i, j, re, im] of entries) {
    const o = cols[j].get(i);
    if (o) {
      o[0] += re;
      o[1] += im;
    } else cols[j].set(i, [re, im]);
  }
  const colPtr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) colPtr[j + 1] = colPtr[j] + cols[j].size;
  const nnz = colPtr[n];
  const rowIdx = new Int32Array(nnz);
  const re = new Float64Array(nnz);
  const im = new Float64Array(nnz);
  for (let j = 0; j < n; j++) {
    let p = colPtr[j];
    for (const i of [...cols[j].keys()].sort((a, b) => a - b)) {
      const v = cols[j].get(i)!;
      rowIdx[p] = i;
      re[p] = v[0];
      im[p] = v[1];
      p++;
    }
  }
  return { pattern: { n, colPtr, rowIdx }, values: { re, im } };
}

export function toDense(m: CscMatrix): { re: number[][]; im: number[][] } {
  const { n, colPtr, rowIdx } = m.pattern;
  const re = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const im = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      re[rowIdx[p]][j] = m.values.re[p];
      im[rowIdx[p]][j] = m.values.im[p];
    }
  }
  return { re, im };
}

export function matvec(m: CscMatrix, xr: Float64Array, xi: Float64Array): [Float64Array, Float64Array] {
  const { n, colPtr, rowIdx } = m.pattern;
  const yr = new Float64Array(n);
  const yi = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      const ar = m.values.re[p];
      const ai = m.values.im[p];
      yr[i] += ar * xr[j] - ai * xi[j];
      yi[i] += ar * xi[j] + ai * xr[j];
    }
  }
  return [yr, yi];
}

/** Deterministic generator for test data (LCG). */
export function rng(seed: number): () => number {
  let s = seed >>> 0 || 1;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296;
}

/**
 * MNA-like matrix: an m x m grid of admittances (5-point), a small leak to
 * ground at each node, and `branches` voltage sources from grid nodes to ground,
 * each adding a branch row/column with a zero diagonal (the MNA stamp of C.-W.
 * Ho, A. E. Ruehli, P. A. Brennan, IEEE Trans. CAS 1975).
 */
export function mnaGrid(m: number, branches: number, seed = 1, spread = 2): CscMatrix {
  const r = rng(seed);
  const nNodes = m * m;
  const n = nNodes + branches;
  const t: Array<[number, number, number, number]> = [];
  const id = (x: number, y: number) => x + m * y;
  for (let y = 0; y < m; y++) {
    for (let x = 0; x < m; x++) {
      const a = id(x, y);
      t.push([a, a, 1e-3 * (0.5 + r()), 1e-4 * r()]);
      for (const [dx, dy] of [
        [1, 0],
        [0, 1],
      ]) {
        if (x + dx >= m || y + dy >= m) continue;
        const b = id(x + dx, y + dy);
        const g = 10 ** (spread * (2 * r() - 1));
        const gi = (r() - 0.5) * g;
        t.push([a, a, g, gi], [b, b, g, gi], [a, b, -g, -gi], [b, a, -g, -gi]);
      }
    }
  }
  for (let k = 0; k < branches; k++) {
    const v = Math.floor(((k + 0.5) / branches) * nNodes);
    t.push([v, nNodes + k, 1, 0], [nNodes + k, v, 1, 0]);
  }
  return fromTriplets(n, t);
}

/** max_i |y_i - b_i| / (|A| |x| + |b|)_max, a normwise backward error. */
export function relResidual(m: CscMatrix, xr: Float64Array, xi: Float64Array, br: Float64Array, bi: Float64Array): number {
  const [yr, yi] = matvec(m, xr, xi);
  let num = 0;
  let anorm = 0;
  let xnorm = 0;
  let bnorm = 0;
  for (let p = 0; p < m.values.re.length; p++) anorm = Math.max(anorm, Math.hypot(m.values.re[p], m.values.im[p]));
  for (let i = 0; i < xr.length; i++) {
    num = Math.max(num, Math.hypot(yr[i] - br[i], yi[i] - bi[i]));
    xnorm = Math.max(xnorm, Math.hypot(xr[i], xi[i]));
    bnorm = Math.max(bnorm, Math.hypot(br[i], bi[i]));
  }
  return num / (anorm * xnorm + bnorm);
}

/** Pattern of the 5-point m x m grid (with diagonal), built directly: fast for large m. */
export function gridPattern(m: number): CscPattern {
  const n = m * m;
  const colPtr = new Int32Array(n + 1);
  const rowIdx = new Int32Array(5 * n);
  let nz = 0;
  for (let j = 0; j < n; j++) {
    const x = j % m;
    const y = (j - x) / m;
    if (y > 0) rowIdx[nz++] = j - m;
    if (x > 0) rowIdx[nz++] = j - 1;
    rowIdx[nz++] = j;
    if (x < m - 1) rowIdx[nz++] = j + 1;
    if (y < m - 1) rowIdx[nz++] = j + m;
    colPtr[j + 1] = nz;
  }
  return { n, colPtr, rowIdx: rowIdx.slice(0, nz) };
}

/**
 * Random sparse n x n matrix (complex, or with zero imaginary parts when `real`): entries uniform in
 * (-1, 1) with the given density, some diagonals left out, made nonsingular by a strong entry (3 .. 4) on a
 * random permutation (the family of lu.test.ts). Invented data for tests only.
 */
export function randomSparse(n: number, seed: number, density = 0.3, zeroDiag = 0.3, real = false): CscMatrix {
  const r = rng(seed);
  const perm = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [perm[i], perm[j]] = [perm[j], perm[i]];
  }
  const t: Array<[number, number, number, number]> = [];
  const im = () => (real ? 0 : 2 * r() - 1);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      if (i === j && r() < zeroDiag) continue;
      if (i === j || r() < density) t.push([i, j, 2 * r() - 1, im()]);
    }
    t.push([perm[j], j, 3 + r(), real ? 0 : r() - 0.5]);
  }
  return fromTriplets(n, t);
}

/** The real parts of a matrix's values (its imaginary parts dropped). */
export function realValues(m: CscMatrix): Float64Array {
  return m.values.re.slice();
}

/** y = A x for real x, with the real parts of A. */
export function matvecReal(m: CscMatrix, x: Float64Array, transposed = false): Float64Array {
  const { n, colPtr, rowIdx } = m.pattern;
  const y = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      if (transposed) y[j] += m.values.re[p] * x[rowIdx[p]];
      else y[rowIdx[p]] += m.values.re[p] * x[j];
    }
  }
  return y;
}
