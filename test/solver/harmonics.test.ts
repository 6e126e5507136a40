import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { harmonicPlan, harmonicSteadyState, ModelRefusal, parseGraphModel, solveGraph, transientGraph } from '../../src/solver';
import { rebuildPeriod } from '../../src/model/fourier';
import type { GraphModel, HarmonicSeries } from '../../src/model/graph';

const model = (elements: unknown[], extra: Partial<GraphModel> = {}): GraphModel =>
  parseGraphModel({ schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd', elements, couplings: [], ...extra });

/** The example of examples/graphs: the 85 kHz wireless pair, its inverter giving a ±50 V square wave (a full bridge). */
function squarePair(): GraphModel {
  return parseGraphModel(JSON.parse(readFileSync(new URL('../../examples/graphs/wireless-square-drive-85khz.json', import.meta.url), 'utf8')));
}

const mag = (z: { re: number; im: number }) => Math.hypot(z.re, z.im);

describe('harmonic steady state', () => {
  it('a square voltage into a resistor: each current harmonic is V_n/R and the RMS is the square wave\'s (Parseval, Ohm)', () => {
    const m = model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'square', low: 0, high: 10, frequencyHz: 1000 } },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 5 },
    ]);
    const r = harmonicSteadyState(m);
    expect(r.schema).toBe('coilwright.harmonics/1');
    expect(r.fundamentalHz).toBe(1000);
    // duty 0.5: DC and the odd orders only (the even coefficients vanish, standard)
    expect(r.orders.slice(0, 4)).toEqual([0, 1, 3, 5]);
    expect(r.orders.at(-1)).toBe(203);
    const v = r.elements.R1.voltage!;
    const i = r.elements.R1.current!;
    expect(v.phasors[0].re).toBeCloseTo(5, 12); // mean of a 0–10 V square wave
    // RMS harmonic n = (4·5/(πn))/√2 for the ±5 V part (standard)
    expect(mag(v.phasors[1])).toBeCloseTo(20 / Math.PI / Math.SQRT2, 12);
    expect(mag(i.phasors[2])).toBeCloseTo(20 / (3 * Math.PI) / Math.SQRT2 / 5, 12);
    // true RMS of a 0–10 V square wave of duty 0.5 is √50 = 7.07 V; 203 harmonics keep it to 0.1 % of the AC part
    expect(Math.abs(v.rms - Math.sqrt(50)) / Math.sqrt(50)).toBeLessThan(1e-3);
    // average power: Σ over the orders = mean of v²/R = 50/5 W, less the truncated tail (under 0.2 % of the AC part's 25/5 W)
    expect(Math.abs(r.elements.R1.watts - 10)).toBeLessThan(0.002 * 5);
    expect(r.balance.totalDissipated).toBeCloseTo(r.elements.R1.watts, 12);
    expect(r.balance.totalDelivered).toBeCloseTo(r.elements.R1.watts, 10);
  });

  it('Tellegen per harmonic: the complex powers of all parts sum to zero at every order (the wireless pair, square drive)', () => {
    const r = harmonicSteadyState(squarePair());
    r.orders.forEach((_, k) => {
      let p = 0;
      let q = 0;
      let scale = 0;
      for (const e of Object.values(r.elements)) {
        p += e.power[k].watts;
        q += e.power[k].vars;
        scale += Math.hypot(e.power[k].watts, e.power[k].vars);
      }
      expect(Math.hypot(p, q)).toBeLessThan(1e-10 * scale);
    });
  });

  it('THD of the square drive is the truncated series of √(π²/8 − 1)', () => {
    const r = harmonicSteadyState(squarePair());
    expect(r.orders[0]).toBe(1); // no DC: a ±50 V square wave has mean 0
    // Σ_{odd 3..203} 1/n² under the root (the truncated series of √(π²/8 − 1), standard)
    let s = 0;
    for (let n = 3; n <= 203; n += 2) s += 1 / (n * n);
    expect(r.elements.Vinv.voltage!.thd!).toBeCloseTo(Math.sqrt(s), 12);
    expect(r.elements.Vinv.current!.thd!).toBeLessThan(0.1);
  });

  it('cross-check: the rebuilt period equals the last period of the time response once it has settled (TR-BDF2 engine)', () => {
    const m = squarePair();
    const f = 85000;
    const T = 1 / f;
    // the pair's modes decay as e^(−t·(R1 + R2)/(4L)) ≈ e^(−t/30 µs), 2.5 periods (series RLC, standard): 40 periods settle it to 1e-7
    const periods = 40;
    const perPeriod = 64;
    const run = transientGraph(m, { stopS: periods * T, stepS: T / perPeriod, tolerance: 1e-6, start: 'given' }, ['Lpad', 'Rbat']);
    // the currents fall as 1/n² past the tuning, so the tail beyond order N is about 1/N of the fundamental: 4001 orders
    const r = harmonicSteadyState(m, { probe: ['Lpad', 'Rbat'], count: 4001 });
    const check = (timeSeries: number[], h: HarmonicSeries) => {
      const { values } = rebuildPeriod(r.fundamentalHz, r.orders, h.phasors, Math.SQRT2, perPeriod);
      const last = timeSeries.slice(timeSeries.length - perPeriod - 1);
      const peak = Math.max(...last.map(Math.abs));
      // measured: 2.2e-5 of the peak for the primary current, 4.4e-6 for the load voltage, mostly the orders
      // above 4001 left out; the time response at tolerance 1e-6 lies between its 1e-3 (1e-4) and 1e-5 (1e-7) (contract)
      let worst = 0;
      for (let k = 0; k <= perPeriod; k++) worst = Math.max(worst, Math.abs(values[k] - last[k]) / peak);
      expect(worst).toBeLessThan(1e-4);
    };
    // the sample times of the last period, t = (periods − 1)·T + k·T/64, fall on the rebuilt grid: one whole period later
    check(run.elements.Lpad.current!, r.elements.Lpad.current!);
    check(run.elements.Rbat.voltage!, r.elements.Rbat.voltage!);
  });

  it('a circuit of sources that follow their phasors has one harmonic, the solve itself (superposition of one term)', () => {
    const m = parseGraphModel(JSON.parse(readFileSync(new URL('../../examples/graphs/wireless-charging-85khz.json', import.meta.url), 'utf8')));
    const r = harmonicSteadyState(m);
    const s = solveGraph(m);
    expect(r.orders).toEqual([1]);
    for (const [id, e] of Object.entries(s.elements)) {
      if (!('voltage' in e)) continue;
      expect(r.elements[id].voltage!.phasors[0]).toEqual(e.voltage);
      expect(r.elements[id].current!.phasors[0]).toEqual(e.current);
      expect(r.elements[id].power[0]).toEqual(e.power);
      expect(r.elements[id].current!.thd).toBe(0);
    }
    for (const [n, v] of Object.entries(s.nodes)) expect(r.nodes[n].phasors[0]).toEqual(v);
  });

  it('finds the common fundamental of sources at whole multiples: a phasor source, a sine and a constant', () => {
    const m = model([
      { id: 'I1', kind: 'current-source', nodes: ['gnd', 'b'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'constant', value: 0.25 } },
      { id: 'I2', kind: 'current-source', nodes: ['gnd', 'b'], magnitude: 0.25, phaseDeg: 0 },
      { id: 'I3', kind: 'current-source', nodes: ['gnd', 'b'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'sine', amplitude: 0.5, frequencyHz: 150 } },
      { id: 'R1', kind: 'resistor', nodes: ['b', 'gnd'], ohms: 4 },
    ], { frequencyHz: 100 });
    const plan = harmonicPlan(m);
    expect(plan.fundamentalHz).toBeCloseTo(50, 12);
    expect(plan.orders).toEqual([0, 2, 3]);
    const r = harmonicSteadyState(m);
    // superposition by hand (Ohm, 4 Ω): DC 0.25 A → 1 V; 100 Hz 0.25 A RMS → 1 V RMS; 150 Hz 0.5 A peak → 2 V peak = √2 V RMS
    const vb = r.nodes.b;
    expect(vb.phasors[0].re).toBeCloseTo(1, 12);
    expect(mag(vb.phasors[1])).toBeCloseTo(1, 12);
    expect(mag(vb.phasors[2])).toBeCloseTo(Math.SQRT2, 12);
    expect(vb.rms).toBeCloseTo(Math.sqrt(1 + 1 + 2), 12);
    // no 50 Hz fundamental at node b: no THD to print
    expect(vb.thd).toBeUndefined();
    expect(r.elements.R1.watts).toBeCloseTo(4 / 4, 12);
  });

  it.each([
    [{ shape: 'step', before: 0, after: 1, atS: 0 }, /element "V2".*a step is not periodic/],
    [{ shape: 'points', timesS: [0, 1], values: [0, 1] }, /element "V2".*not periodic/],
    [{ shape: 'sine', amplitude: 1, frequencyHz: 50 * Math.PI }, /element "V2": its 157\.07.* Hz shares no common fundamental with "V1" at 50 Hz/],
    [{ shape: 'sine', amplitude: 1, frequencyHz: 50 * 300 }, /element "V2": its 15000 Hz is harmonic 300 .* above the 203 harmonics asked for; ask for at least 300/],
  ])('refuses %j naming the source', (waveform, message) => {
    const m = model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'V2', kind: 'voltage-source', nodes: ['b', 'a'], magnitude: 1, phaseDeg: 0, waveform },
      { id: 'R1', kind: 'resistor', nodes: ['b', 'gnd'], ohms: 4 },
    ]);
    let err: unknown;
    try {
      harmonicSteadyState(m);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ModelRefusal);
    expect((err as ModelRefusal).message).toMatch(message);
    expect((err as ModelRefusal).culprits).toEqual([{ kind: 'element', id: 'V2' }]);
  });

  it('refuses a circuit with no periodic source, and names the order at which a solve fails', () => {
    expect(() => harmonicSteadyState(model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 4 },
    ], { frequencyHz: 0 }))).toThrow(/no source of the circuit is periodic/);
    // a 0–1 V square wave's DC reaches node b only through a capacitor: undetermined at 0 Hz (graph-model.md)
    expect(() => harmonicSteadyState(model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0, waveform: { shape: 'square', low: 0, high: 1, frequencyHz: 50 } },
      { id: 'C1', kind: 'capacitor', nodes: ['a', 'b'], farads: 1e-6 },
      { id: 'C2', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 1e-6 },
    ]))).toThrow(/"b".*\(harmonic 0 of 50 Hz\)/);
  });
});

