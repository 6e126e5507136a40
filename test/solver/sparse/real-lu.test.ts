import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { create, lusolveDependencies } from 'mathjs';
import { analyze, ComplexSparseLU, RealSparseLU } from '../../../src/solver/sparse/lu';
import { SingularMatrixError } from '../../../src/solver/sparse/types';
import { type CscMatrix, fromDense, fromTriplets, matvecReal, mnaGrid, randomSparse, rng, toDense } from './helpers';

const math = create({ lusolveDependencies });

/** Reference: mathjs `lusolve` (dense LU with partial pivoting), an independent implementation. */
function mathjsSolve(m: CscMatrix, b: Float64Array, transposed = false): number[] {
  const d = toDense(m).re;
  const A = transposed ? d[0].map((_, j) => d.map((row) => row[j])) : d;
  const x = math.lusolve(A, Array.from(b, (v) => [v])) as unknown as number[][];
  return x.map((r) => r[0]);
}

/** |x_i - ref_i| <= tol * max |ref| for every i. */
function expectClose(x: Float64Array, ref: ArrayLike<number>, tol = 1e-9): void {
  let scale = 0;
  for (let i = 0; i < ref.length; i++) scale = Math.max(scale, Math.abs(ref[i]));
  for (let i = 0; i < ref.length; i++) expect(Math.abs(x[i] - ref[i])).toBeLessThanOrEqual(tol * scale);
}

function rhs(n: number, seed: number): Float64Array {
  const r = rng(seed);
  return Float64Array.from({ length: n }, () => r() - 0.5);
}

/** max |A x - b| / (max|A| max|x| + max|b|), the normwise backward error (Higham, 2002, section 7.1). */
function backwardError(m: CscMatrix, x: Float64Array, b: Float64Array): number {
  const y = matvecReal(m, x);
  let r = 0;
  let a = 0;
  let xm = 0;
  let bm = 0;
  for (const v of m.values.re) a = Math.max(a, Math.abs(v));
  for (let i = 0; i < b.length; i++) {
    r = Math.max(r, Math.abs(y[i] - b[i]));
    xm = Math.max(xm, Math.abs(x[i]));
    bm = Math.max(bm, Math.abs(b[i]));
  }
  return r / (a * xm + bm);
}

/** factor and solve with a fresh RealSparseLU on the real parts of m */
function solveReal(m: CscMatrix, b: Float64Array): { x: Float64Array; lu: RealSparseLU } {
  const lu = new RealSparseLU(analyze(m.pattern));
  lu.factor(m.values.re);
  const x = b.slice();
  lu.solve(x);
  return { x, lu };
}

const realMatrix = fc
  .record({
    n: fc.integer({ min: 1, max: 14 }),
    seed: fc.integer({ min: 1, max: 2 ** 30 }),
    density: fc.double({ min: 0.05, max: 0.5, noNaN: true }),
    zeroDiag: fc.double({ min: 0, max: 0.7, noNaN: true }),
  })
  .map(({ n, seed, density, zeroDiag }) => randomSparse(n, seed, density, zeroDiag, true));

describe('RealSparseLU against mathjs lusolve', () => {
  it('solves random sparse real systems, including zero diagonals, and their transposes', () => {
    fc.assert(
      fc.property(realMatrix, fc.integer({ min: 1, max: 1000 }), (m, seed) => {
        const b = rhs(m.pattern.n, seed);
        const { x, lu } = solveReal(m, b);
        expectClose(x, mathjsSolve(m, b));
        const y = b.slice();
        lu.solveTransposed(y);
        expectClose(y, mathjsSolve(m, b, true)); // mathjs on the explicit transpose
      }),
      { numRuns: 150 },
    );
  });

  it('solves an MNA-like grid with branch rows (zero diagonals) and conductances over 1e-6..1e6 S', () => {
    for (const seed of [1, 2, 3]) {
      const m = mnaGrid(5, 4, seed, 6);
      const b = rhs(m.pattern.n, seed);
      expectClose(solveReal(m, b).x, mathjsSolve(m, b));
    }
  });
});

