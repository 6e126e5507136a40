import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as math from 'mathjs';
import { analyze, ComplexSparseLU } from '../../../src/solver/sparse/lu';
import { SingularMatrixError } from '../../../src/solver/sparse/types';
import { type CscMatrix, fromDense, fromTriplets, mnaGrid, randomSparse, relResidual, rng, toDense } from './helpers';

/** Reference solution from mathjs `lusolve` (dense LU with partial pivoting), an independent implementation. */
function mathjsSolve(m: CscMatrix, br: Float64Array, bi: Float64Array): { re: number[]; im: number[] } {
  const d = toDense(m);
  const n = m.pattern.n;
  const A = d.re.map((row, i) => row.map((v, j) => math.complex(v, d.im[i][j])));
  const b = Array.from({ length: n }, (_, i) => [math.complex(br[i], bi[i])]);
  const x = math.lusolve(A, b) as unknown as math.Complex[][];
  return { re: x.map((r) => r[0].re), im: x.map((r) => r[0].im) };
}

function solveWith(m: CscMatrix, br: Float64Array, bi: Float64Array): { x: [Float64Array, Float64Array]; lu: ComplexSparseLU } {
  const lu = new ComplexSparseLU(analyze(m.pattern));
  lu.factor(m.values);
  const xr = br.slice();
  const xi = bi.slice();
  lu.solve(xr, xi);
  return { x: [xr, xi], lu };
}

/** Relative agreement on real and imaginary parts, scaled by the largest |x_i| (tolerance 1e-9). */
function expectClose(xr: Float64Array, xi: Float64Array, ref: { re: number[]; im: number[] }, tol = 1e-9): void {
  let scale = 0;
  for (let i = 0; i < ref.re.length; i++) scale = Math.max(scale, Math.hypot(ref.re[i], ref.im[i]));
  for (let i = 0; i < ref.re.length; i++) {
    expect(Math.abs(xr[i] - ref.re[i])).toBeLessThanOrEqual(tol * scale);
    expect(Math.abs(xi[i] - ref.im[i])).toBeLessThanOrEqual(tol * scale);
  }
}

function rhs(n: number, seed: number): [Float64Array, Float64Array] {
  const r = rng(seed);
  return [Float64Array.from({ length: n }, () => r() - 0.5), Float64Array.from({ length: n }, () => r() - 0.5)];
}

/** Random sparse complex matrix with a zero diagonal in some rows, made nonsingular by a permuted strong entry. */
const sparseMatrix = fc
  .record({
    n: fc.integer({ min: 1, max: 14 }),
    seed: fc.integer({ min: 1, max: 2 ** 30 }),
    density: fc.double({ min: 0.05, max: 0.5, noNaN: true }),
    zeroDiag: fc.double({ min: 0, max: 0.7, noNaN: true }),
  })
  .map(({ n, seed, density, zeroDiag }) => randomSparse(n, seed, density, zeroDiag));

describe('ComplexSparseLU against mathjs lusolve', () => {
  it('solves random sparse complex systems, including zero diagonals', () => {
    fc.assert(
      fc.property(sparseMatrix, fc.integer({ min: 1, max: 1000 }), (m, seed) => {
        const [br, bi] = rhs(m.pattern.n, seed);
        const { x } = solveWith(m, br, bi);
        expectClose(x[0], x[1], mathjsSolve(m, br, bi));
      }),
      { numRuns: 150 },
    );
  });

  it('solves an MNA-like grid with branch rows (zero diagonals) and admittances over 1e-6..1e6 S', () => {
    for (const seed of [1, 2, 3]) {
      const m = mnaGrid(5, 4, seed, 6); // 25 nodes, 4 voltage-source branches
      const [br, bi] = rhs(m.pattern.n, seed);
      const { x } = solveWith(m, br, bi);
      expectClose(x[0], x[1], mathjsSolve(m, br, bi));
    }
  });

  it('copes with inductor branch rows at 0 Hz and +-1 couplings (zero diagonal, large impedances elsewhere)', () => {
    // nodes 0..2, branch currents 3 (source at node 0) and 4, 5 (coupled inductors 0-1 and 1-2)
    const w = 2 * Math.PI * 50;
    const build = (omega: number) =>
      fromTriplets(6, [
        [0, 0, 1e-6, 0],
        [1, 1, 1 / 12, 0],
        [2, 2, 1e-3, 0],
        [0, 3, 1, 0],
        [3, 0, 1, 0],
        [0, 4, 1, 0],
        [1, 4, -1, 0],
        [4, 0, 1, 0],
        [4, 1, -1, 0],
        [1, 5, 1, 0],
        [2, 5, -1, 0],
        [5, 1, 1, 0],
        [5, 2, -1, 0],
        [4, 4, 0, -omega * 2000],
        [5, 5, 0, -omega * 0.05],
        [4, 5, 0, -omega * 9],
        [5, 4, 0, -omega * 9],
      ]);
    for (const omega of [w, 2 * Math.PI * 1e4, 0]) {
      const m = build(omega);
      // keep the inductor diagonals structural even when they are zero (0 Hz)
      const [br, bi] = [Float64Array.from([0, 0, 0, 230, 0, 0]), new Float64Array(6)];
      const { x } = solveWith(m, br, bi);
      expectClose(x[0], x[1], mathjsSolve(m, br, bi));
    }
  });
});

