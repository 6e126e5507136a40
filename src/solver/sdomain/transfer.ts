/**
 * The transfer function H(s) = Y(s)/U(s) from one source to one output
 * (contract: time-and-s-domain.md, "tf"), and the natural frequencies of the
 * whole circuit, on the full descriptor (G, C, B): every other independent
 * source zero, every initial value zero.
 *
 * Poles are the finite eigenvalues of the pencil (G, C) that H keeps: the
 * modal form (modal.ts) takes each natural frequency's residue from H itself
 * and the zeros from a small matrix of that realisation. Where that form does
 * not apply (an improper H, a multiple pole), the zeros are the eigenvalues of
 * the system matrix [[G + sC, −b], [c(s)ᵀ, d]] (H = det of it over
 * det(G + sC), by the Schur complement), which include every pole the input
 * does not reach or the output does not see. Pairs that cancel are removed, so
 * the printed H is minimal; its gain comes from one direct solve at a complex
 * test point, and the factored H is checked against direct solves on the jω
 * axis.
 */
import { TRANSFER_SCHEMA, type ComplexJson, type GraphModel, type TransferResult } from '../../model/graph';
import { ModelRefusal } from '../errors';
import { buildTopology } from '../core/topology';
import { checkSolvable } from '../core/checks';
import { collectMutuals } from '../core/windings';
import { buildDescriptor, type Descriptor } from '../core/descriptor';
import { defOf, sourceRole } from '../elements/registry';
import { analyze, ComplexSparseLU } from '../lu-backend';
import { SingularMatrixError, type CscPattern } from '../sparse/types';
import { SolverSession } from '../phasor/session';
import { pencilEigenvalues, PencilTooLarge, type Roots, type SparsePencil } from './pencil';
import { cdiv, cmul, monicFromRoots, rootProduct, type C } from './polynomial';
import { cleanRoots, minimalRoots, settleZeroCluster } from './minimal';
import { modalTransfer } from './modal';

/** A command-line usage fault of `tf` (exit 2): unknown source, node or element, or a malformed output. */
export class TransferUsageError extends Error {}

/** The output as a linear form y = c0·x + s·c1·x + d·u. */
interface OutputForm {
  idx: number[];
  c0: number[];
  c1: number[];
  d: number;
}

function outputForm(model: GraphModel, d: Descriptor, terminals: Int32Array, nodeIndex: Map<string, number>, what: string, input: number): OutputForm {
  const m = /^(node|voltage|current):(.+)$/.exec(what);
  if (!m) throw new TransferUsageError(`--output must be node:NAME, voltage:ELEMENT or current:ELEMENT, got "${what}"`);
  const [, kind, name] = m;
  const form: OutputForm = { idx: [], c0: [], c1: [], d: 0 };
  const add = (u: number, a: number, b: number) => {
    if (u < 0) return;
    form.idx.push(u);
    form.c0.push(a);
    form.c1.push(b);
  };
  if (kind === 'node') {
    const v = nodeIndex.get(name);
    if (v === undefined) throw new TransferUsageError(`--output: "${name}" is not a node of this model`);
    add(d.nodeUnknown[v], 1, 0);
    return form;
  }
  const i = model.elements.findIndex((e) => e.id === name);
  if (i < 0) throw new TransferUsageError(`--output: "${name}" is not an element of this model`);
  const el = model.elements[i];
  const port = defOf(el).ports[0]; // on an ideal transformer: its primary
  const a = d.nodeUnknown[terminals[4 * i + port.terminals[0]]];
  const b = d.nodeUnknown[terminals[4 * i + port.terminals[1]]];
  if (kind === 'voltage') {
    add(a, 1, 0);
    add(b, -1, 0);
    return form;
  }
  const rule = port.current;
  switch (rule.kind) {
    case 'resistance': {
      const ohms = rule.ohms(el as never, {});
      add(a, 1 / ohms, 0);
      add(b, -1 / ohms, 0);
      break;
    }
    case 'capacitance': {
      const farads = rule.farads(el as never);
      add(a, 0, farads);
      add(b, 0, -farads);
      break;
    }
    case 'branch':
      add(d.branchUnknown[i] + rule.branch, rule.gain(el as never), 0);
      break;
    case 'source':
      form.d = i === input ? 1 : 0;
      break;
  }
  return form;
}

