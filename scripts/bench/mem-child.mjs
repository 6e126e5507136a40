// Peak memory of one full solve and one probed sweep, in a fresh process.
// Run by scripts/bench.mjs as:
//   node --expose-gc scripts/bench/mem-child.mjs SOLVER_BUNDLE FILE PROBE
// Prints one JSON line after the solve and one after the sweep: maxRssMB
// (process.resourceUsage), heapPeakMB (the largest heapUsed seen between
// steps), baseRssMB (before reading the file).
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';

const [bundle, file, probe] = process.argv.slice(2);
const solver = await import(pathToFileURL(bundle).href);
globalThis.gc?.();
const baseRssMB = process.memoryUsage().rss / 2 ** 20;
let heapPeak = 0;
const sample = () => {
  heapPeak = Math.max(heapPeak, process.memoryUsage().heapUsed);
};

let text = readFileSync(file, 'utf8');
sample();
let json = JSON.parse(text);
sample();
text = null;
const model = solver.parseGraphModel(json);
sample();
json = null;
let result = solver.solveGraph(model);
sample();
result = null;
const report = (step) =>
  process.stdout.write(
    JSON.stringify({ step, maxRssMB: process.resourceUsage().maxRSS / 1024, heapPeakMB: heapPeak / 2 ** 20, baseRssMB }) + '\n',
  );
report('solve');
const freqs = Array.from({ length: 50 }, (_, i) => 10 * Math.pow(1e4, i / 49));
const sweep = solver.sweepGraph(model, freqs, [probe]);
sample();
if (sweep.frequenciesHz.length === 50) report('sweep');
