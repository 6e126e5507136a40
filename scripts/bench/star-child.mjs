// In-process figures for one star model (one hub node joined to every other node), first call of a
// fresh process, printed as they come so that a stopped run keeps what it measured.
//   node scripts/bench/star-child.mjs SOLVER_BUNDLE GENERATORS_BUNDLE NODES
import { pathToFileURL } from 'node:url';
import { now } from './timing.mjs';

const [bundle, genBundle, nodesArg] = process.argv.slice(2);
const solver = await import(pathToFileURL(bundle).href);
const gen = await import(pathToFileURL(genBundle).href);
const emit = (o) => process.stdout.write(JSON.stringify(o) + '\n');
const model = gen.star(Number(nodesArg));
let t = now();
const parsed = solver.parseGraphModel(model);
emit({ validateMs: now() - t });
t = now();
const session = solver.createSession(parsed);
emit({ sessionMs: now() - t }); // topology, MNA pattern, ordering (the LU's analyse)
t = now();
session.solveRaw(parsed.frequencyHz);
emit({ factorSolveMs: now() - t }); // values, factor, solve
t = now();
solver.solveGraph(parsed);
emit({ solveGraphMs: now() - t }); // the whole solve once more, results included (warm)