/** The system matrix [[G, −b], [c0ᵀ, d]] + s·[[C, 0], [c1ᵀ, 0]] as a sparse pencil of order n+1. */
function systemPencil(d: Descriptor, bRows: number[], bCoef: number[], out: OutputForm): SparsePencil {
  const n = d.n;
  const { colPtr, rowIdx } = d.pattern;
  const last0 = new Map<number, number>();
  const last1 = new Map<number, number>();
  out.idx.forEach((u, t) => {
    last0.set(u, (last0.get(u) ?? 0) + out.c0[t]);
    last1.set(u, (last1.get(u) ?? 0) + out.c1[t]);
  });
  const cp = new Int32Array(n + 2);
  const ri: number[] = [];
  const a: number[] = [];
  const e: number[] = [];
  for (let j = 0; j < n; j++) {
    cp[j] = ri.length;
    for (let s = colPtr[j]; s < colPtr[j + 1]; s++) {
      ri.push(rowIdx[s]);
      a.push(d.g[s]);
      e.push(d.c[s]);
    }
    if (last0.has(j)) {
      ri.push(n);
      a.push(last0.get(j)!);
      e.push(last1.get(j)!);
    }
  }
  cp[n] = ri.length;
  const col = bRows.map((r, t) => [r, -bCoef[t]] as [number, number]).sort((x, y) => x[0] - y[0]);
  for (const [r, v] of col) {
    ri.push(r);
    a.push(v);
    e.push(0);
  }
  ri.push(n);
  a.push(out.d);
  e.push(0);
  cp[n + 1] = ri.length;
  const pattern: CscPattern = { n: n + 1, colPtr: cp, rowIdx: Int32Array.from(ri) };
  return { pattern, a: Float64Array.from(a), e: Float64Array.from(e) };
}

/** Direct evaluations of H at complex points, with the size of the terms that make up each. */
class DirectH {
  private readonly lu: ComplexSparseLU;
  private factored = false;
  private readonly re: Float64Array;
  private readonly im: Float64Array;
  constructor(private readonly d: Descriptor, private readonly bRows: number[], private readonly bCoef: number[], private readonly out: OutputForm) {
    this.lu = new ComplexSparseLU(analyze(d.pattern));
    this.re = new Float64Array(d.pattern.rowIdx.length);
    this.im = new Float64Array(d.pattern.rowIdx.length);
  }
  at(s: C): { h: C; size: number } {
    const { d, re, im } = this;
    for (let t = 0; t < re.length; t++) {
      re[t] = d.g[t] + s.re * d.c[t];
      im[t] = s.im * d.c[t];
    }
    if (this.factored) this.lu.refactor({ re, im });
    else this.lu.factor({ re, im });
    this.factored = true;
    const xr = new Float64Array(d.n);
    const xi = new Float64Array(d.n);
    this.bRows.forEach((r, t) => (xr[r] += this.bCoef[t]));
    this.lu.solve(xr, xi);
    let hr = this.out.d;
    let hi = 0;
    let xmax = 0;
    for (let u = 0; u < xr.length; u++) xmax = Math.max(xmax, Math.hypot(xr[u], xi[u]));
    // how large the output could be from this state: Σ|c_i(s)|·max|x| + |d|
    let size = Math.abs(this.out.d);
    this.out.idx.forEach((u, t) => {
      // (c0 + s·c1)·x
      const kr = this.out.c0[t] + s.re * this.out.c1[t];
      const ki = s.im * this.out.c1[t];
      hr += kr * xr[u] - ki * xi[u];
      hi += kr * xi[u] + ki * xr[u];
      size += Math.hypot(kr, ki) * xmax;
    });
    return { h: { re: hr, im: hi }, size };
  }
}

function magnitudes(r: Roots): number[] {
  return r.re.map((x, i) => Math.hypot(x, r.im[i]));
}

function sortRoots(r: Roots): Roots {
  const order = r.re.map((_, i) => i).sort((i, j) => {
    const mi = Math.hypot(r.re[i], r.im[i]);
    const mj = Math.hypot(r.re[j], r.im[j]);
    if (mi !== mj) return mi - mj;
    if (r.re[i] !== r.re[j]) return r.re[j] - r.re[i];
    return r.im[j] - r.im[i];
  });
  return { re: order.map((i) => r.re[i]), im: order.map((i) => r.im[i]) };
}

const json = (r: Roots): ComplexJson[] => r.re.map((re, i) => ({ re, im: r.im[i] }));

