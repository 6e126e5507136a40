/**
 * The analysis worker's work, as plain functions of a graph model (testable
 * without a Worker). Every model goes through parseGraphModel first, as the
 * solve worker does.
 */
import type { ComplexJson, GraphModel, InductorEl, SolveResult, TwoTerminalResult } from '../model/graph';
import { withNameTables } from '../model/names';
import { portAgreement } from '../model/resultCompare';
import { hasValueTarget, withValue } from '../model/valueTarget';
import type { CompareAnswer, HarmonicAnswer, InspectAnswer, PowerAnswer, SweepQuantity, SweepSpec, TAnswer, TransferAnswer } from './protocol';
import {
  compareDotFlip, connectionOf, createSession, frequencyGrid, harmonicSteadyState, pairState, parseGraphModel, powerSummary,
  reflectedImpedance, solveGraph, sourceImpedance, substituteTEquivalent, tEquivalent, transferFunction, type SolverSession,
} from '../solver';
import { sourceRole } from '../solver/elements/registry';

type C = ComplexJson;
const ZERO: C = { re: 0, im: 0 };
const sub = (a: C, b: C): C => ({ re: a.re - b.re, im: a.im - b.im });
const add = (a: C, b: C): C => ({ re: a.re + b.re, im: a.im + b.im });
const div = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
const abs = (a: C) => Math.hypot(a.re, a.im);

function couplingPair(model: GraphModel, coupling: string, pair?: [string, string]): [string, string] {
  const c = (model.couplings ?? []).find((x) => x.id === coupling);
  if (!c) throw new Error(`coupling "${coupling}" is not on this sheet`);
  return pair ?? [c.windings[0], c.windings[1]];
}

/** Coupling state at the solved currents, the reflected impedances and what each source sees. */
export function inspect(raw: GraphModel, received: SolveResult, coupling: string, pair?: [string, string]): InspectAnswer {
  const model = parseGraphModel(raw);
  const result = withNameTables(received);
  const [a, b] = couplingPair(model, coupling, pair);
  const st = pairState(model, result, coupling, [a, b]);
  const refl = [reflectedImpedance(model, a), reflectedImpedance(model, b)];
  const conn = connectionOf(model, coupling, [a, b]);
  const sources = model.elements
    .filter((e) => sourceRole(e) !== undefined)
    .map((e) => {
      try {
        return { id: e.id, z: sourceImpedance(model, e.id).z };
      } catch {
        return { id: e.id, z: null };
      }
    });
  return {
    windings: [a, b], l1: st.l1, l2: st.l2, m: st.m, k: st.k, flux: st.flux, energyJ: st.energyJ, interaction: st.interaction,
    reflected: [refl[0].reflected, refl[1].reflected],
    reflectedFrom: [refl[0].partners, refl[1].partners],
    connection: conn,
    sources,
    frequencyHz: model.frequencyHz,
    amplitudes: model.amplitudes,
  };
}

const nodeV = (r: SolveResult, n: string): C => r.nodes[n] ?? ZERO;

/**
 * Effective inductance of a series or parallel connected pair, measured
 * from a solve: L = Im(V/I)/ω across the combination.
 */
export function measuredInductance(model: GraphModel, result: SolveResult, a: string, b: string, kind: 'series' | 'parallel'): number | null {
  const w1 = model.elements.find((e) => e.id === a) as InductorEl;
  const w2 = model.elements.find((e) => e.id === b) as InductorEl;
  const i1 = (result.elements[a] as TwoTerminalResult).current;
  const i2 = (result.elements[b] as TwoTerminalResult).current;
  const omega = 2 * Math.PI * result.frequencyHz;
  let v: C;
  let i: C;
  if (kind === 'series') {
    const mid = w1.nodes.find((n) => w2.nodes.includes(n))!;
    const end1 = w1.nodes[0] === mid ? w1.nodes[1] : w1.nodes[0];
    const end2 = w2.nodes[0] === mid ? w2.nodes[1] : w2.nodes[0];
    v = sub(nodeV(result, end1), nodeV(result, end2));
    i = end1 === w1.nodes[0] ? i1 : { re: -i1.re, im: -i1.im };
  } else {
    v = sub(nodeV(result, w1.nodes[0]), nodeV(result, w1.nodes[1]));
    i = add(i1, w2.nodes[0] === w1.nodes[0] ? i2 : { re: -i2.re, im: -i2.im });
  }
  if (abs(i) === 0 || omega === 0) return null;
  return div(v, i).im / omega;
}

