import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { sortColumns, sortInts } from '../../../src/solver/sparse/sort';

/** Distinct integers, shuffled or in the shapes a depth-first search leaves (runs up and down). */
const lists = fc.oneof(
  fc.uniqueArray(fc.integer({ min: -1e6, max: 1e6 }), { maxLength: 300 }),
  fc.record({ n: fc.integer({ min: 0, max: 3000 }), shape: fc.constantFrom('up', 'down', 'down-then-max', 'organ', 'sawtooth') }).map(({ n, shape }) => {
    const a = Array.from({ length: n }, (_, i) => i);
    if (shape === 'down') a.reverse();
    if (shape === 'down-then-max') return [...a.slice(0, -1).reverse(), n - 1]; // a star's hub column
    if (shape === 'organ') return [...a.filter((v) => v % 2 === 0), ...a.filter((v) => v % 2 === 1).reverse()];
    if (shape === 'sawtooth') return a.map((v) => (v % 37) * 1000 + Math.floor(v / 37));
    return a;
  }),
);

describe('sortInts', () => {
  it('sorts like Array.prototype.sort, in place in its range only', () => {
    fc.assert(
      fc.property(lists, fc.integer({ min: 0, max: 5 }), (list, pad) => {
        const a = Int32Array.from([...Array(pad).fill(-7), ...list, ...Array(pad).fill(9)]);
        sortInts(a, pad, pad + list.length, new Int32Array(list.length));
        const want = [...list].sort((x, y) => x - y); // reference: the language's own sort
        expect(Array.from(a.subarray(pad, pad + list.length))).toEqual(want);
        expect(Array.from(a.subarray(0, pad))).toEqual(Array(pad).fill(-7));
        expect(Array.from(a.subarray(pad + list.length))).toEqual(Array(pad).fill(9));
      }),
      { numRuns: 400 },
    );
  });
});

describe('sortColumns', () => {
  it('sorts each column by row and carries its values (w numbers per entry) along', () => {
    fc.assert(
      fc.property(fc.array(fc.uniqueArray(fc.integer({ min: 0, max: 49 }), { maxLength: 50 }), { minLength: 1, maxLength: 8 }), fc.constantFrom(1, 2), (cols, w) => {
        const cp = new Int32Array(cols.length + 1);
        cols.forEach((c, j) => (cp[j + 1] = cp[j] + c.length));
        const ci = Int32Array.from(cols.flat());
        const cx = Float64Array.from({ length: w * ci.length }, (_, k) => ci[Math.floor(k / w)] * 10 + (k % w)); // value tied to its row
        const x = new Float64Array(w * 50);
        sortColumns(cols.length, cp, ci, cx, w, x, new Int32Array(50));
        cols.forEach((c, j) => expect(Array.from(ci.subarray(cp[j], cp[j + 1]))).toEqual([...c].sort((p, q) => p - q)));
        for (let p = 0; p < ci.length; p++) for (let k = 0; k < w; k++) expect(cx[w * p + k]).toBe(ci[p] * 10 + k);
        expect(x.every((v) => v === 0)).toBe(true); // the work vector is left clean
      }),
      { numRuns: 200 },
    );
  });
});
