/**
 * The graph model and solve-result interchange, as fixed by the project's
 * graph-model contract (schema `coilwright.graph/1`, `coilwright.result/1`,
 * `coilwright.sweep/1`). Quantities are SI numbers.
 */

export const GRAPH_SCHEMA = 'coilwright.graph/1';
export const RESULT_SCHEMA = 'coilwright.result/1';
export const SWEEP_SCHEMA = 'coilwright.sweep/1';

export type Amplitudes = 'rms' | 'peak';
export type DotEnd = 'first' | 'second';

export interface ResistorEl { id: string; kind: 'resistor'; nodes: [string, string]; ohms: number }
export interface InductorEl { id: string; kind: 'inductor'; nodes: [string, string]; henries: number; dot?: DotEnd }
export interface CapacitorEl { id: string; kind: 'capacitor'; nodes: [string, string]; farads: number }
export interface VoltageSourceEl { id: string; kind: 'voltage-source'; nodes: [string, string]; magnitude: number; phaseDeg: number }
export interface CurrentSourceEl { id: string; kind: 'current-source'; nodes: [string, string]; magnitude: number; phaseDeg: number }
/**
 * Extension of the contract: an arm of an equivalent circuit (for example a
 * T-equivalent of a coupled pair). Its inductance may be zero or negative,
 * which is valid for analysis but is not a part one can buy.
 */
export interface InductanceArmEl { id: string; kind: 'inductance-arm'; nodes: [string, string]; henries: number }
export interface IdealTransformerEl { id: string; kind: 'ideal-transformer'; nodes: [string, string, string, string]; ratio: number }

export type GraphElement =
  | ResistorEl
  | InductorEl
  | CapacitorEl
  | VoltageSourceEl
  | CurrentSourceEl
  | IdealTransformerEl
  | InductanceArmEl;

export type ElementKind = GraphElement['kind'];

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

/** What a refusal names: the element, coupling or node at fault. */
export interface RefusalCulprit { kind: 'element' | 'coupling' | 'node' | 'file' | 'model'; id?: string }
