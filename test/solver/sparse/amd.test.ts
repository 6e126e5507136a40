import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { amdAnalyze, amdOrder } from '../../../src/solver/sparse/amd';
import { analyze, ComplexSparseLU } from '../../../src/solver/sparse/lu';
import type { CscPattern } from '../../../src/solver/sparse/types';
import { fromTriplets, gridPattern, relResidual, rng } from './helpers';

function isPermutation(p: Int32Array, n: number): boolean {
  if (p.length !== n) return false;
  const seen = new Uint8Array(n);
  for (const v of p) {
    if (v < 0 || v >= n || seen[v]) return false;
    seen[v] = 1;
  }
  return true;
}

function patternOf(n: number, pairs: Array<[number, number]>): CscPattern {
  return fromTriplets(
    n,
    pairs.map(([i, j]) => [i, j, 1, 0] as [number, number, number, number]),
  ).pattern;
}

function fill(pattern: CscPattern, q: Int32Array): number {
  const m = { n: pattern.n, q, pattern };
  const lu = new ComplexSparseLU(m);
  const nz = pattern.colPtr[pattern.n];
  // diagonally dominant values so that the pivots stay on the diagonal
  const re = new Float64Array(nz);
  for (let j = 0; j < pattern.n; j++) {
    for (let p = pattern.colPtr[j]; p < pattern.colPtr[j + 1]; p++) re[p] = pattern.rowIdx[p] === j ? 10 : -1;
  }
  lu.factor({ re, im: new Float64Array(nz) });
  return lu.nnzL + lu.nnzU;
}

describe('amdOrder', () => {
  it('returns a permutation for random patterns, including empty columns and unsymmetric entries', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 60 }).chain((n) =>
          fc.tuple(
            fc.constant(n),
            fc.array(fc.tuple(fc.nat(Math.max(0, n - 1)), fc.nat(Math.max(0, n - 1))), { maxLength: n === 0 ? 0 : 4 * n }),
          ),
        ),
        ([n, pairs]) => {
          const p = amdOrder(patternOf(n, pairs));
          expect(isPermutation(p, n)).toBe(true);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('orders random unsymmetric patterns (list compaction runs) so that LU stays accurate', () => {
    const r = rng(3);
    for (const n of [300, 3000]) {
      const t: Array<[number, number, number, number]> = [];
      for (let i = 0; i < n; i++) {
        t.push([i, i, 8 + r(), r()]);
        for (let e = 0; e < 2; e++) t.push([i, Math.floor(r() * n), r() - 0.5, r() - 0.5]);
      }
      const m = fromTriplets(n, t);
      const p = amdOrder(m.pattern);
      expect(isPermutation(p, n)).toBe(true);
      if (n > 300) continue;
      const lu = new ComplexSparseLU({ n, q: p, pattern: m.pattern });
      lu.factor(m.values);
      const br = Float64Array.from({ length: n }, () => r());
      const bi = new Float64Array(n);
      const xr = br.slice();
      const xi = bi.slice();
      lu.solve(xr, xi);
      expect(relResidual(m, xr, xi, br, bi)).toBeLessThan(1e-14);
    }
  });

  it('handles isolated unknowns, a dense row and column, and a diagonal matrix', () => {
    const n = 400;
    const pairs: Array<[number, number]> = [];
    for (let i = 0; i < n; i++) {
      if (i % 7 === 3) continue; // isolated unknowns: empty row and column
      pairs.push([i, i]);
      if (i > 0) pairs.push([0, i], [i, 0]); // node 0 touches everything
      if (i + 1 < n && (i + 1) % 7 !== 3) pairs.push([i, i + 1]);
    }
    const pattern = patternOf(n, pairs);
    const p = amdOrder(pattern);
    expect(isPermutation(p, n)).toBe(true);
    expect(p[n - 1]).toBe(0); // the dense unknown goes last
    // an arrow matrix (hub 0 plus a chain) ordered with its hub last factors without fill
    const arrowPairs: Array<[number, number]> = [];
    for (let i = 0; i < n; i++) {
      arrowPairs.push([i, i]);
      if (i > 0) arrowPairs.push([0, i], [i, 0]);
    }
    const arrow = patternOf(n, arrowPairs);
    const pa = amdOrder(arrow);
    expect(pa[n - 1]).toBe(0);
    expect(fill(arrow, pa)).toBe(arrow.colPtr[n] + n); // nnz(L) + nnz(U) = nnz(A) + n: no fill
    const diag = patternOf(50, Array.from({ length: 50 }, (_, i) => [i, i] as [number, number]));
    expect(isPermutation(amdOrder(diag), 50)).toBe(true);
  });

  it('sets supply-rail-like nodes (degree in the thousands) aside quickly and orders them last', () => {
    // 100 x 100 grid plus 20 rails, each tied to 1,500 random grid nodes
    const g = gridPattern(100);
    const n0 = g.n;
    const rails = 20;
    const n = n0 + rails;
    const r = rng(5);
    const cols: number[][] = [];
    for (let j = 0; j < n0; j++) cols.push(Array.from(g.rowIdx.subarray(g.colPtr[j], g.colPtr[j + 1])));
    for (let h = 0; h < rails; h++) cols.push([n0 + h]);
    for (let h = 0; h < rails; h++) {
      for (let t = 0; t < 1500; t++) {
        const v = Math.floor(r() * n0);
        cols[n0 + h].push(v);
        cols[v].push(n0 + h);
      }
    }
    const colPtr = new Int32Array(n + 1);
    const rows: number[] = [];
    cols.forEach((c, j) => {
      for (const i of [...new Set(c)].sort((a, b) => a - b)) rows.push(i);
      colPtr[j + 1] = rows.length;
    });
    const t0 = performance.now();
    const p = amdOrder({ n, colPtr, rowIdx: Int32Array.from(rows) });
    const ms = performance.now() - t0;
    expect(isPermutation(p, n)).toBe(true);
    expect([...p.subarray(n - rails)].sort((a, b) => a - b)).toEqual(Array.from({ length: rails }, (_, h) => n0 + h));
    expect(ms).toBeLessThan(1500); // ~20 ms when set aside; far slower if the rails stayed in the graph
  });

  it('gives clearly less fill than the natural order on a 60 x 60 grid', () => {
    const pattern = gridPattern(60);
    const n = pattern.n;
    const natural = Int32Array.from({ length: n }, (_, i) => i);
    const amd = analyze(pattern).q;
    expect(isPermutation(amd, n)).toBe(true);
    const fNat = fill(pattern, natural);
    const fAmd = fill(pattern, amd);
    console.log(`60x60 grid: nnz(L)+nnz(U) natural ${fNat}, AMD ${fAmd} (${(fNat / fAmd).toFixed(1)}x less)`);
    // natural order on an m x m grid fills the band: about 2 m^3 entries (closed form for a banded factor)
    expect(fNat).toBeGreaterThan(2 * 60 ** 3 * 0.9);
    expect(fAmd).toBeLessThan(fNat / 3);
  });

  it('orders a 40,000-unknown grid in well under a second', () => {
    const pattern = gridPattern(200); // 40,000 unknowns keeps the test fast
    const t0 = performance.now();
    const p = amdOrder(pattern);
    const ms = performance.now() - t0;
    expect(isPermutation(p, pattern.n)).toBe(true);
    expect(ms).toBeLessThan(2000); // generous: CI machines vary; scripts/bench-lu.mjs measures properly
  });
});

