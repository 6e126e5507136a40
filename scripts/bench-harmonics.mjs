#!/usr/bin/env node
/**
 * Harmonic steady-state benchmark (prints figures; not a pass/fail test): RLC
 * ladders of scripts/bench/generators.ts whose source is a ±325 V square wave at
 * 1 kHz, solved with the default 203 harmonics (102 odd orders) by the harmonic
 * engine (src/solver/phasor/harmonics.ts, bundled with esbuild), against the
 * same orders solved with a fresh session each (structure, ordering and
 * symbolic analysis built anew per order, as a loop over `solve` would; the
 * solves alone, without reading any result, so the engine's column includes more work).
 * Median of 3 runs after one warm-up.
 *   node scripts/bench-harmonics.mjs [sizes...]     (default 100 1000 10000)
 */
import { build } from 'esbuild';
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { pathToFileURL } from 'node:url';

const ROOT = new URL('..', import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), 'cw-harmonics-'));
const out = join(dir, 'bench.mjs');
await build({
  stdin: {
    contents: "export * from './src/solver/index.ts'; export { rlcLadder } from './scripts/bench/generators.ts';",
    resolveDir: ROOT, loader: 'ts',
  },
  bundle: true, format: 'esm', platform: 'node', outfile: out, logLevel: 'error',
});
const { rlcLadder, harmonicSteadyState, harmonicPlan, parseGraphModel, SolverSession } = await import(pathToFileURL(out).href);

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
function timed(fn) {
  fn();
  const ts = [];
  for (let r = 0; r < 3; r++) {
    const t0 = performance.now();
    fn();
    ts.push(performance.now() - t0);
  }
  return median(ts);
}

const sizes = process.argv.slice(2).map(Number).filter((n) => n >= 4);
console.log('nodes    elements  orders   one analysis (ms)  per order (ms)   fresh session per order (ms)  ratio');
for (const nodes of sizes.length ? sizes : [100, 1000, 10000]) {
  const raw = rlcLadder(nodes, { frequencyHz: 1000 });
  raw.elements[0].waveform = { shape: 'square', low: -325, high: 325, frequencyHz: 1000 };
  const model = parseGraphModel(raw);
  const plan = harmonicPlan(model);
  const engine = timed(() => harmonicSteadyState(model, { probe: ['a0'] }));
  const fresh = timed(() => {
    plan.orders.forEach((order, k) => {
      // the solve alone, no results read: the difference is the structure and symbolic analysis built anew
      new SolverSession(model).solveRaw(order * plan.fundamentalHz, plan.values[k]);
    });
  });
  console.log(
    `${String(nodes).padEnd(9)}${String(model.elements.length).padEnd(10)}${String(plan.orders.length).padEnd(9)}` +
    `${engine.toFixed(1).padStart(17)}  ${(engine / plan.orders.length).toFixed(3).padStart(14)}   ${fresh.toFixed(1).padStart(28)}  ${(fresh / engine).toFixed(2).padStart(5)}`,
  );
}
rmSync(dir, { recursive: true, force: true });