describe('ComplexSparseLU with wide supernodes found during factor', () => {
  /** Denser random matrices (n 20..60): their factors hold long runs of columns with nested patterns. */
  const denseish = fc
    .record({
      n: fc.integer({ min: 20, max: 60 }),
      seed: fc.integer({ min: 1, max: 2 ** 30 }),
      density: fc.double({ min: 0.1, max: 0.6, noNaN: true }),
      zeroDiag: fc.double({ min: 0, max: 0.5, noNaN: true }),
      weakDiag: fc.boolean(),
    })
    .map(({ n, seed, density, zeroDiag, weakDiag }) => {
      const r = rng(seed);
      const perm = Array.from({ length: n }, (_, i) => i);
      for (let i = n - 1; i > 0; i--) {
        const j = Math.floor(r() * (i + 1));
        [perm[i], perm[j]] = [perm[j], perm[i]];
      }
      const t: Array<[number, number, number, number]> = [];
      for (let j = 0; j < n; j++) {
        for (let i = 0; i < n; i++) {
          if (i === j && r() < zeroDiag) continue;
          // a weak diagonal (1e-5) falls below the pivot threshold and forces off-diagonal pivots
          const s = i === j && weakDiag && r() < 0.5 ? 1e-5 : 1;
          if (i === j || r() < density) t.push([i, j, s * (2 * r() - 1), s * (2 * r() - 1)]);
        }
        t.push([perm[j], j, 3 + r(), r() - 0.5]);
      }
      return fromTriplets(n, t);
    });

  it('agrees with mathjs lusolve, with diagonal and off-diagonal pivots', () => {
    fc.assert(
      fc.property(denseish, fc.integer({ min: 1, max: 1000 }), (m, seed) => {
        const [br, bi] = rhs(m.pattern.n, seed);
        const { x, lu } = solveWith(m, br, bi);
        // reference: mathjs lusolve (dense LU with partial pivoting), an independent implementation
        expectClose(x[0], x[1], mathjsSolve(m, br, bi));
        // the factors alone, without solve's refinement: a backward error far from the O(1) of a wrong
        // factor (growth under threshold pivoting costs digits: measured worst 3.4e-11 over 4,000 samples)
        const plain = new ComplexSparseLU(analyze(m.pattern), { refineTol: Infinity });
        plain.factor(m.values);
        const z = [br.slice(), bi.slice()];
        plain.solve(z[0], z[1]);
        expect(relResidual(m, z[0], z[1], br, bi)).toBeLessThan(1e-8);
        // refactor with the same values replays the same pivots: same solution up to rounding
        expect(lu.refactor(m.values)).toBe(true);
        const y = [br.slice(), bi.slice()];
        lu.solve(y[0], y[1]);
        expectClose(y[0], y[1], { re: Array.from(x[0]), im: Array.from(x[1]) }, 1e-11);
      }),
      { numRuns: 40 },
    );
  });
});

