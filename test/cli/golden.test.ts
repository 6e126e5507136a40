import { beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

/**
 * The command line's output, byte for byte, on the example files and on a set
 * of fixed models (test/fixtures/golden/*.json: generator ladders and meshes,
 * DC, peak amplitudes, an isolated secondary, k = 1, three windings, inductance
 * arms). The expected texts were written by the solver before its core was
 * rebuilt; a change of the numbers here is a change of behaviour and must be
 * deliberate. Regenerate with UPDATE_GOLDEN=1 only for such a change.
 */

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const fixtures = join(root, 'test', 'fixtures', 'golden');
const expectedDir = join(fixtures, 'expected');
const dir = mkdtempSync(join(tmpdir(), 'coilwright-golden-'));
const cli = join(dir, 'coilwright.mjs');
const update = process.env.UPDATE_GOLDEN === '1';

interface Case { name: string; args: string[] }
const cases: Case[] = [];
const rel = (...p: string[]) => join(root, ...p);
for (const f of readdirSync(fixtures).filter((f) => f.endsWith('.json')).sort()) {
  const file = join(fixtures, f);
  const base = f.replace(/\.json$/, '');
  cases.push({ name: `solve-${base}`, args: ['solve', file] });
}
for (const f of ['current-transformer-burden', 'isolation-transformer-230v', 'wireless-charging-85khz']) {
  cases.push({ name: `solve-graph-${f}`, args: ['solve', rel('examples', 'graphs', `${f}.json`)] });
  cases.push({ name: `solve-sheet-${f}`, args: ['solve', rel('examples', 'sheets', `${f}.json`)] });
  cases.push({ name: `sweep-graph-${f}`, args: ['sweep', rel('examples', 'graphs', `${f}.json`), '--from', '10', '--to', '100000', '--points', '25', '--log'] });
}
cases.push({ name: 'sweep-ladder-200', args: ['sweep', join(fixtures, 'ladder-200.json'), '--from', '10', '--to', '100000', '--points', '20', '--log', '--probe', 'a50,Vin,L5,R98'] });
cases.push({ name: 'sweep-mesh-144', args: ['sweep', join(fixtures, 'mesh-144.json'), '--from', '10', '--to', '50000', '--points', '6', '--probe', 'n0_0,n5_5'] });
cases.push({ name: 'sweep-three-windings-k', args: ['sweep', join(fixtures, 'three-windings-k.json'), '--from', '1', '--to', '10000', '--points', '15'] });
cases.push({ name: 'sweep-t-arms-mutual', args: ['sweep', join(fixtures, 't-arms-mutual.json'), '--from', '1', '--to', '1000', '--points', '7', '--log'] });

beforeAll(async () => {
  await build({ entryPoints: [join(root, 'src/cli/main.ts')], outfile: cli, bundle: true, platform: 'node', format: 'esm', target: 'node20', logLevel: 'error' });
  if (update) mkdirSync(expectedDir, { recursive: true });
});

describe('command-line output is unchanged', () => {
  for (const c of cases) {
    it(c.name, () => {
      const r = spawnSync(process.execPath, [cli, ...c.args], { encoding: 'utf8', maxBuffer: 1 << 28 });
      expect(r.stderr).toBe('');
      expect(r.status).toBe(0);
      const path = join(expectedDir, `${c.name}.txt`);
      if (update || !existsSync(path)) {
        if (!update) throw new Error(`no expected output for ${c.name}; run with UPDATE_GOLDEN=1`);
        writeFileSync(path, r.stdout);
        return;
      }
      // byte for byte: the solver's own output before the change is the reference
      expect(r.stdout === readFileSync(path, 'utf8')).toBe(true);
    });
  }
});
