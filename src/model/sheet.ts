/** The sheet: what the editor draws and saves (current schema version). */
import type { Amplitudes, DotEnd } from './graph';
import type { QuarterTurns } from './geometry';

export const SHEET_SCHEMA_PREFIX = 'coilwright.sheet/';
export const SHEET_VERSION = 4;
export const SHEET_SCHEMA = `${SHEET_SCHEMA_PREFIX}${SHEET_VERSION}` as const;

export type PartKind =
  | 'resistor'
  | 'winding'
  | 'capacitor'
  | 'vsource'
  | 'isource'
  | 'transformer'
  | 'ground'
  | 'label'
  /** an arm of an equivalent circuit (T-equivalent): an inductance that may be zero or negative */
  | 'arm';

export const PART_KINDS: readonly PartKind[] = [
  'resistor', 'winding', 'capacitor', 'vsource', 'isource', 'transformer', 'ground', 'label', 'arm',
];

export interface Part {
  id: string;
  kind: PartKind;
  x: number;
  y: number;
  rot: QuarterTurns;
  mirror: boolean;
  /** designator (R1, L1 …); empty for ground and node labels */
  ref: string;
  /** the part's main value in SI units (ohms, henries, farads, volts, amperes, turns ratio) */
  value?: number;
  phaseDeg?: number;
  dot?: DotEnd;
  /** node name of a node label */
  name?: string;
}

export interface Wire {
  id: string;
  /** orthogonal polyline, flat [x0, y0, x1, y1, …] */
  pts: number[];
}

export interface SheetCoupling {
  id: string;
  ref: string;
  /** part ids of the coupled windings */
  windings: string[];
  /** whether `value` is the coupling coefficient k or the mutual inductance M in henries */
  by: 'k' | 'M';
  value: number;
}

export interface Sheet {
  schema: typeof SHEET_SCHEMA;
  title: string;
  frequencyHz: number;
  amplitudes: Amplitudes;
  parts: Part[];
  wires: Wire[];
  couplings: SheetCoupling[];
}

export function emptySheet(title = 'Untitled sheet'): Sheet {
  return { schema: SHEET_SCHEMA, title, frequencyHz: 50, amplitudes: 'rms', parts: [], wires: [], couplings: [] };
}
