#!/usr/bin/env node
// Benchmark of the solver and the command line (`npm run bench`).
//
//   node scripts/bench.mjs [--sizes 100,1000,10000,100000] [--no-cli] [--no-mathjs] [--no-memory] [--full]
//                          [--star-sizes 100000,300000,1000000] [--no-star] [--no-tf] [--no-forms]
//                          [--no-phases] [--no-transient] [--sweep-cap-s 120]
//
// Generates RLC ladders and 2-D meshes (scripts/bench/generators.ts) into
// bench/out/, then measures
//   - the solver in-process (bundled with esbuild from src/solver/index.ts), one
//     child process per model (scripts/bench/inproc-child.mjs) with a time cap;
//   - mathjs `lusolve` on the same MNA, dense, where it can finish within 10 s;
//   - peak memory of a fresh process that reads, solves and sweeps one model;
//   - a star (one hub node joined to every other node, scripts/bench/generators.ts `star`) in-process at
//     100k, 300k and 1M nodes, where cost must stay near-linear (scripts/bench/star-child.mjs);
//   - the branch form of windings (every winding current an unknown) against the admittance form (Γ/(jω)):
//     unknowns, fresh factor and sweep point per model (scripts/bench/forms-child.mjs);
//   - `tf` (poles, zeros and natural frequencies) on RLC ladders of about 20, 200 and 2,000 MNA unknowns
//     (scripts/bench/tf-child.mjs);
//   - the time response (scripts/bench-transient.mjs): engine steps per second, per-step cost against one
//     solve with the kept factors, and the `transient` command against a fixed-step SciPy integration;
//   - wall time of the bundled command line against the SciPy script
//     scripts/bench/scipy_yardstick.py doing the same work from the same file;
//   - where the time of the command-line `solve` goes, by phase (scripts/bench-phases.mjs).
// Prints tables and one line per target; writes bench/out/results.json.
//
// Time caps keep a run near ten minutes on two cores: a SciPy run is stopped
// once it has taken max(60 s, 1.5 × the command line's time), which is enough
// to decide "no slower than SciPy" (--full lets it finish).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { build } from 'esbuild';
import { SWEEP_POINTS, median, now, timeMedian } from './bench/timing.mjs';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const OUT = join(ROOT, 'bench', 'out');
const CLI = join(ROOT, 'dist-cli', 'coilwright.mjs');
const YARDSTICK = join(ROOT, 'scripts', 'bench', 'scipy_yardstick.py');
const INPROC_CHILD = join(ROOT, 'scripts', 'bench', 'inproc-child.mjs');
const MEM_CHILD = join(ROOT, 'scripts', 'bench', 'mem-child.mjs');
const STAR_CHILD = join(ROOT, 'scripts', 'bench', 'star-child.mjs');
const TF_CHILD = join(ROOT, 'scripts', 'bench', 'tf-child.mjs');
const FORMS_CHILD = join(ROOT, 'scripts', 'bench', 'forms-child.mjs');
const GENERATORS = ['ladder', 'mesh'];
const SWEEP_ARGS = ['--from', '10', '--to', '100000', '--points', String(SWEEP_POINTS), '--log'];

// ---------------------------------------------------------------- options
const argv = process.argv.slice(2);
const flag = (name) => argv.includes(name);
const option = (name, fallback) => {
  const i = argv.indexOf(name);
  return i >= 0 && argv[i + 1] ? argv[i + 1] : fallback;
};
const SIZES = option('--sizes', '100,1000,10000,100000').split(',').map(Number);
const CLI_SIZES = SIZES.filter((n) => n >= 1000);
const FULL = flag('--full');
const STAR_SIZES = flag('--no-star') ? [] : option('--star-sizes', '100000,300000,1000000').split(',').map(Number);
/** time cap of one star run */
const STAR_CAP_MS = 120000;
/** time cap of one in-process child, by model size */
const inprocCapMs = (n) => (n <= 1000 ? 30000 : n <= 10000 ? 60000 : 90000);
/** time cap of one memory run (its figure after the solve survives a stop during the sweep) */
const memCapMs = (n) => (n <= 10000 ? 30000 : 60000);
/** time cap of one command-line run */
const CLI_CAP_MS = 120000;
/**
 * time cap of one command-line sweep (--sweep-cap-s): a 100,000-node mesh sweeps its 50 points in about four
 * minutes (each point a numeric refactor of some 5 million factor entries), over the default cap; raise it to
 * measure that sweep (SciPy's stays capped at 1.5 × the command line's time)
 */
const SWEEP_CAP_MS = 1000 * Number(option('--sweep-cap-s', String(CLI_CAP_MS / 1000)));