export function transferFunction(model: GraphModel, inputId: string, output: string): TransferResult {
  const input = model.elements.findIndex((e) => e.id === inputId);
  if (input < 0) throw new TransferUsageError(`--input: "${inputId}" is not an element of this model`);
  if (!sourceRole(model.elements[input])) {
    throw new TransferUsageError(`--input: "${inputId}" is a ${model.elements[input].kind}, not a voltage or current source`);
  }
  const topo = buildTopology(model);
  const mutuals = collectMutuals(model);
  const d = buildDescriptor(model, topo, mutuals);
  const out = outputForm(model, d, topo.terminals, topo.nodeIndex, output, input);
  checkSolvable(model, topo, 1); // the structural refusals of any frequency above 0 Hz

  const bRows = Array.from(d.srcRow.subarray(d.srcPtr[input], d.srcPtr[input + 1]));
  const bCoef = Array.from(d.srcCoef.subarray(d.srcPtr[input], d.srcPtr[input + 1]));
  const warnings = [...topo.warnings];

  let natural: Roots;
  let shift: number;
  try {
    ({ roots: natural, shift } = pencilEigenvalues({ pattern: d.pattern, a: d.g, e: d.c }));
  } catch (e) {
    if (e instanceof PencilTooLarge) throw new ModelRefusal(`model: ${e.message}; this model is too large for tf`, [{ kind: 'model' }]);
    if (e instanceof SingularMatrixError) throw singularRefusal(model);
    throw e;
  }
  const scaleOf = (r: Roots) => Math.max(0, ...magnitudes(r));
  const direct = new DirectH(d, bRows, bCoef, out);
  // test points spread over the spectrum, off the axes
  const rho = geometricMiddle(natural, shift);
  const tests: C[] = [0.37, 1, 2.9].map((f) => ({ re: -0.31 * rho * f, im: 0.95 * rho * f }));
  const values = tests.map((s) => {
    try {
      return direct.at(s);
    } catch (e) {
      if (e instanceof SingularMatrixError) throw singularRefusal(model);
      throw e;
    }
  });

  const base = { schema: TRANSFER_SCHEMA, input: inputId, output } as const;
  const identicallyZero = values.every((v) => Math.hypot(v.h.re, v.h.im) <= 1e-12 * v.size || v.size === 0);
  // the scale roots are measured against: the largest root, or the circuit's typical rate when all are at 0
  const largestNatural = Math.max(scaleOf(natural), 1e-6 * shift);
  const naturalFrequencies = json(sortRoots(cleanRoots(settleZeroCluster(natural, largestNatural), largestNatural)));
  if (identicallyZero) {
    warnings.push(`H(s) is 0 at every frequency: source "${inputId}" does not reach ${output}`);
    return { ...base, gain: 0, zeros: [], poles: [], numerator: [], denominator: [], naturalFrequencies, warnings };
  }

  // gain from the test point where H is largest relative to its terms (the best conditioned)
  let best = 0;
  for (let t = 1; t < values.length; t++) {
    if (Math.hypot(values[t].h.re, values[t].h.im) / values[t].size > Math.hypot(values[best].h.re, values[best].h.im) / values[best].size) best = t;
  }
  const probe = (s: C): { h: C; size: number } | null => {
    try {
      return direct.at(s);
    } catch (e) {
      if (e instanceof SingularMatrixError) return null;
      throw e;
    }
  };
  // the modal form needs the natural frequencies and H alone; the system matrix's eigenvalues (a second
  // dense eigensolve of the same order, the costliest step) only where it does not apply
  let largest = largestNatural;
  let minimal = modalTransfer(natural, { re: [], im: [] }, probe, largest);
  if (minimal) largest = Math.max(largest, scaleOf(minimal.zeros));
  else {
    let zerosAll: Roots;
    let zeroShift: number;
    try {
      ({ roots: zerosAll, shift: zeroShift } = pencilEigenvalues(systemPencil(d, bRows, bCoef, out), zeroPencilShift(direct, shift, rho)));
    } catch (e) {
      if (e instanceof PencilTooLarge) throw new ModelRefusal(`model: ${e.message}; this model is too large for tf`, [{ kind: 'model' }]);
      if (e instanceof SingularMatrixError) throw singularRefusal(model);
      throw e;
    }
    largest = Math.max(largestNatural, scaleOf(zerosAll), 1e-6 * zeroShift);
    minimal = modalTransfer(natural, zerosAll, probe, largest) ?? minimalRoots(zerosAll, natural, largest, probe);
  }
  minimal.zeros = cleanRoots(settleZeroCluster(minimal.zeros, largest), largest);
  const poles = sortRoots(minimal.poles);
  const zeros = sortRoots(minimal.zeros);
  const k = cmul(values[best].h, cdiv(rootProduct(poles, tests[best]), rootProduct(zeros, tests[best])));
  const worst = checkOnAxis(direct, k.re, zeros, poles, rho);
  const gain = k.re;
  if (Math.abs(k.im) > 1e-6 * Math.abs(k.re)) {
    warnings.push(`the gain came out complex (${k.re} + ${k.im}j) before rounding to its real part: the poles and zeros may be inaccurate`);
  }
  if (worst > 1e-6) {
    warnings.push(`the factored H(s) agrees with the direct solve to ${worst.toPrecision(2)} relative only (poles or zeros too close together to separate)`);
  }
  const numerator = monicFromRoots(zeros).map((c) => c * gain + 0);
  const denominator = monicFromRoots(poles).map((c) => c + 0);
  return { ...base, gain, zeros: json(zeros), poles: json(poles), numerator, denominator, naturalFrequencies, warnings };
}

