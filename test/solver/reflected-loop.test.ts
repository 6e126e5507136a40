import { describe, it, expect } from 'vitest';
import { complexDependencies, create, lusolveDependencies, matrixDependencies } from 'mathjs';
import { reflectedImpedance, reflectedImpedances, sourceImpedance } from '../../src/solver';
import type { GraphModel } from '../../src/model/graph';
import { model, cx, csub, expectComplexClose } from '../helpers';

const mj = create({ complexDependencies, lusolveDependencies, matrixDependencies });

/**
 * Independent reference: the loop equations of n coupled windings, V_i = Σ_j (jωL_ij + δ_ij·Z_i) I_j with the
 * dots' signs on the mutual terms (coupled-winding equations, field notes), winding 1 driven by 1 V and the others
 * closed by their loads, solved by mathjs `lusolve` on complex numbers (a general-purpose library).
 * Returns Z_in − jωL1.
 */
function loopReference(omega: number, l: number[], k: number, loads: number[], signs: number[]) {
  const n = l.length;
  const z = l.map((li, i) =>
    l.map((lj, j) => {
      const x = i === j ? omega * li : omega * k * Math.sqrt(li * lj) * signs[i] * signs[j];
      return mj.complex(i === j && i > 0 ? loads[i - 1] : 0, x);
    }),
  );
  const rhs = l.map((_, i) => [mj.complex(i === 0 ? 1 : 0, 0)]);
  const sol = mj.lusolve(mj.matrix(z), mj.matrix(rhs)).toArray() as unknown as { re: number; im: number }[][];
  const i1 = sol[0][0];
  const d = i1.re * i1.re + i1.im * i1.im;
  const zin = cx(i1.re / d, -i1.im / d);
  return csub(zin, cx(0, omega * l[0]));
}

function threeWindings(dot3: 'first' | 'second' = 'first'): GraphModel {
  // windings of 1, 4 and 9 mH all at k = 0.5, the partners loaded by 20 Ω and 50 Ω, at 5 kHz (an example of ours)
  return model(5000, [
    { id: 'V1', kind: 'voltage-source', nodes: ['p', 'gnd'], magnitude: 1, phaseDeg: 0 },
    { id: 'L1', kind: 'inductor', nodes: ['p', 'gnd'], henries: 1e-3, dot: 'first' },
    { id: 'L2', kind: 'inductor', nodes: ['s2', 'r2'], henries: 4e-3, dot: 'first' },
    { id: 'R2', kind: 'resistor', nodes: ['s2', 'r2'], ohms: 20 },
    { id: 'L3', kind: 'inductor', nodes: ['s3', 'r3'], henries: 9e-3, dot: dot3 },
    { id: 'R3', kind: 'resistor', nodes: ['s3', 'r3'], ohms: 50 },
  ], [{ id: 'K', windings: ['L1', 'L2', 'L3'], k: 0.5 }]);
}

