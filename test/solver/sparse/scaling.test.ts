import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyze, ComplexSparseLU, RealSparseLU } from '../../../src/solver/sparse/lu';
import { SingularMatrixError } from '../../../src/solver/sparse/types';
import { exactSolveComplex, exactSolveReal } from './exact';
import { type CscMatrix, fromTriplets, mnaGrid, randomSparse, rng, toDense } from './helpers';

type Triplet = [number, number, number, number];
const scaled = { scale: 'rows-cols' } as const;

/** Complex solve of m x = b (b real) with the given options; throws what factor throws. */
function solveComplex(m: CscMatrix, b: number[], options = {}): { re: Float64Array; im: Float64Array; lu: ComplexSparseLU } {
  const lu = new ComplexSparseLU(analyze(m.pattern), options);
  lu.factor(m.values);
  const re = Float64Array.from(b);
  const im = new Float64Array(b.length);
  lu.solve(re, im);
  return { re, im, lu };
}

/** max_i |x_i - ref_i| / |ref_i| over the nonzero ref_i: every component to full precision, not just the largest. */
function componentwiseError(re: Float64Array, im: Float64Array, ref: { re: number[]; im: number[] }): number {
  let err = 0;
  for (let i = 0; i < ref.re.length; i++) {
    const size = Math.hypot(ref.re[i], ref.im[i]);
    if (size > 0) err = Math.max(err, Math.hypot(re[i] - ref.re[i], im[i] - ref.im[i]) / size);
  }
  return err;
}

/** The exact solution of the floating-point matrix (exact.ts: mathjs BigNumber, 100 digits). */
function exact(m: CscMatrix, b: number[]): { re: number[]; im: number[] } {
  const d = toDense(m);
  return exactSolveComplex(d.re, d.im, b, b.map(() => 0));
}

// MNA of a 1 V source at node a (unknowns va, vb, vc, then branch currents), stamped as in
// C.-W. Ho, A. E. Ruehli, P. A. Brennan, IEEE Trans. CAS 22(6), 1975: conductance G between two nodes adds
// G to both diagonals and -G off them; a branch (source, or a part given its own current) adds +-1 incidence
// entries and its own equation.
const G1 = 1e-9; // 1 GOhm
const source: Triplet[] = [
  [0, 3, 1, 0],
  [3, 0, 1, 0],
];
const a_b: Triplet[] = [
  [0, 0, G1, 0],
  [0, 1, -G1, 0],
  [1, 0, -G1, 0],
  [1, 1, G1, 0],
];

describe('scaling: circuits whose entries span 1e-9 .. 1e+9', () => {
  it('1 V into 1 GOhm, 1 uOhm, 1 GOhm in series, the 1 uOhm with its own branch current: full precision', () => {
    // unknowns va, vb, vc, i(V), i(R2); R2 = 1e-6 Ohm as vb - vc - R2 i = 0
    const m = fromTriplets(5, [...source, ...a_b, [1, 4, 1, 0], [2, 4, -1, 0], [2, 2, 1e-9, 0], [4, 1, 1, 0], [4, 2, -1, 0], [4, 4, -1e-6, 0]]);
    const b = [0, 0, 0, 1, 0];
    const ref = exact(m, b);
    const x = solveComplex(m, b, scaled);
    expect(componentwiseError(x.re, x.im, ref)).toBeLessThan(1e-14);
    // closed form of the divider: the current is 1 V / (2 GOhm + 1 uOhm)
    expect(x.re[4]).toBeCloseTo(1 / (2e9 + 1e-6), 24);
  });

  it('a 1 nH inductor between 1 GOhm and 330 MOhm at 50 Hz (admittance form): refused unscaled, exact scaled', () => {
    // unknowns va, vb, vc, i(V); the inductor as the admittance 1/(j w L) = -j 3.18e6 S between b and c
    const y = -1 / (2 * Math.PI * 50 * 1e-9);
    const m = fromTriplets(4, [...source, ...a_b, [1, 1, 0, y], [1, 2, 0, -y], [2, 1, 0, -y], [2, 2, 1 / 330e6, y]]);
    const b = [0, 0, 0, 1];
    // unscaled, the test against 1e-14 of each column's largest entry (3.2e6) calls the 1e-9 pivots singular
    expect(() => solveComplex(m, b)).toThrow(SingularMatrixError);
    const x = solveComplex(m, b, scaled);
    expect(componentwiseError(x.re, x.im, exact(m, b))).toBeLessThan(1e-13);
  });

  it('the same inductor with its own branch current: full precision either way', () => {
    // unknowns va, vb, vc, i(V), i(L); vb - vc - j w L i = 0
    const wl = 2 * Math.PI * 50 * 1e-9;
    const m = fromTriplets(5, [...source, ...a_b, [1, 4, 1, 0], [2, 4, -1, 0], [2, 2, 1 / 330e6, 0], [4, 1, 1, 0], [4, 2, -1, 0], [4, 4, 0, -wl]]);
    const b = [0, 0, 0, 1, 0];
    const ref = exact(m, b);
    for (const options of [{}, scaled]) {
      const x = solveComplex(m, b, options);
      expect(componentwiseError(x.re, x.im, ref)).toBeLessThan(1e-14);
    }
  });

  it('the 1 uOhm as a conductance (1e6 S): no longer refused, and the condition estimate says why digits are lost', () => {
    // the b-c block [[G2 + G1, -G2], [-G2, G2 + G3]] is singular to within 2e-15 of its size: kappa ~ 1e15,
    // so no LU can give full precision; the answer is to give the small resistor a branch current
    const G2 = 1e6;
    const m = fromTriplets(4, [...source, ...a_b, [1, 1, G2, 0], [1, 2, -G2, 0], [2, 1, -G2, 0], [2, 2, G2 + 1e-9, 0]]);
    const b = [0, 0, 0, 1];
    expect(() => solveComplex(m, b)).toThrow(SingularMatrixError);
    const x = solveComplex(m, b, scaled);
    const { kappa, column } = x.lu.conditionEstimate();
    expect(kappa).toBeGreaterThan(1e14);
    expect([1, 2]).toContain(column); // node b or c, the ends of the 1 uOhm
  });
});

