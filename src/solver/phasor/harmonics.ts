/**
 * The harmonic steady state: for a circuit whose sources are periodic with a
 * common fundamental f0 (sines at whole multiples of it, square waves,
 * constants, sources that follow their phasor), the response that remains once
 * the start-up has died away is, by superposition (the circuit is linear), the
 * sum over the orders n of the phasor solution at n·f0 driven by every
 * source's n-th Fourier coefficient (src/model/fourier.ts). One structure and
 * one symbolic analysis of the LU serve every order; each order re-evaluates
 * the values and refactors numerically (phasor/session.ts). Order 0 (DC) is
 * solved by the 0 Hz rules of graph-model.md, and only when some source has a
 * DC part.
 */
import { HARMONICS_SCHEMA, type Amplitudes, type ComplexJson, type GraphModel, type HarmonicResult, type HarmonicSeries, type PowerJson, type Waveform } from '../../model/graph';
import { nameTable } from '../../model/names';
import { isDissipative, sourceKindOf } from '../../model/elementFacts';
import { DEFAULT_HARMONIC_COUNT, notPeriodic, periodicFrequency, rmsAndThd, waveformHarmonic, waveformMean } from '../../model/fourier';
import { ModelRefusal } from '../errors';
import { SolverSession, type SourceValues } from './session';
import { defOf } from '../elements/registry';
import { ProbeError } from './sweep';

/** The most orders a run takes (a fundamental at most this far below the highest source frequency, too). */
export const MAX_HARMONIC_COUNT = 100_000;

/** Two frequencies are whole multiples of a fundamental when they agree with it to this relative amount. */
const RATIO_TOLERANCE = 1e-12;
/**
 * The fundamental lies at most this many times below the lowest source frequency (60 Hz beside 50 Hz: 5;
 * 85 kHz beside 50 Hz: 1). Beyond it nearly any ratio would pass as one of whole numbers, and the
 * "fundamental" would be an artefact of the digits typed.
 */
const MAX_DIVISOR = 1000;

export interface HarmonicOptions {
  /** the highest order solved (default DEFAULT_HARMONIC_COUNT) */
  count?: number;
  /** keep only these nodes and elements in the result (an unknown name is a ProbeError) */
  probe?: string[];
}

/** What each source drives at each order, found before anything is solved. */
export interface HarmonicPlan {
  fundamentalHz: number;
  count: number;
  /** orders at which some source is non-zero, ascending (0: DC) */
  orders: number[];
  /** per order: every source's value in the model's amplitudes (DC: the value itself), by element index */
  values: SourceValues[];
}


/**
 * A source's spectrum over its own frequency: DC and the line of each order of that frequency, as peak
 * phasors (a waveform's) or in the model's amplitudes already (`inModelUnits`: a source that follows its phasor).
 */
interface Spectrum { id: string; index: number; frequencyHz: number | null; dc: number; line: (k: number) => ComplexJson; inModelUnits?: boolean }

function spectrumOf(model: GraphModel, index: number): Spectrum {
  const el = model.elements[index] as { id: string; kind: string; magnitude: number; phaseDeg: number; waveform?: Waveform };
  const w = el.waveform;
  if (w) {
    const why = notPeriodic(w);
    if (why) {
      throw new ModelRefusal(
        `element "${el.id}" (${el.kind}): its waveform has no harmonic steady state: ${why}; give it a sine, square or constant waveform, or none (it then follows its phasor)`,
        [{ kind: 'element', id: el.id }],
      );
    }
    const f = periodicFrequency(w);
    const zeroAc = (w.shape === 'sine' && w.amplitude === 0) || (w.shape === 'square' && w.high === w.low);
    return { id: el.id, index, frequencyHz: zeroAc ? null : f, dc: waveformMean(w), line: (k) => waveformHarmonic(w, k) };
  }
  const ph = (el.phaseDeg * Math.PI) / 180;
  if (model.frequencyHz === 0) return { id: el.id, index, frequencyHz: null, dc: el.magnitude * Math.cos(ph), line: () => ({ re: 0, im: 0 }) };
  // the source's own phasor, in the model's amplitudes (its solve result, exactly)
  const own = defOf(el as never).phasor!(el as never);
  return { id: el.id, index, frequencyHz: el.magnitude === 0 ? null : model.frequencyHz, dc: 0, line: (k) => (k === 1 ? own : { re: 0, im: 0 }), inModelUnits: true };
}

/** p/q ≈ r (continued fractions), the first with |r − p/q| ≤ tolerance·r and q ≤ maxQ; null when there is none. */
function ratioOf(r: number, maxQ: number): { p: number; q: number } | null {
  let [p0, q0, p1, q1] = [0, 1, 1, 0];
  let x = r;
  for (let step = 0; step < 64; step++) {
    const a = Math.floor(x);
    [p0, q0, p1, q1] = [p1, q1, a * p1 + p0, a * q1 + q0];
    if (q1 > maxQ) return null;
    if (Math.abs(r - p1 / q1) <= RATIO_TOLERANCE * r) return { p: p1, q: q1 };
    const rest = x - a;
    if (rest === 0) return null;
    x = 1 / rest;
  }
  return null;
}

