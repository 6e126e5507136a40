import { describe, expect, it } from 'vitest';
import { analyze, ComplexSparseLU } from '../../../src/solver/sparse/lu';
import { SolverSession } from '../../../src/solver/phasor/session';
import { parseGraphModel } from '../../../src/solver/validate';
import { mesh2d, rlcLadder } from '../../../scripts/bench/generators';
import type { GraphModel } from '../../../src/model/graph';

/**
 * The column order of MNA's branch currents (sparse/symbolic.ts, branchFrom): every branch unknown sits next
 * to a node of its own, and the LU's pivots stay within those pairs at any frequency, so that the factors
 * hold no more than the Cholesky pattern of A + A^T in that order (the bound of diagonal pivots; A. George,
 * J. W. H. Liu, "Computer Solution of Large Sparse Positive Definite Systems", 1981) and do not grow.
 */

const models: Array<[string, GraphModel]> = [
  ['ladder of 400 nodes', rlcLadder(400)],
  ['mesh of 400 nodes', mesh2d(400)],
];

function system(model: GraphModel) {
  const mna = new SolverSession(parseGraphModel(model), undefined, 'ac').mna;
  const values = (f: number) => {
    const w = 2 * Math.PI * f;
    const im = new Float64Array(mna.c.length);
    for (let s = 0; s < im.length; s++) im[s] = w * mna.c[s] - mna.inv[s] / w;
    return { re: mna.g.slice(), im };
  };
  return { mna, values };
}

describe('branch currents ordered with their nodes', () => {
  for (const [name, model] of models) {
    it(`${name}: each branch unknown follows a node of its column, only branch unknowns between`, () => {
      const { mna } = system(model);
      const sym = analyze(mna.pattern, { branchFrom: mna.nodeCount });
      const seen = new Set(sym.q);
      expect(seen.size).toBe(mna.n); // a permutation
      const { colPtr, rowIdx } = mna.pattern;
      for (let k = 0; k < mna.n; k++) {
        const u = sym.q[k];
        if (u < mna.nodeCount) continue;
        let j = k - 1;
        while (j >= 0 && sym.q[j] >= mna.nodeCount) j--;
        const nodes = Array.from(rowIdx.subarray(colPtr[u], colPtr[u + 1])).filter((r) => r < mna.nodeCount);
        if (nodes.length) expect(nodes).toContain(sym.q[j]);
      }
    });

    it(`${name}: the factors stay within the Cholesky count and do not grow, from 10 Hz to 1 MHz`, () => {
      const { mna, values } = system(model);
      const sym = analyze(mna.pattern, { branchFrom: mna.nodeCount });
      const n = mna.n;
      for (const f of [10, 1e3, 1e5, 1e6]) {
        const lu = new ComplexSparseLU(sym, { scale: 'rows-cols' });
        const v = values(f);
        lu.factor(v);
        expect(lu.nnzL - n).toBeLessThanOrEqual(1.25 * sym.cholNnz!);
        expect(lu.nnzU - n).toBeLessThanOrEqual(1.25 * sym.cholNnz!);
        // the solve is backward stable: residual of a random right-hand side at rounding level
        const bRe = Float64Array.from({ length: n }, (_, i) => Math.sin(i + 1));
        const bIm = Float64Array.from({ length: n }, (_, i) => Math.cos(3 * i));
        const xRe = bRe.slice();
        const xIm = bIm.slice();
        lu.solve(xRe, xIm);
        const rRe = bRe.slice();
        const rIm = bIm.slice();
        let aMax = 0;
        let xMax = 0;
        for (let j = 0; j < n; j++) {
          xMax = Math.max(xMax, Math.hypot(xRe[j], xIm[j]));
          for (let p = mna.pattern.colPtr[j]; p < mna.pattern.colPtr[j + 1]; p++) {
            const i = mna.pattern.rowIdx[p];
            const ar = v.re[p];
            const ai = v.im[p];
            aMax = Math.max(aMax, Math.hypot(ar, ai));
            rRe[i] -= ar * xRe[j] - ai * xIm[j];
            rIm[i] -= ar * xIm[j] + ai * xRe[j];
          }
        }
        let rMax = 0;
        for (let i = 0; i < n; i++) rMax = Math.max(rMax, Math.hypot(rRe[i], rIm[i]));
        // normwise backward error (Higham, "Accuracy and Stability of Numerical Algorithms", 2002, eq. 7.23, ∞-norms bounded by entries)
        expect(rMax / (aMax * xMax + 1)).toBeLessThan(1e-12);
      }
    });
  }

  it('a pattern without branch unknowns keeps the plain order', () => {
    const { mna } = system(models[1][1]);
    expect(Array.from(analyze(mna.pattern, { branchFrom: mna.n }).q)).toEqual(Array.from(analyze(mna.pattern).q));
  });
});
