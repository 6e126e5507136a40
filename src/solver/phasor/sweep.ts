import { SWEEP_SCHEMA, type ComplexJson, type GraphModel, type SweepResult } from '../../model/graph';
import { nameTable } from '../../model/names';
import { ModelRefusal } from '../errors';
import { SolverSession } from './session';
import { portCount } from '../elements/registry';

/** Frequencies evenly spaced, or evenly spaced in log when `log` is set. */
export function frequencyGrid(from: number, to: number, points: number, log: boolean): number[] {
  if (points === 1) return [from];
  const out: number[] = [];
  for (let i = 0; i < points; i++) out.push(frequencyAt(from, to, points, log, i));
  return out;
}

/** The i-th frequency of that grid, without building it (the last one is exactly `to`). */
export function frequencyAt(from: number, to: number, points: number, log: boolean, i: number): number {
  if (points === 1) return from;
  if (i === points - 1) return to;
  const t = i / (points - 1);
  return log ? from * Math.pow(to / from, t) : from + (to - from) * t;
}

/**
 * What each sweep point carries, in this order: the voltage of each probed
 * node, then for each probed element its voltage and current (an ideal
 * transformer: primary and secondary voltage, then primary and secondary current).
 */
export interface SweepLayout {
  nodes: string[];
  elements: { id: string; transformer: boolean }[];
  /** complex values per point */
  width: number;
}

/** A sweep solved one point at a time, so that a caller can write each point out and keep nothing. */
export interface SweepStream {
  layout: SweepLayout;
  warnings: string[];
  /** Solves at one frequency and writes the point's values into `out`: real and imaginary parts interleaved, 2·width numbers. */
  solveInto(frequencyHz: number, out: Float64Array): void;
}

/**
 * Prepares a sweep of one model: the structure is analysed once and each
 * point only refactors numerically. `probe` limits the output to the named
 * nodes and elements; an unknown name is refused.
 */
export function sweepStream(model: GraphModel, probe?: string[]): SweepStream {
  const session = new SolverSession(model);
  const nodeNames = session.topo.nodeNames;
  let probeNodes: string[] = nodeNames;
  let probeElements = model.elements;
  if (probe) {
    const nodeSet = new Set(nodeNames);
    const elementIds = new Set(model.elements.map((e) => e.id));
    for (const name of probe) {
      if (!nodeSet.has(name) && !elementIds.has(name)) {
        throw new ProbeError(`--probe: "${name}" is neither a node nor an element of this model`);
      }
    }
    const wanted = new Set(probe);
    probeNodes = nodeNames.filter((n) => wanted.has(n));
    probeElements = model.elements.filter((e) => wanted.has(e.id));
  }
  const only = { nodes: new Set(probeNodes), elements: new Set(probeElements.map((e) => e.id)) };
  const elements = probeElements.map((e) => ({ id: e.id, transformer: portCount(e) === 2 }));
  const width = probeNodes.length + elements.reduce((n, e) => n + (e.transformer ? 4 : 2), 0);
  const solveInto = (f: number, out: Float64Array) => {
    let res;
    try {
      res = session.toResult(session.solveRaw(f), only);
    } catch (e) {
      if (e instanceof ModelRefusal && !e.message.includes(' Hz')) {
        throw new ModelRefusal(`${e.message} (at ${f} Hz)`, e.culprits);
      }
      throw e;
    }
    let k = 0;
    const put = (z: ComplexJson) => {
      out[k++] = z.re;
      out[k++] = z.im;
    };
    for (const n of probeNodes) put(res.nodes[n]);
    for (const e of elements) {
      const r = res.elements[e.id];
      if ('voltages' in r) {
        put(r.voltages[0]);
        put(r.voltages[1]);
        put(r.currents[0]);
        put(r.currents[1]);
      } else {
        put(r.voltage);
        put(r.current);
      }
    }
  };
  return { layout: { nodes: probeNodes, elements, width }, warnings: [...session.warnings], solveInto };
}

/** Solves one model at each frequency and gathers the whole sweep (see `sweepStream` for one point at a time). */
export function sweepGraph(model: GraphModel, frequenciesHz: number[], probe?: string[]): SweepResult {
  const stream = sweepStream(model, probe);
  const { layout } = stream;
  // no prototype: a node or element named "__proto__" or "constructor" is an entry like any other
  const nodes = nameTable<ComplexJson[]>();
  for (const n of layout.nodes) nodes[n] = [];
  const elements = nameTable<SweepResult['elements'][string]>();
  for (const e of layout.elements) elements[e.id] = e.transformer ? { voltages: [], currents: [] } : { voltage: [], current: [] };
  const point = new Float64Array(2 * layout.width);
  for (const f of frequenciesHz) {
    stream.solveInto(f, point);
    let k = 0;
    const next = (): ComplexJson => {
      const z = { re: point[k], im: point[k + 1] };
      k += 2;
      return z;
    };
    for (const n of layout.nodes) nodes[n].push(next());
    for (const e of layout.elements) {
      const out = elements[e.id];
      if (e.transformer) {
        out.voltages!.push([next(), next()]);
        out.currents!.push([next(), next()]);
      } else {
        out.voltage!.push(next());
        out.current!.push(next());
      }
    }
  }
  return {
    schema: SWEEP_SCHEMA,
    amplitudes: model.amplitudes,
    frequenciesHz: [...frequenciesHz],
    nodes,
    elements,
    warnings: stream.warnings,
  };
}

/** A command-line usage fault (exit 2), not a model refusal. */
export class ProbeError extends Error {}
