import { describe, it, expect, beforeAll } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildCli, cliOut } from '../../scripts/build-cli.mjs';

/**
 * Every refusal the graph-model contract lists, through the command line as a
 * script would call it: exit 1, one line on standard error naming the
 * culprit, nothing on standard output (contract: "Refusals").
 */

const dir = mkdtempSync(join(tmpdir(), 'coilwright-cli-'));
let counter = 0;

function run(args: string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [cliOut, ...args], { encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

function fileWith(content: string | Buffer): string {
  const p = join(dir, `m${counter++}.json`);
  writeFileSync(p, content);
  return p;
}

const base = (elements: unknown[], couplings: unknown[] = [], extra: Record<string, unknown> = {}) =>
  JSON.stringify({ schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd', elements, couplings, ...extra });

const V = { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 0 };
const R = { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 10 };
const La = { id: 'La', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.1 };
const Lb = { id: 'Lb', kind: 'inductor', nodes: ['c', 'gnd'], henries: 0.4 };
const Lc = { id: 'Lc', kind: 'inductor', nodes: ['d', 'gnd'], henries: 0.2 };
const Rc = { id: 'Rc', kind: 'resistor', nodes: ['c', 'gnd'], ohms: 5 };
const Rd = { id: 'Rd', kind: 'resistor', nodes: ['d', 'gnd'], ohms: 5 };

const cases: { name: string; content: string | Buffer; culprit: RegExp }[] = [
  { name: 'unknown kind', content: base([V, { id: 'X1', kind: 'memristor', nodes: ['a', 'gnd'] }]), culprit: /"X1".*unknown kind "memristor"/ },
  { name: 'missing value', content: base([V, { id: 'R9', kind: 'resistor', nodes: ['a', 'gnd'] }]), culprit: /"R9".*ohms is missing/ },
  { name: 'k > 1', content: base([V, R, La, Lb, Rc], [{ id: 'K1', windings: ['La', 'Lb'], k: 1.2 }]), culprit: /coupling "K1".*k = 1.2.*between 0 and 1/ },
  { name: 'M > sqrt(L1·L2)', content: base([V, R, La, Lb, Rc], [{ id: 'K1', windings: ['La', 'Lb'], henries: 0.3 }]), culprit: /coupling "K1".*M = 0.3 H.*sqrt\(L1·L2\) = 0.2 H/ },
  { name: 'negative resistance', content: base([V, { ...R, ohms: -3 }, La]), culprit: /"R1".*ohms must be greater than 0, got -3/ },
  { name: 'zero inductance', content: base([V, R, { ...La, henries: 0 }]), culprit: /"La".*henries must be greater than 0, got 0/ },
  { name: 'zero capacitance', content: base([V, R, { id: 'C1', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 0 }]), culprit: /"C1".*farads must be greater than 0/ },
  { name: 'coupling names a missing element', content: base([V, R, La], [{ id: 'K1', windings: ['La', 'Lz'], k: 0.5 }]), culprit: /coupling "K1".*"Lz" is not an element/ },
  { name: 'coupling names a non-inductor', content: base([V, R, La], [{ id: 'K1', windings: ['La', 'R1'], k: 0.5 }]), culprit: /coupling "K1".*"R1" is a resistor, not an inductor/ },
  { name: 'duplicate id', content: base([V, R, { ...La, id: 'R1' }]), culprit: /element "R1": duplicate id/ },
  {
    name: 'node reached only through capacitors at 0 Hz',
    content: base([V, { id: 'C1', kind: 'capacitor', nodes: ['a', 'm'], farads: 1e-6 }, { id: 'C2', kind: 'capacitor', nodes: ['m', 'gnd'], farads: 1e-6 }], [], { frequencyHz: 0 }),
    culprit: /node "m".*undetermined at 0 Hz/,
  },
  { name: 'loop of voltage sources', content: base([V, { ...V, id: 'V2', magnitude: 5 }, R, La]), culprit: /"V2".*"V1".*loop of voltage sources/ },
  {
    name: 'loop of a voltage source and transformer windings',
    content: base([V, { id: 'T1', kind: 'ideal-transformer', nodes: ['a', 'gnd', 's', 'gnd'], ratio: 2 }, { id: 'V2', kind: 'voltage-source', nodes: ['s', 'gnd'], magnitude: 5, phaseDeg: 0 }]),
    culprit: /"V2".*loop/,
  },
  {
    name: 'cut set of current sources',
    content: base([V, R, La, { id: 'I1', kind: 'current-source', nodes: ['b', 'q'], magnitude: 1, phaseDeg: 0 }, { id: 'R2', kind: 'resistor', nodes: ['q', 'r'], ohms: 3 }]),
    culprit: /"I1".*cut set of current sources/,
  },
  {
    name: 'inductance matrix not positive semidefinite',
    content: base([V, R, La, Lb, Lc, Rc, Rd], [
      { id: 'K12', windings: ['La', 'Lb'], k: 0.9 },
      { id: 'K13', windings: ['La', 'Lc'], k: 0.9 },
      { id: 'K23', windings: ['Lb', 'Lc'], k: 0.1 },
    ]),
    // det [[1,.9,.9],[.9,1,.1],[.9,.1,1]] = −0.468 < 0 (hand computation)
    culprit: /coupling "K\d\d".*not positive semidefinite/,
  },
  { name: 'not JSON', content: 'this is not json', culprit: /not a JSON file/ },
  { name: 'binary', content: Buffer.from([0, 159, 146, 150, 255, 1, 2, 3, 123, 34]), culprit: /not a JSON file/ },
  { name: 'truncated', content: base([V, R, La]).slice(0, 60), culprit: /not a JSON file/ },
  { name: 'not this schema', content: JSON.stringify({ schema: 'other/1', elements: [] }), culprit: /"schema" must be "coilwright.graph\/1"/ },
  { name: 'a newer schema', content: JSON.stringify({ schema: 'coilwright.graph/9', elements: [] }), culprit: /newer version/ },
  { name: 'a JSON array', content: '[1,2,3]', culprit: /expected a JSON object/ },
  { name: 'a huge number', content: base([V, { ...R, ohms: '1e999' }]).replace('"1e999"', '1e999'), culprit: /"R1".*ohms must be a finite number/ },
  { name: 'a wrong type', content: base([V, { ...R, ohms: '10 ohm' }]), culprit: /"R1".*ohms has the wrong type/ },
  { name: 'a source phase at 0 Hz', content: base([{ ...V, phaseDeg: 30 }, R, La], [], { frequencyHz: 0 }), culprit: /"V1".*phaseDeg must be 0 or 180/ },
  { name: 'a missing ground', content: base([V, R, La], [], { ground: 'earth' }), culprit: /node "earth".*ground node is not a terminal/ },
  { name: 'a negative frequency', content: base([V, R, La], [], { frequencyHz: -50 }), culprit: /frequencyHz must be 0 or more/ },
  // 5e-324 is the smallest subnormal double: 1/5e-324 overflows to Infinity (IEEE 754, from memory); it is no undetermined node
  { name: 'a 5e-324 Ω resistor', content: base([V, R, { ...R, id: 'R2', nodes: ['b', 'gnd'], ohms: 5e-324 }]), culprit: /"R2" \(resistor\): ohms must lie between 1e-150 and 1e150 in size.*got 5e-324/ },
  { name: 'a source beyond double range', content: base([{ ...V, magnitude: 1e151 }, { ...R, nodes: ['a', 'gnd'] }]), culprit: /"V1".*magnitude must lie between 1e-150 and 1e150/ },
  {
    name: 'a power beyond double range',
    content: base([{ ...V, magnitude: 1e150 }, { ...R, ohms: 1e-10 }, { ...R, id: 'R2', nodes: ['b', 'gnd'], ohms: 1e-10 }]),
    // P = V²/R = 1e300/2e-10 = 5e309 W > 1.8e308, the largest double (IEEE 754, from memory)
    culprit: /"V1": its power overflows at 50 Hz/,
  },
  // ω0 = 1/√(LC) (closed form): 1 H and 1 F at f = 1/(2π) Hz, which rounds to ω = 1 exactly in double precision
  {
    name: 'an exact series LC resonance across a voltage source',
    content: base([V, { ...La, nodes: ['a', 'b'], henries: 1 }, { id: 'C1', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 1 }], [], { frequencyHz: 1 / (2 * Math.PI) }),
    culprit: /"La" and "C1" are in exact resonance.*across the ideal voltage source "V1".*defined answer only if a resistance breaks it/,
  },
  {
    name: 'an exact parallel LC resonance driven by a current source',
    content: base([{ id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 1, phaseDeg: 0 }, { ...La, nodes: ['a', 'gnd'], henries: 1 }, { id: 'C1', kind: 'capacitor', nodes: ['a', 'gnd'], farads: 1 }], [], { frequencyHz: 1 / (2 * Math.PI) }),
    culprit: /"La" and "C1" are in exact resonance.*defined answer only if a resistance breaks it/,
  },
  {
    name: 'two k = 1 windings each driven by a voltage source',
    content: base([V, { ...La, nodes: ['a', 'gnd'] }, { ...V, id: 'V2', nodes: ['c', 'gnd'] }, Lb], [{ id: 'K1', windings: ['La', 'Lb'], k: 1 }]),
    // the singular column may be a source's current or one of its nodes, as rounding decides; the coupling is named either way
    culprit: /(element "V\d" \(voltage-source\)|node "[ac]"): its (current|voltage) is undetermined.*coupling "K1" \(windings "La" and "Lb", k = 1\)/,
  },
];

beforeAll(async () => {
  await buildCli();
});

describe('command-line refusals', () => {
  for (const c of cases) {
    it(`refuses ${c.name}`, () => {
      const r = run(['solve', fileWith(c.content)]);
      expect(r.status).toBe(1);
      expect(r.stdout).toBe('');
      const lines = r.stderr.trimEnd().split('\n');
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(c.culprit);
      expect(r.stderr).not.toMatch(/\bat .*\.(m?js|ts):\d+/); // no stack trace
    });
  }

  it('exits 2 for a wrong command line', () => {
    const good = fileWith(base([V, R, La]));
    for (const args of [[], ['frobnicate', good], ['solve'], ['sweep', good, '--from', '10'], ['sweep', good, '--from', 'x', '--to', '5', '--points', '3'], ['sweep', good, '--from', '0', '--to', '5', '--points', '3', '--log'], ['sweep', good, '--from', '1', '--to', '5', '--points', '3', '--probe', 'nowhere'], ['solve', join(dir, 'missing.json')]]) {
      const r = run(args);
      if (args.length === 0) {
        expect(r.status).toBe(0); // no arguments: usage on stdout
        continue;
      }
      expect(r.status, args.join(' ')).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
    }
  });

  it('solves and sweeps a good file with exit 0', () => {
    const good = fileWith(base([V, R, La]));
    const s = run(['solve', good]);
    expect(s.status).toBe(0);
    const res = JSON.parse(s.stdout);
    expect(res.schema).toBe('coilwright.result/1');
    // series RL: I = V/(R + jωL) = 10/(10 + j·31.4159) (Ohm's law)
    const w = 2 * Math.PI * 50 * 0.1;
    const d = 100 + w * w;
    expect(res.elements.R1.current.re).toBeCloseTo((10 * 10) / d, 12);
    expect(res.elements.R1.current.im).toBeCloseTo((-10 * w) / d, 12);
    const sw = run(['sweep', good, '--from', '10', '--to', '1000', '--points', '5', '--log', '--probe', 'b,La']);
    expect(sw.status).toBe(0);
    const out = JSON.parse(sw.stdout);
    expect(out.schema).toBe('coilwright.sweep/1');
    expect(out.frequenciesHz).toHaveLength(5);
    expect(out.frequenciesHz[2]).toBeCloseTo(100, 9); // geometric middle of 10 and 1000
    expect(Object.keys(out.nodes)).toEqual(['b']);
    expect(Object.keys(out.elements)).toEqual(['La']);
    expect(out.elements.La.current).toHaveLength(5);
  });
});
