/**
 * The time response as the contract prints it (`coilwright.transient/1`):
 * every node's voltage to its reference, and each element's voltage, current
 * (reference directions of graph-model.md, by each kind's port rules) and
 * power v·i absorbed, at every output time.
 */
import { TRANSIENT_SCHEMA, type GraphModel } from '../../model/graph';
import { nameTable } from '../../model/names';
import { defOf } from '../elements/registry';
import { ProbeError } from '../phasor/sweep';
import { TransientEngine, type Sample, type TransientOptions } from './engine';
import { STEADY_STATE_FIELD, SteadyStateWatch, type SteadyStateReport } from './steadyState';

export interface TransientLayout {
  nodes: string[];
  /** per probed node: its unknown (−1: a reference, printed as 0) */
  nodeUnknown: Int32Array;
  /** probed elements: their index and number of ports (1: voltage, current, power; 2: two of each and the power) */
  elements: { id: string; index: number; ports: number }[];
  /** values per sample */
  width: number;
}

export interface TransientSeries {
  voltage?: number[];
  current?: number[];
  voltages?: [number[], number[]];
  currents?: [number[], number[]];
  power: number[];
}

export interface TransientResult {
  schema: typeof TRANSIENT_SCHEMA;
  timesS: number[];
  nodes: Record<string, number[]>;
  elements: Record<string, TransientSeries>;
  warnings: string[];
  /** added field: how far the last period is from the phasor steady state (steadyState.ts) */
  [STEADY_STATE_FIELD]: SteadyStateReport;
}

export function transientLayout(engine: TransientEngine, probe?: string[]): TransientLayout {
  const { model, topo } = engine;
  let nodes = topo.nodeNames;
  let elements = model.elements.map((e, index) => ({ id: e.id, index, ports: defOf(e).ports.length }));
  if (probe) {
    const nodeSet = new Set(nodes);
    const ids = new Set(model.elements.map((e) => e.id));
    for (const name of probe) {
      if (!nodeSet.has(name) && !ids.has(name)) throw new ProbeError(`--probe: "${name}" is neither a node nor an element of this model`);
    }
    const wanted = new Set(probe);
    nodes = nodes.filter((n) => wanted.has(n));
    elements = elements.filter((e) => wanted.has(e.id));
  }
  const d = engine.descriptor;
  const nodeUnknown = Int32Array.from(nodes.map((n) => d.nodeUnknown[topo.nodeIndex.get(n)!]));
  const width = nodes.length + elements.reduce((w, e) => w + (e.ports === 1 ? 3 : 5), 0);
  return { nodes, nodeUnknown, elements, width };
}

/** The printed values of one sample into `out`, in layout order. */
export function readSample(engine: TransientEngine, layout: TransientLayout, s: Sample, out: Float64Array): void {
  const { x, dx, t } = s;
  const d = engine.descriptor;
  const terminals = engine.topo.terminals;
  let k = 0;
  for (let i = 0; i < layout.nodes.length; i++) {
    const u = layout.nodeUnknown[i];
    out[k++] = u >= 0 ? x[u] + 0 : 0;
  }
  const v = (node: number, vec: Float64Array) => {
    const u = d.nodeUnknown[node];
    return u >= 0 ? vec[u] : 0;
  };
  for (const e of layout.elements) {
    const el = engine.model.elements[e.index];
    const def = defOf(el);
    let power = 0;
    const vs: number[] = [];
    const is: number[] = [];
    for (const port of def.ports) {
      const a = terminals[4 * e.index + port.terminals[0]];
      const b = terminals[4 * e.index + port.terminals[1]];
      const volts = v(a, x) - v(b, x);
      let amps = 0;
      const rule = port.current;
      switch (rule.kind) {
        case 'resistance':
          amps = volts / rule.ohms(el as never, { closed: s.closed[e.index] === 1 });
          break;
        case 'capacitance':
          amps = rule.farads(el as never) * (v(a, dx) - v(b, dx));
          break;
        case 'branch':
          amps = rule.gain(el as never) * x[d.branchUnknown[e.index] + rule.branch];
          break;
        case 'source':
          amps = engine.sourceValue(e.index, t, 1);
          break;
      }
      vs.push(volts);
      is.push(amps);
      power += volts * amps;
    }
    for (const q of vs) out[k++] = q + 0;
    for (const q of is) out[k++] = q + 0;
    out[k++] = power + 0;
  }
}

/** A run of the model with the printed values handed to `sink` sample by sample. */
export function transientStream(model: GraphModel, options: TransientOptions, probe?: string[]) {
  const engine = new TransientEngine(model, options);
  const layout = transientLayout(engine, probe);
  const values = new Float64Array(layout.width);
  const outputs = Math.floor((options.stopS / options.stepS) * (1 + 1e-12) + 1e-9);
  const watch = new SteadyStateWatch(model, layout, options.stopS, outputs * options.stepS);
  return {
    layout,
    engine,
    run(sink: (t: number, values: Float64Array) => void): string[] {
      engine.run((s) => {
        readSample(engine, layout, s, values);
        watch.observe(s.t, values);
        sink(s.t, values);
      });
      return engine.warnings;
    },
    /** after the run: how far its last period is from the phasor steady state */
    steadyState: (): SteadyStateReport => watch.report(),
  };
}

/** The whole time response in memory (for the editor, tests and small runs). */
export function transientGraph(model: GraphModel, options: TransientOptions, probe?: string[]): TransientResult {
  const stream = transientStream(model, options, probe);
  const { layout } = stream;
  const columns: number[][] = Array.from({ length: layout.width }, () => []);
  const timesS: number[] = [];
  const warnings = stream.run((t, values) => {
    timesS.push(t);
    for (let q = 0; q < values.length; q++) columns[q].push(values[q]);
  });
  const nodes = nameTable<number[]>();
  let q = 0;
  for (const name of layout.nodes) nodes[name] = columns[q++];
  const elements = nameTable<TransientSeries>();
  for (const e of layout.elements) {
    if (e.ports === 1) elements[e.id] = { voltage: columns[q], current: columns[q + 1], power: columns[q + 2] };
    else elements[e.id] = { voltages: [columns[q], columns[q + 1]], currents: [columns[q + 2], columns[q + 3]], power: columns[q + 4] };
    q += e.ports === 1 ? 3 : 5;
  }
  return { schema: TRANSIENT_SCHEMA, timesS, nodes, elements, warnings, [STEADY_STATE_FIELD]: stream.steadyState() };
}