/**
 * A real shift for the system matrix M(σ) = [[G + σC, −b], [cᵀ, d]]. Its last
 * pivot is the Schur complement H(σ), and ‖M(σ)⁻¹‖ grows as 1/|H(σ)|: for a
 * strictly proper H that falls as σ^−(relative degree) beyond the poles (and,
 * along a long ladder, as a product over every pole below σ), so a shift that
 * suits G + σC (a rate typical of the state columns, often far above the
 * poles) leaves a pivot at rounding level, and the pencil would be taken as
 * singular at every s, though det M(s) = det(G + sC)·H(s) is not 0. The shift
 * is taken where |H(σ)| is largest against the terms that make it up, over
 * the decades about the circuit's own rates (direct solves, cheap beside the
 * eigensolve).
 */
function zeroPencilShift(direct: DirectH, shift: number, rho: number): number {
  const tried: { sigma: number; ratio: number }[] = [];
  for (let k = -8; k <= 2; k++) {
    for (const base of [rho, shift]) {
      const sigma = base * 10 ** k * 1.0317; // off the decades, so it does not sit on a root
      let v;
      try {
        v = direct.at({ re: sigma, im: 0 });
      } catch (e) {
        if (e instanceof SingularMatrixError) continue;
        throw e;
      }
      const ratio = v.size > 0 ? Math.hypot(v.h.re, v.h.im) / v.size : 0;
      if (Number.isFinite(ratio)) tried.push({ sigma, ratio });
    }
  }
  const top = Math.max(0, ...tried.map((t) => t.ratio));
  if (!(top > 0)) return rho * 1.0317;
  // nearest the circuit's typical rate among those within a decade of the best
  const near = (t: { sigma: number }) => Math.abs(Math.log(t.sigma / rho));
  return tried.filter((t) => t.ratio >= 0.1 * top).reduce((a, b) => (near(b) < near(a) ? b : a)).sigma;
}

/** The geometric middle of the roots' magnitudes, those at 0 left out; the shift when none is left. */
function geometricMiddle(r: Roots, shift: number): number {
  const all = magnitudes(r);
  const floor = 1e-9 * Math.max(shift, ...all);
  const m = all.filter((x) => x > floor);
  if (!m.length) return shift;
  return Math.sqrt(Math.min(...m) * Math.max(...m));
}

/** Largest relative difference between the factored H and a direct solve at points on the jω axis. */
function checkOnAxis(direct: DirectH, gain: number, zeros: Roots, poles: Roots, rho: number): number {
  let worst = 0;
  for (const f of [0.013, 0.21, 1.07, 4.3, 61]) {
    const s = { re: 0, im: rho * f };
    let v;
    try {
      v = direct.at(s);
    } catch {
      continue; // a pole on the axis
    }
    const fac = cmul({ re: gain, im: 0 }, cdiv(rootProduct(zeros, s), rootProduct(poles, s)));
    const diff = Math.hypot(fac.re - v.h.re, fac.im - v.h.im);
    const size = Math.max(Math.hypot(v.h.re, v.h.im), 1e-9 * v.size);
    if (size > 0 && Number.isFinite(diff)) worst = Math.max(worst, diff / size);
  }
  return worst;
}

/** The phasor engine's own refusal for a model whose pencil is singular at every s. */
function singularRefusal(model: GraphModel): ModelRefusal {
  try {
    new SolverSession({ ...model, frequencyHz: 1 }).solveAt(1);
  } catch (e) {
    if (e instanceof ModelRefusal) return e;
  }
  return new ModelRefusal('model: its equations are singular at every frequency (a short or an open that fixes nothing); check the circuit for a part that shorts a source', [{ kind: 'model' }]);
}
