// In-process figures of `tf` (the s-domain transfer function) on one RLC ladder, in a fresh process,
// printed as they come so that a stopped run keeps what it measured.
//   node scripts/bench/tf-child.mjs SOLVER_BUNDLE GENERATORS_BUNDLE SECTIONS
import { pathToFileURL } from 'node:url';
import { now } from './timing.mjs';

const [bundle, genBundle, sectionsArg] = process.argv.slice(2);
const solver = await import(pathToFileURL(bundle).href);
const gen = await import(pathToFileURL(genBundle).href);
const emit = (o) => process.stdout.write(JSON.stringify(o) + '\n');
const sections = Number(sectionsArg);
// rlcLadder(n) builds floor((n − 2)/2) sections
const model = solver.parseGraphModel(gen.rlcLadder(2 * sections + 2));
// MNA unknowns: every node but ground, one branch current per inductor and one for the source
const nodes = new Set(model.elements.flatMap((e) => e.nodes));
const inductors = model.elements.filter((e) => e.kind === 'inductor').length;
emit({ unknowns: nodes.size - 1 + inductors + 1, states: inductors + model.elements.filter((e) => e.kind === 'capacitor').length });
// the voltage halfway along the ladder
const output = `node:a${Math.ceil(sections / 2)}`;
let t = now();
let tf;
try {
  tf = solver.transferFunction(model, 'Vin', output);
} catch (e) {
  emit({ error: `refused after ${Math.round(now() - t)} ms: ${String(e?.message ?? e).slice(0, 90)}` });
  process.exit(0);
}
emit({ firstMs: now() - t, poles: tf.poles.length, zeros: tf.zeros.length });
// warm: the median of up to five more, within ten seconds
const times = [];
const until = now() + 10000;
while (times.length < 5 && now() < until) {
  t = now();
  tf = solver.transferFunction(model, 'Vin', output);
  times.push(now() - t);
}
times.sort((a, b) => a - b);
if (times.length) emit({ warmMs: times[Math.floor(times.length / 2)], runs: times.length });
