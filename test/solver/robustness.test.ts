import { describe, it, expect } from 'vitest';
import { kFromMutual, ModelRefusal, mutualFromK, solveGraph } from '../../src/solver';
import type { GraphModel } from '../../src/model/graph';
import { model, two } from '../helpers';
import { preciseSolve } from '../reference/precise-mna';

/** |a − b| within 1e-6 of |b| or 1e-9 of `scale` (the largest quantity of its kind). */
function near(a: { re: number; im: number }, b: { re: number; im: number }, scale: number) {
  const d = Math.hypot(a.re - b.re, a.im - b.im);
  expect(d).toBeLessThanOrEqual(Math.max(1e-6 * Math.hypot(b.re, b.im), 1e-9 * scale));
}

/** Every element's port currents and voltages against the 80-digit reference (test/reference/precise-mna.ts). */
function againstReference(m: GraphModel) {
  const r = solveGraph(m);
  const ref = preciseSolve(m);
  let iMax = 0;
  let vMax = 0;
  for (const e of ref.elements.values()) {
    for (const i of e.currents) iMax = Math.max(iMax, Math.hypot(i.re, i.im));
    for (const v of e.voltages) vMax = Math.max(vMax, Math.hypot(v.re, v.im));
  }
  for (const [id, e] of ref.elements) {
    const got = r.elements[id] as { current?: { re: number; im: number }; voltage?: { re: number; im: number }; currents?: { re: number; im: number }[]; voltages?: { re: number; im: number }[] };
    const cur = got.currents ?? [got.current!];
    const vol = got.voltages ?? [got.voltage!];
    e.currents.forEach((c, t) => near(cur[t], c, iMax));
    e.voltages.forEach((v, t) => near(vol[t], v, vMax));
  }
  return r;
}

describe('small reactances keep their digits', () => {
  it('1 µH in series with 1 µF at 0.01 Hz: I(L1) = jωC·V to full precision', () => {
    // series LC far below resonance: I = V/(jωL + 1/(jωC)) ≈ jωC·V = 6.2832e-8j A (closed form)
    const m = model(0.01, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'b'], henries: 1e-6 },
      { id: 'C1', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 1e-6 },
    ]);
    const r = againstReference(m);
    const w = 2 * Math.PI * 0.01;
    const exact = 1 / (1 / (w * 1e-6) - w * 1e-6); // |I| = 1/(1/(ωC) − ωL), leading
    expect(two(r, 'L1').current.im).toBeCloseTo(exact, 15);
    // KCL at b: the inductor's current is the capacitor's (Kirchhoff)
    const iL = two(r, 'L1').current;
    const iC = two(r, 'C1').current;
    expect(Math.abs(iL.im - iC.im)).toBeLessThanOrEqual(1e-9 * Math.abs(iC.im));
  });

  it('a winding loaded by 1 GΩ carries its tiny current to full precision', () => {
    // reference: 80-digit branch-form MNA (test/reference/precise-mna.ts)
    const m = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: 0.1, dot: 'first' },
      { id: 'L2', kind: 'inductor', nodes: ['s', 'gnd'], henries: 0.1, dot: 'first' },
      { id: 'R1', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 1e9 },
    ], [{ id: 'K1', windings: ['L1', 'L2'], k: 0.5 }]);
    againstReference(m);
  });

  it('a series-coupled resonator of Q = 10,000 agrees with the reference from 0.01 Hz to 1 GHz', () => {
    // reference: 80-digit branch-form MNA (test/reference/precise-mna.ts)
    for (let e = -2; e <= 9; e++) {
      const m = model(10 ** e, [
        { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
        { id: 'L1', kind: 'inductor', nodes: ['a', 'b'], henries: 1e-3, dot: 'first' },
        { id: 'L2', kind: 'inductor', nodes: ['b', 'c'], henries: 1e-3, dot: 'first' },
        { id: 'C1', kind: 'capacitor', nodes: ['c', 'd'], farads: 1e-9 },
        { id: 'R1', kind: 'resistor', nodes: ['d', 'gnd'], ohms: Math.sqrt(2e-3 * 1.5 / 1e-9) / 1e4 },
      ], [{ id: 'K1', windings: ['L1', 'L2'], k: 0.5 }]);
      againstReference(m);
    }
  });
});

