// In-process solver figures for one model, in a process of its own so that a
// slow build can be stopped without losing the figures already measured.
//   node scripts/bench/inproc-child.mjs SOLVER_BUNDLE FILE PROBE NODES
// Prints one JSON object per line as each figure is measured.
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { SWEEP_POINTS, gc, logGrid, median, now, runsFor, timeMedian } from './timing.mjs';

const [bundle, file, probe, nodesArg] = process.argv.slice(2);
const n = Number(nodesArg);
const solver = await import(pathToFileURL(bundle).href);
const emit = (o) => process.stdout.write(JSON.stringify(o) + '\n');
const started = now();

const text = readFileSync(file, 'utf8');
emit({ jsonParseMs: timeMedian(() => JSON.parse(text), Math.min(5, runsFor(n))) });
const json = JSON.parse(text);

let model;
emit({
  solveMs: timeMedian(() => {
    model = solver.parseGraphModel(json);
    solver.solveGraph(model);
  }, runsFor(n)),
});

// where the solve's time goes: validation alone, and structure (topology, MNA pattern, ordering) alone
emit({ parseMs: timeMedian(() => solver.parseGraphModel(json), runsFor(n)) });
emit({ sessionMs: timeMedian(() => solver.createSession(model), Math.max(3, runsFor(n) >> 1)) });

const freqs = logGrid();
const session = solver.createSession(model);
if (typeof session.solveRaw === 'function') {
  emit({ unknowns: session.mna?.pattern?.n ?? null });
  // fresh: build, order, factor and solve at the sweep's first frequency
  emit({ freshMs: timeMedian(() => solver.createSession(model).solveRaw(freqs[0]), Math.max(3, runsFor(n) >> 1)) });
  // refactor: the kept structure, new values, numeric refactorisation
  session.solveRaw(freqs[0]);
  const per = [];
  const t0 = now();
  sampling: for (let rep = 0; rep < (n >= 100000 ? 1 : 3); rep++) {
    for (const f of freqs.slice(1)) {
      if (per.length >= 1 && now() - t0 > 15000) break sampling;
      gc();
      const t = now();
      session.solveRaw(f);
      per.push(now() - t);
      // re-emitted after every point, so a stopped run still reports what it measured
      emit({ refactorMs: median(per), refactorMaxMs: Math.max(...per), refactorSamples: per.length });
    }
  }
}

// public path: a probed sweep, per point = (T(50 points) - T(1 point)) / 49
const reps = n >= 10000 ? 3 : 5;
const t1 = timeMedian(() => solver.sweepGraph(model, [freqs[0]], [probe]), reps);
emit({ sweep1Ms: t1 });
const sweeps = [];
for (let i = 0; i < reps; i++) {
  if (i > 0 && sweeps.reduce((a, b) => a + b, 0) > 10000) break;
  gc();
  const t = now();
  solver.sweepGraph(model, freqs, [probe]);
  sweeps.push(now() - t);
}
const t50 = median(sweeps);
emit({ sweepTotalMs: t50, sweepPointMs: Math.max(0, (t50 - t1) / (SWEEP_POINTS - 1)) });
emit({ childMs: now() - started });