// ---------------------------------------------------------------- helpers
const log = (...a) => console.log(...a);
const note = (s) => process.stderr.write(`  .. ${s}\n`);
const fmt = (x, d = 1) => (x === undefined || x === null || Number.isNaN(x) ? '-' : x >= 100 ? x.toFixed(0) : x.toFixed(d));
const fmtN = (n) => n.toLocaleString('en-US');
function pad(rows) {
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => String(r[c]).length)));
  return rows.map((r) => r.map((v, c) => (c === 0 ? String(v).padEnd(widths[c]) : String(v).padStart(widths[c]))).join('  ')).join('\n');
}
/** Largest |a_i - b_i| relative to the largest |b_i|; a, b arrays of {re, im}. */
function maxRelDiff(a, b) {
  let scale = 0;
  let diff = 0;
  for (let i = 0; i < b.length; i++) scale = Math.max(scale, Math.hypot(b[i].re, b[i].im));
  for (let i = 0; i < b.length; i++) diff = Math.max(diff, a[i] ? Math.hypot(a[i].re - b[i].re, a[i].im - b[i].im) : Infinity);
  return scale > 0 ? diff / scale : diff;
}

async function bundle(contents, name) {
  const outfile = join(OUT, '.bundle', `${name}.mjs`);
  await build({
    stdin: { contents, resolveDir: ROOT, loader: 'ts', sourcefile: `${name}-entry.ts` },
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    outfile,
    packages: 'external',
    logLevel: 'silent',
  });
  return { file: outfile, mod: await import(`${pathToFileURL(outfile).href}?t=${Date.now()}`) };
}

/**
 * Wall time of one command, its exit status and peak RSS (GNU time when
 * present). coreutils `timeout` stops the command itself at the cap, so no
 * orphan is left running behind the wrapper.
 */
function run(cmd, args, { stdoutFile, timeoutMs }) {
  const rssFile = join(OUT, '.bundle', 'rss.txt');
  rmSync(rssFile, { force: true });
  const useTime = existsSync('/usr/bin/time');
  const capped = ['timeout', '-s', 'KILL', String(Math.ceil(timeoutMs / 1000)), cmd, ...args];
  const [exe, exeArgs] = useTime ? ['/usr/bin/time', ['-f', '%M', '-o', rssFile, ...capped]] : [capped[0], capped.slice(1)];
  const t = now();
  const r = spawnSync(exe, exeArgs, { cwd: ROOT, stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 1 << 30, timeout: Math.ceil(timeoutMs + 20000), killSignal: 'SIGKILL' });
  const ms = now() - t;
  if (r.error?.code === 'ETIMEDOUT' || r.signal || r.status === 137 || r.status === 124) return { ms, timedOut: true };
  if (stdoutFile) writeFileSync(stdoutFile, r.stdout ?? '');
  const rssMB = useTime && existsSync(rssFile) ? Number(readFileSync(rssFile, 'utf8').trim().split('\n').pop()) / 1024 : undefined;
  return { ms, status: r.status, stderr: String(r.stderr ?? '').trim(), rssMB };
}

/** Runs a child that prints one JSON object per line; merges what it printed, even when stopped. */
function runJsonChild(args, timeoutMs) {
  const r = spawnSync(process.execPath, args, { cwd: ROOT, encoding: 'utf8', maxBuffer: 1 << 26, timeout: timeoutMs, killSignal: 'SIGKILL' });
  const out = {};
  for (const line of String(r.stdout ?? '').split('\n')) {
    try {
      Object.assign(out, JSON.parse(line));
    } catch {
      /* not a figure line */
    }
  }
  if (r.error?.code === 'ETIMEDOUT' || r.signal) out.timedOut = true;
  else if (r.status !== 0) out.error = String(r.stderr ?? '').trim().split('\n').filter((l) => /Error|Refus/.test(l))[0] ?? `exit ${r.status}`;
  return out;
}

// ---------------------------------------------------------------- setup
mkdirSync(join(OUT, '.bundle'), { recursive: true });
mkdirSync(join(OUT, 'cli'), { recursive: true });
const started = now();
const pyVersion = spawnSync('python3', ['-c', 'import scipy, numpy, sys; print(sys.version.split()[0], scipy.__version__, numpy.__version__)'], { encoding: 'utf8' });
log(`Coilwright benchmark, ${new Date().toISOString()}`);
log(`node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}; python ${pyVersion.stdout.trim().replace(' ', ', scipy ').replace(/ (\S+)$/, ', numpy $1') || 'unavailable'}`);
log(`sizes ${SIZES.map(fmtN).join(', ')} nodes; sweeps of ${SWEEP_POINTS} log-spaced points, 10 Hz .. 100 kHz`);
log(`load average at start ${loadavg().map((x) => x.toFixed(1)).join(' ')} (wall-clock figures grow with other work on the machine)\n`);

