#!/usr/bin/env node
/**
 * Long command-line sweeps (prints figures; not a pass/fail test): the
 * wireless example swept at 10 000 to 1 000 000 points, every quantity and
 * one probed element, output to /dev/null. Prints wall time and the peak
 * resident memory of the child process; memory should stay flat as the
 * points grow (the sweep is spooled to a temporary file).
 *   node scripts/bench-long-sweep.mjs [--points 10000,100000,1000000]
 */
import { spawnSync } from 'node:child_process';
import { openSync, closeSync, readFileSync, mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { buildCli, cliOut } from './build-cli.mjs';

const ROOT = new URL('..', import.meta.url).pathname;
const MODEL = join(ROOT, 'examples', 'graphs', 'wireless-charging-85khz.json');
const PRELOAD = join(ROOT, 'scripts', 'bench', 'rss-at-exit.cjs');
const i = process.argv.indexOf('--points');
const POINTS = (i > 0 ? process.argv[i + 1] : '10000,100000,1000000').split(',').map(Number);

await buildCli();
const dir = mkdtempSync(join(tmpdir(), 'cw-long-sweep-'));
console.log('points     probe   seconds  peak RSS (MB)');
for (const points of POINTS) {
  for (const probe of [null, 'Rbat']) {
    const report = join(dir, 'rss.json');
    const fd3 = openSync(report, 'w');
    const sink = openSync('/dev/null', 'w');
    const args = ['-r', PRELOAD, cliOut, 'sweep', MODEL, '--from', '60000', '--to', '110000', '--points', String(points), ...(probe ? ['--probe', probe] : [])];
    const t0 = performance.now();
    const r = spawnSync(process.execPath, args, { stdio: ['ignore', sink, 'pipe', fd3], encoding: 'utf8' });
    const secs = (performance.now() - t0) / 1000;
    closeSync(fd3);
    closeSync(sink);
    const rss = r.status === 0 ? JSON.parse(readFileSync(report, 'utf8')).maxRssMB.toFixed(0) : `failed: ${r.stderr.trim().split('\n').pop()}`;
    console.log(`${String(points).padEnd(10)} ${(probe ?? 'all').padEnd(7)} ${secs.toFixed(1).padStart(7)}  ${rss}`);
  }
}
rmSync(dir, { recursive: true, force: true });