/**
 * The fundamental and each source's lines up to `count`. Refuses, naming the
 * source: a waveform that is not periodic; a frequency that shares no common
 * fundamental with the sources before it (their ratio is no ratio of whole
 * numbers that keeps every order within MAX_HARMONIC_COUNT); a source whose
 * own frequency lies above the orders asked for; a circuit with no periodic source.
 */
export function harmonicPlan(model: GraphModel, count = DEFAULT_HARMONIC_COUNT): HarmonicPlan {
  const spectra: Spectrum[] = [];
  model.elements.forEach((el, i) => {
    if (sourceKindOf(el)) spectra.push(spectrumOf(model, i));
  });
  if (spectra.length === 0) throw new ModelRefusal('model: the circuit has no source, so it has no steady state to split into harmonics', [{ kind: 'model' }]);
  const periodic = spectra.filter((s) => s.frequencyHz !== null);
  if (periodic.length === 0) {
    throw new ModelRefusal(
      'model: no source of the circuit is periodic (every one is constant or zero), so its steady state is the DC solve; give a source a sine or square waveform, or a frequency above 0 Hz',
      [{ kind: 'model' }],
    );
  }
  // the common fundamental, source by source: f0 ← f0/q where f/f0 = p/q in lowest terms
  let f0 = periodic[0].frequencyHz!;
  let lowest = f0;
  let highest = f0;
  for (const s of periodic.slice(1)) {
    const f = s.frequencyHz!;
    const r = ratioOf(f / f0, MAX_DIVISOR);
    const next = r ? f0 / r.q : 0;
    lowest = Math.min(lowest, f);
    highest = Math.max(highest, f);
    if (!r || lowest / next > MAX_DIVISOR + 0.5 || highest / next > MAX_HARMONIC_COUNT + 0.5) {
      throw new ModelRefusal(
        `element "${s.id}": its ${f} Hz shares no common fundamental with "${periodic[0].id}" at ${periodic[0].frequencyHz} Hz (their ratio ${Number((f / periodic[0].frequencyHz!).toPrecision(10))} is no ratio of whole numbers m/n with n up to ${MAX_DIVISOR}); make every source frequency a whole multiple of one fundamental`,
        [{ kind: 'element', id: s.id }],
      );
    }
    f0 = next;
  }
  const orderOf = (f: number) => Math.round(f / f0);
  for (const s of periodic) {
    const m = orderOf(s.frequencyHz!);
    if (m > count) {
      throw new ModelRefusal(
        `element "${s.id}": its ${s.frequencyHz} Hz is harmonic ${m} of the common fundamental ${Number(f0.toPrecision(12))} Hz, above the ${count} harmonics asked for; ask for at least ${m}`,
        [{ kind: 'element', id: s.id }],
      );
    }
  }
  const toModel = model.amplitudes === 'rms' ? Math.SQRT1_2 : 1;
  const lines = new Map<number, Map<number, { re: number; im: number }>>();
  const put = (order: number, index: number, re: number, im: number) => {
    if (re === 0 && im === 0) return;
    let at = lines.get(order);
    if (!at) lines.set(order, (at = new Map()));
    at.set(index, { re, im });
  };
  for (const s of spectra) {
    put(0, s.index, s.dc, 0);
    if (s.frequencyHz === null) continue;
    const m = orderOf(s.frequencyHz);
    const scale = s.inModelUnits ? 1 : toModel;
    for (let k = 1; k * m <= count; k++) {
      const a = s.line(k);
      put(k * m, s.index, scale * a.re, scale * a.im);
    }
  }
  const orders = [...lines.keys()].sort((a, b) => a - b);
  const n = model.elements.length;
  const values = orders.map((o) => {
    const v = { re: new Float64Array(n), im: new Float64Array(n) };
    for (const [i, z] of lines.get(o)!) {
      v.re[i] = z.re;
      v.im[i] = z.im;
    }
    return v;
  });
  return { fundamentalHz: f0, count, orders, values };
}

const z = (v: number) => (v === 0 ? 0 : v);

function series(phasors: ComplexJson[], orders: number[], amplitudes: Amplitudes): HarmonicSeries {
  const { rms, thd } = rmsAndThd(orders, phasors, amplitudes === 'rms' ? 1 : Math.SQRT1_2);
  return thd === null ? { phasors, rms } : { phasors, rms, thd };
}

