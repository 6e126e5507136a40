import { describe, expect, it } from 'vitest';
import { parseGraphModel, solveGraph, STEADY_STATE_FIELD, transientGraph } from '../../../src/solver';
import type { GraphElement, TwoTerminalResult } from '../../../src/model/graph';

/**
 * The steady-state gap: how far a sine-driven run's last period is from the
 * phasor solve (the added field `coilwright.steadyState`), against the
 * closed form of an RL circuit switched onto a sine.
 */

const f = 50;
const w = 2 * Math.PI * f;
const [R, L] = [10, 1];
const tau = L / R; // 0.1 s, five periods
const rl = (source: Partial<GraphElement> = {}) => parseGraphModel({
  schema: 'coilwright.graph/1', frequencyHz: f, amplitudes: 'peak', ground: 'gnd', couplings: [],
  elements: [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 100, phaseDeg: -90, ...source } as GraphElement,
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: R },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: L },
  ],
});

describe('steady-state gap of a sine-driven run', () => {
  // RL switched onto a sine from rest: i(t) = |I|·cos(ωt + φ) − |I|·cos φ·e^(−t/τ), τ = L/R (from memory).
  // Over the last period [T − 1/f, T] the current's largest distance from its steady state is at the period's
  // start, |I|·|cos φ|·e^(−(T − 1/f)/τ); relative to the crest |I|, that is the gap (the resistor's voltage is
  // R·i and the source's current −i, the same ratio; the inductor's voltage deviates by R/(ωL) of that).
  const ph = (solveGraph(rl()).elements.L1 as TwoTerminalResult).current;
  const cosPhi = Math.abs(Math.cos(Math.atan2(ph.im, ph.re)));
  const expected = (T: number) => cosPhi * Math.exp(-(T - 1 / f) / tau);

  it('after 0.5 τ the gap is large and as the closed form says', () => {
    const T = 0.5 * tau;
    const r = transientGraph(rl(), { stopS: T, stepS: 1e-4, tolerance: 1e-7, start: 'given' });
    const s = r[STEADY_STATE_FIELD];
    expect(s.sineDriven).toBe(true);
    if (!s.sineDriven) return;
    expect(s.fromS).toBeCloseTo(T - 1 / f, 12);
    expect(s.toS).toBeCloseTo(T, 12);
    expect(s.gap).toBeGreaterThan(0.2);
    expect(Math.abs(s.gap / expected(T) - 1)).toBeLessThan(1e-3);
    expect(s.worst).toMatch(/"(L1|R1|V1)"/);
  });

  it('after 10 τ the gap is small (e^(−9.8) of cos φ, and the rounding of the run)', () => {
    const T = 10 * tau;
    const r = transientGraph(rl(), { stopS: T, stepS: 1e-4, tolerance: 1e-5, start: 'given' });
    const s = r[STEADY_STATE_FIELD];
    expect(s.sineDriven).toBe(true);
    if (!s.sineDriven) return;
    expect(s.gap).toBeLessThan(1e-3);
    expect(s.gap).toBeLessThan(expected(T) + 1e-4);
  });

  it('a sine waveform at the model frequency counts as the phasor it equals; other drives say why there is no gap', () => {
    const sine = transientGraph(rl({ waveform: { shape: 'sine', amplitude: 100, frequencyHz: f, phaseDeg: -90 } }), { stopS: 0.05, stepS: 1e-4, tolerance: 1e-4, start: 'given' });
    const plain = transientGraph(rl(), { stopS: 0.05, stepS: 1e-4, tolerance: 1e-4, start: 'given' });
    expect(sine[STEADY_STATE_FIELD]).toEqual(plain[STEADY_STATE_FIELD]);
    const step = transientGraph(rl({ waveform: { shape: 'step', before: 0, after: 1, atS: 0 } }), { stopS: 0.05, stepS: 1e-4, tolerance: 1e-4, start: 'given' });
    expect(step[STEADY_STATE_FIELD]).toEqual({ sineDriven: false, reason: 'source "V1" has a step waveform' });
    const short = transientGraph(rl(), { stopS: 0.01, stepS: 1e-4, tolerance: 1e-4, start: 'given' });
    expect(short[STEADY_STATE_FIELD]).toEqual({ sineDriven: false, reason: 'the run is shorter than one period' });
    const other = transientGraph(rl({ waveform: { shape: 'sine', amplitude: 1, frequencyHz: 60 } }), { stopS: 0.05, stepS: 1e-4, tolerance: 1e-4, start: 'given' });
    expect(other[STEADY_STATE_FIELD]).toEqual({ sineDriven: false, reason: 'source "V1" runs at 60 Hz, not the model\'s 50 Hz' });
  });
});