describe('wide impedance spreads', () => {
  it('a 1e150 F capacitor at 1 MHz is a short: V = I/(jωC), I = V/R', () => {
    // ωC = 2π·1e6·1e150 ≈ 6.28e156 S (capacitor admittance, common practice); the RC divider's closed form
    const m = model(1e6, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 10 },
      { id: 'C1', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 1e150 },
    ]);
    const r = solveGraph(m);
    expect(two(r, 'R1').current.re).toBeCloseTo(0.1, 15);
    const wC = 2 * Math.PI * 1e6 * 1e150;
    expect(r.nodes.b.im / (-0.1 / wC)).toBeCloseTo(1, 9);
  });

  it('1 V into 1 GΩ, 1 µΩ, 1 GΩ in series solves, every node to the reference', () => {
    // reference: 80-digit branch-form MNA (test/reference/precise-mna.ts); series divider (Ohm's law)
    for (const mid of [1e-6, 1e-3]) {
      const m = model(50, [
        { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
        { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 1e9 },
        { id: 'R2', kind: 'resistor', nodes: ['b', 'c'], ohms: mid },
        { id: 'R3', kind: 'resistor', nodes: ['c', 'gnd'], ohms: 1e9 },
      ]);
      const r = againstReference(m);
      expect(two(r, 'R2').voltage.re / (mid / (2e9 + mid))).toBeCloseTo(1, 6);
    }
  });

  it('1 nH between 1 GΩ and 330 MΩ at 50 Hz solves', () => {
    // reference: 80-digit branch-form MNA (test/reference/precise-mna.ts)
    const m = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 1e9 },
      { id: 'L1', kind: 'inductor', nodes: ['b', 'c'], henries: 1e-9 },
      { id: 'R2', kind: 'resistor', nodes: ['c', 'gnd'], ohms: 330e6 },
    ]);
    const r = againstReference(m);
    const w = 2 * Math.PI * 50;
    // V(L1) = jωL·I with I = 1/(1.33e9 + jωL) (series circuit)
    expect(two(r, 'L1').voltage.im / ((w * 1e-9) / 1.33e9)).toBeCloseTo(1, 6);
  });

  it('a 1 kA current transformer with a 1 µΩ bus bar, 1 GΩ insulation, 1 nH stray and k = 0.99999 solves', () => {
    // invented demo values; reference: 80-digit branch-form MNA (test/reference/precise-mna.ts)
    const m = model(50, [
      { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 1000, phaseDeg: 0 },
      { id: 'Rbus', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 1e-6 },
      { id: 'Lp', kind: 'inductor', nodes: ['a', 'p'], henries: 1e-6, dot: 'first' },
      { id: 'Lst', kind: 'inductor', nodes: ['p', 'gnd'], henries: 1e-9 },
      { id: 'Ls', kind: 'inductor', nodes: ['s', 't'], henries: 1e-2, dot: 'first' },
      { id: 'Rb', kind: 'resistor', nodes: ['s', 't'], ohms: 1 },
      { id: 'Riso', kind: 'resistor', nodes: ['t', 'gnd'], ohms: 1e9 },
    ], [{ id: 'K1', windings: ['Lp', 'Ls'], k: 0.99999 }]);
    againstReference(m);
  });

  it('warns, naming a node, when the spread costs more than six digits', () => {
    // 1 F at 50 Hz (314 S) between two 1 GΩ resistors: condition number ~ 314/1e-9 ≈ 3e11 > 1e10 (ratio of
    // admittances, common practice); the 1 kΩ divider alone is well conditioned and gives no warning
    const m = (farads: number) => model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 1e9 },
      { id: 'C2', kind: 'capacitor', nodes: ['b', 'c'], farads },
      { id: 'R3', kind: 'resistor', nodes: ['c', 'gnd'], ohms: 1e9 },
    ]);
    expect(solveGraph(m(1)).warnings.join('\n')).toMatch(/node "[bc]": .*may have lost more than six digits/);
    expect(solveGraph(m(1e-9)).warnings).toEqual([]);
  });
});