const genBundle = await bundle(
  `export { rlcLadder, mesh2d, star, probeNode } from './scripts/bench/generators.ts';
   export { buildDenseMna, mnaSize } from './scripts/bench/dense-mna.ts';`,
  'generators',
);
const gen = genBundle.mod;

const results = { date: new Date().toISOString(), node: process.version, sizes: SIZES, cases: [], cli: [], notes: [] };
let solver = null;
let solverFile = null;
if (existsSync(join(ROOT, 'src', 'solver', 'index.ts'))) {
  try {
    const b = await bundle(`export * from './src/solver/index.ts';`, 'solver');
    const missing = ['parseGraphModel', 'solveGraph', 'createSession', 'sweepGraph'].filter((n) => typeof b.mod[n] !== 'function');
    if (missing.length) results.notes.push(`src/solver/index.ts does not export ${missing.join(', ')}: in-process figures skipped`);
    else (solver = b.mod), (solverFile = b.file);
  } catch (e) {
    results.notes.push(`bundling src/solver/index.ts failed (${String(e.message).split('\n')[0]}): in-process figures skipped`);
  }
} else results.notes.push('src/solver/index.ts not found: in-process figures skipped');

// ---------------------------------------------------------------- models
const cases = [];
for (const g of GENERATORS) {
  for (const n of SIZES) {
    const model = g === 'ladder' ? gen.rlcLadder(n) : gen.mesh2d(n);
    const file = join(OUT, `${g}-${n}.json`);
    const text = JSON.stringify(model);
    writeFileSync(file, text);
    cases.push({ gen: g, n, file: relative(ROOT, file), probe: gen.probeNode(g, model), elements: model.elements.length, couplings: model.couplings?.length ?? 0, mb: text.length / 2 ** 20 });
  }
}
note(`wrote ${cases.length} models to ${relative(ROOT, OUT)}/`);

// ---------------------------------------------------------------- in-process
if (solver) {
  for (const c of cases) {
    note(`in-process ${c.gen} ${fmtN(c.n)}`);
    const figures = runJsonChild(['--expose-gc', INPROC_CHILD, solverFile, c.file, c.probe, String(c.n)], inprocCapMs(c.n));
    if (figures.timedOut) c.inprocNote = `stopped after ${inprocCapMs(c.n) / 1000} s; figures missing were not reached`;
    if (figures.error) c.inprocNote = `failed: ${figures.error}`;
    delete figures.timedOut;
    delete figures.error;
    Object.assign(c, figures);
  }

  // ---- mathjs lusolve on the same MNA, dense
  if (!flag('--no-mathjs')) try {
    const math = await import('mathjs');
    for (const g of GENERATORS) {
      let base = null;
      for (const c of cases.filter((x) => x.gen === g)) {
        const model = JSON.parse(readFileSync(join(ROOT, c.file), 'utf8'));
        const size = gen.mnaSize(model);
        c.denseN = size;
        const estimate = base ? base.ms * Math.pow(size / base.n, 3) : 0;
        if (base && estimate > 10000) {
          c.mathjsNote = `not run: ${estimate < 1e7 ? `~${fmt(estimate / 1000)} s` : 'far over 10 s'} by n³ scaling from ${fmtN(base.size)} nodes`;
          continue;
        }
        if (!base && size > 400) {
          c.mathjsNote = `not run: a dense ${fmtN(size)}² complex LU, and no small model to scale from (run with size 100)`;
          continue;
        }
        const d = gen.buildDenseMna(model);
        note(`mathjs lusolve ${g} ${fmtN(c.n)} (${d.n} unknowns)`);
        const A = [];
        for (let i = 0; i < d.n; i++) {
          const row = new Array(d.n);
          for (let j = 0; j < d.n; j++) row[j] = math.complex(d.re[i * d.n + j], d.im[i * d.n + j]);
          A.push(row);
        }
        const b = Array.from({ length: d.n }, (_, i) => [math.complex(d.bRe[i], d.bIm[i])]);
        let x;
        const ms = timeMedian(() => (x = math.lusolve(A, b)), 3, { warm: 0, budgetMs: 10000 });
        c.mathjsMs = ms;
        if (c.solveMs) c.mathjsRatio = ms / c.solveMs;
        const sparse = solver.solveGraph(solver.parseGraphModel(model));
        const got = [];
        const want = [];
        for (const [name, i] of d.nodeIndex) {
          got.push(sparse.nodes[name]);
          want.push({ re: x[i][0].re, im: x[i][0].im });
        }
        c.mathjsAgreement = maxRelDiff(got, want);
        base = { n: d.n, ms, size: c.n };
      }
    }
  } catch (e) {
    results.notes.push(`mathjs comparison failed: ${String(e?.message ?? e).split('\n')[0]}`);
  }

  // ---- peak memory in a fresh process
  if (!flag('--no-memory')) {
    for (const c of cases) {
      note(`memory ${c.gen} ${fmtN(c.n)}`);
      const m = runJsonChild(['--expose-gc', MEM_CHILD, solverFile, c.file, c.probe], memCapMs(c.n));
      if (m.maxRssMB !== undefined) Object.assign(c, { maxRssMB: m.maxRssMB, heapPeakMB: m.heapPeakMB, baseRssMB: m.baseRssMB });
      if (m.step !== 'sweep') c.memNote = m.timedOut ? `memory run stopped after ${memCapMs(c.n) / 1000} s${m.step ? `; figure covers the ${m.step} only` : ''}` : `memory run failed: ${m.error}`;
    }
  }
}

