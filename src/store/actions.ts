/** Edits and view changes applied to the store. Each sheet edit is one undo step. */
import { refProblem } from '../model/designators';
import * as E from '../model/edits';
import { GRID, snap, type Point } from '../model/geometry';
import { sheetBoundsProblem } from '../model/sheetSchema';
import { isCouplable } from '../model/parts/registry';
import type { PartKind, Sheet } from '../model/sheet';
import type { EditorState, EditorStore, View } from './types';

/**
 * Replace the sheet (one undo step) and optionally the selection. An edit
 * that would leave the sheet's bounds (a file could then not be read back)
 * is refused with a notice and the sheet stays as it was.
 */
export function commit(store: EditorStore, next: Sheet, selection?: string[]): void {
  const s = store.getState();
  if (next === s.sheet && !selection) return;
  if (next !== s.sheet && refuseReadOnly(store)) return;
  const beyond = next === s.sheet ? null : sheetBoundsProblem(next);
  if (beyond) {
    store.setState({ preview: null, notice: { text: `That edit was not made: ${beyond}.`, tone: 'error' } });
    return;
  }
  store.setState({ sheet: next, preview: null, ...(selection ? { selection } : {}) });
}

export function notify(store: EditorStore, text: string, tone: 'info' | 'error' = 'info'): void {
  store.setState({ notice: { text, tone } });
}

/** A sheet shown read-only (another tab edits it) takes no edits: says so and returns true. */
function refuseReadOnly(store: EditorStore): boolean {
  if (store.getState().tab.state !== 'read-only') return false;
  store.setState({ preview: null, notice: { text: 'This sheet is read-only in this tab (another tab edits it). Take it over or keep a copy to edit it here.', tone: 'error' } });
  return true;
}

export function selectedSet(s: EditorState): Set<string> {
  return new Set(s.selection);
}

export function setSelection(store: EditorStore, ids: string[]): void {
  store.setState({ selection: ids });
}

export function placePart(store: EditorStore, kind: PartKind, at: Point, rot?: 0 | 1 | 2 | 3, mirror = false): string {
  const s = store.getState();
  const part = E.makePart(s.sheet, kind, at.x, at.y, rot, mirror);
  commit(store, E.addParts(s.sheet, [part]), [part.id]);
  return part.id;
}

/** Turn the selection by `quarters` quarter turns clockwise (3: one anticlockwise). */
export function rotateSelection(store: EditorStore, quarters: 1 | 2 | 3 = 1): void {
  const s = store.getState();
  if (!s.selection.length) return;
  commit(store, E.rotateParts(s.sheet, selectedSet(s), quarters));
}

export function mirrorSelection(store: EditorStore): void {
  const s = store.getState();
  if (!s.selection.length) return;
  commit(store, E.mirrorParts(s.sheet, selectedSet(s)));
}

export function deleteSelection(store: EditorStore): void {
  const s = store.getState();
  if (!s.selection.length) return;
  commit(store, E.deleteItems(s.sheet, selectedSet(s)), []);
}

export function copySelection(store: EditorStore): void {
  const s = store.getState();
  if (!s.selection.length) return;
  const frag = E.copyFragment(s.sheet, selectedSet(s));
  store.setState({ clipboard: frag });
  notify(store, `Copied ${frag.parts.length} part(s) and ${frag.wires.length} wire(s)`);
}

export function pasteClipboard(store: EditorStore, offset = 40): void {
  const s = store.getState();
  if (!s.clipboard) return notify(store, 'Nothing copied yet');
  const r = E.pasteFragment(s.sheet, s.clipboard, offset, offset);
  commit(store, r.sheet, r.ids);
  // the next paste lands further on
  store.setState({ clipboard: { ...s.clipboard, parts: s.clipboard.parts.map((p) => ({ ...p, x: p.x + offset, y: p.y + offset })), wires: s.clipboard.wires.map((w) => ({ ...w, pts: w.pts.map((v) => v + offset) })) } });
}

export function duplicateSelection(store: EditorStore): void {
  const s = store.getState();
  if (!s.selection.length) return;
  const r = E.pasteFragment(s.sheet, E.copyFragment(s.sheet, selectedSet(s)), 40, 40);
  commit(store, r.sheet, r.ids);
}

export function flipDotsOfSelection(store: EditorStore): void {
  const s = store.getState();
  const ids = new Set(s.sheet.parts.filter((p) => isCouplable(p) && s.selection.includes(p.id)).map((p) => p.id));
  if (!ids.size) return notify(store, 'Select a winding to swap its dot');
  commit(store, E.flipDots(s.sheet, ids));
}

export function flipDot(store: EditorStore, partId: string): void {
  const s = store.getState();
  commit(store, E.flipDots(s.sheet, new Set([partId])));
}

export function coupleSelection(store: EditorStore): void {
  const s = store.getState();
  const ids = s.sheet.parts.filter((p) => isCouplable(p) && s.selection.includes(p.id)).map((p) => p.id);
  if (ids.length < 2) return notify(store, 'Select two or more windings to link them', 'error');
  const r = E.coupleWindings(s.sheet, ids);
  commit(store, r.sheet, [r.coupling.id]);
}

export function renamePart(store: EditorStore, partId: string, ref: string): string | null {
  const s = store.getState();
  const problem = refProblem(s.sheet, partId, ref);
  if (problem) return problem;
  commit(store, E.updatePart(s.sheet, partId, { ref: ref.trim() }));
  return null;
}

