import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { addDependencies, create, divideDependencies, eigsDependencies, matrixDependencies, multiplyDependencies, type Complex } from 'mathjs';
import { ModelRefusal, parseGraphModel, transferFunction } from '../../../src/solver';
import type { ComplexJson, GraphElement, TransferResult } from '../../../src/model/graph';
import { cdiv, cmul, cx, model } from '../../helpers';

/**
 * `tf` on RLC ladders (a voltage source, then per section a series R and L
 * and a shunt C to ground), with the output at any node along it. An output at
 * the far end has no finite zero (an all-pole H); it must be answered, not
 * taken for a singular circuit. References outside the solver: the ladder's
 * chain (ABCD) matrices multiplied in mathjs complex arithmetic (two-port
 * cascade, common practice), and mathjs `eigs` of the ladder's state matrix.
 */

const math = create({ addDependencies, divideDependencies, eigsDependencies, matrixDependencies, multiplyDependencies });

interface Section { r: number; l: number; c: number }

function ladderModel(sections: Section[]) {
  const elements: GraphElement[] = [{ id: 'V1', kind: 'voltage-source', nodes: ['a0', 'gnd'], magnitude: 1, phaseDeg: 0 }];
  sections.forEach((s, i) => {
    elements.push({ id: `R${i}`, kind: 'resistor', nodes: [`a${i}`, `m${i}`], ohms: s.r });
    elements.push({ id: `L${i}`, kind: 'inductor', nodes: [`m${i}`, `a${i + 1}`], henries: s.l });
    elements.push({ id: `C${i}`, kind: 'capacitor', nodes: [`a${i + 1}`, 'gnd'], farads: s.c });
  });
  return parseGraphModel(model(50, elements));
}

/**
 * V(a_k)/V1 from chain matrices (two-port cascade, common practice): a section is
 * [[1, R + sL], [0, 1]]·[[1, 0], [sC, 1]]; with the far end open, V1 = A_total·V_N and
 * V_k = A_(k..N)·V_N, so H = A_(k..N)/A_total.
 */
function chainH(sections: Section[], k: number, s: ComplexJson): ComplexJson {
  const sc = math.complex(s.re, s.im);
  const product = (from: number) => {
    let t: Complex[][] = [[math.complex(1, 0), math.complex(0, 0)], [math.complex(0, 0), math.complex(1, 0)]];
    for (let i = from; i < sections.length; i++) {
      const { r, l, c } = sections[i];
      const z = math.add(r, math.multiply(sc, l)) as Complex;
      const y = math.multiply(sc, c) as Complex;
      const sec: Complex[][] = [[math.add(1, math.multiply(z, y)) as Complex, z], [y, math.complex(1, 0)]];
      t = math.multiply(t, sec) as unknown as Complex[][];
    }
    return t[0][0];
  };
  const h = math.divide(product(k), product(0)) as Complex;
  return cx(h.re, h.im);
}

function factored(t: TransferResult, s: ComplexJson): ComplexJson {
  let h = cx(t.gain);
  for (const z of t.zeros) h = cmul(h, cx(s.re - z.re, s.im - z.im));
  for (const p of t.poles) h = cdiv(h, cx(s.re - p.re, s.im - p.im));
  return h;
}

function expectRelClose(a: ComplexJson, b: ComplexJson, rel: number): void {
  const diff = Math.hypot(a.re - b.re, a.im - b.im);
  const size = Math.hypot(b.re, b.im);
  if (!(diff <= rel * size)) throw new Error(`H = ${a.re} + ${a.im}j, reference ${b.re} + ${b.im}j: ${diff / size} relative`);
}

/** Points on the jω axis about the ladder's band (ω from 0.1 to 10 of 1/√(LC) of its first section). */
function axisPoints(sections: Section[]): ComplexJson[] {
  const w0 = 1 / Math.sqrt(sections[0].l * sections[0].c);
  return [0.1, 0.37, 1, 2.3, 10].map((f) => cx(0, f * w0));
}

const uniform: Section[] = Array.from({ length: 6 }, () => ({ r: 1, l: 1e-3, c: 1e-6 }));

