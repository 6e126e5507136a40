// What the branch form of windings costs: the phasor engine's default form (every winding keeps its branch
// current) against the admittance form (windings through the reciprocal inductance matrix Γ/(jω) where well
// conditioned), on one model in a process of its own. Prints one JSON object per line.
//   node --expose-gc scripts/bench/forms-child.mjs SOLVER_BUNDLE FILE NODES
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { gc, logGrid, median, now, runsFor, timeMedian } from './timing.mjs';

const [bundle, file, nodesArg] = process.argv.slice(2);
const n = Number(nodesArg);
const solver = await import(pathToFileURL(bundle).href);
const emit = (o) => process.stdout.write(JSON.stringify(o) + '\n');
const model = solver.parseGraphModel(JSON.parse(readFileSync(file, 'utf8')));
const freqs = logGrid();
for (const [name, form] of [['branch', 'ac'], ['admittance', 'admittance']]) {
  const make = () => new solver.SolverSession(model, undefined, form);
  emit({ [`${name}Unknowns`]: make().mna.n });
  // fresh: structure, ordering, factor and solve at the sweep's first frequency
  emit({ [`${name}FreshMs`]: timeMedian(() => make().solveRaw(freqs[0]), Math.max(3, runsFor(n) >> 1)) });
  // a sweep point: numeric refactor and solve on the kept structure
  const s = make();
  s.solveRaw(freqs[0]);
  const per = [];
  const t0 = now();
  for (const f of freqs.slice(1)) {
    if (per.length >= 3 && now() - t0 > 10000) break;
    gc();
    const t = now();
    s.solveRaw(f);
    per.push(now() - t);
  }
  emit({ [`${name}PointMs`]: median(per) });
}
