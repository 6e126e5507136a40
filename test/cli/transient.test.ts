import { describe, it, expect } from 'vitest';
import { cliHarness } from './bundle';
import { formatJson } from '../../src/cli/format';
import { parseGraphModel, transientGraph } from '../../src/solver';
/**
 * `transient` through the command line as a script would call it (contract:
 * time-and-s-domain.md, "transient" and "Exit status"): the output times and
 * fields; --stop, --step, --tolerance, --start and --probe out of range are
 * usage errors (exit 2), a structurally unsolvable model is refused (exit 1);
 * one line on standard error and nothing on standard output either way.
 */

const { run, fileWith } = cliHarness('coilwright-transient-');
const model = (elements: unknown[]) => ({ schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'peak', ground: 'gnd', elements, couplings: [] });
// a 10 V step into R = 10 Ω and L = 10 mH: i(t) = 1 − e^(−t/τ) A, τ = L/R = 1 ms (closed form, first-order circuit)
const rl = fileWith(model([
  { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 0, waveform: { shape: 'step', before: 0, after: 10, atS: 0 } },
  { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 10 },
  { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: 10e-3 },
]));

describe('transient from the command line', () => {
  it('prints the RL step response at every output step, to the tolerance asked', () => {
    const r = run(['transient', rl, '--stop', '5e-3', '--step', '1e-4', '--tolerance', '1e-7']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.schema).toBe('coilwright.transient/1');
    expect(out.timesS).toHaveLength(51);
    expect(out.timesS[50]).toBeCloseTo(5e-3, 15);
    expect(out.nodes.gnd.every((v: number) => v === 0)).toBe(true);
    const i = out.elements.L1.current as number[];
    out.timesS.forEach((t: number, k: number) => expect(Math.abs(i[k] - (1 - Math.exp(-t / 1e-3)))).toBeLessThan(1e-5));
    // power = v·i absorbed (graph-model reference directions): the source delivers, so its power is negative
    expect(out.elements.V1.power[10]).toBeCloseTo(-10 * i[10], 9);
    expect(out.warnings).toEqual([]);
  });

  it('--probe keeps only the named entries; --start dc starts from the operating point', () => {
    const r = run(['transient', rl, '--stop', '1e-3', '--probe', 'L1,b', '--start', 'dc']);
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out.nodes)).toEqual(['b']);
    expect(Object.keys(out.elements)).toEqual(['L1']);
    // the step is at t = 0, so the operating point holds it after: i = 10 V / 10 Ω = 1 A throughout
    for (const v of out.elements.L1.current) expect(v).toBeCloseTo(1, 6);
    expect(out.timesS).toHaveLength(1001);
  });

  it.each([
    [['--stop', '0'], /--stop must be above 0/],
    [['--stop', '1e-3', '--step', '0'], /--step/],
    [['--stop', '1e-3', '--step', '2e-3'], /--step/],
    [['--stop', '1', '--step', '1e-7'], /1,000,000|samples/],
    [['--stop', '1e-3', '--tolerance', '1e-11'], /--tolerance/],
    [['--stop', '1e-3', '--tolerance', '0.1'], /--tolerance/],
    [['--stop', '1e-3', '--start', 'cold'], /--start/],
    [['--stop', '1e-3', '--probe', 'nowhere'], /nowhere/],
    [[], /--stop/],
  ])('%j is a usage error naming the option', (args, message) => {
    const r = run(['transient', rl, ...args]);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message);
  });

  it('two voltage sources in parallel are refused naming both, as solve refuses them (exit 1)', () => {
    const loop = fileWith(model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'V2', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 2, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 1 },
    ]));
    const r = run(['transient', loop, '--stop', '1e-3']);
    expect(r.stdout).toBe('');
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/"V2".*"V1"|"V1".*"V2"/);
  });

  const R = { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 1 };
  const V = { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 };
  it.each([
    ['a square edge longer than its half period', [{ ...V, waveform: { shape: 'square', low: 0, high: 1, frequencyHz: 1000, edgeS: 1e-3 } }, R], [], /"V1".*waveform\.edgeS/],
    ['toggle times out of order', [V, { id: 'S1', kind: 'switch', nodes: ['a', 'b'], closed: true, togglesS: [2e-3, 1e-3] }, { ...R, nodes: ['b', 'gnd'] }], [], /"S1".*togglesS\[1\]/],
    ['an open resistance below the closed one', [V, { id: 'S1', kind: 'switch', nodes: ['a', 'b'], closed: true, onOhms: 2, offOhms: 1 }, { ...R, nodes: ['b', 'gnd'] }], [], /"S1".*offOhms/],
    ['an initial voltage that is not a number', [V, { id: 'C1', kind: 'capacitor', nodes: ['a', 'gnd'], farads: 1e-6, initialVolts: 'x' }], [], /"C1".*initialVolts/],
    ['an initial current that is not finite', [V, { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: 1e-3, initialAmps: '1e999' }], [], /"L1".*initialAmps/],
    ['--start dc where a node is reached only through capacitors (0 Hz rules)', [V, { id: 'C1', kind: 'capacitor', nodes: ['a', 'b'], farads: 1e-6 }, { id: 'C2', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 1e-6 }], ['--start', 'dc'], /node "b".*0 Hz/],
  ])('%s is refused in one line naming it (exit 1)', (_what, elements, extra, message) => {
    const r = run(['transient', fileWith(model(elements)), '--stop', '1e-3', ...extra]);
    expect(r.stdout).toBe('');
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message);
  });

  it('adds how far the last period is from the phasor steady state, and prints what the engine gives', () => {
    // a 50 Hz sine into R = 10 Ω, L = 1 H (τ = 0.1 s) for 0.05 s: far from settled (steady-state.test.ts holds
    // the figure to its closed form); the added field sits beside the contract's, which are unchanged
    const content = { ...model([{ ...V, magnitude: 100, phaseDeg: -90 }, { ...R, nodes: ['a', 'b'], ohms: 10 }, { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: 1 }]) };
    const file = fileWith(content);
    const r = run(['transient', file, '--stop', '0.05', '--step', '1e-3']);
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out)).toEqual(['schema', 'timesS', 'nodes', 'elements', 'warnings', 'coilwright.steadyState']);
    expect(out['coilwright.steadyState']).toMatchObject({ sineDriven: true, frequencyHz: 50, toS: 0.05 });
    expect(out['coilwright.steadyState'].fromS).toBeCloseTo(0.03, 12);
    expect(out['coilwright.steadyState'].gap).toBeGreaterThan(0.3);
    expect(r.stdout).toBe(formatJson(transientGraph(parseGraphModel(content as never), { stopS: 0.05, stepS: 1e-3, tolerance: 1e-4, start: 'given' })) + '\n');
    const stepped = run(['transient', rl, '--stop', '0.04', '--step', '1e-3']);
    expect(JSON.parse(stepped.stdout)['coilwright.steadyState']).toEqual({ sineDriven: false, reason: 'source "V1" has a step waveform' });
  });
});