/** The circuit as drawn against the same with one dot flipped. */
export function compare(raw: GraphModel, winding: string, coupling?: string): CompareAnswer {
  const model = parseGraphModel(raw);
  const cmp = compareDotFlip(model, winding);
  let connection: CompareAnswer['connection'] = null;
  const c = (model.couplings ?? []).find((x) => (coupling ? x.id === coupling : x.windings.includes(winding)));
  if (c && c.windings.length === 2) {
    const pair = c.windings as [string, string];
    const conn = connectionOf(model, c.id, pair);
    if (conn) {
      const aiding = conn.sense === 'aiding' ? conn.inductance : conn.otherSense;
      const opposing = conn.sense === 'aiding' ? conn.otherSense : conn.inductance;
      connection = {
        kind: conn.kind, sense: conn.sense, aiding, opposing,
        measuredBefore: measuredInductance(model, cmp.before, pair[0], pair[1], conn.kind),
        measuredAfter: measuredInductance(cmp.flipped, cmp.after, pair[0], pair[1], conn.kind),
      };
    }
  }
  return {
    winding,
    changes: cmp.changes.map(({ label, quantity, before, after, delta }) => ({ label, quantity, before, after, delta })),
    inputImpedance: cmp.inputImpedance.map((x) => ({ source: x.source, before: x.before.z, after: x.after.z })),
    connection,
  };
}

/** T-equivalent arms and notes, with a solve of the model before and after the substitution to check the ports agree. */
export function tCheck(raw: GraphModel, coupling: string): TAnswer {
  const model = parseGraphModel(raw);
  const t = tEquivalent(model, coupling);
  const s = substituteTEquivalent(model, coupling);
  const before = solveGraph(model);
  const after = solveGraph(parseGraphModel(s.model));
  const w1 = model.elements.find((e) => e.id === t.windings[0])!;
  const w2 = model.elements.find((e) => e.id === t.windings[1])!;
  const outerPins: [0 | 1, 0 | 1] = [w1.nodes[0] === t.ports.outer1 ? 0 : 1, w2.nodes[0] === t.ports.outer2 ? 0 : 1];
  // an arm runs from the outer terminal to the centre, so its reference direction is reversed where the outer terminal was the second
  const reversed = new Set(t.windings.filter((_, s) => outerPins[s] === 1));
  const { maxRel, compared } = portAgreement(before, after, new Set(t.windings), reversed);
  return {
    windings: t.windings,
    outerPins,
    l1: t.l1, l2: t.l2, m: t.m, arm1: t.arm1, arm2: t.arm2, shunt: t.shunt,
    shared: t.common !== null,
    negativeArms: t.negativeArms,
    notes: t.notes,
    check: { maxRel, compared },
  };
}

export function power(raw: GraphModel, received: SolveResult): PowerAnswer {
  const model = parseGraphModel(raw);
  const result = withNameTables(received);
  const s = powerSummary(model, result);
  return {
    rows: s.rows, delivered: s.delivered, dissipated: s.dissipated,
    tellegen: { watts: s.tellegen.watts, vars: s.tellegen.vars, relative: s.tellegen.relative },
    amplitudes: model.amplitudes,
  };
}

// ---------------------------------------------------------------- sweeps

/** [start, end) index ranges of `chunk` points covering `total`. */
export function chunkRanges(total: number, chunk: number): [number, number][] {
  const size = Math.max(1, Math.floor(chunk));
  const out: [number, number][] = [];
  for (let s = 0; s < total; s += size) out.push([s, Math.min(total, s + size)]);
  return out;
}

/** A sweep prepared once (sessions built, names checked), solved range by range. */
export interface PreparedSweep {
  frequencies: number[];
  /** a value sweep: the swept values */
  values?: number[];
  traces: Float64Array[];
  run(start: number, end: number): void;
}

/** The sessions a set of quantities needs on one model: the circuit, and per source asked about, the circuit driven by it alone at 1∠0°. */
function sweepSessions(model: GraphModel, sources: Map<string, 'voltage' | 'current'>) {
  const session = createSession(model);
  const zin = new Map<string, { session: SolverSession; drives: 'voltage' | 'current' }>();
  for (const [id, drives] of sources) {
    // the rest of the circuit with every other source zeroed, driven by this one at 1∠0°
    const test: GraphModel = {
      ...model,
      elements: model.elements.map((e) =>
        sourceRole(e) ? { ...e, magnitude: e.id === id ? 1 : 0, phaseDeg: 0 } : e),
    };
    zin.set(id, { session: createSession(test), drives });
  }
  return { session, zin };
}

export const VALUE_SWEEP_MAX_POINTS = 5000;

