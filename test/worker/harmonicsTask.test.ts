import { describe, expect, it } from 'vitest';
import { harmonics, VIEW_MAX_HARMONICS } from '../../src/worker/analysisTasks';
import type { GraphModel } from '../../src/model/graph';

// a ±1 A square current into 2 Ω (values of our own): V_n = 2 Ω·(4/(πn)) A peak for odd n (standard, Ohm)
const m = {
  schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'peak', ground: 'gnd', couplings: [],
  elements: [
    { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'square', low: -1, high: 1, frequencyHz: 400 } },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 2 },
  ],
} as unknown as GraphModel;

describe('the harmonic view\'s task', () => {
  it('answers the whole circuit\'s harmonics as the solver gives them, after reading the model', () => {
    const a = harmonics(m, 9);
    expect(a.orders).toEqual([1, 3, 5, 7, 9]);
    a.orders.forEach((n, k) => {
      const v = a.nodes.a.phasors[k];
      expect(Math.hypot(v.re, v.im)).toBeCloseTo((2 * 4) / (Math.PI * n), 12);
    });
    // the current source's own current is its harmonic (the source's value, as a solve reads it back)
    expect(Math.hypot(a.elements.I1.current!.phasors[0].re, a.elements.I1.current!.phasors[0].im)).toBeCloseTo(4 / Math.PI, 12);
    expect(a.ms).toBeGreaterThanOrEqual(0);
  });

  it('refuses a count outside 1 … VIEW_MAX_HARMONICS and a model the reader refuses', () => {
    expect(() => harmonics(m, 0)).toThrow(/whole number from 1 to 5000/);
    expect(() => harmonics(m, VIEW_MAX_HARMONICS + 1)).toThrow(/from 1 to 5000/);
    expect(() => harmonics({ ...m, elements: [{ id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: -1 }] } as unknown as GraphModel, 5)).toThrow(/R1/);
  });
});
