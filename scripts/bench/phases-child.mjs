// Phase breakdown of one `solve` in a fresh process, first call of each step, as the command line meets it.
//   node scripts/bench/phases-child.mjs PHASES_BUNDLE FILE
// Prints one JSON object: CPU milliseconds per phase (bundle load, read, JSON.parse, validation, topology and
// refusal checks, assembly, ordering, factor + solve, result objects, serialisation and writing to /dev/null).
import { closeSync, openSync, readFileSync, writeSync } from 'node:fs';
import { pathToFileURL } from 'node:url';

// CPU time of the process (user + system, all its threads), far steadier than wall time on a shared machine
const now = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
const [bundle, file] = process.argv.slice(2);
const out = {};
let t = now();
const lap = (name) => {
  const t2 = now();
  out[name] = t2 - t;
  t = t2;
};
const p = await import(pathToFileURL(bundle).href);
lap('loadMs');
const text = readFileSync(file, 'utf8');
lap('readMs');
const json = JSON.parse(text);
lap('jsonParseMs');
const model = p.parseGraphModel(json);
lap('validateMs');
const topo = p.buildTopology(model);
p.checkSolvable(model, topo, model.frequencyHz);
lap('topologyMs');
const mutuals = p.collectMutuals(model);
const mna = p.buildDescriptor(model, topo, mutuals, { branchResistors: p.smallResistors(model, topo) });
lap('assemblyMs');
const symbolic = p.analyze(mna.pattern);
lap('orderingMs');
const lu = new p.ComplexSparseLU(symbolic, { scale: 'rows-cols' });
const omega = 2 * Math.PI * model.frequencyHz;
const re = new Float64Array(mna.g);
const im = new Float64Array(re.length);
for (let s = 0; s < im.length; s++) im[s] = omega * mna.c[s] - mna.inv[s] / omega;
lu.factor({ re, im });
const xRe = new Float64Array(mna.n);
const xIm = new Float64Array(mna.n);
xRe[0] = 1;
lu.solve(xRe, xIm);
lap('luMs');
// the session's own solve, untimed, gives the solution the result phases read
const session = new p.SolverSession(model);
const sol = session.solveRaw(model.frequencyHz);
t = now();
const result = session.toResult(sol);
lap('resultMs');
const fd = openSync('/dev/null', 'w');
const write = (pieces) => {
  let buf = [];
  let size = 0;
  for (const s of pieces) {
    buf.push(s);
    size += s.length;
    if (size >= 1 << 20) (writeSync(fd, buf.join('')), (buf = []), (size = 0));
  }
  buf.push('\n');
  writeSync(fd, buf.join(''));
};
t = now();
write(p.jsonPieces(result));
lap('writeMs');
if (typeof p.solveJsonPieces === 'function') {
  t = now();
  write(p.solveJsonPieces(session, sol));
  lap('streamWriteMs');
}
closeSync(fd);
out.rssMB = process.memoryUsage().rss / 2 ** 20;
process.stdout.write(JSON.stringify(out) + '\n');
