/**
 * The wire tool: orthogonal polylines from pin or wire to pin or wire.
 *
 *   idle → drawing (click adds a corner) → idle (ends on a pin or wire, double click, Enter, Escape)
 *
 * From the keyboard: the arrow keys move a pin cursor to the nearest pin in
 * their direction, `]` and `[` step through the pins in sheet order, Enter
 * starts the wire at the cursor's pin and Enter again ends it at the next pin
 * picked (an L-shaped route). Escape ends a wire being drawn.
 */
import { addWire } from '../model/edits';
import { snap, type Point } from '../model/geometry';
import { hitTest, pointOnWire } from '../model/hit';
import { pinPositions } from '../model/parts/registry';
import { elbow } from '../model/wires';
import { commit } from '../store/actions';
import { ToolMachine, type KeyInput, type PointerInput } from './machine';

const DIRS: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, -1], ArrowDown: [0, 1] };

export class WireTool extends ToolMachine {
  private pts: number[] = [];
  private startAt: Point = { x: 0, y: 0 };

  /** Where a click lands: a pin, a point on a wire, or the nearest grid point; and whether it connects there. */
  target(e: Point): { at: Point; connects: boolean } {
    const s = this.store.getState().sheet;
    const hit = hitTest(s, e, this.tol(8), { pins: true });
    if (hit.type === 'pin') return { at: hit.at, connects: true };
    const g = { x: snap(e.x), y: snap(e.y) };
    for (const p of s.parts) for (const q of pinPositions(p)) if (q.x === g.x && q.y === g.y) return { at: g, connects: true };
    const onWire = pointOnWire(s, g, 0.5) ?? pointOnWire(s, e, this.tol(5));
    if (onWire) return { at: { x: snap(onWire.x), y: snap(onWire.y) }, connects: true };
    return { at: g, connects: false };
  }

  override onDown(e: PointerInput): void {
    if (e.button !== 0) return;
    const t = this.target(e);
    if (this.state === 'idle') {
      this.pts = [t.at.x, t.at.y];
      this.startAt = t.at;
      this.go('drawing');
      this.store.setState({ wireDraft: [t.at.x, t.at.y, t.at.x, t.at.y] });
      return;
    }
    const n = this.pts.length;
    const lx = this.pts[n - 2], ly = this.pts[n - 1];
    if ((t.at.x === lx && t.at.y === ly) || (e.detail ?? 1) >= 2) {
      this.finish();
      return;
    }
    this.pts.push(...elbow(lx, ly, t.at.x, t.at.y).slice(2));
    const back = t.at.x === this.startAt.x && t.at.y === this.startAt.y;
    if (t.connects && !back) this.finish();
    else this.store.setState({ wireDraft: this.pts.slice() });
  }

  /** every pin of the sheet in sheet order */
  private pins(): Point[] {
    return this.store.getState().sheet.parts.flatMap((p) => pinPositions(p));
  }

  private moveCursor(to: Point | null): void {
    this.store.setState({ pinCursor: to });
    if (to && this.state === 'drawing') {
      const n = this.pts.length;
      this.store.setState({ wireDraft: [...this.pts, ...elbow(this.pts[n - 2], this.pts[n - 1], to.x, to.y).slice(2)] });
    }
  }

  /** the pin nearest `from` within 60° of direction (dx, dy) */
  private pinToward(from: Point, dx: number, dy: number): Point | null {
    let best: Point | null = null;
    let bestScore = Infinity;
    for (const q of this.pins()) {
      const vx = q.x - from.x, vy = q.y - from.y;
      const along = vx * dx + vy * dy;
      const across = Math.abs(vx * dy - vy * dx);
      if (along <= 0 || across > along * 1.8) continue;
      const score = along + 2 * across;
      if (score < bestScore) { bestScore = score; best = q; }
    }
    return best;
  }

  private keyboardStart(): Point | null {
    const s = this.store.getState();
    const pins = this.pins();
    if (!pins.length) return null;
    const v = s.view;
    const c = { x: (400 - v.x) / v.zoom, y: (300 - v.y) / v.zoom };
    const last = this.pts.length ? { x: this.pts[this.pts.length - 2], y: this.pts[this.pts.length - 1] } : c;
    return pins.reduce((a, b) => (Math.hypot(a.x - last.x, a.y - last.y) <= Math.hypot(b.x - last.x, b.y - last.y) ? a : b));
  }

  override onMove(e: PointerInput): void {
    if (this.state !== 'drawing') return;
    const t = this.target(e);
    const n = this.pts.length;
    this.store.setState({ wireDraft: [...this.pts, ...elbow(this.pts[n - 2], this.pts[n - 1], t.at.x, t.at.y).slice(2)] });
  }

  finish(): void {
    if (this.state !== 'drawing') return;
    const r = addWire(this.store.getState().sheet, this.pts);
    this.store.setState({ wireDraft: null });
    if (r.wire) commit(this.store, r.sheet, [r.wire.id]);
    this.pts = [];
    this.go('idle');
  }

  override onKey(k: KeyInput): boolean {
    if (k.mod || k.alt) return false;
    const cursor = this.store.getState().pinCursor;
    const dir = DIRS[k.key];
    if (dir && !k.shift) {
      const from = cursor ?? this.keyboardStart();
      if (!from) return false;
      this.moveCursor(cursor ? this.pinToward(cursor, dir[0], dir[1]) ?? cursor : from);
      return true;
    }
    if (k.key === ']' || k.key === '[') {
      const pins = this.pins();
      if (!pins.length) return false;
      const at = cursor ? pins.findIndex((q) => q.x === cursor.x && q.y === cursor.y) : -1;
      const next = at < 0 ? (k.key === ']' ? 0 : pins.length - 1) : (at + (k.key === ']' ? 1 : pins.length - 1)) % pins.length;
      this.moveCursor(pins[next]);
      return true;
    }
    if (k.key === 'Enter' && cursor) {
      // a click at the cursor's pin: starts a wire, or ends the one being drawn there
      this.onDown({ x: cursor.x, y: cursor.y, sx: 0, sy: 0, button: 0, shift: false, mod: false, alt: false, detail: 1 });
      if (this.state === 'drawing') this.moveCursor(cursor);
      return true;
    }
    if (this.state !== 'drawing') return false;
    if (k.key === 'Escape' || k.key === 'Enter') {
      this.finish();
      return true;
    }
    return false;
  }

  override exit(): void {
    this.finish();
    this.store.setState({ wireDraft: null, pinCursor: null });
  }
}
