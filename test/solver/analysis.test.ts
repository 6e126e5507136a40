import { describe, it, expect } from 'vitest';
import { SolverSession, solveGraph, kFromMutual, mutualFromK, reflectedImpedances, sourceImpedance, tellegenResidual, sweepGraph, frequencyGrid } from '../../src/solver';
import { referenceSolve } from '../reference/dense-mna';
import { model, two, cx, cadd, cdiv, cabs, expectComplexClose, expectClose } from '../helpers';

describe('k and M', () => {
  it('converts both ways: M = k·sqrt(L1·L2)', () => {
    // definition of the coupling coefficient (field notes)
    expectClose(mutualFromK(0.5, 0.04, 0.01), 0.01, 1e-15);
    expectClose(kFromMutual(0.01, 0.04, 0.01), 0.5, 1e-15);
    expectClose(kFromMutual(mutualFromK(0.37, 3e-3, 7e-6), 3e-3, 7e-6), 0.37, 1e-14);
  });
  it('refuses values outside the physical range with the allowed range', () => {
    expect(() => mutualFromK(1.01, 1, 1)).toThrow(/between 0 and 1/);
    expect(() => kFromMutual(0.3, 0.04, 0.01)).toThrow(/between 0 and sqrt\(L1·L2\) = 0.02 H/);
    expect(() => kFromMutual(-0.1, 1, 1)).toThrow(RangeError);
  });
});

describe('three or more windings', () => {
  const elements = [
    { id: 'V1', kind: 'voltage-source' as const, nodes: ['a', 'gnd'] as [string, string], magnitude: 12, phaseDeg: 10 },
    { id: 'R1', kind: 'resistor' as const, nodes: ['a', 'p'] as [string, string], ohms: 1 },
    { id: 'L1', kind: 'inductor' as const, nodes: ['p', 'gnd'] as [string, string], henries: 0.01 },
    { id: 'L2', kind: 'inductor' as const, nodes: ['s', 'gnd'] as [string, string], henries: 0.02, dot: 'second' as const },
    { id: 'L3', kind: 'inductor' as const, nodes: ['t', 'gnd'] as [string, string], henries: 0.005 },
    { id: 'R2', kind: 'resistor' as const, nodes: ['s', 'gnd'] as [string, string], ohms: 20 },
    { id: 'R3', kind: 'resistor' as const, nodes: ['t', 'gnd'] as [string, string], ohms: 3 },
  ];

  it('a k coupling among three windings agrees with the dense reference (mathjs lusolve)', () => {
    const m = model(400, elements, [{ id: 'K', windings: ['L1', 'L2', 'L3'], k: 0.7 }]);
    const r = solveGraph(m);
    const ref = referenceSolve(m);
    for (const [n, v] of ref.nodes) expectComplexClose(r.nodes[n], v, 1e-9);
  });

  it('several couplings may share windings', () => {
    const m = model(400, elements, [
      { id: 'K12', windings: ['L1', 'L2'], k: 0.6 },
      { id: 'K13', windings: ['L1', 'L3'], henries: 0.002 },
      { id: 'K23', windings: ['L2', 'L3'], k: 0.3 },
    ]);
    const r = solveGraph(m);
    const ref = referenceSolve(m);
    for (const [n, v] of ref.nodes) expectComplexClose(r.nodes[n], v, 1e-9);
    expect(tellegenResidual(r).relative).toBeLessThan(1e-12);
  });

  it('k = 1 among three windings (singular inductance matrix) still solves', () => {
    const m = model(400, elements, [{ id: 'K', windings: ['L1', 'L2', 'L3'], k: 1 }]);
    const r = solveGraph(m);
    // perfect coupling: winding voltages scale with sqrt(L) (turns), L2's dot reversed (from memory)
    const v1 = two(r, 'L1').voltage;
    expectComplexClose(two(r, 'L3').voltage, { re: v1.re * Math.sqrt(0.5), im: v1.im * Math.sqrt(0.5) }, 1e-9);
    expectComplexClose(two(r, 'L2').voltage, { re: -v1.re * Math.sqrt(2), im: -v1.im * Math.sqrt(2) }, 1e-9);
  });
});

describe('isolated parts', () => {
  it('each floating part gets the first node met in element order as its reference', () => {
    const m = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 100, phaseDeg: 0 },
      { id: 'T1', kind: 'ideal-transformer', nodes: ['a', 'gnd', 'x2', 'x1'], ratio: 2 },
      { id: 'R1', kind: 'resistor', nodes: ['x1', 'x2'], ohms: 10 },
      { id: 'T2', kind: 'ideal-transformer', nodes: ['a', 'gnd', 'y1', 'y2'], ratio: 5 },
      { id: 'R2', kind: 'resistor', nodes: ['y2', 'y1'], ohms: 4 },
    ]);
    const r = solveGraph(m);
    expect(r.warnings).toHaveLength(2);
    // T1's secondary part is met first through T1's nodes: x2 before x1 (contract: "Galvanically isolated parts")
    expect(r.warnings[0]).toMatch(/relative to node "x2"/);
    expect(r.warnings[1]).toMatch(/relative to node "y1"/);
    expect(r.nodes.x2).toEqual({ re: 0, im: 0 });
    expect(r.nodes.y1).toEqual({ re: 0, im: 0 });
    // ideal transformer: V_s = V_p/ratio (contract) → x2 − x1 = 50 V, y1 − y2 = 20 V
    expectClose(r.nodes.x1.re, -50, 1e-12);
    expectClose(r.nodes.y2.re, -20, 1e-12);
    // currents exact: 50 V / 10 Ω and 20 V / 4 Ω
    expectClose(cabs(two(r, 'R1').current), 5, 1e-12);
    expectClose(cabs(two(r, 'R2').current), 5, 1e-12);
  });
});

