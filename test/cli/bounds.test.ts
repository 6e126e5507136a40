import { beforeAll, describe, expect, it } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { closeSync, openSync, readFileSync, writeFileSync, writeSync, ftruncateSync } from 'node:fs';
import { join } from 'node:path';
import { rlcLadder } from '../../scripts/bench/generators';
import { MAX_ELEMENTS, MAX_FILE_BYTES, MAX_JSON_VALUES, MAX_SWEEP_VALUES } from '../../src/cli/limits';
import { bundleCli, root } from './bundle';

/**
 * The command line within bounds, as a script would call it. Memory is
 * bounded by the harness: the child runs with a small V8 heap
 * (--max-old-space-size) and must finish; what cannot fit is refused in one
 * line before the work starts. A closed pipe ends quietly, a write error is
 * one line, and no input ever yields "internal error" or a stack trace.
 */

let dir = '';
let cli = '';
const wireless = join(root, 'examples', 'graphs', 'wireless-charging-85khz.json');

beforeAll(async () => {
  ({ dir, cli } = await bundleCli('coilwright-bounds-'));
});

interface Run { status: number | null; stdout: string; stderr: string }

/** Runs the command line; `heapMb` caps the child's JavaScript heap; `stdout` may be a file descriptor to write to instead of a pipe. */
function run(args: string[], o: { heapMb?: number; stdout?: number } = {}): Run {
  const flags = o.heapMb ? [`--max-old-space-size=${o.heapMb}`] : [];
  const r = spawnSync(process.execPath, [...flags, cli, ...args], { encoding: 'utf8', stdio: ['ignore', o.stdout ?? 'pipe', 'pipe'], maxBuffer: 64 * 1024 * 1024 });
  return { status: r.status, stdout: r.stdout ?? '', stderr: r.stderr };
}

/** One line on standard error, no stack trace, no "internal error". */
function oneCleanLine(r: Run): string {
  const lines = r.stderr.trimEnd().split('\n');
  expect(lines, r.stderr).toHaveLength(1);
  expect(r.stderr).not.toMatch(/internal error|\bat .*\.(m?js|ts):\d+|node:internal/);
  return lines[0];
}

let n = 0;
function fileWith(text: string): string {
  const p = join(dir, `f${n++}.json`);
  writeFileSync(p, text);
  return p;
}

const RESERVED = {
  schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd',
  elements: [
    { id: '__proto__', kind: 'voltage-source', nodes: ['constructor', 'gnd'], magnitude: 10, phaseDeg: 0 },
    { id: 'toString', kind: 'resistor', nodes: ['constructor', '__proto__'], ohms: 10 },
    { id: 'valueOf', kind: 'resistor', nodes: ['__proto__', 'gnd'], ohms: 30 },
  ],
};

describe('reserved names through the command line', () => {
  it('solve prints every node and element, __proto__ included', () => {
    const r = run(['solve', fileWith(JSON.stringify(RESERVED))]);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout); // JSON.parse makes "__proto__" an own key (ECMA-262 JSON.parse, from memory)
    expect(Object.keys(out.nodes).sort()).toEqual(['__proto__', 'constructor', 'gnd']);
    expect(Object.keys(out.elements).sort()).toEqual(['__proto__', 'toString', 'valueOf']);
    expect(out.nodes.__proto__.re).toBeCloseTo(7.5, 12); // divider: 10 V · 30/(10 + 30) (Ohm's law)
  });

  it('svg draws them and sweep probes them', () => {
    const file = fileWith(JSON.stringify(RESERVED));
    const svg = run(['svg', file]);
    expect(svg.stderr).toBe('');
    expect(svg.status).toBe(0);
    expect(svg.stdout).toContain('>__proto__<');
    const sw = run(['sweep', file, '--from', '10', '--to', '20', '--points', '2', '--probe', '__proto__,valueOf']);
    expect(sw.status).toBe(0);
    const out = JSON.parse(sw.stdout);
    expect(Object.keys(out.nodes)).toEqual(['__proto__']);
    expect(Object.keys(out.elements)).toEqual(['__proto__', 'valueOf']);
  });
});

describe('sweeps in bounded memory', () => {
  it('a 200 000-point sweep of every quantity runs in a 64 MB heap (the whole sweep as objects needs several hundred MB)', () => {
    const out = openSync('/dev/null', 'w');
    const r = run(['sweep', wireless, '--from', '60000', '--to', '110000', '--points', '200000'], { heapMb: 64, stdout: out });
    closeSync(out);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
  });

  it('a long probed sweep in a 64 MB heap prints every point, the last frequency exactly --to', () => {
    const file = join(dir, 'long.json');
    const out = openSync(file, 'w');
    const r = run(['sweep', wireless, '--from', '60000', '--to', '110000', '--points', '300000', '--probe', 'Rbat'], { heapMb: 64, stdout: out });
    closeSync(out);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const sweep = JSON.parse(readFileSync(file, 'utf8'));
    expect(sweep.frequenciesHz).toHaveLength(300000);
    expect(sweep.frequenciesHz[299999]).toBe(110000);
    expect(sweep.elements.Rbat.current).toHaveLength(300000);
  });

  it('a sweep that cannot fit is refused at once, in one line saying the limit', () => {
    const ladder = fileWith(JSON.stringify(rlcLadder(31)));
    const r = run(['sweep', ladder, '--from', '10', '--to', '100000', '--points', '1000000', '--log'], { heapMb: 64 });
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    const line = oneCleanLine(r);
    expect(line).toMatch(new RegExp(`1 000 000 points × \\d+ probed values = [\\d ]+, more than the ${String(MAX_SWEEP_VALUES).replace(/\B(?=(\d{3})+(?!\d))/g, ' ')} values a sweep prints; name fewer`));
  });
});