describe('analyze: size of the factors', () => {
  it('predicts nnz(L) and nnz(U) exactly for symmetric patterns with diagonal pivots', () => {
    // For a symmetric pattern and diagonal pivots the L and U^T patterns are the Cholesky pattern of A
    // (A. George, J. W. H. Liu, "Computer Solution of Large Sparse Positive Definite Systems", 1981).
    for (const [m, seed] of [
      [1, 1],
      [7, 2],
      [25, 3],
    ]) {
      const a = mnaGrid(m, 0, seed); // no branch rows: strongly diagonal, the diagonal is always kept
      const sym = analyze(a.pattern);
      const lu = new ComplexSparseLU(sym);
      lu.factor(a.values);
      const n = a.pattern.n;
      expect(sym.cholNnz).toBe(lu.nnzL - n);
      expect(sym.cholNnz).toBe(lu.nnzU - n);
    }
  });

  it('predicts a random symmetric pattern with a dominant diagonal, and bounds an unsymmetric one', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 40 }), fc.integer({ min: 1, max: 2 ** 30 }), fc.boolean(), (n, seed, symmetric) => {
        const r = rng(seed);
        const t: Array<[number, number, number, number]> = [];
        for (let j = 0; j < n; j++) {
          t.push([j, j, 4 * n, 1]); // dominant diagonal: every pivot stays on it
          for (let i = j + 1; i < n; i++) {
            if (r() < 0.1) {
              t.push([i, j, r(), r()]);
              if (symmetric || r() < 0.5) t.push([j, i, r(), r()]);
            }
          }
        }
        const a = fromTriplets(n, t);
        const sym = analyze(a.pattern);
        const lu = new ComplexSparseLU(sym);
        lu.factor(a.values);
        // the Cholesky pattern of A + A^T contains L and U^T of A with diagonal pivots (same source)
        if (symmetric) expect(sym.cholNnz).toBe(lu.nnzL - n);
        expect(lu.nnzL - n).toBeLessThanOrEqual(sym.cholNnz ?? -1);
        expect(lu.nnzU - n).toBeLessThanOrEqual(sym.cholNnz ?? -1);
      }),
      { numRuns: 100 },
    );
  });
});

describe('solve: iterative refinement', () => {
  it('recovers the digits that threshold pivoting loses to growth, on well-conditioned random matrices', () => {
    // Diagonal preference (pivotTol 1e-3) accepts multipliers up to 1e3, so the factors can grow and the
    // backward error of a plain solve exceeds the ~1e-16 of partial pivoting; refinement in working
    // precision brings it back to refineTol (N. J. Higham, "Accuracy and Stability of Numerical
    // Algorithms", 2nd ed., 2002, chapter 12). Both figures are normwise backward errors.
    let worstPlain = 0;
    let worstRefined = 0;
    for (let seed = 1; seed <= 2000; seed++) {
      const r = rng(seed);
      const n = 6 + Math.floor(r() * 10);
      const perm = Array.from({ length: n }, (_, i) => i);
      for (let i = n - 1; i > 0; i--) {
        const j = Math.floor(r() * (i + 1));
        [perm[i], perm[j]] = [perm[j], perm[i]];
      }
      const t: Array<[number, number, number, number]> = [];
      for (let j = 0; j < n; j++) {
        for (let i = 0; i < n; i++) if (i === j || r() < 0.4) t.push([i, j, 2 * r() - 1, 2 * r() - 1]);
        t.push([perm[j], j, 3 + r(), r() - 0.5]);
      }
      const m = fromTriplets(n, t);
      const sym = analyze(m.pattern);
      const [br, bi] = rhs(n, seed);
      const plain = new ComplexSparseLU(sym, { refineTol: Infinity });
      plain.factor(m.values);
      const x0 = [br.slice(), bi.slice()];
      plain.solve(x0[0], x0[1]);
      worstPlain = Math.max(worstPlain, relResidual(m, x0[0], x0[1], br, bi));
      const refined = new ComplexSparseLU(sym);
      refined.factor(m.values);
      const x1 = [br.slice(), bi.slice()];
      refined.solve(x1[0], x1[1]);
      worstRefined = Math.max(worstRefined, relResidual(m, x1[0], x1[1], br, bi));
    }
    expect(worstPlain).toBeGreaterThan(1e-13); // growth is there to be repaired (measured: 4.7e-13)
    expect(worstRefined).toBeLessThan(2e-14); // refined to the default refineTol, 1e-14
  });

  it('solves a diagonal system exactly (nothing to refine)', () => {
    const m = fromTriplets(3, [
      [0, 0, 2, 0],
      [1, 1, 0, 4],
      [2, 2, -1, 1],
    ]);
    const lu = new ComplexSparseLU(analyze(m.pattern));
    lu.factor(m.values);
    const xr = Float64Array.from([2, 4, 2]);
    const xi = Float64Array.from([0, 0, 0]);
    lu.solve(xr, xi);
    // closed form: x_i = b_i / a_ii = 1, 4/(4i) = -i, 2/(-1+i) = -1 - i
    expect([...xr]).toEqual([1, 0, -1]);
    expect([...xi]).toEqual([0, -1, -1]);
  });
});