describe('parts with both terminals on one node', () => {
  it('a shorted turn: the primary sees Rs + jωL1(1 − k²)', () => {
    // shorted secondary of coupled windings: Z_in = jωL1(1 − k²) (field notes; standard result, from memory);
    // reference: 80-digit branch-form MNA (test/reference/precise-mna.ts)
    const f = 50;
    const w = 2 * Math.PI * f;
    const m = model(f, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'Rs', kind: 'resistor', nodes: ['a', 'b'], ohms: 2 },
      { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.01, dot: 'first' },
      { id: 'L2', kind: 'inductor', nodes: ['s', 's'], henries: 0.04, dot: 'first' },
    ], [{ id: 'K1', windings: ['L1', 'L2'], k: 0.8 }]);
    const r = againstReference(m);
    const i = two(r, 'Rs').current;
    const zr = 2;
    const zi = w * 0.01 * (1 - 0.64);
    const d = zr * zr + zi * zi;
    expect(i.re).toBeCloseTo(zr / d, 12);
    expect(i.im).toBeCloseTo(-zi / d, 12);
  });

  it('an ideal transformer with a shorted secondary driven by a current source', () => {
    // reference: 80-digit branch-form MNA (test/reference/precise-mna.ts); V_p = n·V_s = 0 (ideal transformer)
    const m = model(50, [
      { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 10 },
      { id: 'T1', kind: 'ideal-transformer', nodes: ['a', 'gnd', 's', 's'], ratio: 2 },
    ]);
    const r = againstReference(m);
    expect(Math.abs(r.nodes.a.re)).toBeLessThan(1e-12);
  });

  it('a current source whose two ends meet', () => {
    // its current circulates in itself: the rest of the circuit sees nothing (KCL); reference as above
    const m = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 10 },
      { id: 'I1', kind: 'current-source', nodes: ['a', 'a'], magnitude: 1, phaseDeg: 0 },
    ]);
    const r = againstReference(m);
    expect(two(r, 'R1').current.re).toBeCloseTo(0.1, 15);
  });
});

describe('refusals that name what has no answer', () => {
  const refusal = (m: GraphModel): ModelRefusal => {
    try {
      solveGraph(m);
    } catch (e) {
      if (e instanceof ModelRefusal) return e;
      throw e;
    }
    throw new Error('expected a refusal');
  };
  // f = 1/(2π) Hz rounds to ω = 1 exactly, so 1 H with 1 F is an exact resonance ω0 = 1/√(LC) (closed form)
  const f0 = 1 / (2 * Math.PI);

  it('an exact series LC resonance across a voltage source names the L and the C and the resistance that would break it', () => {
    const e = refusal(model(f0, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'b'], henries: 1 },
      { id: 'C1', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 1 },
    ]));
    expect(e.message).toMatch(/"L1" and "C1" are in exact resonance .*across the ideal voltage source "V1", and lossless parts in exact resonance have a defined answer only if a resistance breaks it/);
    expect(e.message).not.toMatch(/contradict/);
    expect(e.culprits).toEqual(expect.arrayContaining([{ kind: 'element', id: 'L1' }, { kind: 'element', id: 'C1' }]));
  });

  it('the same resonance with 1 mΩ in series solves: I = V/R (Z = R at ω0, closed form)', () => {
    const r = solveGraph(model(f0, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'c'], ohms: 1e-3 },
      { id: 'L1', kind: 'inductor', nodes: ['c', 'b'], henries: 1 },
      { id: 'C1', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 1 },
    ]));
    expect(two(r, 'R1').current.re).toBeCloseTo(1000, 6);
  });

  it('two k = 1 windings each driven by a voltage source name the coupling, even where rounding leaves the LU a pivot', () => {
    // 0.1 H and 0.4 H at k = 1 (turns ratio 1:2) with 10 V on each: V2 = 2·V1 is contradicted (ideal transformer law)
    const e = refusal(model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 0 },
      { id: 'La', kind: 'inductor', nodes: ['a', 'gnd'], henries: 0.1 },
      { id: 'V2', kind: 'voltage-source', nodes: ['c', 'gnd'], magnitude: 10, phaseDeg: 0 },
      { id: 'Lb', kind: 'inductor', nodes: ['c', 'gnd'], henries: 0.4 },
    ], [{ id: 'K1', windings: ['La', 'Lb'], k: 1 }]));
    expect(e.message).toMatch(/coupling "K1" \(windings "La" and "Lb", k = 1\)/);
    expect(e.culprits).toContainEqual({ kind: 'coupling', id: 'K1' });
  });

  it('M = k·√L1·√L2 holds for inductances whose product would overflow or underflow', () => {
    // k·√(L1·L2) with L1·L2 = 1e400 is Infinity and with 1e-400 is 0 in doubles (IEEE 754, from memory)
    expect(mutualFromK(0.5, 1e200, 1e200) / 5e199).toBeCloseTo(1, 14);
    expect(mutualFromK(0.5, 1e-200, 1e-200) / 5e-201).toBeCloseTo(1, 14);
    expect(kFromMutual(5e199, 1e200, 1e200)).toBeCloseTo(0.5, 14);
  });
});
