import { SWEEP_SCHEMA, type ComplexJson, type GraphModel, type SweepResult } from '../../model/graph';
import { ModelRefusal } from '../errors';
import { SolverSession } from './session';
import { portCount } from '../elements/registry';

/** Frequencies evenly spaced, or evenly spaced in log when `log` is set. */
export function frequencyGrid(from: number, to: number, points: number, log: boolean): number[] {
  if (points === 1) return [from];
  const out: number[] = [];
  for (let i = 0; i < points; i++) {
    const t = i / (points - 1);
    out.push(log ? from * Math.pow(to / from, t) : from + (to - from) * t);
  }
  out[points - 1] = to;
  return out;
}

/**
 * Solves one model at each frequency. The structure is analysed once and each
 * point only refactors numerically. `probe` limits the output to the named
 * nodes and elements; an unknown name is refused.
 */
export function sweepGraph(model: GraphModel, frequenciesHz: number[], probe?: string[]): SweepResult {
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
  const nodes: Record<string, ComplexJson[]> = {};
  for (const n of probeNodes) nodes[n] = [];
  const elements: SweepResult['elements'] = {};
  for (const e of probeElements) {
    elements[e.id] = portCount(e) === 2 ? { voltages: [], currents: [] } : { voltage: [], current: [] };
  }
  for (const f of frequenciesHz) {
    let res;
    try {
      res = session.toResult(session.solveRaw(f), only);
    } catch (e) {
      if (e instanceof ModelRefusal && !e.message.includes(' Hz')) {
        throw new ModelRefusal(`${e.message} (at ${f} Hz)`, e.culprits);
      }
      throw e;
    }
    for (const n of probeNodes) nodes[n].push(res.nodes[n]);
    for (const e of probeElements) {
      const r = res.elements[e.id];
      const out = elements[e.id];
      if ('voltages' in r) {
        out.voltages!.push(r.voltages);
        out.currents!.push(r.currents);
      } else {
        out.voltage!.push(r.voltage);
        out.current!.push(r.current);
      }
    }
  }
  return {
    schema: SWEEP_SCHEMA,
    amplitudes: model.amplitudes,
    frequenciesHz: [...frequenciesHz],
    nodes,
    elements,
    warnings: [...session.warnings],
  };
}

/** A command-line usage fault (exit 2), not a model refusal. */
export class ProbeError extends Error {}
