/**
 * The wire tool: orthogonal polylines from pin or wire to pin or wire.
 *
 *   idle → drawing (click adds a corner) → idle (ends on a pin or wire, double click, Enter, Escape)
 */
import { addWire } from '../model/edits';
import { snap, type Point } from '../model/geometry';
import { hitTest, pointOnWire } from '../model/hit';
import { pinPositions } from '../model/parts/registry';
import { elbow } from '../model/wires';
import { commit } from '../store/actions';
import { ToolMachine, type KeyInput, type PointerInput } from './machine';

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
    if (this.state !== 'drawing') return false;
    if (k.key === 'Escape' || k.key === 'Enter') {
      this.finish();
      return true;
    }
    return false;
  }

  override exit(): void {
    this.finish();
    this.store.setState({ wireDraft: null });
  }
}
