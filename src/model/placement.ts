/**
 * Where a part placed from the keyboard goes: the first spot, searched
 * outward from a starting point (to the right first, then below, left and
 * above), where its box keeps a margin from every other part and its pins
 * land on no wire and no other pin.
 */
import { GRID, pointKey, rectOfLocal, snap, toSheet, type Point, type QuarterTurns, type Rect } from './geometry';
import { pointOnWire } from './hit';
import { PART_DEFS, partBox, pinPositions } from './parts/registry';
import type { PartKind, Sheet } from './sheet';

const MARGIN = 20;

const overlaps = (a: Rect, b: Rect, m: number) => a.x0 - m < b.x1 && b.x0 - m < a.x1 && a.y0 - m < b.y1 && b.y0 - m < a.y1;

export function freeSpot(sheet: Sheet, kind: PartKind, rot: QuarterTurns, mirror: boolean, near: Point): Point {
  const def = PART_DEFS[kind];
  const boxes = sheet.parts.map(partBox);
  const pins = new Set<number>();
  for (const p of sheet.parts) for (const q of pinPositions(p)) pins.add(pointKey(q.x, q.y));
  const fits = (x: number, y: number) => {
    const pl = { x, y, rot, mirror };
    const box = rectOfLocal(pl, def.box);
    if (boxes.some((b) => overlaps(box, b, MARGIN))) return false;
    return def.pins.every((p) => {
      const q = toSheet(pl, p.x, p.y);
      return !pins.has(pointKey(q.x, q.y)) && !pointOnWire(sheet, q, 0.5);
    });
  };
  const x0 = snap(near.x), y0 = snap(near.y);
  if (fits(x0, y0)) return { x: x0, y: y0 };
  const step = 2 * GRID;
  for (let r = 1; r <= 60; r++) {
    // the ring at distance r·step, right side first, then below, left and above
    const d = r * step;
    const ring: Point[] = [];
    for (let t = -r; t <= r; t++) ring.push({ x: x0 + d, y: y0 + t * step });
    for (let t = r; t >= -r; t--) ring.push({ x: x0 + t * step, y: y0 + d });
    for (let t = r; t >= -r; t--) ring.push({ x: x0 - d, y: y0 + t * step });
    for (let t = -r; t <= r; t++) ring.push({ x: x0 + t * step, y: y0 - d });
    // nearest to the starting row first, so parts fall into a line
    ring.sort((a, b) => Math.abs(a.y - y0) - Math.abs(b.y - y0) || Math.abs(a.x - x0) - Math.abs(b.x - x0));
    for (const q of ring) if (fits(q.x, q.y)) return q;
  }
  return { x: x0, y: y0 };
}

/** Where to start looking for a new part's spot: beside the given part, else the centre of the view. */
export function placementStart(sheet: Sheet, lastId: string | null, viewCentre: Point): Point {
  const last = lastId ? sheet.parts.find((p) => p.id === lastId) : undefined;
  if (!last) return viewCentre;
  const b = partBox(last);
  return { x: b.x1 + 60, y: last.y };
}