/** The harmonic steady state of a model (see the module's comment); refusals name the source, or the order at which a solve fails. */
export function harmonicSteadyState(model: GraphModel, options: HarmonicOptions = {}): HarmonicResult {
  const count = options.count ?? DEFAULT_HARMONIC_COUNT;
  if (!(Number.isInteger(count) && count >= 1 && count <= MAX_HARMONIC_COUNT)) {
    throw new ProbeError(`--count must be a whole number from 1 to ${MAX_HARMONIC_COUNT}, got ${count}`);
  }
  const plan = harmonicPlan(model, count);
  const session = new SolverSession(model);
  const nodeNames = session.topo.nodeNames;
  let keepNodes = nodeNames;
  let keepElements = model.elements.map((e) => e.id);
  if (options.probe) {
    const nodeSet = new Set(nodeNames);
    const ids = new Set(keepElements);
    for (const name of options.probe) {
      if (!nodeSet.has(name) && !ids.has(name)) throw new ProbeError(`--probe: "${name}" is neither a node nor an element of this model`);
    }
    const wanted = new Set(options.probe);
    keepNodes = nodeNames.filter((n) => wanted.has(n));
    keepElements = keepElements.filter((id) => wanted.has(id));
  }
  const keepSet = new Set(keepElements);
  const nodeIndex = keepNodes.map((n) => session.topo.nodeIndex.get(n)!);
  const nodeP = keepNodes.map(() => [] as ComplexJson[]);
  // the elements read at each order: the kept ones, and the sources and lossy parts for the balance
  const lossy = model.elements.map((e) => isDissipative(e));
  const source = model.elements.map((e) => sourceKindOf(e) !== undefined);
  const read: number[] = [];
  model.elements.forEach((e, i) => {
    if (keepSet.has(e.id) || lossy[i] || source[i]) read.push(i);
  });
  const ports = model.elements.map((e) => defOf(e).ports.length);
  const elP = new Map<number, { v: ComplexJson[][]; i: ComplexJson[][]; power: PowerJson[] }>();
  model.elements.forEach((e, i) => {
    if (keepSet.has(e.id)) elP.set(i, { v: Array.from({ length: ports[i] }, () => []), i: Array.from({ length: ports[i] }, () => []), power: [] });
  });
  const delivered: number[] = [];
  const dissipated: number[] = [];
  const port = { vr: 0, vi: 0, ir: 0, ii: 0 };
  plan.orders.forEach((order, k) => {
    const f = order * plan.fundamentalHz;
    let sol;
    try {
      sol = session.solveRaw(f, plan.values[k]);
    } catch (e) {
      if (e instanceof ModelRefusal) throw new ModelRefusal(`${e.message} (harmonic ${order} of ${plan.fundamentalHz} Hz)`, e.culprits);
      throw e;
    }
    nodeIndex.forEach((v, q) => nodeP[q].push({ re: z(sol.vRe[v]), im: z(sol.vIm[v]) }));
    // S = V·conj(I) at DC and for RMS phasors, ½·V·conj(I) for peak ones (graph-model.md)
    const scale = order === 0 || model.amplitudes === 'rms' ? 1 : 0.5;
    let d = 0;
    let l = 0;
    for (const i of read) {
      const out = elP.get(i);
      let watts = 0;
      let vars = 0;
      for (let p = 0; p < ports[i]; p++) {
        session.readPort(sol, i, p, port);
        watts += scale * (port.vr * port.ir + port.vi * port.ii);
        vars += scale * (port.vi * port.ir - port.vr * port.ii);
        if (out) {
          out.v[p].push({ re: z(port.vr), im: z(port.vi) });
          out.i[p].push({ re: z(port.ir), im: z(port.ii) });
        }
      }
      if (!Number.isFinite(watts) || !Number.isFinite(vars)) {
        const id = model.elements[i].id;
        throw new ModelRefusal(`element "${id}": its power overflows at harmonic ${order} of ${plan.fundamentalHz} Hz (more than 1.8e308 W or var); bring the circuit's voltages, currents and values nearer to everyday sizes`, [{ kind: 'element', id }]);
      }
      if (source[i]) d -= watts;
      if (lossy[i]) l += watts;
      out?.power.push({ watts: z(watts), vars: z(vars) });
    }
    delivered.push(z(d));
    dissipated.push(z(l));
  });
  const { orders } = plan;
  const amp = model.amplitudes;
  const nodes = nameTable<HarmonicSeries>();
  keepNodes.forEach((name, q) => (nodes[name] = series(nodeP[q], orders, amp)));
  const elements = nameTable<HarmonicResult['elements'][string]>();
  for (const [i, p] of elP) {
    const id = model.elements[i].id;
    const watts = z(p.power.reduce((s, x) => s + x.watts, 0));
    elements[id] = p.v.length === 2
      ? { voltages: [series(p.v[0], orders, amp), series(p.v[1], orders, amp)], currents: [series(p.i[0], orders, amp), series(p.i[1], orders, amp)], power: p.power, watts }
      : { voltage: series(p.v[0] ?? [], orders, amp), current: series(p.i[0] ?? [], orders, amp), power: p.power, watts };
  }
  const sum = (a: number[]) => z(a.reduce((s, x) => s + x, 0));
  return {
    schema: HARMONICS_SCHEMA,
    amplitudes: amp,
    fundamentalHz: plan.fundamentalHz,
    count,
    orders: [...orders],
    frequenciesHz: orders.map((o) => o * plan.fundamentalHz),
    nodes,
    elements,
    balance: { delivered, dissipated, totalDelivered: sum(delivered), totalDissipated: sum(dissipated) },
    warnings: [...session.warnings],
  };
}