export function prepareSweep(raw: GraphModel, spec: SweepSpec): PreparedSweep {
  const model = parseGraphModel(raw);
  const over = spec.over;
  if (over) {
    if (!(spec.points >= 2 && spec.points <= VALUE_SWEEP_MAX_POINTS)) throw new Error(`a value sweep takes between 2 and ${VALUE_SWEEP_MAX_POINTS} points`);
    if (!hasValueTarget(model, over.target)) throw new Error(`${over.target.kind === 'coupling' ? 'coupling' : 'part'} "${over.target.id}" has no value to sweep on this sheet`);
    if (!(Number.isFinite(spec.from) && Number.isFinite(spec.to) && spec.to > spec.from)) throw new Error('the values must run from a lower to a higher one');
    if (spec.log && !(spec.from > 0)) throw new Error('log spacing needs values above 0');
    if (!(over.frequencyHz >= 0 && Number.isFinite(over.frequencyHz))) throw new Error('the frequency of a value sweep must be 0 Hz or more');
  } else {
    if (!(spec.points >= 2 && spec.points <= 100000)) throw new Error('points must be between 2 and 100000');
    if (!(spec.from > 0 && spec.to > spec.from)) throw new Error('the range must run from a frequency above 0 Hz to a higher one');
  }
  const n = Math.round(spec.points);
  const xs = frequencyGrid(spec.from, spec.to, n, spec.log);
  const frequencies = over ? new Array<number>(n).fill(over.frequencyHz) : xs;
  const values = over ? xs : undefined;
  const nodes = new Set<string>();
  const elements = new Set<string>();
  const sources = new Map<string, 'voltage' | 'current'>();
  const ids = new Set(model.elements.map((e) => e.id));
  const base = sweepSessions(model, new Map());
  const nodeNames = new Set(base.session.topo.nodeNames);
  const need = (q: SweepQuantity): void => {
    switch (q.kind) {
      case 'node':
        if (!nodeNames.has(q.node) && q.node !== model.ground) throw new Error(`node "${q.node}" is not on this sheet`);
        nodes.add(q.node);
        return;
      case 'current': case 'voltage': case 'power':
        if (!ids.has(q.element)) throw new Error(`part "${q.element}" is not on this sheet`);
        elements.add(q.element);
        return;
      case 'zin': {
        const src = model.elements.find((e) => e.id === q.source);
        const drives = src && sourceRole(src);
        if (!drives) throw new Error(`"${q.source}" is not a source on this sheet`);
        sources.set(q.source, drives);
        return;
      }
      case 'ratio':
        need(q.num);
        need(q.den);
    }
  };
  spec.quantities.forEach(need);
  const only = { nodes, elements };
  const fixed = over ? null : sweepSessions(model, sources);
  const traces = spec.quantities.map(() => new Float64Array(2 * n));
  const run = (start: number, end: number) => {
    for (let i = start; i < end; i++) {
      const f = frequencies[i];
      // a value sweep builds the circuit anew at each value (the pattern is the same; the values are not)
      const { session, zin } = fixed ?? sweepSessions(parseGraphModel(withValue(model, over!.target, values![i])), sources);
      const res = session.toResult(session.solveRaw(f), only);
      const zs = new Map<string, C>();
      for (const [id, z] of zin) {
        const r = z.session.toResult(z.session.solveRaw(f), { nodes: new Set(), elements: new Set([id]) }).elements[id] as TwoTerminalResult;
        zs.set(id, z.drives === 'voltage' ? div({ re: 1, im: 0 }, { re: -r.current.re, im: -r.current.im }) : { re: -r.voltage.re, im: -r.voltage.im });
      }
      const value = (q: SweepQuantity): C => {
        switch (q.kind) {
          case 'node': return nodeV(res, q.node);
          case 'current': return (res.elements[q.element] as TwoTerminalResult).current ?? ZERO;
          case 'voltage': return (res.elements[q.element] as TwoTerminalResult).voltage ?? ZERO;
          case 'power': {
            const r = res.elements[q.element];
            return { re: r.power.watts, im: r.power.vars };
          }
          case 'zin': return zs.get(q.source)!;
          case 'ratio': return div(value(q.num), value(q.den));
        }
      };
      spec.quantities.forEach((q, k) => {
        const v = value(q);
        traces[k][2 * i] = v.re;
        traces[k][2 * i + 1] = v.im;
      });
    }
  };
  return { frequencies, values, traces, run };
}

/**
 * The transfer function from a source to an output (the solver's
 * transferFunction), and which of the circuit's natural frequencies are poles
 * of it: each pole is matched to the nearest unmatched natural frequency
 * within a millionth of the larger magnitude.
 */
export function transfer(raw: GraphModel, input: string, output: string): TransferAnswer {
  const model = parseGraphModel(raw);
  const tf = transferFunction(model, input, output);
  const used = new Set<number>();
  for (const p of tf.poles) {
    let best = -1;
    let bestD = Infinity;
    tf.naturalFrequencies.forEach((n, i) => {
      if (used.has(i)) return;
      const d = abs(sub(n, p));
      if (d <= 1e-6 * Math.max(abs(n), abs(p), 1e-300) && d < bestD) { best = i; bestD = d; }
    });
    if (best >= 0) used.add(best);
  }
  return { ...tf, seen: tf.naturalFrequencies.map((_, i) => used.has(i)) };
}

/** The most harmonics the editor's view solves (the command line takes more). */
export const VIEW_MAX_HARMONICS = 5000;

/** The harmonic steady state of the whole circuit up to order `count` (refusals name the source). */
export function harmonics(raw: GraphModel, count: number): HarmonicAnswer {
  if (!(Number.isInteger(count) && count >= 1 && count <= VIEW_MAX_HARMONICS)) {
    throw new Error(`the number of harmonics must be a whole number from 1 to ${VIEW_MAX_HARMONICS}`);
  }
  const t0 = performance.now();
  const result = harmonicSteadyState(parseGraphModel(raw), { count });
  return { ...result, ms: performance.now() - t0 };
}
