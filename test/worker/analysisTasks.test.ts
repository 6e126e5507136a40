import { describe, expect, it } from 'vitest';
import type { DotEnd, GraphModel } from '../../src/model/graph';
import { chunkRanges, compare, inspect, power, prepareSweep, tCheck } from '../../src/worker/analysisTasks';
import { solveGraph } from '../../src/solver';
import { model } from '../helpers';

const f = 2000;
const w = 2 * Math.PI * f;
const L1 = 0.003, L2 = 0.012, k = 0.8;
const M = k * Math.sqrt(L1 * L2);

function series(dot2: DotEnd): GraphModel {
  return model(f, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 5 },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'm'], henries: L1, dot: 'first' },
    { id: 'L2', kind: 'inductor', nodes: ['m', 'gnd'], henries: L2, dot: dot2 },
  ], [{ id: 'K', windings: ['L1', 'L2'], k }]);
}

/** Primary L1 driven through R1, secondary L2 loaded by R2 (separate loop, grounded). */
function loaded(): GraphModel {
  return model(f, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 0 },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 50 },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: L1, dot: 'first' },
    { id: 'L2', kind: 'inductor', nodes: ['s', 'gnd'], henries: L2, dot: 'first' },
    { id: 'R2', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 100 },
  ], [{ id: 'K', windings: ['L1', 'L2'], k }]);
}

describe('sweep chunks', () => {
  it('cover every point once, in order', () => {
    expect(chunkRanges(1000, 300)).toEqual([[0, 300], [300, 600], [600, 900], [900, 1000]]); // 300+300+300+100 = 1000 (arithmetic)
    expect(chunkRanges(3, 50)).toEqual([[0, 3]]);
  });
  it('give the same numbers solved in chunks or in one go', () => {
    const spec = { from: 100, to: 1e5, points: 97, log: true, quantities: [{ kind: 'zin' as const, source: 'V1' }, { kind: 'current' as const, element: 'R2' }] };
    const a = prepareSweep(loaded(), spec);
    a.run(0, 97);
    const b = prepareSweep(loaded(), spec);
    for (const [s, e] of chunkRanges(97, 10)) b.run(s, e);
    expect(Array.from(b.traces[0])).toEqual(Array.from(a.traces[0])); // same arithmetic, same order (invariance)
    expect(Array.from(b.traces[1])).toEqual(Array.from(a.traces[1]));
  });
});

describe('sweep quantities against closed forms', () => {
  const R = 10, L = 1e-3, C = 1e-6;
  const rlc = model(1000, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 2, phaseDeg: 0 },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: R },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'c'], henries: L },
    { id: 'C1', kind: 'capacitor', nodes: ['c', 'gnd'], farads: C },
  ]);
  it('impedance seen by the source, power into a resistor and a voltage ratio', () => {
    const s = prepareSweep(rlc, {
      from: 1000, to: 20000, points: 7, log: true,
      quantities: [
        { kind: 'zin', source: 'V1' },
        { kind: 'power', element: 'R1' },
        { kind: 'ratio', num: { kind: 'node', node: 'c' }, den: { kind: 'node', node: 'a' } },
      ],
    });
    s.run(0, 7);
    s.frequencies.forEach((fr, i) => {
      const om = 2 * Math.PI * fr;
      const x = om * L - 1 / (om * C);
      // Z = R + j(ωL − 1/(ωC)) (series RLC, closed form)
      expect(s.traces[0][2 * i]).toBeCloseTo(R, 9);
      expect(s.traces[0][2 * i + 1] / x).toBeCloseTo(1, 9);
      // P = |V|²R/|Z|² with RMS phasors, Q of a resistor = 0 (closed form)
      expect(s.traces[1][2 * i] / ((4 * R) / (R * R + x * x))).toBeCloseTo(1, 9);
      expect(Math.abs(s.traces[1][2 * i + 1])).toBeLessThan(1e-12);
      // V(c)/V(a) = (1/jωC)/Z (voltage divider, closed form): magnitude
      const ratio = (1 / (om * C)) / Math.hypot(R, x);
      expect(Math.hypot(s.traces[2][2 * i], s.traces[2][2 * i + 1]) / ratio).toBeCloseTo(1, 9);
    });
  });
  it('refuses a name that is not in the model', () => {
    expect(() => prepareSweep(rlc, { from: 1, to: 10, points: 3, log: true, quantities: [{ kind: 'current', element: 'R9' }] })).toThrow(/R9/);
  });
});

