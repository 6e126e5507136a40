// Micro-benchmark of the sparse LU on an MNA-like 2-D grid, an RLC ladder and a star (one hub node joined
// to every other node).
// Usage: node scripts/bench-lu.mjs [grid|ladder|star] [sizes...]
//   default: grid and ladder at 1000 10000 100000; star alone defaults to 100000 300000 1000000
// LU_SRC=/path/to/sparse/index.ts runs another version of the LU under the same conditions.
//
// Per model it prints the complex LU (median of warm runs, and the first call of the process, when the
// engine has not compiled anything yet) and, when the LU exports RealSparseLU, the real twin on a real
// matrix of the same pattern (re + im: the shape of G + C/h) with its cost relative to the complex one.
//
// Times are CPU time (process.cpuUsage, user + system, all threads of the process): the machine is
// shared, so wall time would measure the neighbours. This process builds each matrix and writes it to
// a temporary file as raw typed arrays; a fresh child process loads it and runs the LU, so that the
// child's peak RSS (process.resourceUsage().maxRSS) above the loaded matrix is the LU's own.
import { spawnSync } from 'node:child_process';
import { build } from 'esbuild';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL, fileURLToPath } from 'node:url';

const here = fileURLToPath(new URL('.', import.meta.url));
const self = fileURLToPath(import.meta.url);
const args = process.argv.slice(2);

