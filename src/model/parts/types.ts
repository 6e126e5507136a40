/** One definition per part kind: pins, geometry, drawing, fields and graph contribution. */
import type { ElementKind, GraphElement } from '../graph';
import type { Point, QuarterTurns, Rect } from '../geometry';
import type { NumericField, Part, PartKind } from '../sheet';
import type { Expansion } from '../powerExpansion';

/** The symbol standard drawn: IEC 60617 (the default) or IEEE 315. */
export type SymbolStyle = 'iec' | 'ieee';

/** Drawing primitives in the part's local coordinates (text is drawn upright). */
export type Prim =
  | { t: 'line'; p: number[] }
  | { t: 'poly'; p: number[]; fill?: boolean }
  | { t: 'rect'; x: number; y: number; w: number; h: number }
  | { t: 'circle'; x: number; y: number; r: number; fill?: boolean }
  | { t: 'arc'; x: number; y: number; r: number; a0: number; a1: number }
  | { t: 'text'; x: number; y: number; s: string; size: number; mono?: boolean; bold?: boolean; role?: string };

/**
 * Marks drawn upright in sheet coordinates over a placed symbol: a winding's
 * polarity dot, a node label's name. The canvas, the SVG and the shelf icons
 * all draw them from here.
 */
export type Mark =
  | { t: 'dot'; x: number; y: number; r: number; role: 'polarity-dot' }
  | { t: 'text'; x: number; y: number; s: string; size: number; mono: boolean; bold: boolean; role: 'node-label' };

export interface FieldDef {
  key: NumericField;
  label: string;
  unit: string;
  /** reason the value is not allowed, or null */
  check: (v: number) => string | null;
  /** the value as the entry field shows it, when not a plain SI number (a turns ratio "1:200") */
  editText?: (v: number) => string;
  /** what the field's hint suggests typing */
  hint?: string;
}

export interface PartDef {
  kind: PartKind;
  /** the one name of this kind: shelf, commands, details and keys list all use it */
  label: string;
  /** the key that places it (its place on the shelf), or '' when it is not on the shelf */
  shelfKey: string;
  /** the shelf icon: view box in local units and stroke width */
  icon: { box: Rect; stroke: number };
  /** designator letter, '' when the part has none */
  prefix: string;
  pins: Point[];
  box: Rect;
  defaultRot: QuarterTurns;
  defaults: Pick<Part, NumericField | 'dot' | 'name' | 'closed' | 'togglesS' | 'power'>;
  fields: FieldDef[];
  draw: (part: Part, style?: SymbolStyle) => Prim[];
  /** short value text shown beside the part */
  valueText: (part: Part) => string;
  /** the graph element this part contributes, given the node of each pin */
  toElement?: (part: Part, nodes: string[]) => GraphElement;
  /** instead of one element: the elements (and couplings) the part stands for, with inner nodes of its own */
  expand?: (part: Part, nodes: string[]) => Expansion;
  /** a node name this part imposes on the node of its pin (ground, node label) */
  netName?: (part: Part) => string;
  /** where the polarity dot sits (local), for windings */
  dotAt?: (part: Part) => Point;
  /** marks drawn upright over the symbol, in sheet coordinates (dot, node name) */
  marks?: (part: Part) => Mark[];
  /** the graph element kind that reads back as this part, and its values */
  fromElement?: { kind: ElementKind; values: (el: GraphElement) => Partial<Part> };
  /** the part's box when it depends on the part (a node label grows with its name) */
  boxOf?: (part: Part) => Rect;
  /** a winding: it can be coupled and has a polarity dot */
  couplable?: boolean;
  /** an independent source */
  source?: boolean;
  /** where the designator and value go: beside a turned part, above it, or centred below (a wide symbol) */
  labelBelow?: boolean;
  /** a node name this part carries, edited in the details panel */
  nameField?: { label: string; hint: string };
  /** an editor the details panel adds below the fields: a source's waveform, a switch's state and toggle times */
  editor?: 'waveform' | 'switch' | 'power';
}

/** Whether the part puts anything into the graph model (one element or an expansion). */
export const contributes = (def: PartDef): boolean => !!(def.toElement || def.expand);

export const positive = (what: string) => (v: number) => (v > 0 ? null : `${what} must be more than zero`);
export const nonNegative = (what: string) => (v: number) => (v >= 0 ? null : `${what} must be zero or more`);
export const anyFinite = (what?: string) => (v: number) => (Number.isFinite(v) ? null : `${what ?? 'It'} must be a finite number`);

/** Four semicircular turns (IEC 60617 inductor) between (x0,y) and (x0+40,y), bulging towards -y. */
export function turns(x0: number, y: number, dir: 1 | -1 = 1, vertical = false): Prim[] {
  const out: Prim[] = [];
  for (let i = 0; i < 4; i++) {
    const c = x0 + 5 + 10 * i;
    if (!vertical) out.push({ t: 'arc', x: c, y, r: 5, a0: Math.PI, a1: 2 * Math.PI });
    else out.push({ t: 'arc', x: y, y: c, r: 5, a0: dir > 0 ? Math.PI / 2 : -Math.PI / 2, a1: dir > 0 ? (3 * Math.PI) / 2 : Math.PI / 2 });
  }
  return out;
}