describe('reflected impedance from the full loop', () => {
  const omega = 2 * Math.PI * 5000;

  it('three windings at k = 0.5: 1.16 − 10.34j Ω, as the loop equations and the full solve give', () => {
    const got = reflectedImpedance(threeWindings(), 'L1');
    expect(got.partners).toEqual(['L2', 'L3']);
    expect(got.couplings).toEqual(['K']);
    // mathjs complex solve of the three loop equations (reference above)
    const ref = loopReference(omega, [1e-3, 4e-3, 9e-3], 0.5, [20, 50], [1, 1, 1]);
    expectComplexClose(got.reflected, ref, 1e-9);
    // the figure, to the digits it gives
    expect(got.reflected.re).toBeCloseTo(1.16, 2);
    expect(got.reflected.im).toBeCloseTo(-10.34, 2);
    // the full solve: V1 sits straight across L1, so the impedance it sees is Z_in = jωL1 + Z_refl
    const zin = sourceImpedance(threeWindings(), 'V1').z!;
    expectComplexClose(csub(zin, cx(0, omega * 1e-3)), ref, 1e-9);
  });

  it('the pairwise figures do not add up to it (the partners are coupled to each other)', () => {
    const pairs = reflectedImpedances(threeWindings(), 'L1');
    const sum = pairs.reduce((a, r) => cx(a.re + r.reflected.re, a.im + r.reflected.im), cx(0));
    // the sum the issue reports as wrong: 2.57 − 15.28j Ω
    expect(sum.re).toBeCloseTo(2.57, 2);
    expect(sum.im).toBeCloseTo(-15.28, 2);
    expect(Math.hypot(sum.re - 1.16, sum.im + 10.34)).toBeGreaterThan(1);
  });

  it('reversing the dot of a winding alone in its loop changes nothing (it only renames its current)', () => {
    // physical invariant: M13 and M23 both change sign, so M12·M13·M23 and every loop current's size stay
    const got = reflectedImpedance(threeWindings('second'), 'L1');
    const ref = loopReference(omega, [1e-3, 4e-3, 9e-3], 0.5, [20, 50], [1, 1, -1]);
    expectComplexClose(got.reflected, ref, 1e-9);
    expectComplexClose(got.reflected, reflectedImpedance(threeWindings(), 'L1').reflected, 1e-9);
  });

  it('one partner: (ωM)²/Z22, the same as the pairwise figure', () => {
    // Z_refl = (ωM)²/(jωL2 + R) for a single loaded partner (standard result, field notes)
    const m = model(5000, [
      { id: 'V1', kind: 'voltage-source', nodes: ['p', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['p', 'gnd'], henries: 1e-3 },
      { id: 'L2', kind: 'inductor', nodes: ['s', 'gnd'], henries: 4e-3 },
      { id: 'R2', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 20 },
    ], [{ id: 'K', windings: ['L1', 'L2'], k: 0.5 }]);
    const mm = 0.5 * Math.sqrt(4e-6);
    const z22 = cx(20, omega * 4e-3);
    const d = z22.re ** 2 + z22.im ** 2;
    const expected = cx(((omega * mm) ** 2 * z22.re) / d, (-((omega * mm) ** 2) * z22.im) / d);
    expectComplexClose(reflectedImpedance(m, 'L1').reflected, expected, 1e-9);
    expectComplexClose(reflectedImpedances(m, 'L1')[0].reflected, expected, 1e-9);
  });

  it('a weak coupling keeps its digits: k = 1e-6 reflects k²·(ωL1)·(ωL2)/Z22', () => {
    // same closed form; Z_in − jωL1 by subtraction would lose about twelve of sixteen digits here
    const k = 1e-6;
    const m = model(5000, [
      { id: 'V1', kind: 'voltage-source', nodes: ['p', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['p', 'gnd'], henries: 1e-3 },
      { id: 'L2', kind: 'inductor', nodes: ['s', 'gnd'], henries: 4e-3 },
      { id: 'R2', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 20 },
    ], [{ id: 'K', windings: ['L1', 'L2'], k }]);
    const wm2 = (omega * k * Math.sqrt(4e-6)) ** 2;
    const z22 = cx(20, omega * 4e-3);
    const d = z22.re ** 2 + z22.im ** 2;
    expectComplexClose(reflectedImpedance(m, 'L1').reflected, cx((wm2 * z22.re) / d, (-wm2 * z22.im) / d), 1e-9, 0);
  });

  it('an open partner loop reflects nothing, and 0 Hz reflects nothing', () => {
    const m = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: 1 },
      { id: 'L2', kind: 'inductor', nodes: ['s', 'gnd'], henries: 1 },
    ], [{ id: 'K', windings: ['L1', 'L2'], k: 0.5 }]);
    expect(reflectedImpedance(m, 'L1').reflected).toEqual({ re: 0, im: 0 });
    expect(reflectedImpedance(threeWindings(), 'L1', 0).reflected).toEqual({ re: 0, im: 0 });
  });
});