/** Select the next (or previous) part or coupling in sheet order; with `add`, keep what is selected. */
export function selectNext(store: EditorStore, step: 1 | -1, add: boolean): void {
  const s = store.getState();
  const ids = [...s.sheet.parts.map((p) => p.id), ...s.sheet.couplings.map((c) => c.id)];
  if (!ids.length) return;
  const last = s.selection[s.selection.length - 1];
  const at = last ? ids.indexOf(last) : -1;
  const next = ids[(at + step + ids.length) % ids.length];
  setSelection(store, add ? [...s.selection.filter((id) => id !== next), next] : [next]);
}

/** Move the selection by whole grid steps, wires following as in a drag (one undo step). */
export function nudgeSelection(store: EditorStore, gx: number, gy: number): void {
  const s = store.getState();
  if (!s.selection.length) return;
  commit(store, E.tidyWires(E.moveSelection(s.sheet, selectedSet(s), gx * GRID, gy * GRID)));
}

export function selectAll(store: EditorStore): void {
  const s = store.getState().sheet;
  setSelection(store, [...s.parts.map((p) => p.id), ...s.wires.map((w) => w.id), ...s.couplings.map((c) => c.id)]);
}

export function undo(store: EditorStore): void {
  if (refuseReadOnly(store)) return;
  store.temporal.getState().undo();
  store.setState({ preview: null });
}

export function redo(store: EditorStore): void {
  if (refuseReadOnly(store)) return;
  store.temporal.getState().redo();
  store.setState({ preview: null });
}

// ---- view ----

export function screenToWorld(v: View, sx: number, sy: number): Point {
  return { x: (sx - v.x) / v.zoom, y: (sy - v.y) / v.zoom };
}

export function worldToScreen(v: View, x: number, y: number): Point {
  return { x: x * v.zoom + v.x, y: y * v.zoom + v.y };
}

export function zoomAt(store: EditorStore, factor: number, sx: number, sy: number): void {
  const v = store.getState().view;
  const zoom = Math.min(8, Math.max(0.1, v.zoom * factor));
  const w = screenToWorld(v, sx, sy);
  store.setState({ view: { zoom, x: sx - w.x * zoom, y: sy - w.y * zoom } });
}

export function panBy(store: EditorStore, dx: number, dy: number): void {
  const v = store.getState().view;
  store.setState({ view: { ...v, x: v.x + dx, y: v.y + dy } });
}

/** The box the sheet's contents take in sheet units, with room for their designators and tags; null for an empty sheet. */
export function contentBounds(s: Sheet): { x0: number; y0: number; x1: number; y1: number } | null {
  if (!s.parts.length && !s.wires.length) return null;
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const p of s.parts) { x0 = Math.min(x0, p.x - 140); y0 = Math.min(y0, p.y - 60); x1 = Math.max(x1, p.x + 120); y1 = Math.max(y1, p.y + 50); }
  for (const w of s.wires) for (let i = 0; i < w.pts.length; i += 2) { x0 = Math.min(x0, w.pts[i] - 40); x1 = Math.max(x1, w.pts[i] + 40); y0 = Math.min(y0, w.pts[i + 1] - 30); y1 = Math.max(y1, w.pts[i + 1] + 30); }
  return { x0, y0, x1, y1 };
}

/**
 * Zoom by a key or button: about the middle of the view while some of the
 * drawing stays in view that way; else about the part nearest the middle,
 * held inside the view, so a zoom never pushes the circuit out of view.
 */
export function zoomView(store: EditorStore, factor: number, width: number, height: number): void {
  const s = store.getState();
  const zoom = Math.min(8, Math.max(0.1, s.view.zoom * factor));
  const c = screenToWorld(s.view, width / 2, height / 2);
  const middle: View = { zoom, x: width / 2 - c.x * zoom, y: height / 2 - c.y * zoom };
  // part origins, or the wire points on a sheet of wires alone
  const points: Point[] = s.sheet.parts.map((p) => ({ x: p.x, y: p.y }));
  if (!points.length) for (const w of s.sheet.wires) for (let i = 0; i < w.pts.length; i += 2) points.push({ x: w.pts[i], y: w.pts[i + 1] });
  const shown = (v: View, p: Point) => { const q = worldToScreen(v, p.x, p.y); return q.x >= 0 && q.x <= width && q.y >= 0 && q.y <= height; };
  if (!points.length || points.some((p) => shown(middle, p))) return store.setState({ view: middle });
  let anchor = points[0];
  for (const p of points) if ((p.x - c.x) ** 2 + (p.y - c.y) ** 2 < (anchor.x - c.x) ** 2 + (anchor.y - c.y) ** 2) anchor = p;
  // where the nearest point is on screen, brought inside the view with a margin; it stays there while zooming
  const at = worldToScreen(s.view, anchor.x, anchor.y);
  const mx = Math.min(40, width / 4), my = Math.min(40, height / 4);
  const sx = Math.min(width - mx, Math.max(mx, at.x));
  const sy = Math.min(height - my, Math.max(my, at.y));
  store.setState({ view: { zoom, x: sx - anchor.x * zoom, y: sy - anchor.y * zoom } });
}

/** Fit the sheet's contents into a viewport of the given size. */
export function fitView(store: EditorStore, width: number, height: number): void {
  const b = contentBounds(store.getState().sheet);
  if (!b) return store.setState({ view: { x: width / 2, y: height / 2, zoom: 1.5 } });
  const { x0, y0, x1, y1 } = b;
  const zoom = Math.min(2, Math.max(0.1, Math.min(width / (x1 - x0 + 40), height / (y1 - y0 + 60))));
  store.setState({ view: { zoom, x: width / 2 - ((x0 + x1) / 2) * zoom, y: height / 2 - ((y0 + y1) / 2) * zoom } });
}

export const snapPoint = (p: Point): Point => ({ x: snap(p.x), y: snap(p.y) });