if (args[0] !== '--child') {
  const family = args.find((a) => a === 'grid' || a === 'ladder' || a === 'star');
  const sizes = args.filter((a) => a !== family).map(Number);
  const defaults = family === 'star' ? [100000, 300000, 1000000] : [1000, 10000, 100000];
  const dir = mkdtempSync(join(tmpdir(), 'bench-lu-'));
  try {
    const out = join(dir, 'sparse.mjs');
    await build({ entryPoints: [process.env.LU_SRC || join(here, '../src/solver/sparse/index.ts')], bundle: true, format: 'esm', platform: 'neutral', outfile: out, logLevel: 'error' });
    for (const fam of family ? [family] : ['grid', 'ladder']) {
      for (const N of sizes.length ? sizes : defaults) {
        const { pattern, values } = fam === 'grid' ? mnaGrid(N) : fam === 'star' ? mnaStar(N) : mnaLadder(N);
        const file = join(dir, 'matrix.bin');
        const n = pattern.n;
        const nz = pattern.colPtr[n];
        const head = new Int32Array([n, nz]);
        writeFileSync(file, Buffer.concat([head, pattern.colPtr, pattern.rowIdx, values.re, values.im].map((a) => Buffer.from(a.buffer, a.byteOffset, a.byteLength))));
        const r = spawnSync(process.execPath, [self, '--child', out, file, fam, String(N)], { stdio: 'inherit' });
        if (r.status !== 0) process.exit(r.status ?? 1);
      }
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  process.exit(0);
}

/** Grid of admittances (5-point) plus a branch row/column with zero diagonal every `every` nodes. */
function mnaGrid(nTarget, every = 200, seed = 1) {
  let s = seed >>> 0;
  const rnd = () => ((s = (s * 1664525 + 1013904223) >>> 0) / 4294967296);
  const m = Math.max(2, Math.round(Math.sqrt(nTarget)));
  const nNodes = m * m;
  const branches = [];
  for (let v = 0; v < nNodes; v += every) branches.push(v);
  const n = nNodes + branches.length;
  const cols = Array.from({ length: n }, () => new Map());
  const add = (i, j, re, im) => {
    const c = cols[j];
    const o = c.get(i);
    if (o) { o[0] += re; o[1] += im; } else c.set(i, [re, im]);
  };
  const id = (x, y) => x + m * y;
  for (let y = 0; y < m; y++) for (let x = 0; x < m; x++) {
    const a = id(x, y);
    add(a, a, 1e-3 * rnd(), 1e-4 * rnd()); // leak to ground
    for (const [dx, dy] of [[1, 0], [0, 1]]) {
      if (x + dx >= m || y + dy >= m) continue;
      const b = id(x + dx, y + dy);
      const gr = 10 ** (-2 + 4 * rnd());
      const gi = (rnd() - 0.5) * gr;
      add(a, a, gr, gi); add(b, b, gr, gi); add(a, b, -gr, -gi); add(b, a, -gr, -gi);
    }
  }
  branches.forEach((v, t) => { // voltage source v -> gnd: zero diagonal
    const k = nNodes + t;
    add(v, k, 1, 0); add(k, v, 1, 0);
  });
  return toCsc(n, cols);
}

/** Ladder of sections (series R, inductor branch row, shunt C), consecutive inductors coupled, source at node 0. */
function mnaLadder(nTarget, f = 50e3, seed = 2) {
  let s = seed >>> 0;
  const rnd = () => ((s = (s * 1664525 + 1013904223) >>> 0) / 4294967296);
  const sections = Math.max(1, Math.floor((nTarget - 2) / 3));
  const n = 2 + 3 * sections; // node 0, source branch, then (mid, node, branch) per section
  const w = 2 * Math.PI * f;
  const cols = Array.from({ length: n }, () => new Map());
  const add = (i, j, re, im) => { const c = cols[j]; const o = c.get(i); if (o) { o[0] += re; o[1] += im; } else c.set(i, [re, im]); };
  add(0, 1, 1, 0); add(1, 0, 1, 0);
  let prev = 0;
  for (let t = 0; t < sections; t++) {
    const mid = 2 + 3 * t, node = mid + 1, br = mid + 2;
    const g = 1 / (0.1 + 10 * rnd());
    add(prev, prev, g, 0); add(mid, mid, g, 0); add(prev, mid, -g, 0); add(mid, prev, -g, 0);
    add(mid, br, 1, 0); add(node, br, -1, 0); add(br, mid, 1, 0); add(br, node, -1, 0);
    const L = 1e-6 + 1e-3 * rnd();
    add(br, br, 0, -w * L);
    if (t > 0) { const M = 0.5 * 1e-4; add(br, br - 3, 0, -w * M); add(br - 3, br, 0, -w * M); }
    add(node, node, 1e-3, w * (1e-9 + 1e-6 * rnd()));
    prev = node;
  }
  return toCsc(n, cols);
}

/** Star: hub node 0 joined to N - 2 leaves by conductances, each leaf loaded to ground, a source branch on the hub. */
function mnaStar(nTarget, seed = 3) {
  let s = seed >>> 0;
  const rnd = () => ((s = (s * 1664525 + 1013904223) >>> 0) / 4294967296);
  const n = Math.max(3, nTarget);
  const leaves = n - 2;
  const br = n - 1;
  // built column by column (sorted rows) without maps: the hub column holds every row
  const colPtr = new Int32Array(n + 1);
  const nnz = 1 + leaves + 1 + 2 * leaves + 1;
  const rowIdx = new Int32Array(nnz), re = new Float64Array(nnz), im = new Float64Array(nnz);
  const g = Float64Array.from({ length: leaves }, () => 10 ** (-3 + 3 * rnd()));
  let p = 0;
  let hub = 0;
  for (let i = 0; i < leaves; i++) hub += g[i];
  rowIdx[p] = 0; re[p] = hub; im[p] = 1e-6; p++;
  for (let i = 0; i < leaves; i++) { rowIdx[p] = 1 + i; re[p] = -g[i]; p++; }
  rowIdx[p] = br; re[p] = 1; p++;
  colPtr[1] = p;
  for (let i = 0; i < leaves; i++) {
    rowIdx[p] = 0; re[p] = -g[i]; p++;
    rowIdx[p] = 1 + i; re[p] = g[i] + 1e-4 * (1 + rnd()); im[p] = 1e-6; p++;
    colPtr[2 + i] = p;
  }
  rowIdx[p] = 0; re[p] = 1; p++;
  colPtr[n] = p;
  return { pattern: { n, colPtr, rowIdx }, values: { re, im } };
}

function toCsc(n, cols) {
  const colPtr = new Int32Array(n + 1);
  let nnz = 0;
  for (let j = 0; j < n; j++) { nnz += cols[j].size; colPtr[j + 1] = nnz; }
  const rowIdx = new Int32Array(nnz), re = new Float64Array(nnz), im = new Float64Array(nnz);
  for (let j = 0; j < n; j++) {
    const rows = [...cols[j].keys()].sort((a, b) => a - b);
    let p = colPtr[j];
    for (const i of rows) { const v = cols[j].get(i); rowIdx[p] = i; re[p] = v[0]; im[p] = v[1]; p++; }
  }
  return { pattern: { n, colPtr, rowIdx }, values: { re, im } };
}

function matvec(pattern, values, xr, xi) {
  const { n, colPtr, rowIdx } = pattern;
  const yr = new Float64Array(n), yi = new Float64Array(n);
  for (let j = 0; j < n; j++) for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
    const i = rowIdx[p], ar = values.re[p], ai = values.im[p];
    yr[i] += ar * xr[j] - ai * xi[j]; yi[i] += ar * xi[j] + ai * xr[j];
  }
  return [yr, yi];
}

/** CPU milliseconds (user + system) since `c` from process.cpuUsage(). */
const cpuSince = (c) => {
  const d = process.cpuUsage(c);
  return (d.user + d.system) / 1000;
};
const median = (a) => a.slice().sort((x, y) => x - y)[a.length >> 1];
const MB = 2 ** 20;

const [, bundle, file, fam, sizeArg] = args;
const N = Number(sizeArg);
const { analyze, ComplexSparseLU, RealSparseLU } = await import(pathToFileURL(bundle).href);
const { pattern, values } = (() => {
  const buf = readFileSync(file);
  const [n, nz] = new Int32Array(buf.buffer.slice(buf.byteOffset, buf.byteOffset + 8));
  let off = buf.byteOffset + 8;
  const take = (T, len) => {
    const a = new T(buf.buffer.slice(off, off + len * T.BYTES_PER_ELEMENT));
    off += len * T.BYTES_PER_ELEMENT;
    return a;
  };
  const colPtr = take(Int32Array, n + 1);
  const rowIdx = take(Int32Array, nz);
  const re = take(Float64Array, nz);
  const im = take(Float64Array, nz);
  return { pattern: { n, colPtr, rowIdx }, values: { re, im } };
})();
const n = pattern.n;
const v2 = { re: values.re.map((x) => x * 1.01), im: values.im.slice() }; // a sweep point: other values
const real = values.re.map((x, p) => x + values.im[p]); // G + C/h: a real matrix of the same pattern
const real2 = real.map((x) => x * 1.01);
const rss0 = process.memoryUsage().rss;
const ab0 = process.memoryUsage().arrayBuffers;

function once() {
  const bre = new Float64Array(n).fill(1), bim = new Float64Array(n);
  let c = process.cpuUsage();
  const sym = analyze(pattern);
  const a = cpuSince(c);
  c = process.cpuUsage();
  const lu = new ComplexSparseLU(sym);
  lu.factor(values);
  const f = cpuSince(c);
  c = process.cpuUsage();
  lu.solve(bre, bim);
  const s = cpuSince(c);
  const b2 = new Float64Array(n).fill(1), c2 = new Float64Array(n);
  c = process.cpuUsage();
  const ok = lu.refactor(v2);
  const r = cpuSince(c);
  c = process.cpuUsage();
  lu.solve(b2, c2);
  const s2 = cpuSince(c);
  if (!ok) console.log('  refactor fell back');
  return { lu, b2, c2, a, f, s, tot: a + f + s, r, rs: r + s2, sym };
}

/** The real twin on the same symbolic analysis: factor, solve, refactor, solve. */
function onceReal(sym) {
  const b = new Float64Array(n).fill(1);
  let c = process.cpuUsage();
  const lu = new RealSparseLU(sym);
  lu.factor(real);
  const f = cpuSince(c);
  c = process.cpuUsage();
  lu.solve(b);
  const s = cpuSince(c);
  const b2 = new Float64Array(n).fill(1);
  c = process.cpuUsage();
  const ok = lu.refactor(real2);
  const r = cpuSince(c);
  c = process.cpuUsage();
  lu.solve(b2);
  const s2 = cpuSince(c);
  if (!ok) console.log('  real refactor fell back');
  return { lu, b2, f, s, fs: f + s, r, rs: r + s2, s2 };
}

const reps = N >= 300000 ? 3 : N >= 100000 ? 5 : N >= 10000 ? 15 : 41;
const cold = once(); // includes JIT warm-up for this size
const coldReal = RealSparseLU ? onceReal(cold.sym) : null;
const maxRss = process.resourceUsage().maxRSS * 1024;
const held = process.memoryUsage().arrayBuffers - ab0; // typed arrays the first LUs hold (and their right-hand sides)
const runs = [cold];
const realRuns = [];
for (let r = 0; r < reps; r++) {
  const run = once();
  if (RealSparseLU) realRuns.push(onceReal(run.sym));
  run.lu = run.b2 = run.c2 = null; // keep one LU (the first) for the residual check, not all of them
  runs.push(run);
}
const timed = runs.slice(1);
const { lu, b2, c2 } = cold;
const [yr, yi] = matvec(pattern, v2, b2, c2);
let resid = 0;
for (let i = 0; i < n; i++) resid = Math.max(resid, Math.hypot(yr[i] - 1, yi[i]));
const med = (rs, k) => median(rs.map((r) => r[k]));
const f = (k, rs = timed) => med(rs, k).toFixed(2).padStart(8);
console.log(`${fam} n=${n} nnz(A)=${pattern.colPtr[n]} nnz(L)=${lu.nnzL} nnz(U)=${lu.nnzU} nnz(L+U-I)=${lu.nnzL + lu.nnzU - n} max|Ax-b|=${resid.toExponential(2)}`);
console.log(`  CPU ms (median of ${reps}): analyze ${f('a')} factor ${f('f')} solve ${f('s')} | analyze+factor+solve ${f('tot')} | refactor ${f('r')} refactor+solve ${f('rs')} | ratio ${(med(timed, 'tot') / med(timed, 'rs')).toFixed(1)}x`);
const x = (a, b) => `${(a / b).toFixed(1)}x`;
console.log(`  first call in this process (cold JIT): analyze ${cold.a.toFixed(1)} factor ${cold.f.toFixed(1)} solve ${cold.s.toFixed(1)} | first/warm: analyze ${x(cold.a, med(timed, 'a'))} factor ${x(cold.f, med(timed, 'f'))} solve ${x(cold.s, med(timed, 's'))} refactor ${x(cold.r, med(timed, 'r'))}`);
if (coldReal) {
  const rl = coldReal.lu;
  const b = coldReal.b2;
  let rr = 0;
  const { colPtr, rowIdx } = pattern;
  const y = new Float64Array(n);
  for (let j = 0; j < n; j++) for (let p = colPtr[j]; p < colPtr[j + 1]; p++) y[rowIdx[p]] += real2[p] * b[j];
  for (let i = 0; i < n; i++) rr = Math.max(rr, Math.abs(y[i] - 1));
  const q = (k, kc) => (med(realRuns, k) / med(timed, kc)).toFixed(2);
  console.log(`  real twin (re + im values) nnz(L+U-I)=${rl.nnzL + rl.nnzU - n} max|Ax-b|=${rr.toExponential(2)}: factor ${f('f', realRuns)} solve ${f('s', realRuns)} refactor ${f('r', realRuns)} refactor+solve ${f('rs', realRuns)} | real/complex: factor ${q('f', 'f')} solve ${q('s', 's')} refactor ${q('r', 'r')}`);
  console.log(`  real twin first call: factor ${coldReal.f.toFixed(1)} solve ${coldReal.s.toFixed(1)} | first/warm: factor ${x(coldReal.f, med(realRuns, 'f'))}`);
}
console.log(`  memory of the first call: peak RSS ${(maxRss / MB).toFixed(1)} MB, ${((maxRss - rss0) / MB).toFixed(1)} MB above the loaded matrix; typed arrays held after it ${(held / MB).toFixed(1)} MB`);