describe('scaling: what is singular stays singular', () => {
  function singularColumn(m: CscMatrix, real = false): number {
    try {
      if (real) new RealSparseLU(analyze(m.pattern), scaled).factor(m.values.re);
      else new ComplexSparseLU(analyze(m.pattern), scaled).factor(m.values);
    } catch (e) {
      if (e instanceof SingularMatrixError) return e.column;
      throw e;
    }
    return -1;
  }

  it('names a node connected to nothing, amid entries from 1e-9 to 1e9', () => {
    // unknowns 0..3; unknown 2 has no entries at all (structurally singular)
    const m = fromTriplets(4, [[0, 0, 1e9, 0], [0, 1, -1e9, 0], [1, 0, -1e9, 0], [1, 1, 1e9 + 1e-9, 0], [3, 3, 1e-9, 0]]);
    expect(singularColumn(m)).toBe(2);
    expect(singularColumn(m, true)).toBe(2);
  });

  it('names one of two voltage sources in parallel (equal branch columns), however the rows are scaled', () => {
    for (const g of [1e-9, 1, 1e9]) {
      const m = fromTriplets(3, [[0, 0, g, 0], [0, 1, 1, 0], [1, 0, 1, 0], [0, 2, 1, 0], [2, 0, 1, 0]]);
      expect([1, 2]).toContain(singularColumn(m));
    }
  });

  it('detects a column that is the sum of two others after scaling (values near 1e6 and 1e-6)', () => {
    const a = [
      [1e6, 3e5, 1.3e6],
      [2e-6, 7e-6, 9e-6],
      [5e5, 1e5, 6e5],
    ];
    const t: Triplet[] = [];
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) t.push([i, j, a[i][j], 0.25 * a[i][j]]);
    expect([0, 1, 2]).toContain(singularColumn(fromTriplets(3, t)));
  });
});

