/**
 * k and M from bench readings, the readings taken on the solver's own phasor
 * solve of a known pair (the bench), and checked against the k it was built with.
 */
import { describe, expect, it } from 'vitest';
import { couplingFromBench, inductanceFromTurns, turnsFromInductance } from '../../src/model/couplingMeasure';
import type { GraphElement } from '../../src/model/graph';
import { solveGraph } from '../../src/solver';
import { expectClose, model, two } from '../helpers';

const L1 = 0.8, L2 = 0.05, K = 0.92, F = 1000, W = 2 * Math.PI * F;

/** Drive winding 1 (or the series pair) with 1 V and read the inductance it shows, Im(V/I)/ω. */
function bench(els: GraphElement[]): number {
  const r = solveGraph(model(F, [{ id: 'V', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 }, ...els], [{ id: 'K', windings: ['L1', 'L2'], k: K }]));
  const i = two(r, 'V').current;
  // Z = V / (−I) with the source current leaving its first node through the source
  const z = { re: -i.re / (i.re * i.re + i.im * i.im), im: i.im / (i.re * i.re + i.im * i.im) };
  return z.im / W;
}
const l1 = (nodes: [string, string], dot: 'first' | 'second' = 'first'): GraphElement => ({ id: 'L1', kind: 'inductor', nodes, henries: L1, dot });
const l2 = (nodes: [string, string], dot: 'first' | 'second' = 'first'): GraphElement => ({ id: 'L2', kind: 'inductor', nodes, henries: L2, dot });

describe('coupling from bench readings', () => {
  it('series aiding and opposing: M = (L_aid − L_opp)/4 (common practice)', () => {
    const aid = bench([l1(['a', 'm']), l2(['m', 'gnd'])]);
    const opp = bench([l1(['a', 'm']), l2(['m', 'gnd'], 'second')]);
    // L1 + L2 ± 2M (field notes, standard result from memory)
    expectClose(aid, L1 + L2 + 2 * K * Math.sqrt(L1 * L2), 1e-9);
    const r = couplingFromBench({ method: 'series', a: aid, b: opp }, L1, L2);
    expect(r.ok && r.k).toBeCloseTo(K, 9);
    expect(r.ok && r.note).toBeUndefined();
  });

  it('open and shorted partner: k = √(1 − L_sc/L_oc) (from memory)', () => {
    const oc = bench([l1(['a', 'gnd']), l2(['b', 'gnd'])]);
    // a short of 1 nΩ: its share of the reading is (R/ωL2)², far below the check
    const sc = bench([l1(['a', 'gnd']), l2(['b', 'gnd']), { id: 'Rs', kind: 'resistor', nodes: ['b', 'gnd'], ohms: 1e-9 }]);
    const r = couplingFromBench({ method: 'open-short', a: oc, b: sc }, L1, L2);
    expect(r.ok && r.k).toBeCloseTo(K, 9);
  });

  it('no-load voltage ratio: M = L1·V2/V1 (coupled-winding law, from memory)', () => {
    const rr = solveGraph(model(F, [{ id: 'V', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 0 }, l1(['a', 'gnd']), l2(['b', 'gnd'])], [{ id: 'K', windings: ['L1', 'L2'], k: K }]));
    const v2 = Math.hypot(rr.nodes.b.re, rr.nodes.b.im);
    const r = couplingFromBench({ method: 'voltage-ratio', a: 10, b: v2, driven: 0 }, L1, L2);
    expect(r.ok && r.k).toBeCloseTo(K, 9);
    // driving the other winding: M = L2·V1/V2, the same M
    const rb = solveGraph(model(F, [{ id: 'V', kind: 'voltage-source', nodes: ['b', 'gnd'], magnitude: 10, phaseDeg: 0 }, l1(['a', 'gnd']), l2(['b', 'gnd'])], [{ id: 'K', windings: ['L1', 'L2'], k: K }]));
    const back = couplingFromBench({ method: 'voltage-ratio', a: 10, b: Math.hypot(rb.nodes.a.re, rb.nodes.a.im), driven: 1 }, L1, L2);
    expect(back.ok && back.k).toBeCloseTo(K, 9);
  });

  it('refuses readings no pair gives, naming the reading', () => {
    expect(couplingFromBench({ method: 'series', a: 1, b: 1.2 }, L1, L2)).toMatchObject({ ok: false, field: 'a' });
    expect(couplingFromBench({ method: 'open-short', a: 0.8, b: 0.9 }, L1, L2)).toMatchObject({ ok: false, field: 'b' });
    expect(couplingFromBench({ method: 'voltage-ratio', a: 1, b: 5 }, L1, L2)).toMatchObject({ ok: false, field: 'b' });
    expect(couplingFromBench({ method: 'series', a: 0, b: 0 }, L1, L2)).toMatchObject({ ok: false, field: 'a' });
    // readings that disagree with the sheet's windings are answered with a note
    const r = couplingFromBench({ method: 'series', a: 2, b: 1.5 }, L1, L2);
    expect(r.ok && r.note).toMatch(/differs from L1 \+ L2/);
  });

  it('turns on a core: L = N²·A_L (common practice)', () => {
    expect(inductanceFromTurns(100, 250e-9)).toBeCloseTo(2.5e-3, 15);
    expect(turnsFromInductance(2.5e-3, 250e-9)).toBeCloseTo(100, 12);
  });
});
