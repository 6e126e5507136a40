import { describe, it, expect } from 'vitest';
import { cliHarness } from './bundle';

/**
 * `tf` through the command line as a script would call it (contract:
 * time-and-s-domain.md, "tf" and "Exit status"): the answer's fields; unknown
 * source, node or element and a malformed output are usage errors (exit 2);
 * a structurally unsolvable model is refused as `solve` refuses it (exit 1);
 * one line on standard error and nothing on standard output either way.
 */

const { run, fileWith } = cliHarness('coilwright-tf-');
const model = (elements: unknown[], couplings: unknown[] = []) => ({ schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd', elements, couplings });
const rlc = fileWith(model([
  { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
  { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 10 },
  { id: 'L1', kind: 'inductor', nodes: ['b', 'c'], henries: 1e-3 },
  { id: 'C1', kind: 'capacitor', nodes: ['c', 'gnd'], farads: 1e-6 },
]));

describe('tf from the command line', () => {
  it('prints the transfer function of a series RLC: H = ω0²/(s² + (R/L)s + ω0²) at the capacitor', () => {
    const r = run(['tf', rlc, '--input', 'V1', '--output', 'node:c']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const t = JSON.parse(r.stdout);
    expect(t.schema).toBe('coilwright.transfer/1');
    expect(t.input).toBe('V1');
    expect(t.output).toBe('node:c');
    // series RLC, standard second-order circuit (from memory): ω0² = 1/(LC) = 1e9, R/L = 1e4
    expect(t.gain).toBeCloseTo(1e9, -1);
    expect(t.denominator[0]).toBe(1);
    expect(t.denominator[1] / 1e4).toBeCloseTo(1, 12);
    expect(t.denominator[2] / 1e9).toBeCloseTo(1, 12);
    expect(t.zeros).toEqual([]);
    expect(t.poles).toHaveLength(2);
    expect(t.naturalFrequencies).toHaveLength(2);
    expect(t.warnings).toEqual([]);
  });

  const usage: [string, string[], RegExp][] = [
    ['an unknown source', ['--input', 'V9', '--output', 'node:c'], /--input: "V9" is not an element/],
    ['an input that is not a source', ['--input', 'R1', '--output', 'node:c'], /"R1" is a resistor, not a voltage or current source/],
    ['an unknown node', ['--input', 'V1', '--output', 'node:zz'], /"zz" is not a node/],
    ['an unknown element', ['--input', 'V1', '--output', 'current:X1'], /"X1" is not an element/],
    ['an output of the wrong form', ['--input', 'V1', '--output', 'charge:C1'], /--output must be node:NAME, voltage:ELEMENT or current:ELEMENT/],
    ['a missing --output', ['--input', 'V1'], /tf needs --output/],
    ['a missing --input', ['--output', 'node:c'], /tf needs --input/],
  ];
  for (const [name, args, message] of usage) {
    it(`is a usage error: ${name}`, () => {
      const r = run(['tf', rlc, ...args]);
      expect(r.status).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(message);
    });
  }

  it('refuses a loop of voltage sources as solve does (exit 1, one line naming it)', () => {
    const f = fileWith(model([
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'V2', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 2, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 1 },
    ]));
    const r = run(['tf', f, '--input', 'V1', '--output', 'node:a']);
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/"V2".*"V1".*loop of voltage sources/);
  });

  it('answers the far end of a 6-section RLC ladder, an all-pole H: 12 poles, no zero, H(0) = 1', () => {
    const elements: unknown[] = [{ id: 'V1', kind: 'voltage-source', nodes: ['a0', 'gnd'], magnitude: 1, phaseDeg: 0 }];
    for (let i = 0; i < 6; i++) {
      elements.push({ id: `R${i}`, kind: 'resistor', nodes: [`a${i}`, `m${i}`], ohms: 1 });
      elements.push({ id: `L${i}`, kind: 'inductor', nodes: [`m${i}`, `a${i + 1}`], henries: 1e-3 });
      elements.push({ id: `C${i}`, kind: 'capacitor', nodes: [`a${i + 1}`, 'gnd'], farads: 1e-6 });
    }
    const r = run(['tf', fileWith(model(elements)), '--input', 'V1', '--output', 'node:a6']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const t = JSON.parse(r.stdout);
    expect(t.zeros).toEqual([]);
    expect(t.poles).toHaveLength(12);
    expect(t.numerator).toHaveLength(1);
    expect(t.warnings).toEqual([]);
    // with the far end open no current flows at 0 Hz, so H(0) = 1 (Kirchhoff's laws, common practice): the
    // gain equals the product of −p over the poles, which is the denominator's constant term
    expect(t.numerator[0] / t.denominator[12]).toBeCloseTo(1, 9);
  });

  it('refuses a pencil singular at every s (two identical windings with k = 1 in parallel), exit 1, one line', () => {
    const f = fileWith(model([
      { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 10 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: 1e-3, dot: 'first' },
      { id: 'L2', kind: 'inductor', nodes: ['a', 'gnd'], henries: 1e-3, dot: 'first' },
    ], [{ id: 'K1', windings: ['L1', 'L2'], k: 1 }]));
    const r = run(['tf', f, '--input', 'I1', '--output', 'node:a']);
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/"L2".*undetermined/);
  });

  it('refuses a cut set of current sources (exit 1)', () => {
    const f = fileWith(model([
      { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 1 },
      { id: 'C1', kind: 'capacitor', nodes: ['b', 'a'], farads: 1e-6 },
    ]));
    const r = run(['tf', f, '--input', 'I1', '--output', 'node:a']);
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/"I1".*cut set of current sources/);
  });
});