describe('ComplexSparseLU on larger MNA-like systems', () => {
  it('has a small backward error on a 40 x 40 grid with 30 branch rows and wide value spread', () => {
    const m = mnaGrid(40, 30, 7, 6);
    const [br, bi] = rhs(m.pattern.n, 7);
    const { x } = solveWith(m, br, bi);
    expect(relResidual(m, x[0], x[1], br, bi)).toBeLessThan(1e-13);
  });
});

describe('pivoting on MNA structure', () => {
  it('keeps the fill of the ordering when branch rows force off-diagonal pivots', () => {
    // a voltage-source branch pivots on its node row; the node column must then take the branch row
    // (the displaced diagonal, as KLU does) instead of stealing a neighbour's diagonal in a cascade
    const plain = mnaGrid(30, 0, 5);
    const withBranches = mnaGrid(30, 40, 5);
    const lu0 = new ComplexSparseLU(analyze(plain.pattern));
    lu0.factor(plain.values);
    const lu1 = new ComplexSparseLU(analyze(withBranches.pattern));
    lu1.factor(withBranches.values);
    expect(lu1.nnzL + lu1.nnzU).toBeLessThan(1.3 * (lu0.nnzL + lu0.nnzU));
    const [br, bi] = rhs(withBranches.pattern.n, 3);
    const x = [br.slice(), bi.slice()];
    lu1.solve(x[0], x[1]);
    expect(relResidual(withBranches, x[0], x[1], br, bi)).toBeLessThan(1e-13);
  });

  it('solves a star (one node tied to 2,000 others) through the dense-row path of the ordering', () => {
    const n = 2001;
    const r = rng(8);
    const t: Array<[number, number, number, number]> = [[0, 0, 1e-3, 0]];
    for (let i = 1; i < n; i++) {
      const g = 10 ** (4 * r() - 2);
      t.push([0, 0, g, 0], [i, i, g + 1e-4, 1e-3], [0, i, -g, 0], [i, 0, -g, 0]);
    }
    const m = fromTriplets(n, t);
    const [br, bi] = rhs(n, 9);
    const { x, lu } = solveWith(m, br, bi);
    expect(relResidual(m, x[0], x[1], br, bi)).toBeLessThan(1e-14);
    expect(lu.nnzL + lu.nnzU).toBeLessThanOrEqual(m.pattern.colPtr[n] + n); // hub last: no fill
  });
});

describe('degenerate patterns', () => {
  it('factors and solves a star of 300,000 leaves (one hub joined to every node, a source branch on it)', () => {
    // The hub's column lists every leaf, in the reverse of their pivot order, then the hub: the pattern
    // that made a median-of-three quicksort quadratic. Checked here: the answer, against the closed form
    // of the circuit, and no fill (a leaf eliminated before the hub touches nothing else).
    const leaves = 300000;
    const n = leaves + 2; // hub 0, leaves 1..leaves, source branch n-1
    const colPtr = new Int32Array(n + 1);
    const rowIdx = new Int32Array(4 * leaves + 3);
    const re = new Float64Array(4 * leaves + 3);
    const g = (i: number) => 1 / (1 + (i % 7)); // R_i = 1 .. 7 Ohm hub to leaf i; each leaf 1 kOhm to ground
    let p = 0;
    let hub = 0;
    for (let i = 1; i <= leaves; i++) hub += g(i);
    rowIdx[p] = 0;
    re[p++] = hub;
    for (let i = 1; i <= leaves; i++) (rowIdx[p] = i), (re[p++] = -g(i));
    rowIdx[p] = n - 1;
    re[p++] = 1;
    colPtr[1] = p;
    for (let i = 1; i <= leaves; i++) {
      rowIdx[p] = 0;
      re[p++] = -g(i);
      rowIdx[p] = i;
      re[p++] = g(i) + 1e-3;
      colPtr[i + 1] = p;
    }
    rowIdx[p] = 0;
    re[p++] = 1;
    colPtr[n] = p;
    const pattern = { n, colPtr, rowIdx: rowIdx.subarray(0, p) };
    const lu = new ComplexSparseLU(analyze(pattern));
    lu.factor({ re: re.subarray(0, p), im: new Float64Array(p) });
    expect(lu.nnzL + lu.nnzU).toBeLessThanOrEqual(p + n);
    const xr = new Float64Array(n);
    const xi = new Float64Array(n);
    xr[n - 1] = 10; // 10 V source on the hub
    lu.solve(xr, xi);
    expect(xr[0]).toBeCloseTo(10, 12);
    for (const i of [1, 2, 7, leaves]) expect(xr[i]).toBeCloseTo((10 * 1000) / (1000 + 1 + (i % 7)), 11); // divider R_i, 1 kOhm
  });
});

