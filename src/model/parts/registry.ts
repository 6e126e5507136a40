/** Part definitions by kind, and geometry helpers that use them. */
import type { ElementKind } from '../graph';
import { rectOfLocal, toSheet, type Point, type Rect } from '../geometry';
import { PART_KINDS, type Part, type PartKind } from '../sheet';
import { ground, label, transformer } from './others';
import { powerTransformer } from './power';
import { isource, vsource } from './sources';
import { switchPart } from './switch';
import { arm, capacitor, resistor, winding } from './twoTerminal';
import type { Mark, PartDef } from './types';

export const PART_DEFS: Record<PartKind, PartDef> = {
  resistor, winding, capacitor, vsource, isource, transformer, ground, label, arm, switch: switchPart, power: powerTransformer,
};

export function partDef(kind: PartKind): PartDef {
  return PART_DEFS[kind];
}

/** The kinds offered on the parts shelf, in the order of their keys. */
export const SHELF_KINDS: readonly PartKind[] = PART_KINDS.filter((k) => PART_DEFS[k].shelfKey !== '')
  .sort((a, b) => PART_DEFS[a].shelfKey.localeCompare(PART_DEFS[b].shelfKey));

/** The part kind a graph element kind reads back as. */
export const PART_OF_ELEMENT: Record<ElementKind, PartKind> = Object.fromEntries(
  PART_KINDS.flatMap((k) => (PART_DEFS[k].fromElement ? [[PART_DEFS[k].fromElement!.kind, k]] : [])),
) as Record<ElementKind, PartKind>;

export function pinPositions(part: Part): Point[] {
  return PART_DEFS[part.kind].pins.map((p) => toSheet(part, p.x, p.y));
}

export function partBox(part: Part): Rect {
  const def = PART_DEFS[part.kind];
  return rectOfLocal(part, def.boxOf ? def.boxOf(part) : def.box);
}

export function dotPosition(part: Part): Point | null {
  const def = PART_DEFS[part.kind];
  if (!def.dotAt) return null;
  const d = def.dotAt(part);
  return toSheet(part, d.x, d.y);
}

/** The upright marks over a placed part (polarity dot, node name), in sheet coordinates. */
export function partMarks(part: Part): Mark[] {
  return PART_DEFS[part.kind].marks?.(part) ?? [];
}

/** Whether a part is a winding that can be coupled (and carries a polarity dot). */
export const isCouplable = (part: Part): boolean => !!PART_DEFS[part.kind].couplable;

/** Whether a part is an independent source. */
export const isSource = (part: Part): boolean => !!PART_DEFS[part.kind].source;

export type { PartDef, Prim, FieldDef, Mark } from './types';
export { contributes } from './types';
