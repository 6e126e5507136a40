import { describe, it, expect } from 'vitest';
import { join } from 'node:path';
import { cliHarness, root } from './bundle';
/**
 * `harmonics` through the command line as a script would call it (README,
 * "Command line"): the output's schema, orders and figures; --count and --probe
 * out of range are usage errors (exit 2); a source that is not periodic, or
 * shares no common fundamental, is refused naming it (exit 1); one line on
 * standard error and nothing on standard output either way.
 */

const { run, fileWith } = cliHarness('coilwright-harmonics-');
const model = (elements: unknown[]) => ({ schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'peak', ground: 'gnd', elements, couplings: [] });
// a ±10 V square wave at 1 kHz into 10 Ω in series with 1 mH (values of our own)
const rl = fileWith(model([
  { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'square', low: -10, high: 10, frequencyHz: 1000 } },
  { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 10 },
  { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: 1e-3 },
]));

describe('harmonics from the command line', () => {
  it('prints each odd harmonic of the square drive, solved as a phasor: I_n = V_n/(R + jnωL)', () => {
    const r = run(['harmonics', rl, '--count', '21']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.schema).toBe('coilwright.harmonics/1');
    expect(out.amplitudes).toBe('peak');
    expect(out.fundamentalHz).toBe(1000);
    expect(out.count).toBe(21);
    expect(out.orders).toEqual([1, 3, 5, 7, 9, 11, 13, 15, 17, 19, 21]);
    expect(out.frequenciesHz[1]).toBe(3000);
    out.orders.forEach((n: number, k: number) => {
      // peak harmonic of a ±10 V square wave: 40/(πn) (standard); impedance R + jnωL (Ohm)
      const vn = 40 / (Math.PI * n);
      const zn = Math.hypot(10, 2 * Math.PI * 1000 * n * 1e-3);
      const i = out.elements.L1.current.phasors[k];
      expect(Math.hypot(i.re, i.im)).toBeCloseTo(vn / zn, 12);
      // peak phasors: P_n = ½·|I_n|²·R in the resistor (standard)
      expect(out.elements.R1.power[k].watts).toBeCloseTo(0.5 * (vn / zn) ** 2 * 10, 12);
    });
    expect(out.elements.R1.watts).toBeCloseTo(out.balance.totalDissipated, 12);
    expect(out.balance.totalDelivered).toBeCloseTo(out.balance.totalDissipated, 10);
    // Parseval: the source's RMS from 11 odd harmonics, Σ (40/(πn))²/2 under the root
    let ms = 0;
    for (let n = 1; n <= 21; n += 2) ms += (40 / (Math.PI * n)) ** 2 / 2;
    expect(out.elements.V1.voltage.rms).toBeCloseTo(Math.sqrt(ms), 12);
    expect(out.warnings).toEqual([]);
  });

  it('--probe keeps only the named entries; the default count is 203', () => {
    const r = run(['harmonics', rl, '--probe', 'b,R1']);
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out.nodes)).toEqual(['b']);
    expect(Object.keys(out.elements)).toEqual(['R1']);
    expect(out.count).toBe(203);
    expect(out.orders).toHaveLength(102);
    // a square wave's THD, √(Σ_{odd 3..203} 1/n²), tends to √(π²/8 − 1) ≈ 48.3 % (standard)
    const w = run(['harmonics', rl, '--probe', 'V1']);
    expect(JSON.parse(w.stdout).elements.V1.voltage.thd).toBeCloseTo(0.480884, 5);
  });

  it('reads a sheet saved by the editor, as the other commands do', () => {
    const r = run(['harmonics', join(root, 'examples', 'sheets', 'wireless-charging-85khz.json'), '--count', '3']);
    expect(r.status).toBe(0);
    // the sheet's source follows its phasor: one line at 85 kHz
    expect(JSON.parse(r.stdout).orders).toEqual([1]);
  });

  it.each([
    [['--count', '0'], /--count must be a whole number from 1 to 100000/],
    [['--count', '100001'], /--count/],
    [['--count', '2.5'], /--count/],
    [['--count'], /--count needs a value/],
    [['--probe', 'nowhere'], /"nowhere" is neither a node nor an element/],
    [['--probe', ''], /--probe needs/],
    [['--stop', '1'], /unknown option "--stop" for harmonics/],
  ])('%j is a usage error naming the option', (args, message) => {
    const r = run(['harmonics', rl, ...args]);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message);
  });

  it.each([
    ['a step', { shape: 'step', before: 0, after: 5, atS: 1e-3 }, /element "V2" \(voltage-source\): its waveform has no harmonic steady state: a step is not periodic/],
    ['no common fundamental', { shape: 'sine', amplitude: 1, frequencyHz: 1000 * Math.SQRT2 }, /element "V2": its 1414\.2.* Hz shares no common fundamental with "V1" at 1000 Hz/],
    ['above the count', { shape: 'sine', amplitude: 1, frequencyHz: 250e3 }, /element "V2": its 250000 Hz is harmonic 250 .* ask for at least 250/],
  ])('a source with %s is refused naming it (exit 1)', (_what, waveform, message) => {
    const f = fileWith(model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 0, phaseDeg: 0, waveform: { shape: 'square', low: -1, high: 1, frequencyHz: 1000 } },
      { id: 'V2', kind: 'voltage-source', nodes: ['b', 'a'], magnitude: 0, phaseDeg: 0, waveform },
      { id: 'R1', kind: 'resistor', nodes: ['b', 'gnd'], ohms: 10 },
    ]));
    const r = run(['harmonics', f]);
    expect(r.stdout).toBe('');
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message);
  });

  it('a circuit without a periodic source is refused (exit 1)', () => {
    const f = fileWith({ ...model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 3, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 10 },
    ]), frequencyHz: 0 });
    const r = run(['harmonics', f]);
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/no source of the circuit is periodic/);
  });
});