describe('refactor', () => {
  it('gives the same answer as a fresh factor when values change', () => {
    const m = mnaGrid(12, 6, 3);
    const sym = analyze(m.pattern);
    const lu = new ComplexSparseLU(sym);
    lu.factor(m.values);
    const r = rng(11);
    const changed = {
      re: m.values.re.map((v) => v * (0.5 + r())),
      im: m.values.im.map((v) => v * (0.5 + r()) + 1e-3 * (r() - 0.5)),
    };
    expect(lu.refactor(changed)).toBe(true);
    const [br, bi] = rhs(m.pattern.n, 5);
    const a = [br.slice(), bi.slice()];
    lu.solve(a[0], a[1]);
    const fresh = new ComplexSparseLU(sym);
    fresh.factor(changed);
    const b = [br.slice(), bi.slice()];
    fresh.solve(b[0], b[1]);
    // a fresh factor may pick other pivots (and so another L/U pattern); the solution must agree
    expectClose(a[0], a[1], { re: Array.from(b[0]), im: Array.from(b[1]) }, 1e-11);
  });

  it('agrees with factor on a grid large enough to have wide supernodes (blocked update path)', () => {
    const m = mnaGrid(30, 12, 6, 3);
    const sym = analyze(m.pattern);
    const lu = new ComplexSparseLU(sym);
    lu.factor(m.values);
    const [br, bi] = rhs(m.pattern.n, 6);
    const a = [br.slice(), bi.slice()];
    lu.solve(a[0], a[1]);
    expect(lu.refactor(m.values)).toBe(true); // same values: same pivots, same numbers up to rounding
    const b = [br.slice(), bi.slice()];
    lu.solve(b[0], b[1]);
    expectClose(b[0], b[1], { re: Array.from(a[0]), im: Array.from(a[1]) }, 1e-12);
    const r = rng(12);
    const changed = { re: m.values.re.map((v) => v * (0.9 + 0.2 * r())), im: m.values.im.map((v) => v * (0.9 + 0.2 * r())) };
    expect(lu.refactor(changed)).toBe(true);
    const c = [br.slice(), bi.slice()];
    lu.solve(c[0], c[1]);
    expect(relResidual({ pattern: m.pattern, values: changed }, c[0], c[1], br, bi)).toBeLessThan(1e-13);
  });

  it('is valid before any factor (then it factors) and keeps nnz counts', () => {
    const m = mnaGrid(6, 2, 4);
    const lu = new ComplexSparseLU(analyze(m.pattern));
    expect(lu.refactor(m.values)).toBe(false);
    expect(lu.nnzL).toBeGreaterThan(0);
    const [br, bi] = rhs(m.pattern.n, 1);
    const x = [br.slice(), bi.slice()];
    lu.solve(x[0], x[1]);
    expectClose(x[0], x[1], mathjsSolve(m, br, bi));
    expect(lu.refactor(m.values)).toBe(true);
  });

  /** Natural column order, so that the test controls which pivot is reused. */
  const naturalSym = (m: CscMatrix) => ({
    n: m.pattern.n,
    q: Int32Array.from({ length: m.pattern.n }, (_, i) => i),
    pattern: m.pattern,
  });
  const keepAll = () => true;
  const zeros = (n: number) => Array.from({ length: n }, () => new Array<number>(n).fill(0));

  it('falls back to a full factor when a reused pivot becomes zero', () => {
    // [[d, 1], [1, 1]]: with d = 4 the diagonal is the pivot of column 0; with d = 0 it is not usable
    const m1 = fromDense([[4, 1], [1, 1]], zeros(2), keepAll);
    const m0 = fromDense([[0, 1], [1, 1]], zeros(2), keepAll);
    const lu = new ComplexSparseLU(naturalSym(m1));
    lu.factor(m1.values);
    expect(lu.refactor(m0.values)).toBe(false);
    const br = Float64Array.from([1, 2]);
    const bi = Float64Array.from([0, 0]);
    lu.solve(br, bi);
    // closed form: 0*x0 + x1 = 1, x0 + x1 = 2 -> x = (1, 1)
    expect(br[0]).toBeCloseTo(1, 14);
    expect(br[1]).toBeCloseTo(1, 14);
    // the new pivot sequence (row 1 first) also serves the first values
    expect(lu.refactor(m1.values)).toBe(true);
  });

  it('falls back when a reused pivot becomes tiny relative to its column', () => {
    const m1 = fromDense([[4, 1], [1, 1]], zeros(2), keepAll);
    const mt = fromDense([[1e-5, 1], [1, 1]], zeros(2), keepAll);
    const lu = new ComplexSparseLU(naturalSym(m1));
    lu.factor(m1.values);
    expect(lu.refactor(mt.values)).toBe(false);
    const br = Float64Array.from([1, 2]);
    const bi = Float64Array.from([0, 0]);
    lu.solve(br, bi);
    expectClose(br, bi, mathjsSolve(mt, Float64Array.from([1, 2]), bi.slice()));
  });

  it('falls back when the updated (Schur complement) pivot cancels to zero', () => {
    // [[1,1,0],[1,a,1],[0,1,1]]: the second pivot is a - 1; a = 3 -> 2, a = 1 -> 0
    const m3 = fromDense([[1, 1, 0], [1, 3, 1], [0, 1, 1]], zeros(3));
    const m1 = fromDense([[1, 1, 0], [1, 1, 1], [0, 1, 1]], zeros(3));
    const lu = new ComplexSparseLU(naturalSym(m3));
    lu.factor(m3.values);
    expect(lu.refactor(m1.values)).toBe(false);
    const [br, bi] = rhs(3, 4);
    const x = [br.slice(), bi.slice()];
    lu.solve(x[0], x[1]);
    expectClose(x[0], x[1], mathjsSolve(m1, br, bi));
  });
});