describe('impedances', () => {
  it('a current source sees the impedance across it', () => {
    const m = model(1000, [
      { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 2, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 50 },
      { id: 'C1', kind: 'capacitor', nodes: ['a', 'gnd'], farads: 1e-6 },
    ]);
    // Z = R || 1/(jωC) (standard)
    const y = cadd(cx(1 / 50), cx(0, 2 * Math.PI * 1000 * 1e-6));
    expectComplexClose(sourceImpedance(m, 'I1').z!, cdiv(cx(1), y), 1e-12);
  });

  it('a voltage source on an open circuit sees no finite impedance', () => {
    const m = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'C1', kind: 'capacitor', nodes: ['a', 'b'], farads: 1e-6 },
      { id: 'I0', kind: 'current-source', nodes: ['b', 'gnd'], magnitude: 0, phaseDeg: 0 },
    ]);
    expect(sourceImpedance(m, 'V1').z).toBeNull();
  });

  it('an open partner loop reflects nothing', () => {
    const m = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: 1 },
      { id: 'L2', kind: 'inductor', nodes: ['s', 'gnd'], henries: 1 },
    ], [{ id: 'K', windings: ['L1', 'L2'], k: 0.5 }]);
    const [refl] = reflectedImpedances(m, 'L1');
    expect(refl.partner).toBe('L2');
    expect(refl.loopImpedance).toBeNull();
    expect(refl.reflected).toEqual({ re: 0, im: 0 });
  });
});

describe('sweeps', () => {
  it('log grid is geometric and the sweep matches single solves', () => {
    // geometric spacing: f_i = from·(to/from)^(i/(n−1)) (definition)
    const g = frequencyGrid(10, 1e5, 5, true);
    [10, 100, 1000, 10000, 100000].forEach((f, i) => expectClose(g[i], f, 1e-12));
    expect(frequencyGrid(0, 100, 3, false)).toEqual([0, 50, 100]);
    const m = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 10 },
      { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.01 },
      { id: 'C1', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 1e-6 },
    ]);
    const sw = sweepGraph(m, g);
    g.forEach((f, i) => {
      const single = solveGraph({ ...m, frequencyHz: f });
      expectComplexClose(sw.nodes.b[i], single.nodes.b, 1e-12);
      expectComplexClose(sw.elements.L1.current![i], two(single, 'L1').current, 1e-12);
    });
  });
});

describe('sessions across edits', () => {
  const m0 = model(50, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 0 },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 10 },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.1 },
    { id: 'L2', kind: 'inductor', nodes: ['c', 'gnd'], henries: 0.1 },
    { id: 'R2', kind: 'resistor', nodes: ['c', 'gnd'], ohms: 3 },
  ], [{ id: 'K', windings: ['L1', 'L2'], k: 0.5 }]);

  it('a value edit keeps the symbolic analysis and gives the fresh answer', () => {
    const first = new SolverSession(m0);
    first.solveAt(50);
    const edited = { ...m0, elements: m0.elements.map((e) => (e.id === 'R2' ? { ...e, ohms: 7 } : e)), couplings: [{ id: 'K', windings: ['L1', 'L2'], k: 0.9 }] };
    const next = new SolverSession(edited, first);
    expect(next.reuses(first)).toBe(true);
    const r = next.solveAt(50);
    // the same model solved from scratch is the reference
    const fresh = solveGraph(edited);
    for (const n of Object.keys(fresh.nodes)) expectComplexClose(r.nodes[n], fresh.nodes[n], 1e-12);
  });

  it('a wiring edit starts a new analysis', () => {
    const first = new SolverSession(m0);
    first.solveAt(50);
    const rewired = {
      ...m0,
      elements: [
        ...m0.elements,
        { id: 'C1', kind: 'capacitor' as const, nodes: ['b', 'x'] as [string, string], farads: 1e-6 },
        { id: 'R3', kind: 'resistor' as const, nodes: ['x', 'gnd'] as [string, string], ohms: 5 },
      ],
    };
    const next = new SolverSession(rewired, first);
    expect(next.reuses(first)).toBe(false);
    const fresh = solveGraph(rewired);
    expectComplexClose(next.solveAt(50).nodes.c, fresh.nodes.c, 1e-12);
    expectComplexClose(next.solveAt(50).nodes.x, fresh.nodes.x, 1e-12);
  });
});
