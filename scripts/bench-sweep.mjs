#!/usr/bin/env node
/**
 * Sweep benchmark (prints figures; not a pass/fail test): a 1,000-point log
 * sweep of a generated sheet of about 200 parts (34 cells of source, series
 * resistor, coupled pair, load and ground), plotting the impedance the first
 * source sees, a load current and a node voltage, run through the same code
 * the analysis worker runs (src/worker/analysisTasks.ts, bundled with esbuild),
 * in chunks of 50 points. Median of 5 runs after one warm-up: first in
 * Node, then in a Web Worker in Chromium (the worker posts progress after
 * each chunk and is timed from the request to the last reply, as the editor
 * sees it).
 *   node scripts/bench-sweep.mjs
 */
import { build } from 'esbuild';
import { chromium } from '@playwright/test';
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { pathToFileURL } from 'node:url';

const ROOT = new URL('..', import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), 'cw-sweep-'));
const out = join(dir, 'tasks.mjs');
await build({ entryPoints: [join(ROOT, 'src/worker/analysisTasks.ts')], bundle: true, format: 'esm', platform: 'node', outfile: out, logLevel: 'error' });
const { prepareSweep, chunkRanges } = await import(pathToFileURL(out).href);

function model(cells) {
  const elements = [];
  const couplings = [];
  for (let c = 0; c < cells; c++) {
    const n = (s) => `c${c}${s}`;
    elements.push(
      { id: `V${c + 1}`, kind: 'voltage-source', nodes: [n('a'), 'gnd'], magnitude: 10, phaseDeg: 0 },
      { id: `R${2 * c + 1}`, kind: 'resistor', nodes: [n('a'), n('b')], ohms: 10 },
      { id: `L${2 * c + 1}`, kind: 'inductor', nodes: [n('b'), 'gnd'], henries: 0.01, dot: 'first' },
      { id: `L${2 * c + 2}`, kind: 'inductor', nodes: [n('s'), 'gnd'], henries: 0.02, dot: 'first' },
      { id: `R${2 * c + 2}`, kind: 'resistor', nodes: [n('s'), 'gnd'], ohms: 100 },
    );
    couplings.push({ id: `K${c + 1}`, windings: [`L${2 * c + 1}`, `L${2 * c + 2}`], k: 0.9 });
  }
  return { schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd', elements, couplings };
}

const cells = 34; // 34 × (5 parts + a ground symbol) = 204 parts on the sheet
const m = model(cells);
const spec = {
  from: 1, to: 1e6, points: 1000, log: true,
  quantities: [{ kind: 'zin', source: 'V1' }, { kind: 'current', element: 'R2' }, { kind: 'node', node: 'c0s' }],
};
const once = () => {
  const t0 = performance.now();
  const p = prepareSweep(m, spec);
  for (const [a, b] of chunkRanges(1000, 50)) p.run(a, b);
  return performance.now() - t0;
};
once();
const times = Array.from({ length: 5 }, once).sort((a, b) => a - b);
console.log(`sweep: ${cells * 6} parts (${m.elements.length} elements), 1000 log points, 3 traces incl. source impedance: median ${times[2].toFixed(0)} ms (min ${times[0].toFixed(0)}, max ${times[4].toFixed(0)}); target < 1000 ms`);

// the same in a browser Worker
const workerJs = join(dir, 'worker.js');
await build({
  stdin: {
    contents: `import { prepareSweep, chunkRanges } from ${JSON.stringify(join(ROOT, 'src/worker/analysisTasks.ts'))};
      self.onmessage = (ev) => {
        const { model, spec } = ev.data;
        const p = prepareSweep(model, spec);
        for (const [a, b] of chunkRanges(spec.points, 50)) { p.run(a, b); self.postMessage({ progress: b }); }
        self.postMessage({ done: true, n: p.frequencies.length });
      };`,
    resolveDir: ROOT, loader: 'ts',
  },
  bundle: true, format: 'iife', platform: 'browser', outfile: workerJs, logLevel: 'error',
});
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu'] });
try {
  const page = await browser.newPage();
  const code = (await import('node:fs')).readFileSync(workerJs, 'utf8');
  const ms = await page.evaluate(async ({ code, model, spec }) => {
    const url = URL.createObjectURL(new Blob([code], { type: 'text/javascript' }));
    const w = new Worker(url);
    const run = () => new Promise((resolve) => {
      const t0 = performance.now();
      w.onmessage = (ev) => { if (ev.data.done) resolve(performance.now() - t0); };
      w.postMessage({ model, spec });
    });
    await run();
    const out = [];
    for (let i = 0; i < 5; i++) out.push(await run());
    return out.sort((a, b) => a - b);
  }, { code, model: m, spec });
  console.log(`sweep in a Chromium Worker: same sheet and sweep: median ${ms[2].toFixed(0)} ms (min ${ms[0].toFixed(0)}, max ${ms[4].toFixed(0)}); target < 1000 ms`);
} finally {
  await browser.close();
}
rmSync(dir, { recursive: true, force: true });
