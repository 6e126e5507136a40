#!/usr/bin/env node
// Where the time of the command-line `solve` goes, by phase, on RLC ladders (cheap: about a minute).
//   node scripts/bench-phases.mjs [--sizes 1000,10000,100000] [--gen ladder|mesh] [--runs 3]
// Figures are CPU time (user + system), steadier than wall time on a shared machine. Each phase is timed in a fresh process at its first call (scripts/bench/phases-child.mjs), as the command
// line meets it; start-up is the wall time of `node dist-cli/coilwright.mjs help` less that of `node -e 0`,
// and `whole` the wall time of `node dist-cli/coilwright.mjs solve FILE > /dev/null`. Medians of --runs.
import { spawnSync } from 'node:child_process';
import { closeSync, existsSync, mkdirSync, openSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { build } from 'esbuild';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const OUT = join(ROOT, 'bench', 'out');
const CLI = join(ROOT, 'dist-cli', 'coilwright.mjs');
const argv = process.argv.slice(2);
const option = (name, fallback) => {
  const i = argv.indexOf(name);
  return i >= 0 && argv[i + 1] ? argv[i + 1] : fallback;
};
const SIZES = option('--sizes', '1000,10000,100000').split(',').map(Number);
const GEN = option('--gen', 'ladder');
const RUNS = Number(option('--runs', '3'));
const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const now = () => performance.now();
const fmt = (x) => (x === undefined || Number.isNaN(x) ? '-' : x >= 100 ? x.toFixed(0) : x.toFixed(1));

mkdirSync(join(OUT, '.bundle'), { recursive: true });
async function bundle(contents, name) {
  const outfile = join(OUT, '.bundle', `${name}.mjs`);
  await build({ stdin: { contents, resolveDir: ROOT, loader: 'ts', sourcefile: `${name}-entry.ts` }, bundle: true, platform: 'node', format: 'esm', target: 'node20', outfile, logLevel: 'silent' });
  return outfile;
}
const gen = await import(pathToFileURL(await bundle(`export { rlcLadder, mesh2d } from './scripts/bench/generators.ts';`, 'phases-gen')).href);
const phases = await bundle(
  `export { parseGraphModel } from './src/solver/validate.ts';
   export { buildTopology } from './src/solver/core/topology.ts';
   export { checkSolvable } from './src/solver/core/checks.ts';
   export { collectMutuals } from './src/solver/core/windings.ts';
   export { buildDescriptor, smallResistors } from './src/solver/core/descriptor.ts';
   export { analyze, ComplexSparseLU } from './src/solver/lu-backend.ts';
   export { SolverSession } from './src/solver/phasor/session.ts';
   export * from './src/cli/format.ts';
   export * from './src/cli/solveJson.ts';`,
  'phases',
);
spawnSync(process.execPath, [join(ROOT, 'scripts', 'build-cli.mjs')], { cwd: ROOT });

/** CPU time (user + system) of one command, from GNU time; wall time where it is missing. */
function wall(args, stdoutFile = '/dev/null') {
  const fd = openSync(stdoutFile, 'w');
  const cpuFile = join(OUT, '.bundle', 'phases-cpu.txt');
  const useTime = existsSync('/usr/bin/time');
  const t = now();
  const r = useTime
    ? spawnSync('/usr/bin/time', ['-f', '%U %S', '-o', cpuFile, process.execPath, ...args], { cwd: ROOT, stdio: ['ignore', fd, 'pipe'] })
    : spawnSync(process.execPath, args, { cwd: ROOT, stdio: ['ignore', fd, 'pipe'] });
  const ms = now() - t;
  closeSync(fd);
  if (r.status !== 0) throw new Error(`${args.join(' ')}: ${String(r.stderr)}`);
  if (!useTime) return ms;
  const [user, sys] = readFileSync(cpuFile, 'utf8').trim().split('\n').pop().split(' ').map(Number);
  return 1000 * (user + sys);
}
const nodeMs = median(Array.from({ length: 5 }, () => wall(['-e', '0'])));
const helpMs = median(Array.from({ length: 5 }, () => wall([CLI, 'help'])));

const COLUMNS = [
  ['loadMs', 'bundle load'],
  ['readMs', 'read'],
  ['jsonParseMs', 'JSON.parse'],
  ['validateMs', 'validate'],
  ['topologyMs', 'topology'],
  ['assemblyMs', 'assembly'],
  ['orderingMs', 'ordering'],
  ['luMs', 'factor+solve'],
  ['resultMs', 'result objects'],
  ['writeMs', 'serialise+write'],
  ['streamWriteMs', 'stream write'],
];
const rows = [];
for (const n of SIZES) {
  const file = join(OUT, `phases-${GEN}-${n}.json`);
  writeFileSync(file, JSON.stringify(GEN === 'mesh' ? gen.mesh2d(n) : gen.rlcLadder(n)));
  const runs = [];
  for (let i = 0; i < RUNS; i++) {
    const r = spawnSync(process.execPath, [join(ROOT, 'scripts', 'bench', 'phases-child.mjs'), phases, file], { encoding: 'utf8', maxBuffer: 1 << 24 });
    if (r.status !== 0) throw new Error(r.stderr);
    runs.push(JSON.parse(r.stdout.trim().split('\n').pop()));
  }
  const row = { n };
  for (const [k] of COLUMNS) row[k] = runs[0][k] === undefined ? undefined : median(runs.map((x) => x[k]));
  row.rssMB = median(runs.map((x) => x.rssMB));
  row.wholeMs = median(Array.from({ length: RUNS }, () => wall([CLI, 'solve', file])));
  rows.push(row);
}
const table = [['nodes', 'start-up', ...COLUMNS.map(([, h]) => h), 'whole cli', 'child RSS MB']];
for (const r of rows) table.push([r.n.toLocaleString('en-US'), fmt(helpMs - nodeMs), ...COLUMNS.map(([k]) => fmt(r[k])), fmt(r.wholeMs), fmt(r.rssMB)]);
const widths = table[0].map((_, c) => Math.max(...table.map((r) => String(r[c]).length)));
console.log(`Phases of the command-line solve, ${GEN} (CPU ms, median of ${RUNS} fresh processes; node -e 0 alone ${fmt(nodeMs)} ms)`);
console.log(table.map((r) => r.map((v, c) => String(v).padStart(widths[c])).join('  ')).join('\n'));
console.log('  start-up = `coilwright help` less `node -e 0`; bundle load = import of the solver and format modules;');
console.log('  serialise+write = the result objects through jsonPieces to /dev/null; stream write = the solve writer');
console.log('  straight from the solution arrays (when present); whole cli = CPU time of `coilwright solve FILE > /dev/null` (GNU time)');
writeFileSync(join(OUT, `phases-${GEN}.json`), JSON.stringify({ nodeMs, helpMs, rows }, null, 2));