describe('singular matrices', () => {
  function expectSingularAt(m: CscMatrix, columns: number[]): void {
    const lu = new ComplexSparseLU(analyze(m.pattern));
    let err: unknown;
    try {
      lu.factor(m.values);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(SingularMatrixError);
    expect(columns).toContain((err as SingularMatrixError).column);
  }

  it('names an empty column (an unknown connected to nothing)', () => {
    const m = mnaGrid(4, 1);
    // append an isolated unknown 17 in the middle of the numbering
    const n = m.pattern.n + 1;
    const iso = 7;
    const t: Array<[number, number, number, number]> = [];
    for (let j = 0; j < m.pattern.n; j++) {
      for (let p = m.pattern.colPtr[j]; p < m.pattern.colPtr[j + 1]; p++) {
        const i = m.pattern.rowIdx[p];
        t.push([i >= iso ? i + 1 : i, j >= iso ? j + 1 : j, m.values.re[p], m.values.im[p]]);
      }
    }
    expectSingularAt(fromTriplets(n, t), [iso]);
  });

  it('names a structurally present but all-zero column', () => {
    const keepAll = () => true;
    const m = fromDense(
      [
        [2, 0, 1],
        [1, 0, 3],
        [0, 0, 1],
      ],
      [
        [0, 0, 0],
        [0, 0, 0],
        [0, 0, 0],
      ],
      keepAll,
    );
    expectSingularAt(m, [1]);
  });

  it('names one of two dependent columns (a loop of two voltage sources)', () => {
    // node 0 with a leak; two voltage sources in parallel from node 0 to ground: branch columns 1 and 2 equal
    const m = fromTriplets(3, [
      [0, 0, 1e-3, 0],
      [0, 1, 1, 0],
      [1, 0, 1, 0],
      [0, 2, 1, 0],
      [2, 0, 1, 0],
    ]);
    expectSingularAt(m, [1, 2]);
  });

  it('detects numerical singularity after cancellation (scale-aware, values near 1e6)', () => {
    // column 2 = column 0 + column 1, entries around 1e6
    const a = [
      [1e6, 3e5, 1.3e6],
      [2e5, 7e5, 9e5],
      [5e5, 1e5, 6e5],
    ];
    const m = fromDense(a, a.map((r) => r.map((v) => v * 0.25)));
    expectSingularAt(m, [0, 1, 2]);
  });

  it('does not call a badly scaled but regular MNA matrix singular', () => {
    // a node tied by 1e6 S to a neighbour that leaks 1e-6 S to ground
    const m = fromTriplets(2, [
      [0, 0, 1e6, 0],
      [0, 1, -1e6, 0],
      [1, 0, -1e6, 0],
      [1, 1, 1e6 + 1e-6, 0],
    ]);
    const [br, bi] = [Float64Array.from([1, 0]), new Float64Array(2)];
    const { x } = solveWith(m, br, bi);
    // closed form: 1 A into node 0 flows through 1e6 S then 1e-6 S: v0 = 1e-6 + 1e6 V. The matrix has
    // condition ~1e12 and 1e6 + 1e-6 itself rounds at ~1e-10, so only ~1e-4 relative accuracy is owed.
    expect(Math.abs(x[0][0] - (1e6 + 1e-6)) / 1e6).toBeLessThan(1e-4);
    expect(Math.abs(x[0][1] - 1e6) / 1e6).toBeLessThan(1e-4);
  });
});

describe('API guards', () => {
  it('rejects solve before factor and short arrays', () => {
    const m = mnaGrid(3, 0);
    const lu = new ComplexSparseLU(analyze(m.pattern));
    expect(() => lu.solve(new Float64Array(9), new Float64Array(9))).toThrow();
    expect(() => lu.factor({ re: new Float64Array(1), im: new Float64Array(1) })).toThrow(RangeError);
  });

  it('handles n = 0 and n = 1', () => {
    const e = new ComplexSparseLU(analyze({ n: 0, colPtr: new Int32Array(1), rowIdx: new Int32Array(0) }));
    e.factor({ re: new Float64Array(0), im: new Float64Array(0) });
    e.solve(new Float64Array(0), new Float64Array(0));
    const m = fromDense([[2]], [[2]]);
    const { x } = solveWith(m, Float64Array.from([4]), Float64Array.from([0]));
    // closed form: 4 / (2 + 2i) = 1 - i
    expect(x[0][0]).toBeCloseTo(1, 15);
    expect(x[1][0]).toBeCloseTo(-1, 15);
  });
});

describe('solveTransposed (complex) against mathjs lusolve on the transpose and the conjugate transpose', () => {
  it('solves A^T x = b and A^H x = b', () => {
    for (let seed = 1; seed <= 60; seed++) {
      const n = 1 + (seed % 14);
      const m = randomSparse(n, seed, 0.3, 0.4, false);
      const d = toDense(m);
      const lu = new ComplexSparseLU(analyze(m.pattern));
      lu.factor(m.values);
      const r = rng(seed);
      const br = Float64Array.from({ length: n }, () => r() - 0.5);
      const bi = Float64Array.from({ length: n }, () => r() - 0.5);
      for (const conj of [false, true]) {
        // the transpose written out: (A^T)_ij = a_ji, conjugated for A^H
        const At = d.re.map((row, i) => row.map((_, j) => math.complex(d.re[j][i], conj ? -d.im[j][i] : d.im[j][i])));
        const ref = math.lusolve(At, Array.from(br, (v, i) => [math.complex(v, bi[i])])) as unknown as math.Complex[][];
        const xr = br.slice();
        const xi = bi.slice();
        lu.solveTransposed(xr, xi, conj);
        const size = Math.max(...ref.map((c) => Math.hypot(c[0].re, c[0].im)));
        for (let i = 0; i < n; i++) expect(Math.hypot(xr[i] - ref[i][0].re, xi[i] - ref[i][0].im)).toBeLessThanOrEqual(1e-9 * size);
      }
    }
  });
});