// ---------------------------------------------------------------- star
const stars = [];
if (solver) {
  for (const n of STAR_SIZES) {
    note(`star ${fmtN(n)}`);
    const figures = runJsonChild([STAR_CHILD, solverFile, genBundle.file, String(n)], STAR_CAP_MS);
    stars.push({ n, ...figures });
  }
  results.stars = stars;
}

// ---------------------------------------------------------------- winding forms
const formRuns = [];
if (solver && !flag('--no-forms') && typeof solver.SolverSession === 'function') {
  for (const c of cases) {
    note(`winding forms ${c.gen} ${fmtN(c.n)}`);
    formRuns.push({ gen: c.gen, n: c.n, ...runJsonChild(['--expose-gc', FORMS_CHILD, solverFile, c.file, String(c.n)], inprocCapMs(c.n)) });
  }
  results.forms = formRuns;
}

// ---------------------------------------------------------------- tf (s-domain)
// ladders of s sections have 3s + 2 MNA unknowns (2s + 1 nodes, s inductor currents, the source's) and 2s states
const tfRuns = [];
if (solver && !flag('--no-tf') && typeof solver.transferFunction === 'function') {
  for (const sections of [6, 66, 666]) {
    note(`tf ladder of ${sections} sections`);
    const figures = runJsonChild([TF_CHILD, solverFile, genBundle.file, String(sections)], 180000);
    tfRuns.push({ sections, ...figures });
  }
  results.tf = tfRuns;
}

