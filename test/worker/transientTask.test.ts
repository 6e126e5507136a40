import { describe, expect, it } from 'vitest';
import type { GraphModel } from '../../src/model/graph';
import { steadyModel, transferables, transientRun } from '../../src/worker/transientTask';
import { timeCautions } from '../../src/ui/analysis/timeCautions';
import { instantResult, largestCurrent } from '../../src/ui/analysis/timeRunner';
import { model } from '../helpers';

describe('the time view\'s run in the analysis worker', () => {
  it('an RL step into typed columns: i(t) = V/R·(1 − e^(−tR/L)), with progress and its buffers listed for transfer', () => {
    // RL step response, τ = L/R (closed form, standard result)
    const V = 10, R = 5, L = 0.01;
    const m: GraphModel = model(0, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'step', before: 0, after: V, atS: 0 } },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: R },
      { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: L },
    ] as GraphModel['elements']);
    const reports: number[] = [];
    const a = transientRun(m, { stopS: 0.01, samples: 100_000 }, (done, total) => { expect(total).toBe(100_001); reports.push(done); });
    // progress at every hundredth of the samples, rising to all of them
    expect(reports.length).toBe(100);
    for (let r = 1; r < reports.length; r++) expect(reports[r]).toBeGreaterThan(reports[r - 1]);
    expect(reports[reports.length - 1]).toBe(100_001);
    expect(a.timesS).toBeInstanceOf(Float64Array);
    expect(a.timesS.length).toBe(100_001);
    const i = a.elements.find((e) => e.id === 'L1')!.current[0];
    for (const k of [1000, 20_000, 100_000]) {
      const t = a.timesS[k];
      expect(Math.abs(i[k] - (V / R) * (1 - Math.exp((-t * R) / L)))).toBeLessThan(1e-3 * (V / R));
    }
    // not sine-driven: no steady state to draw
    expect(a.steady).toBeNull();
    expect(transferables(a).length).toBe(1 + a.nodes.length + a.elements.reduce((n, e) => n + 2 * e.voltage.length + 1, 0));
    expect(largestCurrent(a)).toBeCloseTo(V / R * (1 - Math.exp(-5)), 2);
    // one instant as the overlay reads it: real values, the node voltage and the inductor's current at that sample
    const r = instantResult(a, 20_000, 0);
    expect(r.nodes.b.im).toBe(0);
    expect(r.nodes.b.re).toBeCloseTo(a.nodes.find((n) => n.name === 'b')!.values[20_000], 12);
    expect('current' in r.elements.L1 && r.elements.L1.current.re).toBeCloseTo(i[20_000], 12);
  });

  it('a refused model and bad settings fail with one line naming the culprit', () => {
    const m: GraphModel = model(50, [
      { id: 'I1', kind: 'current-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'C1', kind: 'capacitor', nodes: ['a', 'gnd'], farads: 1e-6 },
      { id: 'I2', kind: 'current-source', nodes: ['b', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 1 },
    ] as GraphModel['elements']);
    expect(() => transientRun(m, { stopS: 0.01, samples: 100 })).toThrow(/I2|"b"|node b/);
    const ok: GraphModel = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 1 },
    ] as GraphModel['elements']);
    expect(() => transientRun(ok, { stopS: 0, samples: 100 })).toThrow(/^Stop time/);
    expect(() => transientRun(ok, { stopS: 1, samples: 1e9 })).toThrow(/^Resolution/);
  });

  it('the steady state of a sine-driven run: switches as they end the run, a matching sine waveform as its phasor', () => {
    const m: GraphModel = model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 230, phaseDeg: 0, waveform: { shape: 'sine', amplitude: 230 * Math.SQRT2, frequencyHz: 50, phaseDeg: -90, startS: 0.005 } },
      { id: 'S1', kind: 'switch', nodes: ['a', 'b'], closed: false, togglesS: [0.01, 0.02, 0.03] },
      { id: 'R1', kind: 'resistor', nodes: ['b', 'gnd'], ohms: 10 },
    ] as GraphModel['elements']);
    const s = steadyModel(m, 0.1)!;
    // three toggles from open: closed at the end
    expect(s.elements.find((e) => e.id === 'S1')).toMatchObject({ closed: true });
    // 230·√2 V peak as an RMS phasor of 230 V at −90°
    const v = s.elements.find((e) => e.id === 'V1') as { magnitude: number; phaseDeg: number; waveform?: unknown };
    expect(v.magnitude).toBeCloseTo(230, 9);
    expect(v.phaseDeg).toBe(-90);
    expect(v.waveform).toBeUndefined();
    expect(steadyModel(m, 0.015)!.elements.find((e) => e.id === 'S1')).toMatchObject({ closed: true });
    expect(steadyModel(m, 0.025)!.elements.find((e) => e.id === 'S1')).toMatchObject({ closed: false });
    const square = { ...m, elements: m.elements.map((e) => (e.id === 'V1' ? { ...e, waveform: { shape: 'square', low: 0, high: 1, frequencyHz: 50 } } : e)) } as GraphModel;
    expect(steadyModel(square, 0.1)).toBeNull();
  });

  it('energising a winding at the voltage zero: the first current peak is twice the steady-state peak, and it is read out', () => {
    // v = Vm·sin(ωt) switched onto L at t = 0 gives i = Vm/(ωL)·(1 − cos ωt): first peak 2·Vm/(ωL),
    // twice the steady-state peak (switching a magnetising inductance at the voltage zero, standard result, from memory);
    // the winding's own small resistance lets the offset decay slowly
    const f = 50, L = 1, Vrms = 230;
    const m: GraphModel = model(f, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: Vrms, phaseDeg: -90 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 0.01 },
      { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: L, dot: 'first' },
      { id: 'L2', kind: 'inductor', nodes: ['s', 'gnd'], henries: 1, dot: 'first' },
      { id: 'R2', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 1e6 },
    ] as GraphModel['elements'], [{ id: 'K', windings: ['L1', 'L2'], k: 0.99 }]);
    const a = transientRun(m, { stopS: 0.04, samples: 8000 });
    expect(a.steady).not.toBeNull();
    const c = timeCautions(m, a, a.steady).find((x) => x.kind === 'inrush' && x.element === 'L1')!;
    const ssPeak = (Vrms * Math.SQRT2) / (2 * Math.PI * f * L);
    expect(Math.abs(c.peak) / ssPeak).toBeCloseTo(2, 1);
    // at half a period (10 ms)
    expect(c.atS).toBeCloseTo(0.01, 3);
    expect(c.hazard).toBe(true);
    expect(c.text).toMatch(/local codes and licensed practice/);
  });

  it('a current transformer whose burden opens: the spike across the open switch is read out with the caution', () => {
    // a CT: 100 A primary current, 1:100 turns (L2 = 100²·L1), burden 1 Ω through S1, which opens at 25 ms;
    // open, S1 leaks 100 kΩ (the insulation and stray paths a real open secondary has)
    const m: GraphModel = model(50, [
      { id: 'Ip', kind: 'current-source', nodes: ['gnd', 'p'], magnitude: 100, phaseDeg: 0 },
      { id: 'Lp', kind: 'inductor', nodes: ['p', 'gnd'], henries: 1e-4, dot: 'first' },
      { id: 'Ls', kind: 'inductor', nodes: ['s', 'gnd'], henries: 1, dot: 'first' },
      { id: 'S1', kind: 'switch', nodes: ['s', 'x'], closed: true, togglesS: [0.025], offOhms: 1e5 },
      { id: 'Rb', kind: 'resistor', nodes: ['x', 'gnd'], ohms: 1 },
    ] as GraphModel['elements'], [{ id: 'K', windings: ['Lp', 'Ls'], k: 0.999 }]);
    const a = transientRun(m, { stopS: 0.04, samples: 4000 });
    const all = timeCautions(m, a, a.steady).filter((x) => x.kind === 'open-burden');
    // one caution for the switch, naming the winding it opens (not the primary, which shares its ground)
    expect(all).toHaveLength(1);
    const c = all[0];
    expect(c.element).toBe('S1');
    expect(c.text).toMatch(/winding Ls /);
    // its ring after the opening is that caution's, not an energising current against the open circuit's steady state
    expect(timeCautions(m, a, a.steady).filter((x) => x.kind === 'inrush').map((x) => x.element)).toEqual(['Lp']);
    expect(c.atS).toBeGreaterThanOrEqual(0.025);
    // open: the secondary's open-circuit voltage ωM·I = 2π·50·(0.999·√(1e-4·1))·100·√2 ≈ 443 V peak (coupled windings, open secondary)
    const openPeak = 2 * Math.PI * 50 * 0.999 * Math.sqrt(1e-4) * 100 * Math.SQRT2;
    expect(Math.abs(c.peak)).toBeGreaterThan(0.9 * openPeak);
    expect(c.text).toMatch(/current-transformer/);
    expect(c.text).toMatch(/local electrical codes and licensed practice/);
  });
});
