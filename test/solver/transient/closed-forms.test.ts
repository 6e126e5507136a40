import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { worstDeviation } from '../../helpers';
import { parseGraphModel, solveGraph, transientGraph, transientStream } from '../../../src/solver';
import type { GraphElement, GraphModel, TwoTerminalResult } from '../../../src/model/graph';

/**
 * The time response against closed forms of circuit theory, at the accuracy
 * the contract promises (time-and-s-domain.md, "Accuracy": every sample within
 * 1e-3·P at the default tolerance, 1e-5·P at 1e-7, P the quantity's largest
 * magnitude over the run).
 */

const model = (elements: GraphElement[], frequencyHz = 50, amplitudes: 'rms' | 'peak' = 'peak'): GraphModel =>
  parseGraphModel({ schema: 'coilwright.graph/1', frequencyHz, amplitudes, ground: 'gnd', elements, couplings: [] });

const worst = (r: { timesS: number[] }, got: number[], exact: (t: number) => number) => worstDeviation(r.timesS, got, exact);

describe('time response, closed forms', () => {
  const R = 10;
  const L = 0.1;
  const tau = L / R;
  const rl = (extra: Partial<GraphElement> = {}) => model([
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'step', before: 0, after: 10, atS: tau }, ...extra } as GraphElement,
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: R },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: L },
  ]);
  // RL step: i = (V/R)·(1 − e^(−(t − t0)/τ)), τ = L/R (first-order circuit, from memory)
  const iRL = (t: number) => (t < tau * (1 - 1e-9) ? 0 : (10 / R) * (1 - Math.exp(-(t - tau) / tau)));

  it('an RL step follows (V/R)(1 − e^(−t/τ)) to 1e-3·P at the default tolerance and 1e-5·P at 1e-7', () => {
    for (const [tolerance, bound] of [[1e-4, 1e-3], [1e-7, 1e-5]]) {
      const r = transientGraph(rl(), { stopS: 6 * tau, stepS: (6 * tau) / 600, tolerance, start: 'given' });
      const { err, peak } = worst(r, r.elements.L1.current!, iRL);
      expect(err).toBeLessThan(bound * peak);
      // the resistor's voltage is i·R and the inductor's V − i·R (KVL)
      const v = worst(r, r.elements.L1.voltage!, (t) => (t < tau * (1 - 1e-9) ? 0 : 10 - R * iRL(t)));
      expect(v.err).toBeLessThan(bound * v.peak);
    }
  });

  it('a sine-driven RL from rest follows its closed form, and steps that differ by the rounding of t alone reuse one factorisation', () => {
    // v = A·cos(ωt − 90°) = A·sin ωt (the contract's cosine convention);
    // i = (A/|Z|)·(sin(ωt − φ) + sin φ·e^(−t/τ)), |Z| = √(R² + (ωL)²), φ = atan(ωL/R) (first-order circuit, from memory)
    const f = 50;
    const w = 2 * Math.PI * f;
    const A = 10;
    const Z = Math.hypot(R, w * L);
    const phi = Math.atan2(w * L, R);
    const exact = (t: number) => (A / Z) * (Math.sin(w * t - phi) + Math.sin(phi) * Math.exp(-t / tau));
    const m = rl({ waveform: { shape: 'sine', amplitude: A, frequencyHz: f, phaseDeg: -90 } } as Partial<GraphElement>);
    const stream = transientStream(m, { stopS: 0.2, stepS: 1e-4, tolerance: 1e-4, start: 'given' });
    const ts: number[] = [];
    const got: number[] = [];
    // the sample's columns: the nodes, then per one-port element its voltage, current and power
    let col = stream.layout.nodes.length;
    for (const e of stream.layout.elements) {
      if (e.id === 'L1') break;
      col += e.ports === 1 ? 3 : 5;
    }
    col += 1;
    stream.run((t, v) => {
      ts.push(t);
      got.push(v[col]);
    });
    const { err, peak } = worstDeviation(ts, got, exact);
    expect(err).toBeLessThan(1e-3 * peak);
    // the matrix G + C/(κh) depends on the step alone, and the controlled step is held at a power-of-two part
    // of the output step: a run of thousands of steps needs only a handful of factorisations
    const { steps, factorCount } = stream.engine;
    expect(steps).toBeGreaterThan(2000);
    expect(factorCount).toBeLessThan(0.02 * steps);
  });

  it('the sample at the step itself shows the value just after it', () => {
    const r = transientGraph(rl(), { stopS: 2 * tau, stepS: tau / 10, tolerance: 1e-4, start: 'given' });
    const k = r.timesS.findIndex((t) => Math.abs(t - tau) < 1e-12);
    expect(r.nodes.a[k]).toBe(10);
    expect(r.elements.L1.voltage![k]).toBeCloseTo(10, 6); // no current yet: all of V across L
  });

  it('a magnetising inductance switched in at the voltage zero draws an offset equal to its steady-state peak; at the peak, none', () => {
    const f = 50;
    const w = 2 * Math.PI * f;
    const A = 325;
    const Lm = 2;
    // switched in at the voltage zero: v = A·sin(ωt) from t = 0, i = (A/ωL)(1 − cos ωt): it swings from 0 to twice the
    // steady-state peak A/(ωL), an offset equal to that peak (standard result, from memory; field notes)
    const atZero = model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'sine', amplitude: A, frequencyHz: f, phaseDeg: -90 } },
      { id: 'Lm', kind: 'inductor', nodes: ['a', 'gnd'], henries: Lm },
    ]);
    const r = transientGraph(atZero, { stopS: 0.1, stepS: 1e-4, tolerance: 1e-4, start: 'given' });
    const ipk = A / (w * Lm);
    const { err, peak } = worst(r, r.elements.Lm.current!, (t) => ipk * (1 - Math.cos(w * t)));
    expect(err).toBeLessThan(1e-3 * peak);
    expect(Math.max(...r.elements.Lm.current!)).toBeCloseTo(2 * ipk, 3);
    // switched in at the peak: v = A·cos(ωt), i = (A/ωL)·sin ωt, no offset
    const atPeak = model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'sine', amplitude: A, frequencyHz: f } },
      { id: 'Lm', kind: 'inductor', nodes: ['a', 'gnd'], henries: Lm },
    ]);
    const p = transientGraph(atPeak, { stopS: 0.1, stepS: 1e-4, tolerance: 1e-4, start: 'given' });
    const q = worst(p, p.elements.Lm.current!, (t) => ipk * Math.sin(w * t));
    expect(q.err).toBeLessThan(1e-3 * q.peak);
  });

  it('with winding resistance the offset decays with L/R into the phasor steady state', () => {
    const f = 50;
    const w = 2 * Math.PI * f;
    const [A, Lm, Rw] = [325, 2, 40];
    const tauW = Lm / Rw;
    const m = model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: A, phaseDeg: -90 },
      { id: 'Rw', kind: 'resistor', nodes: ['a', 'b'], ohms: Rw },
      { id: 'Lm', kind: 'inductor', nodes: ['b', 'gnd'], henries: Lm },
    ], f);
    const r = transientGraph(m, { stopS: 12 * tauW, stepS: 1e-4, tolerance: 1e-4, start: 'given' });
    // i(t) = |I|·cos(ωt + φ_I) − |I|·cos(φ_I)·e^(−t/τ) (RL switched onto a sine, from memory), |I|∠φ_I the phasor current
    const ph = solveGraph(m).elements.Lm as TwoTerminalResult;
    const mag = Math.hypot(ph.current.re, ph.current.im);
    const phi = Math.atan2(ph.current.im, ph.current.re);
    const exact = (t: number) => mag * Math.cos(w * t + phi) - mag * Math.cos(phi) * Math.exp(-t / tauW);
    const { err, peak } = worst(r, r.elements.Lm.current!, exact);
    expect(err).toBeLessThan(1e-3 * peak);
    // the last period is the phasor steady state (the graph-model contract's solve)
    const last = r.timesS.length - 1;
    const tEnd = r.timesS[last];
    expect(Math.abs(r.elements.Lm.current![last] - mag * Math.cos(w * tEnd + phi))).toBeLessThan(1e-3 * mag);
  });

  it('an LC tank from an initial voltage keeps its energy within 1e-6 over 1,000 periods', () => {
    const [Lc, C] = [1e-3, 1e-6];
    const w0 = 1 / Math.sqrt(Lc * C);
    const period = (2 * Math.PI) / w0;
    const m = model([
      { id: 'C1', kind: 'capacitor', nodes: ['a', 'gnd'], farads: C, initialVolts: 1 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: Lc },
    ]);
    const r = transientGraph(m, { stopS: 1000 * period, stepS: period / 4, tolerance: 5e-4, start: 'given' });
    // E = ½Cv² + ½Li² is conserved by a lossless tank (energy argument, standard)
    const e0 = 0.5 * C;
    let drift = 0;
    r.timesS.forEach((_, k) => {
      const e = 0.5 * C * r.nodes.a[k] ** 2 + 0.5 * Lc * r.elements.L1.current![k] ** 2;
      drift = Math.max(drift, Math.abs(e - e0) / e0);
    });
    expect(drift).toBeLessThan(1e-6);
    expect(r.warnings).toEqual([]);
  });

  it('a capacitor straight across a stepped source jumps with it, conserving charge, and says so', () => {
    // two capacitors in series across a source that steps to 10 V: the charge q = C1C2/(C1+C2)·10 puts
    // 10·C2/(C1+C2) across C1 at once (charge conservation, from memory)
    const m = model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'step', before: 0, after: 10, atS: 1e-3 } },
      { id: 'C1', kind: 'capacitor', nodes: ['a', 'b'], farads: 1e-6 },
      { id: 'C2', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 3e-6 },
      { id: 'R2', kind: 'resistor', nodes: ['b', 'gnd'], ohms: 1e3 },
    ]);
    const r = transientGraph(m, { stopS: 2e-3, stepS: 1e-4, tolerance: 1e-4, start: 'given' });
    const k = r.timesS.findIndex((t) => Math.abs(t - 1e-3) < 1e-12);
    expect(r.elements.C1.voltage![k]).toBeCloseTo(10 * 0.75, 6);
    expect(r.warnings.join(' ')).toMatch(/state jump at 0\.001 s: "C1".*"C2"/);
    // afterwards C2 discharges through R2 with τ = R2·(C1 + C2) (the source shorts C1's far end): v_b = 2.5·e^(−t/τ)
    const tau = 1e3 * 4e-6;
    const last = r.timesS.length - 1;
    expect(r.nodes.b[last]).toBeCloseTo(2.5 * Math.exp(-1e-3 / tau), 3);
  });

  it('a current transformer fed from rest follows its first-order closed form (error estimates that are rounding do not stall the steps)', () => {
    // the 1:1000 CT of examples/ (20 µH : 20 H, k = 0.999, 5 Ω secondary loop), its bus current a sine from zero.
    // The primary is a current source, so the secondary obeys Ls·di_s/dt + R·i_s = −M·di_p/dt (first order,
    // from the coupled-winding law of the contract): i_s = ss(t) − ss(0)·e^(−t/τ), τ = Ls/R, ss the phasor solve.
    const raw = JSON.parse(readFileSync(new URL('../../../examples/graphs/current-transformer-burden.json', import.meta.url), 'utf8'));
    const bus = raw.elements.find((e: GraphElement) => e.id === 'Iline');
    bus.phaseDeg = -90;
    const m = parseGraphModel(raw);
    const r = transientGraph(m, { stopS: 0.06, stepS: 1e-5, tolerance: 1e-4, start: 'given' }, ['Lsec']);
    const w = 2 * Math.PI * 50;
    const ph = (solveGraph(m).elements.Lsec as TwoTerminalResult).current;
    // rms phasor: the waveform's crest is √2 times its magnitude
    const ss = (t: number) => Math.SQRT2 * (ph.re * Math.cos(w * t) - ph.im * Math.sin(w * t));
    const tauS = 20 / 5;
    const { err, peak } = worst(r, r.elements.Lsec.current!, (t) => ss(t) - ss(0) * Math.exp(-t / tauS));
    expect(err).toBeLessThan(1e-3 * peak);
  });
});