// ---------------------------------------------------------------- command line
let cliReady = false;
if (!flag('--no-cli') && CLI_SIZES.length) {
  if (existsSync(join(ROOT, 'scripts', 'build-cli.mjs'))) {
    note('building the command line (scripts/build-cli.mjs)');
    const r = spawnSync(process.execPath, [join(ROOT, 'scripts', 'build-cli.mjs')], { cwd: ROOT, encoding: 'utf8' });
    if (r.status !== 0) results.notes.push(`build:cli failed: ${String(r.stderr || r.stdout).trim().split('\n').pop()}`);
  }
  cliReady = existsSync(CLI);
  if (!cliReady) results.notes.push(`command line not timed: ${relative(ROOT, CLI)} missing (npm run build:cli)`);
  for (const c of cases.filter((x) => CLI_SIZES.includes(x.n))) {
    const row = { gen: c.gen, n: c.n };
    for (const mode of ['solve', 'sweep']) {
      const tail = mode === 'solve' ? ['solve', c.file] : ['sweep', c.file, ...SWEEP_ARGS, '--probe', c.probe];
      const tools = [['cli', process.execPath, [CLI, ...tail]], ['py', 'python3', [YARDSTICK, ...tail]]].filter(([t]) => t === 'py' || cliReady);
      for (const [tool, cmd, args] of tools) {
        const key = `${tool}_${mode}`;
        // a sweep the in-process figures say cannot finish within the cap is not started
        const expected = c.sweepTotalMs ?? (c.refactorMs !== undefined ? (c.freshMs ?? 0) + SWEEP_POINTS * c.refactorMs : undefined);
        if (tool === 'cli' && mode === 'sweep' && !FULL && expected > SWEEP_CAP_MS) {
          row[`${key}_skipped`] = `not run: in-process figures put it near ${fmt(expected / 1000)} s, over the ${SWEEP_CAP_MS / 1000} s cap (--sweep-cap-s)`;
          continue;
        }
        if (tool === 'py' && row[`cli_${mode}_skipped`]) {
          row[`${key}_skipped`] = 'not run, as the command line was not (--full runs both)';
          continue;
        }
        note(`${tool === 'cli' ? 'command line' : 'SciPy'} ${mode} ${c.gen} ${fmtN(c.n)}`);
        const cliMs = row[`cli_${mode}_ms`];
        const cliCap = mode === 'sweep' ? Math.max(CLI_CAP_MS, SWEEP_CAP_MS) : CLI_CAP_MS;
        const cap = tool === 'cli' || FULL ? cliCap * (FULL ? 10 : 1) : Math.max(60000, 1.5 * (cliMs ?? 40000));
        const times = [];
        for (let i = 0; i < 3; i++) {
          const r = run(cmd, args, { stdoutFile: i === 0 ? join(OUT, 'cli', `${c.gen}-${c.n}.${tool}.${mode}.json`) : null, timeoutMs: cap });
          if (r.timedOut) {
            row[`${key}_stoppedMs`] = cap;
            break;
          }
          if (r.status !== 0) {
            row[`${key}_error`] = r.stderr.split('\n').pop();
            break;
          }
          times.push(r.ms);
          row[`${key}_rssMB`] = Math.max(row[`${key}_rssMB`] ?? 0, r.rssMB ?? 0) || undefined;
          if (r.ms > 12000) break; // one run of a slow command is figure enough within the budget
        }
        if (times.length) (row[`${key}_ms`] = median(times)), (row[`${key}_runs`] = times.length);
      }
    }
    // the two tools must agree, or the comparison means nothing
    const load = (tool, mode) => JSON.parse(readFileSync(join(OUT, 'cli', `${c.gen}-${c.n}.${tool}.${mode}.json`), 'utf8'));
    if (row.cli_solve_ms && row.py_solve_ms) {
      const a = load('cli', 'solve');
      const b = load('py', 'solve');
      const names = Object.keys(b.nodes);
      row.solveAgreement = maxRelDiff(names.map((k) => a.nodes[k]), names.map((k) => b.nodes[k]));
    }
    if (row.cli_sweep_ms && row.py_sweep_ms) row.sweepAgreement = maxRelDiff(load('cli', 'sweep').nodes[c.probe] ?? [], load('py', 'sweep').nodes[c.probe]);
    results.cli.push(row);
  }
}

// ---------------------------------------------------------------- report
log('Models');
log(pad([
  ['model', 'nodes', 'elements', 'couplings', 'MNA unknowns', 'file MB', 'probe'],
  ...cases.map((c) => [c.gen, fmtN(c.n), fmtN(c.elements), fmtN(c.couplings), c.unknowns ? fmtN(c.unknowns) : c.denseN ? fmtN(c.denseN) : '-', fmt(c.mb), c.probe]),
]));

const perPoint = (c) => (c.sweepPointMs !== undefined || c.refactorMs !== undefined ? Math.max(c.sweepPointMs ?? 0, c.refactorMs ?? 0) : undefined);
if (solver) {
  log('\nIn-process solver (ms, medians; solve = parseGraphModel + solveGraph on an already parsed JSON object)');
  log(pad([
    ['model', 'nodes', 'JSON.parse', 'solve', 'validate', 'session', 'fresh factor', 'refactor pt', 'sweep pt', 'fresh/pt', 'mathjs', 'mathjs/solve', 'peak RSS MB', 'heap MB'],
    ...cases.map((c) => [
      c.gen,
      fmtN(c.n),
      fmt(c.jsonParseMs, 2),
      fmt(c.solveMs, 2),
      fmt(c.parseMs, 2),
      fmt(c.sessionMs, 2),
      fmt(c.freshMs, 2),
      fmt(c.refactorMs, 3),
      fmt(c.sweepPointMs, 3),
      c.freshMs && perPoint(c) ? `${fmt(c.freshMs / perPoint(c))}×` : '-',
      c.mathjsMs !== undefined ? fmt(c.mathjsMs) : '-',
      c.mathjsRatio !== undefined ? `${fmt(c.mathjsRatio)}×` : '-',
      fmt(c.maxRssMB),
      fmt(c.heapPeakMB),
    ]),
  ]));
  log('  validate = parseGraphModel alone; session = createSession alone (topology, MNA pattern, symbolic analysis);');
  log('  fresh factor = createSession + solveRaw at 10 Hz (build MNA, order, factor, solve); refactor pt = solveRaw of that session');
  log('  at each next sweep frequency (numeric refactor + solve); sweep pt = (sweepGraph of 50 points − of 1 point) / 49, one probe;');
  log('  fresh/pt divides by the larger per-point figure. peak RSS = maxRSS of a fresh `node --expose-gc` that reads the file,');
  log('  solves once and sweeps 50 points; heap = largest heapUsed seen between those steps.');
  for (const c of cases) {
    const tag = `  ${c.gen} ${fmtN(c.n)}:`;
    if (c.inprocNote) log(`${tag} in-process ${c.inprocNote}`);
    if (c.refactorMaxMs !== undefined && c.refactorMaxMs > 5 * c.refactorMs) log(`${tag} slowest refactor point ${fmt(c.refactorMaxMs)} ms (median ${fmt(c.refactorMs, 3)} ms)`);
    if (c.mathjsNote) log(`${tag} mathjs ${c.mathjsNote}`);
    else if (c.mathjsAgreement !== undefined) log(`${tag} mathjs on ${fmtN(c.denseN)} unknowns; node voltages agree with the solver to ${c.mathjsAgreement.toExponential(1)} (relative)`);
    if (c.memNote) log(`${tag} ${c.memNote}`);
  }
}

