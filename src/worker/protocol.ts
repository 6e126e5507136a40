/**
 * Messages between the editor and the analysis worker (plain data). The
 * analysis worker answers questions about a solved circuit (coupling state,
 * dot comparison, T-equivalent check, power) and runs frequency sweeps in
 * chunks that report progress and can be cancelled. The answers are built
 * from the solver's own types; the editor imports these types only.
 */
import type { ComplexJson, GraphModel, HarmonicResult, RefusalCulprit, SolveResult, TransferResult } from '../model/graph';
import type { Change, PairState, PowerSummary, TEquivalent } from '../solver';
import type { ValueTarget } from '../model/valueTarget';

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

/** The pair's state at the solved currents (the solver's PairState), with what the inspector shows around it. */
export type InspectAnswer = Omit<PairState, 'coupling' | 'mutualTerm'> & {
  /** impedance reflected into each winding by all its partners (the full loop, Z_in − jωL; (ωM)²/Z22 for one partner) */
  reflected: [ComplexJson, ComplexJson];
  /** the partners each of those comes from (more than the pair's other winding when a winding has several) */
  reflectedFrom: [string[], string[]];
  connection: { kind: 'series' | 'parallel'; sense: 'aiding' | 'opposing'; inductance: number; otherSense: number } | null;
  sources: { id: string; z: ComplexJson | null }[];
  frequencyHz: number;
  amplitudes: 'rms' | 'peak';
};

/** One change the dot flip makes (the solver's Change, without its target). */
export type ChangeRow = Omit<Change, 'target'>;

export interface CompareAnswer {
  winding: string;
  changes: ChangeRow[];
  inputImpedance: { source: string; before: ComplexJson | null; after: ComplexJson | null }[];
  /** series/parallel formulas with the effective inductance measured from the solve, when the pair is simply connected */
  connection: { kind: 'series' | 'parallel'; sense: 'aiding' | 'opposing'; aiding: number; opposing: number; measuredBefore: number | null; measuredAfter: number | null } | null;
}

/** The solver's T-equivalent of a pair, with the pins of its outer ends and a port check of the substitution. */
export type TAnswer = Pick<TEquivalent, 'windings' | 'l1' | 'l2' | 'm' | 'arm1' | 'arm2' | 'shunt' | 'negativeArms' | 'notes'> & {
  /** winding pins (0 or 1) that are the outer ends of the T's series arms */
  outerPins: [0 | 1, 0 | 1];
  /** whether the two windings share a terminal */
  shared: boolean;
  /** largest relative difference of the port voltages and currents between the pair and its T (graph-level check) */
  check: { maxRel: number; compared: number };
};

/** The solver's power summary, with the amplitudes it was read at. */
export type PowerAnswer = Pick<PowerSummary, 'rows' | 'delivered' | 'dissipated'> & {
  tellegen: Pick<PowerSummary['tellegen'], 'watts' | 'vars' | 'relative'>;
  amplitudes: 'rms' | 'peak';
};

/** The solver's transfer function, with the natural frequencies this input and output do not see marked. */
export type TransferAnswer = TransferResult & {
  /** for each entry of naturalFrequencies: whether it is a pole of this (minimal) H */
  seen: boolean[];
};

/** The harmonic steady state of the whole circuit (the solver's harmonicSteadyState), with the time it took. */
export type HarmonicAnswer = HarmonicResult & { ms: number };

export interface SweepAnswer {
  /** the frequency of each point (all the same in a value sweep) */
  frequenciesHz: number[];
  /** a value sweep: the value of each point */
  values?: number[];
  /** one complex series per requested quantity (re and im interleaved: re0, im0, re1, im1 …) */
  traces: number[][];
  ms: number;
}

/** A time response run in the analysis worker (contract: time-and-s-domain.md, `transient`). */
export interface TransientSpec {
  stopS: number;
  /** output samples after t = 0 (the output step is stopS / samples) */
  samples: number;
  tolerance?: number;
  start?: 'given' | 'dc';
  /** for tests: the run waits before its first step until cancelled (it can never finish before a cancel) */
  hold?: boolean;
}

/**
 * The run as columns of typed arrays (posted as transferables): `timesS`, one
 * column per node voltage, and per element its voltage, current and power
 * (a two-port: primary then secondary voltage and current). `steady` is the
 * phasor steady state of a sine-driven circuit, with each switch in the state
 * it ends the run in (null when some source is not a sine at the sheet's
 * frequency, or the circuit has no steady state to reach).
 */
export interface TransientAnswer {
  timesS: Float64Array;
  nodes: { name: string; values: Float64Array }[];
  elements: { id: string; voltage: Float64Array[]; current: Float64Array[]; power: Float64Array }[];
  steady: SolveResult | null;
  warnings: string[];
  ms: number;
}

export type AnalysisRequest =
  | { id: number; kind: 'inspect'; model: GraphModel; result: SolveResult; coupling: string; pair?: [string, string] }
  | { id: number; kind: 'compare'; model: GraphModel; winding: string; coupling?: string }
  | { id: number; kind: 'tcheck'; model: GraphModel; coupling: string }
  | { id: number; kind: 'power'; model: GraphModel; result: SolveResult }
  | { id: number; kind: 'sweep'; model: GraphModel; spec: SweepSpec }
  | { id: number; kind: 'transfer'; model: GraphModel; input: string; output: string }
  | { id: number; kind: 'transient'; model: GraphModel; spec: TransientSpec }
  | { id: number; kind: 'harmonics'; model: GraphModel; count: number }
  | { id: number; kind: 'cancel'; target: number };

export type AnalysisReply =
  | { id: number; type: 'done'; value: unknown }
  | { id: number; type: 'failed'; message: string; culprits?: RefusalCulprit[] }
  | { id: number; type: 'progress'; done: number; total: number }
  | { id: number; type: 'cancelled' };