describe('RealSparseLU against ComplexSparseLU with zero imaginary parts', () => {
  /** Both variants on the same symbolic analysis: the real one on m, the complex one on m with im = 0. */
  function bothVariants(m: CscMatrix, b: Float64Array) {
    const sym = analyze(m.pattern);
    const { x, lu: real } = solveReal(m, b);
    const cplx = new ComplexSparseLU(sym);
    cplx.factor({ re: m.values.re, im: new Float64Array(m.values.re.length) });
    const yr = b.slice();
    const yi = new Float64Array(b.length);
    cplx.solve(yr, yi);
    return { x, yr, yi, real, cplx };
  }

  it('takes the same pivots (same factor sizes) and gives the same solution', () => {
    // Both variants run the same pivoting rules on the same symbolic analysis; with zero imaginary parts
    // every complex product is the real one, so only the rounding of divisions may differ.
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 60 }),
        fc.integer({ min: 1, max: 2 ** 30 }),
        fc.double({ min: 0.05, max: 0.5, noNaN: true }),
        (n, seed, density) => {
          const m = randomSparse(n, seed, density, 0.4, true);
          const { x, yr, yi, real, cplx } = bothVariants(m, rhs(n, seed + 1));
          expect(real.nnzL).toBe(cplx.nnzL);
          expect(real.nnzU).toBe(cplx.nnzU);
          expectClose(x, yr, 1e-12);
          expect(Math.max(...Array.from(yi, Math.abs))).toBe(0); // zero imaginary parts stay zero
        },
      ),
      { numRuns: 80 },
    );
  });

  it('agrees on a grid large enough for the four-column supernode updates', () => {
    const m = mnaGrid(30, 12, 6, 3);
    const b = rhs(m.pattern.n, 4);
    const { x, yr, real, cplx } = bothVariants(m, b);
    expect(real.nnzL).toBe(cplx.nnzL);
    expectClose(x, yr, 1e-12);
    expect(backwardError(m, x, b)).toBeLessThan(1e-14);
  });
});

describe('RealSparseLU refactor', () => {
  it('replays the pivots on new values and agrees with a fresh factor', () => {
    const m = mnaGrid(12, 6, 3);
    const sym = analyze(m.pattern);
    const lu = new RealSparseLU(sym);
    lu.factor(m.values.re);
    const r = rng(11);
    const changed = m.values.re.map((v) => v * (0.5 + r()));
    expect(lu.refactor(changed)).toBe(true);
    const b = rhs(m.pattern.n, 5);
    const x = b.slice();
    lu.solve(x);
    const fresh = new RealSparseLU(sym);
    fresh.factor(changed);
    const y = b.slice();
    fresh.solve(y);
    expectClose(x, y, 1e-11);
  });

  it('factors when there is nothing to reuse, and falls back when a reused pivot becomes zero', () => {
    const keepAll = () => true;
    const zeros = [
      [0, 0],
      [0, 0],
    ];
    const m1 = fromDense([[4, 1], [1, 1]], zeros, keepAll);
    const m0 = fromDense([[0, 1], [1, 1]], zeros, keepAll);
    const natural = { n: 2, q: Int32Array.from([0, 1]), pattern: m1.pattern };
    const lu = new RealSparseLU(natural);
    expect(lu.refactor(m1.values.re)).toBe(false); // no factorisation yet: it factors
    expect(lu.refactor(m0.values.re)).toBe(false); // the pivot 4 became 0: full factor
    const x = Float64Array.from([1, 2]);
    lu.solve(x);
    // closed form: 0*x0 + x1 = 1, x0 + x1 = 2 -> x = (1, 1)
    expect(x[0]).toBeCloseTo(1, 14);
    expect(x[1]).toBeCloseTo(1, 14);
    expect(lu.refactor(m1.values.re)).toBe(true); // the new pivot sequence serves the first values too
  });
});