if (stars.length) {
  log('\nStar: one source and N resistors on one node, each leaf loaded to ground (ms, first call of a fresh process)');
  log(pad([
    ['nodes', 'validate', 'session', 'factor+solve', 'whole solve', 'growth p'],
    ...stars.map((c, i) => {
      const prev = stars[i - 1];
      const total = (c.validateMs ?? 0) + (c.sessionMs ?? 0) + (c.factorSolveMs ?? 0);
      const p = prev?.sessionMs && c.sessionMs && c.factorSolveMs ? Math.log(total / ((prev.validateMs ?? 0) + prev.sessionMs + prev.factorSolveMs)) / Math.log(c.n / prev.n) : undefined;
      return [fmtN(c.n), fmt(c.validateMs), fmt(c.sessionMs), fmt(c.factorSolveMs), fmt(c.solveGraphMs), p === undefined ? '-' : p.toFixed(2)];
    }),
  ]));
  log('  session = createSession (topology, MNA pattern, ordering); factor+solve = its first solveRaw; whole solve =');
  log('  solveGraph once more in the same process (results included); growth p: time ~ nodes^p of validate + session + factor+solve');
  for (const c of stars) if (c.timedOut || c.error) log(`  star ${fmtN(c.n)}: ${c.timedOut ? `stopped after ${STAR_CAP_MS / 1000} s; figures missing were not reached` : `failed: ${c.error}`}`);
}

const cell = (r, key) => (r[`${key}_error`] ? 'ERR' : r[`${key}_skipped`] ? 'skip' : r[`${key}_stoppedMs`] ? `>${fmt(r[`${key}_stoppedMs`])}` : r[`${key}_ms`] ? fmt(r[`${key}_ms`]) + (r[`${key}_runs`] < 3 ? '¹' : '') : '-');
const ratio = (r, mode) => {
  const a = r[`cli_${mode}_ms`];
  const b = r[`py_${mode}_ms`] ?? r[`py_${mode}_stoppedMs`];
  return a && b ? `${r[`py_${mode}_stoppedMs`] ? '<' : ''}${fmt(a / b, 2)}×` : '-';
};
if (results.cli.length) {
  log('\nCommand line vs SciPy script (wall ms, median of 3; peak RSS MB from GNU time)');
  log(pad([
    ['model', 'nodes', 'cli solve', 'scipy solve', 'cli/scipy', 'cli sweep', 'scipy sweep', 'cli/scipy', 'cli RSS', 'scipy RSS', 'agree'],
    ...results.cli.map((r) => [
      r.gen,
      fmtN(r.n),
      cell(r, 'cli_solve'),
      cell(r, 'py_solve'),
      ratio(r, 'solve'),
      cell(r, 'cli_sweep'),
      cell(r, 'py_sweep'),
      ratio(r, 'sweep'),
      fmt(Math.max(r.cli_solve_rssMB ?? 0, r.cli_sweep_rssMB ?? 0) || undefined),
      fmt(Math.max(r.py_solve_rssMB ?? 0, r.py_sweep_rssMB ?? 0) || undefined),
      r.solveAgreement !== undefined || r.sweepAgreement !== undefined ? Math.max(r.solveAgreement ?? 0, r.sweepAgreement ?? 0).toExponential(0) : '-',
    ]),
  ]));
  log(`  solve = solve FILE; sweep = sweep FILE ${SWEEP_ARGS.join(' ')} --probe <one node>; ¹ one run (over 12 s);`);
  log('  >N = stopped at N ms (the SciPy cap is max(60 s, 1.5 × the command line); --full lifts it);');
  log('  agree = largest node-voltage difference between the two outputs, relative to the largest voltage');
  for (const r of results.cli)
    for (const k of Object.keys(r)) if (k.endsWith('_error') || k.endsWith('_skipped')) log(`  ${r.gen} ${fmtN(r.n)} ${k.replace(/_(error|skipped)$/, '').replace('py_', 'SciPy ').replace('cli_', 'command-line ')}: ${r[k]}`);
}
if (formRuns.length) {
  log('\nWinding forms (in-process, ms, medians): branch = every winding keeps its current (the phasor default), admittance = Γ/(jω)');
  log(pad([
    ['model', 'nodes', 'unknowns branch', 'unknowns admittance', 'fresh branch', 'fresh admittance', 'point branch', 'point admittance', 'point ratio', 'note'],
    ...formRuns.map((r) => [r.gen, fmtN(r.n), r.branchUnknowns ? fmtN(r.branchUnknowns) : '-', r.admittanceUnknowns ? fmtN(r.admittanceUnknowns) : '-',
      fmt(r.branchFreshMs, 2), fmt(r.admittanceFreshMs, 2), fmt(r.branchPointMs, 3), fmt(r.admittancePointMs, 3),
      r.branchPointMs && r.admittancePointMs ? `${fmt(r.branchPointMs / r.admittancePointMs, 2)}×` : '-', r.timedOut ? 'stopped' : r.error ?? '']),
  ]));
}
if (tfRuns.length) {
  log('\ntf on RLC ladders (in-process, ms; first call of a fresh process, then the median of up to five more)');
  log(pad([
    ['sections', 'MNA unknowns', 'states', 'poles', 'first', 'warm', 'note'],
    ...tfRuns.map((r) => [String(r.sections), r.unknowns ? fmtN(r.unknowns) : '-', r.states ? fmtN(r.states) : '-', r.poles !== undefined ? fmtN(r.poles) : '-', fmt(r.firstMs, 1), fmt(r.warmMs, 1), r.timedOut ? 'stopped after 180 s' : r.error ?? '']),
  ]));
}
for (const n of results.notes) log(`note: ${n}`);

