/**
 * Messages between the editor and the analysis worker (plain data). The
 * analysis worker answers questions about a solved circuit (coupling state,
 * dot comparison, T-equivalent check, power) and runs frequency sweeps in
 * chunks that report progress and can be cancelled.
 */
import type { ComplexJson, GraphModel, SolveResult } from './graph';
import type { ValueTarget } from './valueTarget';

/** What a sweep trace plots. */
export type SweepQuantity =
  | { kind: 'node'; node: string }
  | { kind: 'current'; element: string }
  | { kind: 'voltage'; element: string }
  | { kind: 'zin'; source: string }
  | { kind: 'power'; element: string }
  | { kind: 'ratio'; num: SweepQuantity; den: SweepQuantity };

export interface SweepSpec {
  from: number;
  to: number;
  points: number;
  log: boolean;
  quantities: SweepQuantity[];
  /** points solved between two progress reports (and cancel checks) */
  chunk?: number;
  /** for tests: after the first chunk the sweep waits for a cancel, so it can never finish before one */
  hold?: boolean;
  /** a value sweep: `from`…`to` are values of this target, solved at one frequency */
  over?: { target: ValueTarget; frequencyHz: number };
}

export interface PortZ { z: ComplexJson | null }

export interface InspectAnswer {
  windings: [string, string];
  l1: number;
  l2: number;
  m: number;
  k: number;
  flux: [ComplexJson, ComplexJson];
  energyJ: number;
  interaction: 'aiding' | 'opposing' | 'none';
  /** reflected impedance into each winding's loop, (ωM)²/Z22 */
  reflected: [ComplexJson, ComplexJson];
  connection: { kind: 'series' | 'parallel'; sense: 'aiding' | 'opposing'; inductance: number; otherSense: number } | null;
  sources: { id: string; z: ComplexJson | null }[];
  frequencyHz: number;
  amplitudes: 'rms' | 'peak';
}

export interface ChangeRow { label: string; quantity: 'voltage' | 'current' | 'power'; before: ComplexJson; after: ComplexJson; delta: ComplexJson }

export interface CompareAnswer {
  winding: string;
  changes: ChangeRow[];
  inputImpedance: { source: string; before: ComplexJson | null; after: ComplexJson | null }[];
  /** series/parallel formulas with the effective inductance measured from the solve, when the pair is simply connected */
  connection: { kind: 'series' | 'parallel'; sense: 'aiding' | 'opposing'; aiding: number; opposing: number; measuredBefore: number | null; measuredAfter: number | null } | null;
}

export interface TAnswer {
  windings: [string, string];
  /** winding pins (0 or 1) that are the outer ends of the T's series arms */
  outerPins: [0 | 1, 0 | 1];
  l1: number;
  l2: number;
  m: number;
  arm1: number;
  arm2: number;
  shunt: number;
  shared: boolean;
  negativeArms: string[];
  notes: string[];
  /** largest relative difference of the port voltages and currents between the pair and its T (graph-level check) */
  check: { maxRel: number; compared: number };
}

export interface PowerAnswer {
  rows: { id: string; kind: string; watts: number; vars: number; va: number; powerFactor: number | null; sense: 'lagging' | 'leading' | null }[];
  delivered: { watts: number; vars: number };
  dissipated: number;
  tellegen: { watts: number; vars: number; relative: number };
  amplitudes: 'rms' | 'peak';
}

export interface SweepAnswer {
  /** the frequency of each point (all the same in a value sweep) */
  frequenciesHz: number[];
  /** a value sweep: the value of each point */
  values?: number[];
  /** one complex series per requested quantity (re and im interleaved: re0, im0, re1, im1 …) */
  traces: number[][];
  ms: number;
}

export type AnalysisRequest =
  | { id: number; kind: 'inspect'; model: GraphModel; result: SolveResult; coupling: string; pair?: [string, string] }
  | { id: number; kind: 'compare'; model: GraphModel; winding: string; coupling?: string }
  | { id: number; kind: 'tcheck'; model: GraphModel; coupling: string }
  | { id: number; kind: 'power'; model: GraphModel; result: SolveResult }
  | { id: number; kind: 'sweep'; model: GraphModel; spec: SweepSpec }
  | { id: number; kind: 'cancel'; target: number };

export type AnalysisReply =
  | { id: number; type: 'done'; value: unknown }
  | { id: number; type: 'failed'; message: string }
  | { id: number; type: 'progress'; done: number; total: number }
  | { id: number; type: 'cancelled' };
