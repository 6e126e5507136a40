/**
 * The graph model and solve-result interchange, as fixed by the project's
 * graph-model contract (schema `coilwright.graph/1`, `coilwright.result/1`,
 * `coilwright.sweep/1`). Quantities are SI numbers.
 */

export const GRAPH_SCHEMA = 'coilwright.graph/1';
export const RESULT_SCHEMA = 'coilwright.result/1';
export const SWEEP_SCHEMA = 'coilwright.sweep/1';
export const TRANSFER_SCHEMA = 'coilwright.transfer/1';
export const TRANSIENT_SCHEMA = 'coilwright.transient/1';
export const HARMONICS_SCHEMA = 'coilwright.harmonics/1';

export type Amplitudes = 'rms' | 'peak';
export type DotEnd = 'first' | 'second';

/**
 * The element kinds, their fields and their types are defined once, by the
 * solver's element definitions (src/solver/elements); these are their types.
 */
export type {
  GraphElement, ElementKind, ResistorEl, InductorEl, CapacitorEl, VoltageSourceEl, CurrentSourceEl,
  IdealTransformerEl, InductanceArmEl, SwitchEl,
} from '../solver/elements/registry';
export type { Waveform, WaveformShape } from './waveform';
import type { GraphElement } from '../solver/elements/registry';

export interface Coupling {
  id: string;
  windings: string[];
  /** coupling coefficient, 0..1 (M = k·sqrt(Li·Lj) for every pair) */
  k?: number;
  /** mutual inductance in henries (two windings only) */
  henries?: number;
}

export interface GraphModel {
  schema: typeof GRAPH_SCHEMA;
  frequencyHz: number;
  amplitudes: Amplitudes;
  ground: string;
  elements: GraphElement[];
  couplings?: Coupling[];
}

export interface ComplexJson { re: number; im: number }
export interface PowerJson { watts: number; vars: number }

export interface TwoTerminalResult { voltage: ComplexJson; current: ComplexJson; power: PowerJson }
export interface TransformerResult { voltages: [ComplexJson, ComplexJson]; currents: [ComplexJson, ComplexJson]; power: PowerJson }
export type ElementResult = TwoTerminalResult | TransformerResult;

export interface SolveResult {
  schema: typeof RESULT_SCHEMA;
  frequencyHz: number;
  amplitudes: Amplitudes;
  nodes: Record<string, ComplexJson>;
  elements: Record<string, ElementResult>;
  warnings: string[];
}

export interface SweepResult {
  schema: typeof SWEEP_SCHEMA;
  amplitudes: Amplitudes;
  frequenciesHz: number[];
  nodes: Record<string, ComplexJson[]>;
  elements: Record<string, { voltage?: ComplexJson[]; current?: ComplexJson[]; voltages?: [ComplexJson, ComplexJson][]; currents?: [ComplexJson, ComplexJson][] }>;
  warnings: string[];
}

/** The transfer function of `tf` (contract: time-and-s-domain.md). Roots in rad/s, polynomials highest power first. */
export interface TransferResult {
  schema: typeof TRANSFER_SCHEMA;
  input: string;
  output: string;
  gain: number;
  zeros: ComplexJson[];
  poles: ComplexJson[];
  numerator: number[];
  denominator: number[];
  naturalFrequencies: ComplexJson[];
  warnings: string[];
}

/** One quantity of the harmonic steady state: its phasor per order (DC as a real value), true RMS, THD (absent without a fundamental). */
export interface HarmonicSeries { phasors: ComplexJson[]; rms: number; thd?: number }

/** The harmonic steady state (`harmonics`; our own output, README "Command line"). */
export interface HarmonicResult {
  schema: typeof HARMONICS_SCHEMA;
  amplitudes: Amplitudes;
  fundamentalHz: number;
  /** the highest order asked for */
  count: number;
  /** the orders solved, ascending (0 is DC): those at which some source is non-zero */
  orders: number[];
  frequenciesHz: number[];
  nodes: Record<string, HarmonicSeries>;
  elements: Record<string, {
    voltage?: HarmonicSeries;
    current?: HarmonicSeries;
    voltages?: [HarmonicSeries, HarmonicSeries];
    currents?: [HarmonicSeries, HarmonicSeries];
    /** the complex power absorbed at each order (DC: V·I) */
    power: PowerJson[];
    /** the average power absorbed, Σ over the orders */
    watts: number;
  }>;
  /** per order: the real power the sources deliver and the lossy parts (resistors, switches) absorb, over the whole circuit */
  balance: { delivered: number[]; dissipated: number[]; totalDelivered: number; totalDissipated: number };
  warnings: string[];
}

/** What a refusal names: the element, coupling or node at fault. */
export interface RefusalCulprit { kind: 'element' | 'coupling' | 'node' | 'file' | 'model'; id?: string }
