/** Hit testing and box selection on the sheet, in sheet coordinates. */
import { distToSegment, inRect, rectInside, type Point, type Rect } from './geometry';
import { couplingText } from './couplingName';
import { dotPosition, partBox, pinPositions } from './parts/registry';
import type { Sheet, SheetCoupling } from './sheet';

export type Hit =
  | { type: 'dot'; id: string }
  | { type: 'pin'; id: string; pin: number; at: Point }
  | { type: 'coupling'; id: string }
  | { type: 'part'; id: string }
  | { type: 'wire'; id: string; at: Point }
  | { type: 'none' };

/** The font size of a coupling's label, in sheet units (about 11 px at 100 % zoom). */
export const COUPLING_TEXT = 11;

/** Where a coupling is drawn: a dashed chain between winding centres, its label spot, text and box (the box holds the text with room on each side). */
export function couplingGeometry(sheet: Sheet, c: SheetCoupling): { centres: Point[]; label: Point; text: string; box: Rect } {
  const centres: Point[] = [];
  for (const id of c.windings) {
    const p = sheet.parts.find((q) => q.id === id);
    if (p) centres.push({ x: p.x, y: p.y });
  }
  const n = Math.max(1, centres.length);
  // the label sits above the windings, clear of their designators
  const label = { x: centres.reduce((s, p) => s + p.x, 0) / n, y: Math.min(...centres.map((p) => p.y)) - 52 };
  const text = couplingText(sheet, c);
  // a generous estimate of bold sans text (0.62 em a character) plus 7 units of room each side
  const half = ([...text].length * COUPLING_TEXT * 0.62) / 2 + 7;
  return { centres, label, text, box: { x0: label.x - half, y0: label.y - 10, x1: label.x + half, y1: label.y + 9 } };
}

export function hitTest(sheet: Sheet, p: Point, tol: number, opts: { pins?: boolean } = {}): Hit {
  for (let i = sheet.parts.length - 1; i >= 0; i--) {
    const d = dotPosition(sheet.parts[i]);
    if (d && Math.hypot(d.x - p.x, d.y - p.y) <= Math.max(5, tol)) return { type: 'dot', id: sheet.parts[i].id };
  }
  if (opts.pins) {
    for (let i = sheet.parts.length - 1; i >= 0; i--) {
      const pins = pinPositions(sheet.parts[i]);
      for (let j = 0; j < pins.length; j++) {
        if (Math.hypot(pins[j].x - p.x, pins[j].y - p.y) <= tol) return { type: 'pin', id: sheet.parts[i].id, pin: j, at: pins[j] };
      }
    }
  }
  for (let i = sheet.couplings.length - 1; i >= 0; i--) {
    const g = couplingGeometry(sheet, sheet.couplings[i]);
    if (inRect(g.box, p)) return { type: 'coupling', id: sheet.couplings[i].id };
  }
  for (let i = sheet.parts.length - 1; i >= 0; i--) {
    if (inRect(partBox(sheet.parts[i]), p, tol * 0.5)) return { type: 'part', id: sheet.parts[i].id };
  }
  for (let i = sheet.wires.length - 1; i >= 0; i--) {
    const w = sheet.wires[i].pts;
    for (let j = 0; j + 3 < w.length; j += 2) {
      if (distToSegment(p, w[j], w[j + 1], w[j + 2], w[j + 3]) <= tol) return { type: 'wire', id: sheet.wires[i].id, at: p };
    }
  }
  return { type: 'none' };
}

/** Items wholly inside a selection box. */
export function itemsInBox(sheet: Sheet, r: Rect): string[] {
  const out: string[] = [];
  for (const part of sheet.parts) if (rectInside(partBox(part), r)) out.push(part.id);
  for (const w of sheet.wires) {
    let inside = true;
    for (let j = 0; j < w.pts.length; j += 2) if (!inRect(r, { x: w.pts[j], y: w.pts[j + 1] })) { inside = false; break; }
    if (inside) out.push(w.id);
  }
  for (const c of sheet.couplings) if (inRect(r, couplingGeometry(sheet, c).label)) out.push(c.id);
  return out;
}

/** The nearest point on any wire within tol, snapped onto the wire (for starting or ending a wire on a wire). */
export function pointOnWire(sheet: Sheet, p: Point, tol: number): Point | null {
  for (const w of sheet.wires) {
    const a = w.pts;
    for (let j = 0; j + 3 < a.length; j += 2) {
      if (distToSegment(p, a[j], a[j + 1], a[j + 2], a[j + 3]) <= tol) {
        if (a[j] === a[j + 2]) return { x: a[j], y: Math.min(Math.max(p.y, Math.min(a[j + 1], a[j + 3])), Math.max(a[j + 1], a[j + 3])) };
        return { x: Math.min(Math.max(p.x, Math.min(a[j], a[j + 2])), Math.max(a[j], a[j + 2])), y: a[j + 1] };
      }
    }
  }
  return null;
}