describe('example: the 85 kHz wireless pair driven by a ±50 V square wave (wireless-square-drive-85khz)', () => {
  const m = squarePair();
  const r = harmonicSteadyState(m);
  const el = (id: string) => m.elements.find((e) => e.id === id) as unknown as Record<string, number>;
  const [L, C, Rp, Rs, Rl, k] = [el('Lpad').henries, el('Cp').farads, el('Rcp').ohms, el('Rcs').ohms, el('Rbat').ohms, 0.2];
  // closed form per harmonic (series-series pair, reflected impedance (nωM)²/Z2, field notes; standard):
  // Z_in(n) = Rp + jX_n + (nωM)²/(Rs + Rl + jX_n), X_n = nωL − 1/(nωC); the drive's RMS harmonic (4·50/(πn))/√2
  const w = 2 * Math.PI * 85e3;
  const byHand = (n: number) => {
    const x = n * w * L - 1 / (n * w * C);
    const wm2 = (n * w * k * L) ** 2;
    const d = (Rs + Rl) ** 2 + x * x;
    const zr = Rp + (wm2 * (Rs + Rl)) / d;
    const zi = x - (wm2 * x) / d;
    const v = 200 / (Math.PI * n) / Math.SQRT2;
    const i = v / Math.hypot(zr, zi);
    return { i, p: i * i * zr };
  };
  let pTotal = 0;
  let i2Higher = 0;
  for (let n = 1; n <= 203; n += 2) {
    const h = byHand(n);
    pTotal += h.p;
    if (n > 1) i2Higher += h.i * h.i;
  }
  const first = byHand(1);

  it('the fundamental carries 393.31 W of the 393.32 W delivered (99.996 %)', () => {
    expect(r.balance.delivered[0]).toBeCloseTo(first.p, 9);
    expect(r.balance.totalDelivered).toBeCloseTo(pTotal, 9);
    expect(r.balance.delivered[0]).toBeCloseTo(393.31, 2);
    expect(r.balance.totalDelivered).toBeCloseTo(393.32, 2);
    expect(r.balance.delivered[0] / r.balance.totalDelivered).toBeCloseTo(0.99996, 5);
    // every watt delivered is absorbed by the three resistors (energy balance per harmonic)
    expect(r.balance.totalDissipated).toBeCloseTo(r.balance.totalDelivered, 9);
  });

  it('the primary current is nearly sinusoidal: THD 2.28 % against the drive\'s 48.1 %', () => {
    const thd = r.elements.Vinv.current!.thd!;
    expect(thd).toBeCloseTo(Math.sqrt(i2Higher) / first.i, 10);
    expect(thd).toBeCloseTo(0.0228, 4);
    expect(r.elements.Vinv.voltage!.thd!).toBeCloseTo(0.4809, 4);
    // true RMS 8.739 A beside the fundamental's 8.737 A
    expect(r.elements.Vinv.current!.rms).toBeCloseTo(Math.sqrt(first.i ** 2 + i2Higher), 10);
  });
});