describe('coupling answers', () => {
  it('with three windings the inspector shows the full loop, naming both partners', () => {
    // windings of 1, 4, 9 mH at k = 0.5, loads 20 Ω and 50 Ω, 5 kHz: Z_in − jωL1 = 1.16 − 10.34j Ω
    // (checked against a mathjs solve of the loop equations in test/solver/reflected-loop.test.ts)
    const m = model(5000, [
      { id: 'V1', kind: 'voltage-source', nodes: ['p', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['p', 'gnd'], henries: 1e-3 },
      { id: 'L2', kind: 'inductor', nodes: ['s2', 'r2'], henries: 4e-3 },
      { id: 'R2', kind: 'resistor', nodes: ['s2', 'r2'], ohms: 20 },
      { id: 'L3', kind: 'inductor', nodes: ['s3', 'r3'], henries: 9e-3 },
      { id: 'R3', kind: 'resistor', nodes: ['s3', 'r3'], ohms: 50 },
    ], [{ id: 'K', windings: ['L1', 'L2', 'L3'], k: 0.5 }]);
    const a = inspect(m, solveGraph(m), 'K', ['L1', 'L2']);
    expect(a.reflectedFrom[0]).toEqual(['L2', 'L3']);
    expect(a.reflected[0].re).toBeCloseTo(1.16, 2);
    expect(a.reflected[0].im).toBeCloseTo(-10.34, 2);
  });

  it('reflected impedance (ωM)²/(jωL2 + R2) and what the source sees', () => {
    const m = loaded();
    const a = inspect(m, solveGraph(m), 'K');
    // Z_refl = (ωM)² / (R2 + jωL2) (field notes, reflected impedance)
    const d = 100 * 100 + (w * L2) ** 2;
    const re = ((w * M) ** 2 * 100) / d;
    const im = (-((w * M) ** 2) * w * L2) / d;
    expect(a.reflected[0].re / re).toBeCloseTo(1, 9);
    expect(a.reflected[0].im / im).toBeCloseTo(1, 9);
    // Z_in = R1 + jωL1 + Z_refl (field notes)
    const z = a.sources[0].z!;
    expect(z.re / (50 + re)).toBeCloseTo(1, 9);
    expect(z.im / (w * L1 + im)).toBeCloseTo(1, 9);
    expect(a.k).toBeCloseTo(k, 12); // k = M/√(L1·L2) (field notes)
  });

  it('series pair: aiding and opposing formulas and the inductance measured from the solves', () => {
    const c = compare(series('first'), 'L2');
    // L = L1 + L2 ± 2M (field notes, series connection)
    expect(c.connection!.aiding).toBeCloseTo(L1 + L2 + 2 * M, 12);
    expect(c.connection!.opposing).toBeCloseTo(L1 + L2 - 2 * M, 12);
    expect(c.connection!.measuredBefore! / (L1 + L2 + 2 * M)).toBeCloseTo(1, 9);
    expect(c.connection!.measuredAfter! / (L1 + L2 - 2 * M)).toBeCloseTo(1, 9);
    // 4M between the two measurements (field notes: the bench measurement of M)
    expect((c.connection!.measuredBefore! - c.connection!.measuredAfter!) / (4 * M)).toBeCloseTo(1, 9);
    expect(c.changes.length).toBeGreaterThan(0);
  });

  it('T-equivalent arms and a port check that agrees to rounding', () => {
    const t = tCheck(series('first'), 'K');
    // L1's dot on its outer end, L2's dot on the shared node m: one dot reversed relative to the common terminal,
    // so M enters the T as −M: arms L1 + M, L2 + M, shunt −M (field notes, T-equivalent)
    expect(t.shared).toBe(true);
    expect(t.m / -M).toBeCloseTo(1, 12);
    expect(t.arm1 / (L1 + M)).toBeCloseTo(1, 12);
    expect(t.arm2 / (L2 + M)).toBeCloseTo(1, 12);
    expect(t.negativeArms).toEqual(['shunt']);
    expect(t.check.maxRel).toBeLessThan(1e-9); // the T is exact for port quantities (field notes)
    const floating = loaded();
    floating.elements = floating.elements.map((e) => (e.id === 'L2' || e.id === 'R2' ? { ...e, nodes: ['s', 't'] } : e) as typeof e);
    const iso = tCheck(floating, 'K');
    expect(iso.shared).toBe(false);
    expect(iso.notes.join(' ')).toMatch(/isolation/);
    expect(iso.check.maxRel).toBeLessThan(1e-9);
  });

  it('power balance: sources deliver what the resistors absorb (Tellegen)', () => {
    const m = loaded();
    const p = power(m, solveGraph(m));
    expect(p.delivered.watts / p.dissipated).toBeCloseTo(1, 9); // lossless windings: P delivered = P absorbed (energy conservation)
    expect(p.tellegen.relative).toBeLessThan(1e-9); // Tellegen, 1952
  });
});

describe('value sweep', () => {
  // a divider V·R2/(R1 + R2) with R2 swept (Ohm's law); k swept on a loaded pair matches a solve at each k
  const divider = model(50, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 0 },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 100 },
    { id: 'R2', kind: 'resistor', nodes: ['b', 'gnd'], ohms: 100 },
  ]);
  it('solves the divider at each value of R2', () => {
    const s = prepareSweep(divider, { from: 10, to: 1000, points: 5, log: true, quantities: [{ kind: 'node', node: 'b' }], over: { target: { kind: 'part', id: 'R2' }, frequencyHz: 50 } });
    s.run(0, 5);
    // log spacing: equal ratios, 10^0.5 per step from 10 to 1000 (arithmetic)
    [10, 10 * 10 ** 0.5, 100, 100 * 10 ** 0.5, 1000].forEach((v, i) => expect(s.values![i] / v).toBeCloseTo(1, 12));
    expect(s.frequencies).toEqual([50, 50, 50, 50, 50]);
    s.values!.forEach((r2, i) => expect(s.traces[0][2 * i]).toBeCloseTo((10 * r2) / (100 + r2), 10));
  });
  it('sweeps k linearly from 0, each point as a solve of the model with that k', () => {
    const s = prepareSweep(loaded(), { from: 0, to: 0.9, points: 4, log: false, quantities: [{ kind: 'current', element: 'R2' }], over: { target: { kind: 'coupling', id: 'K' }, frequencyHz: f } });
    s.run(0, 4);
    [0, 0.3, 0.6, 0.9].forEach((v, i) => expect(s.values![i]).toBeCloseTo(v, 14)); // equal steps (arithmetic)
    s.values!.forEach((kv, i) => {
      const m = loaded();
      const r = solveGraph({ ...m, couplings: [{ id: 'K', windings: ['L1', 'L2'], k: kv }] });
      const want = (r.elements.R2 as { current: { re: number; im: number } }).current;
      expect(s.traces[0][2 * i]).toBeCloseTo(want.re, 12); // same model, same solver (consistency)
      expect(s.traces[0][2 * i + 1]).toBeCloseTo(want.im, 12);
    });
    expect(Math.abs(s.traces[0][0]) + Math.abs(s.traces[0][1])).toBe(0); // k = 0: no coupling, no secondary current (field notes)
  });
  it('refuses a target that is not there, naming it', () => {
    expect(() => prepareSweep(divider, { from: 1, to: 2, points: 3, log: false, quantities: [], over: { target: { kind: 'part', id: 'R9' }, frequencyHz: 50 } })).toThrow('"R9"');
  });
});
