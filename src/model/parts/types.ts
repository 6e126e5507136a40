/** One definition per part kind: pins, geometry, drawing, fields and graph contribution. */
import type { GraphElement } from '../graph';
import type { Point, QuarterTurns, Rect } from '../geometry';
import type { Part, PartKind } from '../sheet';

/** The symbol standard drawn: IEC 60617 (the default) or IEEE 315. */
export type SymbolStyle = 'iec' | 'ieee';

/** Drawing primitives in the part's local coordinates (text is drawn upright). */
export type Prim =
  | { t: 'line'; p: number[] }
  | { t: 'poly'; p: number[]; fill?: boolean }
  | { t: 'rect'; x: number; y: number; w: number; h: number }
  | { t: 'circle'; x: number; y: number; r: number; fill?: boolean }
  | { t: 'arc'; x: number; y: number; r: number; a0: number; a1: number }
  | { t: 'text'; x: number; y: number; s: string; size: number };

export interface FieldDef {
  key: 'value' | 'phaseDeg';
  label: string;
  unit: string;
  /** reason the value is not allowed, or null */
  check: (v: number) => string | null;
}

export interface PartDef {
  kind: PartKind;
  /** name on the parts shelf */
  label: string;
  /** designator letter, '' when the part has none */
  prefix: string;
  pins: Point[];
  box: Rect;
  defaultRot: QuarterTurns;
  defaults: Pick<Part, 'value' | 'phaseDeg' | 'dot' | 'name'>;
  fields: FieldDef[];
  draw: (part: Part, style?: SymbolStyle) => Prim[];
  /** short value text shown beside the part */
  valueText: (part: Part) => string;
  /** the graph element this part contributes, given the node of each pin */
  toElement?: (part: Part, nodes: string[]) => GraphElement;
  /** a node name this part imposes on the node of its pin (ground, node label) */
  netName?: (part: Part) => string;
  /** where the polarity dot sits (local), for windings */
  dotAt?: (part: Part) => Point;
}

export const positive = (what: string) => (v: number) => (v > 0 ? null : `${what} must be more than zero`);
export const nonNegative = (what: string) => (v: number) => (v >= 0 ? null : `${what} must be zero or more`);
export const anyFinite = () => (v: number) => (Number.isFinite(v) ? null : 'must be a finite number');

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