describe('tf on RLC ladders', () => {
  it('the far end of a 6-section ladder is all-pole: 12 poles, no zero, H(jω) equal to the chain-matrix product', () => {
    const t = transferFunction(ladderModel(uniform), 'V1', 'node:a6');
    expect(t.zeros).toEqual([]);
    expect(t.poles).toHaveLength(12);
    expect(t.numerator).toHaveLength(1);
    expect(t.warnings).toEqual([]);
    for (const s of axisPoints(uniform)) expectRelClose(factored(t, s), chainH(uniform, 6, s), 1e-9);
    // H(0) = 1 with the far end open (no current, no drop along the ladder)
    expectRelClose(factored(t, cx(0)), cx(1), 1e-9);
  });

  it('every node of the 6-section ladder: numerator degree 2(N − k), H(jω) equal to the chain-matrix product', () => {
    const m = ladderModel(uniform);
    for (let k = 1; k <= 6; k++) {
      const t = transferFunction(m, 'V1', `node:a${k}`);
      expect(t.zeros).toHaveLength(2 * (6 - k));
      expect(t.poles).toHaveLength(12);
      for (const s of axisPoints(uniform)) expectRelClose(factored(t, s), chainH(uniform, k, s), 1e-9);
    }
  });

  it('the poles of a 3-section ladder are the eigenvalues of its state matrix (mathjs eigs)', () => {
    const secs: Section[] = [{ r: 2, l: 1e-3, c: 1e-6 }, { r: 0.5, l: 2.2e-3, c: 4.7e-7 }, { r: 1.2, l: 6.8e-4, c: 2.2e-6 }];
    const n = secs.length;
    // states x = [i_L0..i_L(n−1), v_C0..v_C(n−1)] with the source at 0 (Kirchhoff's laws, common practice):
    // L_i di_i/dt = v_(i−1) − R_i i_i − v_i (v_(−1) = 0), C_i dv_i/dt = i_i − i_(i+1) (i_n = 0);
    // in units of ω_ref so that mathjs works on entries near 1
    const wRef = 1e4;
    const a = Array.from({ length: 2 * n }, () => new Array<number>(2 * n).fill(0));
    secs.forEach(({ r, l, c }, i) => {
      a[i][i] = -r / l / wRef;
      a[i][n + i] = -1 / l / wRef;
      if (i > 0) a[i][n + i - 1] = 1 / l / wRef;
      a[n + i][i] = 1 / c / wRef;
      if (i + 1 < n) a[n + i][i + 1] = -1 / c / wRef;
    });
    const values = math.eigs(a).values as unknown as (number | Complex)[];
    const ref = values.map((v) => (typeof v === 'number' ? cx(v * wRef) : cx(v.re * wRef, v.im * wRef)));
    const t = transferFunction(ladderModel(secs), 'V1', `node:a${n}`);
    expect(t.zeros).toEqual([]);
    expect(t.poles).toHaveLength(2 * n);
    const key = (p: ComplexJson) => p.im * 1e-3 + p.re;
    const got = [...t.poles].sort((x, y) => key(x) - key(y));
    const want = [...ref].sort((x, y) => key(x) - key(y));
    got.forEach((p, i) => expectRelClose(p, want[i], 1e-9));
  });

  it('random ladders of 1 to 12 sections, any output node: H(jω) equals the chain-matrix product to 1e-9', () => {
    const logU = (lo: number, hi: number) => fc.double({ min: Math.log(lo), max: Math.log(hi), noNaN: true }).map(Math.exp);
    // values within a decade of 1 mH and 1 µF: section resonances within a decade of each other
    const section = fc.record({ r: logU(0.1, 10), l: logU(3e-4, 3e-3), c: logU(3e-7, 3e-6) });
    const arb = fc.array(section, { minLength: 1, maxLength: 12 }).chain((secs) => fc.tuple(fc.constant(secs), fc.integer({ min: 1, max: secs.length })));
    fc.assert(
      fc.property(arb, ([secs, k]) => {
        const t = transferFunction(ladderModel(secs), 'V1', `node:a${k}`);
        // the relative degree is 2k (chain matrices: A_(k..N) of degree 2(N − k) over A_total of 2N); a mode
        // the output barely sees (residue below 1e-10 of H) may leave as a pole–zero pair, which keeps it
        expect(t.poles.length - t.zeros.length).toBe(2 * k);
        expect(t.zeros.length).toBeLessThanOrEqual(2 * (secs.length - k));
        if (k === secs.length) expect(t.poles).toHaveLength(2 * secs.length);
        expect(t.warnings).toEqual([]);
        for (const s of axisPoints(secs)) expectRelClose(factored(t, s), chainH(secs, k, s), 1e-9);
      }),
      { numRuns: 40, seed: 8 },
    );
  });

  it('a pencil singular at every s is still refused: two identical windings with k = 1 in parallel', () => {
    // v = sL·(i1 + i2) for both windings: the split of the current is undetermined at every s
    const m = parseGraphModel(model(50, [
      { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 10 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: 1e-3, dot: 'first' },
      { id: 'L2', kind: 'inductor', nodes: ['a', 'gnd'], henries: 1e-3, dot: 'first' },
    ], [{ id: 'K1', windings: ['L1', 'L2'], k: 1 }]));
    expect(() => transferFunction(m, 'I1', 'node:a')).toThrow(ModelRefusal);
    expect(() => transferFunction(m, 'I1', 'node:a')).toThrow(/"L2".*undetermined/);
  });
});