describe('model size and file limits', () => {
  it('a model with more elements than the limit is refused naming the limit', () => {
    const count = MAX_ELEMENTS + 1;
    const els: string[] = [];
    for (let i = 0; i < count; i++) els.push(`{"id":"R${i}","kind":"resistor","nodes":["a","gnd"],"ohms":1}`);
    const file = fileWith(`{"schema":"coilwright.graph/1","frequencyHz":50,"amplitudes":"rms","ground":"gnd","elements":[${els.join(',')}]}`);
    const r = run(['solve', file]);
    expect(r.status).toBe(1);
    expect(oneCleanLine(r)).toMatch(/the model has 1 048 577 elements; this tool solves models of up to 1 048 576 elements/);
  });

  it('a file of more values than any model has is refused before it is parsed', () => {
    const file = fileWith(`{"schema":"coilwright.graph/1","x":[${'1,'.repeat(MAX_JSON_VALUES + 1)}1]}`);
    const r = run(['solve', file], { heapMb: 96 });
    expect(r.status).toBe(1);
    expect(oneCleanLine(r)).toMatch(/holds more than 20 000 000 values/);
  });

  it('a file just under the size limit is read and solved; one over it is refused by its size', () => {
    const model = readFileSync(wireless);
    const under = join(dir, 'under.json');
    const fd = openSync(under, 'w');
    writeSync(fd, model);
    const spaces = Buffer.alloc(8 * 1024 * 1024, 0x20);
    for (let left = MAX_FILE_BYTES - 1 - model.length; left > 0; left -= spaces.length) writeSync(fd, spaces, 0, Math.min(left, spaces.length));
    closeSync(fd);
    const ok = run(['solve', under]);
    expect(ok.stderr).toBe('');
    expect(ok.status).toBe(0);
    expect(JSON.parse(ok.stdout).schema).toBe('coilwright.result/1');
    const over = join(dir, 'over.json');
    const big = openSync(over, 'w');
    ftruncateSync(big, 2 * MAX_FILE_BYTES); // a sparse file: its size is all that is read
    closeSync(big);
    const r = run(['solve', over]);
    expect(r.status).toBe(1);
    expect(oneCleanLine(r)).toMatch(/more than the 268435456-byte limit/);
  });
});

describe('writing the output', () => {
  it('a reader that closes the pipe early ends the command quietly', async () => {
    const child = spawn(process.execPath, [cli, 'sweep', wireless, '--from', '60000', '--to', '110000', '--points', '50000'], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d) => (stderr += d));
    child.stdout.once('data', () => child.stdout.destroy()); // like `| head -c 100`
    const status = await new Promise<number | null>((resolve) => child.on('close', (code) => resolve(code)));
    expect(stderr).toBe('');
    expect(status).toBe(0);
  });

  it('a full disk is one line and status 3', () => {
    for (const args of [['solve', wireless], ['sweep', wireless, '--from', '1', '--to', '2', '--points', '3000']]) {
      const full = openSync('/dev/full', 'w'); // writes fail with ENOSPC (Linux null(4), from memory)
      const r = run(args, { stdout: full });
      closeSync(full);
      expect(r.status).toBe(3);
      expect(oneCleanLine(r)).toBe('coilwright: could not write the output: no space left on the device (ENOSPC)');
    }
  });
});

describe('the command line says what it accepts', () => {
  it('refuses --from above --to and numbers that are not decimal', () => {
    const cases: [string[], RegExp][] = [
      [['--from', '1000', '--to', '10', '--points', '5'], /--from \(1000 Hz\) is above --to \(10 Hz\).*swap them/],
      [['--from', '10', '--to', '1000', '--points', '0x10'], /--points must be a whole number from 1 to 1000000 in decimal digits, got "0x10"/],
      [['--from', '10', '--to', '1000', '--points', '1e3'], /--points must be a whole number .* got "1e3"/],
      [['--from', '0x10', '--to', '1000', '--points', '5'], /--from must be a decimal number of hertz .* got "0x10"/],
      [['--from', '10', '--to', 'Infinity', '--points', '5'], /--to must be a decimal number/],
      [['--from', ' 10', '--to', '1000', '--points', '5'], /--from must be a decimal number/],
    ];
    for (const [flags, re] of cases) {
      const r = run(['sweep', wireless, ...flags]);
      expect(r.status, flags.join(' ')).toBe(2);
      expect(r.stdout).toBe('');
      expect(oneCleanLine(r)).toMatch(re);
    }
    const ok = run(['sweep', wireless, '--from', '8.5e4', '--to', '85000', '--points', '2', '--probe', 'Rbat']);
    expect(ok.status).toBe(0);
    expect(JSON.parse(ok.stdout).frequenciesHz).toEqual([85000, 85000]);
  });
});