// ---------------------------------------------------------------- targets
log('\nTargets');
const verdict = (ok, text) => log(`  ${ok === undefined ? 'n/a   ' : ok ? 'met   ' : 'MISSED'} ${text}`);
const byGen = (g) => cases.filter((c) => c.gen === g);
if (solver) {
  for (const [size, limit] of [[10000, 20], [100000, 300]]) {
    for (const g of GENERATORS) {
      const c = cases.find((x) => x.gen === g && x.n === size);
      if (!c) continue;
      if (c.solveMs === undefined) {
        verdict(false, `in-process solve ${fmtN(size)} nodes < ${limit} ms: ${g} not measured (${c.inprocNote ?? 'no figure'})`);
        continue;
      }
      const ok = c.solveMs < limit;
      verdict(ok, `in-process solve ${fmtN(size)} nodes < ${limit} ms: ${g} ${fmt(c.solveMs)} ms${ok ? '' : `, over by ${fmt(c.solveMs - limit)} ms (${fmt(c.solveMs / limit, 2)}× the target)`}`);
    }
  }
  for (const g of GENERATORS) {
    const rows = byGen(g).filter((c) => c.n >= 1000 && c.freshMs && perPoint(c));
    if (!rows.length) continue;
    const worst = rows.map((c) => ({ c, r: c.freshMs / perPoint(c) })).sort((a, b) => a.r - b.r)[0];
    verdict(worst.r >= 5, `sweep point >= 5× cheaper than a fresh factorisation (1,000+ nodes): ${g} worst ${fmt(worst.r)}× at ${fmtN(worst.c.n)} nodes${worst.r >= 5 ? '' : `, short by a factor ${fmt(5 / worst.r, 2)}`}`);
  }
  for (const g of GENERATORS) {
    const rows = byGen(g).filter((c) => c.n >= 1000 && c.solveMs).sort((a, b) => a.n - b.n);
    if (rows.length < 2) continue;
    const p = (a, b) => Math.log(b.solveMs / a.solveMs) / Math.log(b.n / a.n);
    const slope = p(rows[0], rows.at(-1));
    const last = p(rows.at(-2), rows.at(-1));
    verdict(slope <= 1.2 && last <= 1.3, `near-linear growth, solve time ~ nodes^p with p <= 1.2 over ${fmtN(rows[0].n)}..${fmtN(rows.at(-1).n)} and <= 1.3 on the last step: ${g} p = ${slope.toFixed(2)}, last step ${last.toFixed(2)}`);
    const pts = byGen(g).filter((c) => c.n >= 1000 && perPoint(c)).sort((a, b) => a.n - b.n);
    if (pts.length >= 2) {
      const [a, b] = pts.slice(-2);
      const q = Math.log(perPoint(b) / perPoint(a)) / Math.log(b.n / a.n);
      verdict(q <= 1.3, `near-linear growth, sweep-point cost ~ nodes^p with p <= 1.3 on the last step: ${g} p = ${q.toFixed(2)} (${fmt(perPoint(a), 2)} ms at ${fmtN(a.n)}, ${fmt(perPoint(b), 2)} ms at ${fmtN(b.n)})`);
    }
  }
  for (const g of GENERATORS) {
    const c = cases.find((x) => x.gen === g && x.n === 100000);
    if (!c) continue;
    if (c.maxRssMB !== undefined) verdict(c.maxRssMB < 300, `peak memory at 100,000 nodes < 300 MB: ${g} ${fmt(c.maxRssMB)} MB in-process${c.maxRssMB < 300 ? '' : `, over by ${fmt(c.maxRssMB - 300)} MB`}`);
    else verdict(false, `peak memory at 100,000 nodes < 300 MB: ${g} not measured (${c.memNote ?? 'no figure'})`);
    const r = results.cli.find((x) => x.gen === g && x.n === 100000);
    const cliRss = r && Math.max(r.cli_solve_rssMB ?? 0, r.cli_sweep_rssMB ?? 0);
    if (cliRss) verdict(cliRss < 300, `peak memory at 100,000 nodes < 300 MB: ${g} ${fmt(cliRss)} MB for the command line${cliRss < 300 ? '' : `, over by ${fmt(cliRss - 300)} MB`}`);
  }
} else log('  (solver not available: in-process targets not measured)');
for (const mode of ['solve', 'sweep']) {
  for (const r of results.cli) {
    const a = r[`cli_${mode}_ms`];
    const b = r[`py_${mode}_ms`];
    const stopped = r[`py_${mode}_stoppedMs`];
    const what = `command-line ${mode} no slower than SciPy: ${r.gen} ${fmtN(r.n)}`;
    if (!a) verdict(false, `${what}: the command line ${r[`cli_${mode}_error`] ? `failed (${r[`cli_${mode}_error`]})` : r[`cli_${mode}_stoppedMs`] ? `was stopped after ${fmt(r[`cli_${mode}_stoppedMs`] / 1000)} s` : r[`cli_${mode}_skipped`] ? `was ${r[`cli_${mode}_skipped`]}` : 'was not run'}${b ? `; SciPy took ${fmt(b / 1000)} s` : stopped ? `; SciPy was stopped after ${fmt(stopped / 1000)} s` : ''}`);
    else if (stopped) verdict(a < stopped, `${what}: ${fmt(a)} ms vs SciPy stopped after ${fmt(stopped)} ms`);
    else if (!b) verdict(undefined, `${what}: SciPy ${r[`py_${mode}_error`] ? `failed (${r[`py_${mode}_error`]})` : 'not run'}`);
    else verdict(a <= b, `${what}: ${fmt(a)} vs ${fmt(b)} ms (${fmt(a / b, 2)}×)${a <= b ? '' : `, slower by ${fmt(a - b)} ms`}`);
  }
}

