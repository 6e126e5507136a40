import { describe, expect, it } from 'vitest';
import type { SweepQuantity } from '../../../src/worker/protocol';
import { decodeQ, encodeQ, labelOf, unitOf, withSlider } from '../../../src/ui/analysis/sweepRunner';
import { model } from '../../helpers';

describe('sweep quantities as select values', () => {
  it('round-trip, ratios included, with their units', () => {
    const qs: SweepQuantity[] = [
      { kind: 'node', node: 'n1' },
      { kind: 'zin', source: 'V1' },
      { kind: 'power', element: 'R3' },
      { kind: 'ratio', num: { kind: 'voltage', element: 'R3' }, den: { kind: 'node', node: 'n1' } },
      // names may hold the characters an ad-hoc encoding would split on
      { kind: 'ratio', num: { kind: 'node', node: 'a|b:c' }, den: { kind: 'current', element: '__proto__' } },
    ];
    for (const q of qs) expect(decodeQ(encodeQ(q))).toEqual(q); // identity
    expect(qs.slice(0, 4).map(unitOf)).toEqual(['V', 'Ω', 'VA', '']); // SI units of each quantity; V/V is a pure number (SI brochure)
    expect(labelOf(qs[3])).toBe('V(R3) / V(n1)');
  });
});

describe('slider values', () => {
  const m = model(50, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
    { id: 'C1', kind: 'capacitor', nodes: ['a', 'b'], farads: 1e-6 },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: 1e-3 },
    { id: 'L2', kind: 'inductor', nodes: ['c', 'gnd'], henries: 1e-3 },
    { id: 'R1', kind: 'resistor', nodes: ['c', 'gnd'], ohms: 5 },
  ], [{ id: 'K1', windings: ['L1', 'L2'], henries: 1e-4 }]);
  it('put the value into a copy of the model, leaving the original', () => {
    const c = withSlider(m, { kind: 'part', id: 'C1', label: '', min: 0, max: 1, log: false, unit: 'F' }, 2e-6);
    expect((c.elements[1] as { farads: number }).farads).toBe(2e-6);
    expect((m.elements[1] as { farads: number }).farads).toBe(1e-6);
    const k = withSlider(m, { kind: 'coupling', id: 'K1', label: '', min: 0, max: 1, log: false, unit: '' }, 0.4);
    expect(k.couplings![0]).toEqual({ id: 'K1', windings: ['L1', 'L2'], k: 0.4 }); // a k replaces a given M (graph-model contract: one of k or henries)
  });
});