describe('RealSparseLU refinement and singular matrices', () => {
  it('refines the digits that threshold pivoting loses to growth', () => {
    // diagonal preference (pivotTol 1e-3) lets the factors grow; solve() refines to refineTol (Higham,
    // "Accuracy and Stability of Numerical Algorithms", 2nd ed., 2002, chapter 12)
    let worst = 0;
    for (let seed = 1; seed <= 600; seed++) {
      const n = 6 + (seed % 10);
      const m = randomSparse(n, seed, 0.4, 0, true);
      const lu = new RealSparseLU(analyze(m.pattern));
      lu.factor(m.values.re);
      const b = rhs(n, seed);
      const x = b.slice();
      lu.solve(x);
      worst = Math.max(worst, backwardError(m, x, b));
    }
    expect(worst).toBeLessThan(2e-14);
  });

  it('names the column of an empty unknown and of two dependent branch columns', () => {
    const expectSingular = (m: CscMatrix, columns: number[]) => {
      const lu = new RealSparseLU(analyze(m.pattern));
      let err: unknown;
      try {
        lu.factor(m.values.re);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(SingularMatrixError);
      expect(columns).toContain((err as SingularMatrixError).column);
    };
    // unknown 1 is connected to nothing (an all-zero structural column)
    expectSingular(fromDense([[2, 0, 1], [1, 0, 3], [0, 0, 1]], [[0, 0, 0], [0, 0, 0], [0, 0, 0]], () => true), [1]);
    // two voltage sources in parallel from node 0 to ground: branch columns 1 and 2 are equal
    expectSingular(fromTriplets(3, [[0, 0, 1e-3, 0], [0, 1, 1, 0], [1, 0, 1, 0], [0, 2, 1, 0], [2, 0, 1, 0]]), [1, 2]);
  });
});

describe('RealSparseLU API', () => {
  it('constructs no typed array in solve (it runs every time step)', () => {
    const m = mnaGrid(20, 10, 2, 2);
    const lu = new RealSparseLU(analyze(m.pattern), { refineTol: 0 }); // refinement on whenever it is checked
    lu.factor(m.values.re);
    const b = rhs(m.pattern.n, 2);
    lu.solve(b.slice()); // anything allocated lazily would show up here already
    let made = 0;
    const saved = { F: globalThis.Float64Array, I: globalThis.Int32Array };
    const count = <T extends object>(C: T) => new Proxy(C, { construct: (t, a) => (made++, Reflect.construct(t as never, a)) });
    globalThis.Float64Array = count(saved.F);
    globalThis.Int32Array = count(saved.I);
    try {
      for (let i = 0; i < 20; i++) lu.solve(new Float64Array(b)); // counted: the detector works
    } finally {
      globalThis.Float64Array = saved.F;
      globalThis.Int32Array = saved.I;
    }
    expect(made).toBe(20); // the 20 right-hand sides the test itself copied
  });

  it('guards its inputs and handles n = 0 and n = 1', () => {
    const m = mnaGrid(3, 0);
    const lu = new RealSparseLU(analyze(m.pattern));
    expect(() => lu.solve(new Float64Array(9))).toThrow(/before factor/);
    expect(() => lu.factor(new Float64Array(1))).toThrow(RangeError);
    expect(() => new RealSparseLU(analyze(m.pattern), { scale: 'rows' as never })).toThrow(/scale/);
    const e = new RealSparseLU(analyze({ n: 0, colPtr: new Int32Array(1), rowIdx: new Int32Array(0) }));
    e.factor(new Float64Array(0));
    e.solve(new Float64Array(0));
    const one = fromDense([[4]], [[0]]);
    const l1 = new RealSparseLU(analyze(one.pattern));
    l1.factor(one.values.re);
    const x = Float64Array.from([2]);
    l1.solve(x);
    expect(x[0]).toBe(0.5); // closed form: 2 / 4
  });
});