describe('scaling: a diagonally scaled copy gives the same solution', () => {
  /** D1 A D2 with factors 10^u, u uniform in [-8, 8] (not powers of two, so the copy is rounded). */
  function scaledCopy(m: CscMatrix, seed: number): { m: CscMatrix; d1: Float64Array; d2: Float64Array } {
    const r = rng(seed);
    const n = m.pattern.n;
    const d1 = Float64Array.from({ length: n }, () => 10 ** (16 * r() - 8));
    const d2 = Float64Array.from({ length: n }, () => 10 ** (16 * r() - 8));
    const { colPtr, rowIdx } = m.pattern;
    const re = m.values.re.slice();
    const im = m.values.im.slice();
    for (let j = 0; j < n; j++) {
      for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
        re[p] *= d1[rowIdx[p]] * d2[j];
        im[p] *= d1[rowIdx[p]] * d2[j];
      }
    }
    return { m: { pattern: m.pattern, values: { re, im } }, d1, d2 };
  }

  it('D1 A D2 y = D1 b gives x = D2 y to 1e-12 of max |x| (complex and real, random sparse A)', () => {
    // (D1 A D2)(D2^-1 x) = D1 b: the same system written in other units (linear algebra). A is well
    // conditioned (kappa ~ 1 .. 100), so its rounded scaled copy has the same solution to ~1e-14.
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 20 }), fc.integer({ min: 1, max: 2 ** 30 }), fc.boolean(), (n, seed, real) => {
        const a = randomSparse(n, seed, 0.3, 0.3, real);
        const b = Array.from({ length: n }, (_, i) => Math.sin(i + seed));
        const x = solveComplex(a, b);
        // the claim is for well-conditioned A: the rare random A beyond κ₁ = 1e6 says nothing of scaling
        if (x.lu.conditionEstimate().kappa > 1e6) return;
        const { m, d1, d2 } = scaledCopy(a, seed + 1);
        let y: { re: Float64Array; im: Float64Array };
        if (real) {
          const lu = new RealSparseLU(analyze(m.pattern), scaled);
          lu.factor(m.values.re);
          const v = Float64Array.from(b, (bi, i) => bi * d1[i]);
          lu.solve(v);
          y = { re: v, im: new Float64Array(n) };
        } else {
          y = solveComplex(m, b.map((bi, i) => bi * d1[i]), scaled);
        }
        let size = 0;
        for (let i = 0; i < n; i++) size = Math.max(size, Math.hypot(x.re[i], x.im[i]));
        for (let i = 0; i < n; i++) expect(Math.hypot(y.re[i] * d2[i] - x.re[i], y.im[i] * d2[i] - x.im[i])).toBeLessThanOrEqual(1e-12 * size);
      }),
      { numRuns: 300 },
    );
  });

  it('where the unscaled LU refuses the scaled copy, the scaled one solves it (a fixed instance)', () => {
    // found by search over seeds; the unscaled singular test compares entries 1e16 apart
    let shown = false;
    for (let seed = 1; seed <= 200 && !shown; seed++) {
      const a = randomSparse(12, seed, 0.3, 0.3, true);
      const { m, d1, d2 } = scaledCopy(a, seed);
      try {
        new ComplexSparseLU(analyze(m.pattern)).factor(m.values);
        continue;
      } catch (e) {
        expect(e).toBeInstanceOf(SingularMatrixError);
      }
      const b = Array.from({ length: 12 }, (_, i) => i - 5);
      const y = solveComplex(m, b.map((bi, i) => bi * d1[i]), scaled);
      const ref = exactSolveReal(toDense(a).re, b); // exact solution of A itself
      for (let i = 0; i < 12; i++) expect(Math.abs(y.re[i] * d2[i] - ref[i])).toBeLessThan(1e-12 * Math.max(...ref.map(Math.abs)));
      shown = true;
    }
    expect(shown).toBe(true);
  });
});

describe('scaling: transparent to the caller', () => {
  it('refactor and solveTransposed take and return unscaled quantities', () => {
    const m = mnaGrid(8, 4, 5, 6); // admittances over 1e-6 .. 1e6 S with branch rows
    const sym = analyze(m.pattern);
    const plain = new ComplexSparseLU(sym);
    const lu = new ComplexSparseLU(sym, scaled);
    const r = rng(3);
    const changed = { re: m.values.re.map((v) => v * (0.9 + 0.2 * r())), im: m.values.im.map((v) => v * (0.9 + 0.2 * r())) };
    plain.factor(changed);
    lu.factor(m.values);
    expect(lu.refactor(changed)).toBe(true);
    const n = m.pattern.n;
    for (const transposed of [false, true]) {
      const b = Float64Array.from({ length: n }, () => r() - 0.5);
      const x = [b.slice(), new Float64Array(n)];
      const y = [b.slice(), new Float64Array(n)];
      if (transposed) {
        plain.solveTransposed(x[0], x[1]);
        lu.solveTransposed(y[0], y[1]);
      } else {
        plain.solve(x[0], x[1]);
        lu.solve(y[0], y[1]);
      }
      let size = 0;
      for (let i = 0; i < n; i++) size = Math.max(size, Math.hypot(x[0][i], x[1][i]));
      for (let i = 0; i < n; i++) expect(Math.hypot(y[0][i] - x[0][i], y[1][i] - x[1][i])).toBeLessThan(1e-10 * size);
    }
  });
});