/** Entries of strict L by eliminating the graph of A + A^T in the order q on a dense boolean matrix (the definition of fill). */
function bruteForceLnz(pattern: CscPattern, q: Int32Array): number {
  const n = pattern.n;
  const pos = new Int32Array(n);
  q.forEach((v, k) => (pos[v] = k));
  const adj = Array.from({ length: n }, () => new Uint8Array(n));
  for (let j = 0; j < n; j++) {
    for (let p = pattern.colPtr[j]; p < pattern.colPtr[j + 1]; p++) {
      const a = pos[pattern.rowIdx[p]];
      const b = pos[j];
      if (a !== b) adj[a][b] = adj[b][a] = 1;
    }
  }
  let lnz = 0;
  for (let k = 0; k < n; k++) {
    const below: number[] = [];
    for (let i = k + 1; i < n; i++) if (adj[k][i]) below.push(i);
    lnz += below.length;
    for (const a of below) for (const b of below) if (a !== b) adj[a][b] = 1; // the eliminated node's neighbours form a clique
  }
  return lnz;
}

describe('amdAnalyze', () => {
  it('counts the Cholesky factor of its own order exactly (random patterns, grids, a star)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 45 }), fc.integer({ min: 1, max: 2 ** 30 }), fc.double({ min: 0.02, max: 0.3, noNaN: true }), (n, seed, density) => {
        const r = rng(seed);
        const pairs: Array<[number, number]> = [];
        for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) if (i === j || r() < density) pairs.push([i, j]);
        const pattern = patternOf(n, pairs);
        const { perm, lnz } = amdAnalyze(pattern, { dense: 0 }); // nothing set aside: the count must be exact
        expect([...perm]).toEqual([...amdOrder(pattern, { dense: 0 })]);
        expect(lnz).toBe(bruteForceLnz(pattern, perm)); // source: the definition of fill, by brute force
      }),
      { numRuns: 100 },
    );
    for (const m of [1, 2, 9, 17]) {
      const g = gridPattern(m);
      const { perm, lnz } = amdAnalyze(g);
      expect(lnz).toBe(bruteForceLnz(g, perm)); // same source
    }
    // a star: 300 leaves tied to a hub that is set aside as dense; no fill, L holds the hub's row alone
    const star = patternOf(301, [[0, 0], ...Array.from({ length: 300 }, (_, i) => [[i + 1, i + 1], [0, i + 1], [i + 1, 0]] as Array<[number, number]>).flat()]);
    expect(amdAnalyze(star).lnz).toBe(300); // source: 300 edges, an elimination without fill
  });
});
