import { describe, it, expect } from 'vitest';
import { solveGraph, pairState, connectionOf, compareDotFlip, powerSummary, efficiency, sourceImpedance } from '../../src/solver';
import type { DotEnd, GraphModel } from '../../src/model/graph';
import { model, two, cx, cadd, cdiv, cabs, expectClose, expectComplexClose } from '../helpers';

const f = 2000;
const w = 2 * Math.PI * f;
const L1 = 0.003;
const L2 = 0.012;
const k = 0.8;
const M = k * Math.sqrt(L1 * L2);

function series(dot2: DotEnd): GraphModel {
  // L1 from a to m (dot at a), L2 from m to gnd (dot per test): a current a → gnd enters L1's dot
  return model(f, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 5 },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'm'], henries: L1, dot: 'first' },
    { id: 'L2', kind: 'inductor', nodes: ['m', 'gnd'], henries: L2, dot: dot2 },
  ], [{ id: 'K', windings: ['L1', 'L2'], k }]);
}

describe('connection of a coupled pair', () => {
  it('recognises series aiding and opposing with L1 + L2 ± 2M', () => {
    // series connection formulas (field notes; standard result, from memory)
    const aid = connectionOf(series('first'), 'K')!;
    expect(aid.kind).toBe('series');
    expect(aid.sense).toBe('aiding');
    expectClose(aid.inductance, L1 + L2 + 2 * M, 1e-12);
    expectClose(aid.otherSense, L1 + L2 - 2 * M, 1e-12);
    const opp = connectionOf(series('second'), 'K')!;
    expect(opp.sense).toBe('opposing');
    expectClose(opp.inductance, L1 + L2 - 2 * M, 1e-12);
  });

  it('the effective inductance measured on the solved circuit equals the formula for the sense as wired', () => {
    for (const dot of ['first', 'second'] as const) {
      const m = series(dot);
      const conn = connectionOf(m, 'K')!;
      const r = solveGraph(m);
      // measured: Im(V_chain / I)/ω across the pair
      const vChain = cadd(two(r, 'L1').voltage, two(r, 'L2').voltage);
      const z = cdiv(vChain, two(r, 'L1').current);
      expectClose(z.im / w, conn.inductance, 1e-10);
    }
  });

  it('recognises parallel aiding and opposing with (L1·L2 − M²)/(L1 + L2 ∓ 2M)', () => {
    const par = (dot2: DotEnd) =>
      model(f, [
        { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
        { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: L1 },
        { id: 'L2', kind: 'inductor', nodes: ['a', 'gnd'], henries: L2, dot: dot2 },
      ], [{ id: 'K', windings: ['L1', 'L2'], k }]);
    // parallel connection formulas (field notes; standard result, from memory)
    const aid = connectionOf(par('first'), 'K')!;
    expect(aid).toMatchObject({ kind: 'parallel', sense: 'aiding' });
    expectClose(aid.inductance, (L1 * L2 - M * M) / (L1 + L2 - 2 * M), 1e-12);
    const opp = connectionOf(par('second'), 'K')!;
    expect(opp).toMatchObject({ kind: 'parallel', sense: 'opposing' });
    expectClose(opp.inductance, (L1 * L2 - M * M) / (L1 + L2 + 2 * M), 1e-12);
    // measured from the source: Z = jω·L_eff
    const z = sourceImpedance(par('second'), 'V1').z!;
    expectClose(z.im / w, opp.inductance, 1e-10);
  });
});

describe('pair state', () => {
  it('flux linkage, energy and aiding/opposing agree with the coupled-winding equations', () => {
    for (const dot of ['first', 'second'] as const) {
      const m = series(dot);
      const r = solveGraph(m);
      const s = pairState(m, r, 'K');
      const i = two(r, 'L1').current;
      // V = jω·λ for each winding (coupled-winding equations, field notes)
      expectComplexClose(two(r, 'L1').voltage, { re: -w * s.flux[0].im, im: w * s.flux[0].re }, 1e-10);
      expectComplexClose(two(r, 'L2').voltage, { re: -w * s.flux[1].im, im: w * s.flux[1].re }, 1e-10);
      // series chain: the same current in both; average energy ½·L_eff·|I|² (RMS phasors)
      const leff = dot === 'first' ? L1 + L2 + 2 * M : L1 + L2 - 2 * M;
      expectClose(s.energyJ, 0.5 * leff * cabs(i) ** 2, 1e-10);
      expect(s.interaction).toBe(dot === 'first' ? 'aiding' : 'opposing');
      // reactive power of an inductive store is 2ω·W_avg (standard, from memory)
      expectClose(two(r, 'L1').power.vars + two(r, 'L2').power.vars, 2 * w * s.energyJ, 1e-10);
    }
  });
});

describe('dot comparison', () => {
  it('lists what changes when one dot flips, without touching the model', () => {
    const m = series('first');
    const snapshot = JSON.stringify(m);
    const cmp = compareDotFlip(m, 'L2');
    expect(JSON.stringify(m)).toBe(snapshot);
    // current before and after from the series closed forms: I = V/(R + jω·L_eff)
    const before = cdiv(cx(1), cx(5, w * (L1 + L2 + 2 * M)));
    const after = cdiv(cx(1), cx(5, w * (L1 + L2 - 2 * M)));
    const row = cmp.changes.find((c) => c.label === 'R1 current')!;
    expectComplexClose(row.before, before, 1e-10);
    expectComplexClose(row.after, after, 1e-10);
    expectComplexClose(row.delta, { re: after.re - before.re, im: after.im - before.im }, 1e-9);
    const zin = cmp.inputImpedance[0];
    expect(zin.source).toBe('V1');
    expectComplexClose(zin.before.z!, cx(5, w * (L1 + L2 + 2 * M)), 1e-10);
    expectComplexClose(zin.after.z!, cx(5, w * (L1 + L2 - 2 * M)), 1e-10);
    // the source voltage does not change, so it is not listed
    expect(cmp.changes.some((c) => c.label === 'node a')).toBe(false);
  });
});

describe('power summary', () => {
  it('gives P, Q, |S|, power factor, totals and efficiency', () => {
    const m = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 100, phaseDeg: 0 },
      { id: 'Rline', kind: 'resistor', nodes: ['a', 'b'], ohms: 1 },
      { id: 'Rload', kind: 'resistor', nodes: ['b', 'c'], ohms: 9 },
      { id: 'Lload', kind: 'inductor', nodes: ['c', 'gnd'], henries: 10 / (2 * Math.PI * 50) },
    ]);
    const r = solveGraph(m);
    const p = powerSummary(m, r);
    // Z = 10 + j10 Ω → |I| = 100/√200 = 7.071 A, P = |I|²·10 = 500 W, Q = 500 var, pf = 0.7071 (Ohm's law, standard)
    expectClose(p.delivered.watts, 500, 1e-10);
    expectClose(p.delivered.vars, 500, 1e-10);
    expectClose(p.dissipated, 500, 1e-10);
    const src = p.rows.find((x) => x.id === 'V1')!;
    expectClose(src.va, 500 * Math.SQRT2, 1e-10);
    expectClose(src.powerFactor!, Math.SQRT1_2, 1e-10);
    expect(p.rows.find((x) => x.id === 'Lload')!.powerFactor).toBeCloseTo(0, 12);
    // the source sees 10 + j10 Ω, inductive: its current lags its voltage, and so does the load's (common practice for the words)
    expect(src.sense).toBe('lagging');
    expect(p.rows.find((x) => x.id === 'Lload')!.sense).toBe('lagging');
    expect(p.rows.find((x) => x.id === 'Rload')!.sense).toBeNull();
    // efficiency into Rload: 9/10 of the real power
    expectClose(efficiency(r, 'V1', 'Rload')!, 0.9, 1e-10);
    expect(p.tellegen.relative).toBeLessThan(1e-12);
  });
});
