#!/usr/bin/env node
// Benchmark of the time response (`npm run bench` runs it as its last section; alone:
// node scripts/bench-transient.mjs [--sizes 100x10000,10000x100,100000x10] [--no-cli]; the issue's full sizes,
// 100x100000,10000x1000,100000x100, take tens of minutes: the ladder's MHz resonances, rung by the source
// switched on at t = 0, hold the controlled step far below the 1 µs output step).
//
// For each size, an RLC ladder (scripts/bench/generators.ts) driven by its 1 kHz source from rest:
//   - in-process: the engine's run (src/solver/transient) with its own controlled steps, printing one node
//     at every output step H = 1 µs, and its per-step cost beside one solve with the kept factors;
//   - the bundled command line `transient --stop N·H --step H --probe <node>` (wall time);
//   - the SciPy yardstick (scripts/bench/scipy_yardstick.py transient): the same MNA, the trapezoidal rule at
//     the fixed step H, splu factored once and one solve per step.
// Prints a table; figures only, no pass/fail on speed.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, unlinkSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { build } from 'esbuild';
import { now } from './bench/timing.mjs';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const OUT = join(ROOT, 'bench', 'out');
const CLI = join(ROOT, 'dist-cli', 'coilwright.mjs');
const YARDSTICK = join(ROOT, 'scripts', 'bench', 'scipy_yardstick.py');
const H = 1e-6;

const argv = process.argv.slice(2);
const opt = (name) => {
  const i = argv.indexOf(name);
  return i >= 0 ? argv[i + 1] : undefined;
};
const sizes = (opt('--sizes') ?? '100x10000,10000x100,100000x10').split(',').map((s) => s.split('x').map(Number));
const withCli = !argv.includes('--no-cli');

mkdirSync(OUT, { recursive: true });
const bundle = join(OUT, `transient-bench-${process.pid}.mjs`);
await build({
  stdin: {
    contents: "export { rlcLadder } from './scripts/bench/generators.ts'; export { parseGraphModel, transientStream } from './src/solver/index.ts';",
    resolveDir: ROOT, loader: 'ts',
  },
  outfile: bundle, bundle: true, platform: 'node', format: 'esm', target: 'node20', logLevel: 'error',
});
const { rlcLadder, parseGraphModel, transientStream } = await import(pathToFileURL(bundle).href);
unlinkSync(bundle);

if (withCli && !existsSync(CLI)) spawnSync(process.execPath, [join(ROOT, 'scripts', 'build-cli.mjs')], { cwd: ROOT, stdio: 'inherit' });

const fmt = (v, d = 1) => (Number.isFinite(v) ? v.toFixed(d) : '—');
const rows = [];
for (const [nodes, outSteps] of sizes) {
  const model = rlcLadder(nodes);
  const file = join(OUT, `transient-ladder-${nodes}.json`);
  writeFileSync(file, JSON.stringify(model));
  const probe = 'a1';
  const stop = outSteps * H;
  // in-process
  const m = parseGraphModel(model);
  const stream = transientStream(m, { stopS: stop, stepS: H, tolerance: 1e-4, start: 'given' }, [probe]);
  const t0 = now();
  stream.run(() => {});
  const runMs = now() - t0;
  const engine = stream.engine;
  const steps = engine.steps;
  // one solve with the kept factors of the run's last matrix
  const lu = engine.cache[0].lu;
  const v = new Float64Array(engine.descriptor.n).fill(1);
  const reps = Math.max(20, Math.min(2000, Math.round(2e6 / engine.descriptor.n)));
  const s0 = now();
  for (let r = 0; r < reps; r++) lu.solve(v);
  const solveMs = (now() - s0) / reps;
  const row = { nodes, outSteps, unknowns: engine.descriptor.n, steps, runMs, perStepMs: runMs / steps, solveMs, factors: engine.factorCount ?? NaN };
  // command line and SciPy, wall time from the same file
  const tail = ['transient', file, '--stop', String(stop), '--step', String(H), '--probe', probe];
  if (withCli) {
    const c0 = now();
    const r = spawnSync(process.execPath, [CLI, ...tail], { encoding: 'utf8', maxBuffer: 1 << 30 });
    row.cliMs = r.status === 0 ? now() - c0 : NaN;
    if (r.status !== 0) row.note = `cli: ${r.stderr.trim()}`;
  }
  const p0 = now();
  const py = spawnSync('python3', [YARDSTICK, ...tail], { encoding: 'utf8', maxBuffer: 1 << 30 });
  row.pyMs = py.status === 0 ? now() - p0 : NaN;
  if (py.status !== 0) row.note = `scipy: ${py.stderr.trim().split('\n').pop()}`;
  rows.push(row);
  console.log(
    `${String(nodes).padStart(7)} nodes × ${String(outSteps).padStart(6)} output steps: ${steps} engine steps (${fmt(steps / (runMs / 1000), 0)} steps/s), ` +
      `${row.factors} factorisations, ${fmt(runMs, 0)} ms in-process; ${fmt(row.perStepMs * 1000, 1)} µs per step = ${fmt(row.perStepMs / solveMs, 2)} × one solve (${fmt(solveMs * 1000, 1)} µs); ` +
      `command line ${fmt(row.cliMs, 0)} ms, SciPy fixed-step ${fmt(row.pyMs, 0)} ms (${fmt(outSteps / (row.pyMs / 1000), 0)} steps/s)${row.note ? ` [${row.note}]` : ''}`,
  );
}
writeFileSync(join(OUT, 'transient-results.json'), JSON.stringify(rows, null, 2));
