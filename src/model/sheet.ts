/** The sheet: what the editor draws and saves (current schema version). */
import type { Amplitudes, DotEnd, Waveform } from './graph';
import type { QuarterTurns } from './geometry';
import type { PowerSpec } from './powerTransformer';

export const SHEET_SCHEMA_PREFIX = 'coilwright.sheet/';
export const SHEET_VERSION = 7;
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
  | 'arm'
  /** a switch: a resistance of onOhms when closed, offOhms when open, flipping at its toggle times */
  | 'switch'
  /** a practical two-winding transformer (losses, leakage, magnetising), expanded into graph elements */
  | 'power';

export const PART_KINDS: readonly PartKind[] = [
  'resistor', 'winding', 'capacitor', 'vsource', 'isource', 'transformer', 'ground', 'label', 'arm', 'switch', 'power',
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
  /** a winding's current at t = 0, amperes, in its reference direction (pin 0 to pin 1 through it) */
  initialAmps?: number;
  /** a capacitor's voltage at t = 0, volts, V(pin 0) − V(pin 1) */
  initialVolts?: number;
  /** a source's value over time (the graph model's waveform shapes); without it the source follows its phasor */
  waveform?: Waveform;
  /** a switch: closed at t = 0 (and in the phasor, sweep and s-domain analyses) */
  closed?: boolean;
  /** a switch's resistance when closed and when open, ohms */
  onOhms?: number;
  offOhms?: number;
  /** a switch's toggle times, seconds, strictly increasing and above 0 */
  togglesS?: number[];
  /** a practical transformer's data, in the form it was entered (src/model/powerTransformer.ts) */
  power?: PowerSpec;
  /** a winding's core inductance factor A_L, henries per turn² (its turns are then √(L/A_L)) */
  alH?: number;
}

/** The numeric fields of a part that the details panel edits. */
export type NumericField = 'value' | 'phaseDeg' | 'initialAmps' | 'initialVolts' | 'onOhms' | 'offOhms';

export interface Wire {
  id: string;
  /** orthogonal polyline, flat [x0, y0, x1, y1, …] */
  pts: number[];
}

export interface SheetCoupling {
  id: string;
  /** part ids of the coupled windings (the coupling is named by them: k₁₂, M₁₂) */
  windings: string[];
  /** whether `value` is the coupling coefficient k or the mutual inductance M in henries */
  by: 'k' | 'M';
  value: number;
}

/**
 * The title block's data fields, after ISO 7200 (identification, description
 * and administration); the title itself is the sheet's `title`. All are free
 * text and may be empty.
 */
export interface TitleBlock {
  /** supplementary title */
  subtitle: string;
  /** legal owner */
  owner: string;
  /** identification number of the document */
  number: string;
  /** revision index */
  revision: string;
  /** sheet number, e.g. "1/1" */
  sheet: string;
  /** creator ("drawn by") */
  drawnBy: string;
  checkedBy: string;
  /** approval person */
  approvedBy: string;
  /** document status, e.g. "draft", "released" */
  status: string;
}

export const TITLE_FIELDS: { key: keyof TitleBlock; label: string }[] = [
  { key: 'subtitle', label: 'Supplementary title' },
  { key: 'number', label: 'Document number' },
  { key: 'revision', label: 'Revision' },
  { key: 'sheet', label: 'Sheet' },
  { key: 'owner', label: 'Owner' },
  { key: 'drawnBy', label: 'Drawn by' },
  { key: 'checkedBy', label: 'Checked by' },
  { key: 'approvedBy', label: 'Approved by' },
  { key: 'status', label: 'Status' },
];

export const emptyTitleBlock = (): TitleBlock => ({ subtitle: '', owner: '', number: '', revision: '', sheet: '1/1', drawnBy: '', checkedBy: '', approvedBy: '', status: 'draft' });

/** What the drawing shows of the solved values: which tags, by kind of reading and by part kind or part. */
export interface DisplaySettings {
  /** current arrows and tags beside parts */
  partCurrents: boolean;
  /** current arrows and tags on wires */
  wireCurrents: boolean;
  /** node voltage tags */
  nodeVoltages: boolean;
  /** part kinds whose readings are not drawn */
  hideKinds: PartKind[];
  /** parts (by id) whose readings are not drawn */
  hideParts: string[];
}

export const defaultDisplay = (): DisplaySettings => ({ partCurrents: true, wireCurrents: true, nodeVoltages: true, hideKinds: [], hideParts: [] });

export interface Sheet {
  schema: typeof SHEET_SCHEMA;
  title: string;
  titleBlock: TitleBlock;
  display: DisplaySettings;
  frequencyHz: number;
  amplitudes: Amplitudes;
  parts: Part[];
  wires: Wire[];
  couplings: SheetCoupling[];
}

export function emptySheet(title = 'Untitled sheet'): Sheet {
  return { schema: SHEET_SCHEMA, title, titleBlock: emptyTitleBlock(), display: defaultDisplay(), frequencyHz: 50, amplitudes: 'rms', parts: [], wires: [], couplings: [] };
}