// ---------------------------------------------------------------- phases of `solve` (scripts/bench-phases.mjs)
if (!flag('--no-phases')) {
  note('phases of the command-line solve (scripts/bench-phases.mjs)');
  const sizes = CLI_SIZES.length ? CLI_SIZES : [1000, 10000, 100000];
  const r = spawnSync(process.execPath, [join(ROOT, 'scripts', 'bench-phases.mjs'), '--sizes', sizes.join(',')], { cwd: ROOT, encoding: 'utf8', maxBuffer: 1 << 24 });
  log('');
  log(r.status === 0 ? r.stdout.trimEnd() : `phases not measured: ${String(r.stderr).trim().split('\n').pop()}`);
}

results.cases = cases;
writeFileSync(join(OUT, 'results.json'), JSON.stringify(results, null, 2));
rmSync(join(OUT, '.bundle', 'rss.txt'), { force: true });
log(`\nload average at end ${loadavg().map((x) => x.toFixed(1)).join(' ')}; bench took ${fmt((now() - started) / 1000)} s; figures also in ${relative(ROOT, join(OUT, 'results.json'))}`);

if (!flag('--no-transient')) {
  log('\ntime response (scripts/bench-transient.mjs)');
  spawnSync(process.execPath, [join(ROOT, 'scripts', 'bench-transient.mjs'), ...(flag('--no-cli') ? ['--no-cli'] : [])], { cwd: ROOT, stdio: 'inherit' });
}
