/** Plane geometry of the sheet: points, quarter-turn rotation, mirror, grid. */

export const GRID = 10;

export interface Point { x: number; y: number }
export type QuarterTurns = 0 | 1 | 2 | 3;

export interface Placement { x: number; y: number; rot: QuarterTurns; mirror: boolean }

export function snap(v: number, step = GRID): number {
  return Math.round(v / step) * step;
}

/** Local part coordinates to sheet coordinates: mirror across the local y axis, then turn clockwise on screen, then translate. */
export function toSheet(pl: Placement, lx: number, ly: number): Point {
  let x = pl.mirror ? -lx : lx;
  let y = ly;
  for (let i = 0; i < pl.rot; i++) {
    const t = x;
    x = -y;
    y = t;
  }
  return { x: pl.x + x, y: pl.y + y };
}

export interface Rect { x0: number; y0: number; x1: number; y1: number }

export function rectOfLocal(pl: Placement, r: Rect): Rect {
  const a = toSheet(pl, r.x0, r.y0);
  const b = toSheet(pl, r.x1, r.y1);
  return { x0: Math.min(a.x, b.x), y0: Math.min(a.y, b.y), x1: Math.max(a.x, b.x), y1: Math.max(a.y, b.y) };
}

export function normRect(a: Point, b: Point): Rect {
  return { x0: Math.min(a.x, b.x), y0: Math.min(a.y, b.y), x1: Math.max(a.x, b.x), y1: Math.max(a.y, b.y) };
}

export function inRect(r: Rect, p: Point, pad = 0): boolean {
  return p.x >= r.x0 - pad && p.x <= r.x1 + pad && p.y >= r.y0 - pad && p.y <= r.y1 + pad;
}

export function rectInside(inner: Rect, outer: Rect): boolean {
  return inner.x0 >= outer.x0 && inner.x1 <= outer.x1 && inner.y0 >= outer.y0 && inner.y1 <= outer.y1;
}

/** Distance from p to the segment a-b. */
export function distToSegment(p: Point, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy;
  let t = len2 === 0 ? 0 : ((p.x - ax) * dx + (p.y - ay) * dy) / len2;
  t = Math.max(0, Math.min(1, t));
  const qx = ax + t * dx - p.x;
  const qy = ay + t * dy - p.y;
  return Math.sqrt(qx * qx + qy * qy);
}

/** A numeric key for an integer point (sheet coordinates are snapped integers). */
export function pointKey(x: number, y: number): number {
  return (Math.round(x) + 2_000_000) * 4_000_000 + (Math.round(y) + 2_000_000);
}
