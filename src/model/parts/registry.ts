/** Part definitions by kind, and geometry helpers that use them. */
import { rectOfLocal, toSheet, type Point, type Rect } from '../geometry';
import type { Part, PartKind } from '../sheet';
import { labelWidth, ground, label, transformer } from './others';
import { isource, vsource } from './sources';
import { arm, capacitor, resistor, winding } from './twoTerminal';
import type { PartDef } from './types';

export const PART_DEFS: Record<PartKind, PartDef> = {
  resistor, winding, capacitor, vsource, isource, transformer, ground, label, arm,
};

export function partDef(kind: PartKind): PartDef {
  return PART_DEFS[kind];
}

export function pinPositions(part: Part): Point[] {
  return PART_DEFS[part.kind].pins.map((p) => toSheet(part, p.x, p.y));
}

export function partBox(part: Part): Rect {
  const def = PART_DEFS[part.kind];
  const box = part.kind === 'label' ? { ...def.box, x1: labelWidth(part.name ?? '') } : def.box;
  return rectOfLocal(part, box);
}

export function dotPosition(part: Part): Point | null {
  const def = PART_DEFS[part.kind];
  if (!def.dotAt) return null;
  const d = def.dotAt(part);
  return toSheet(part, d.x, d.y);
}

export type { PartDef, Prim, FieldDef } from './types';
