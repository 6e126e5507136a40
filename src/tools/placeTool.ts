/**
 * The place tool: a ghost of the chosen part follows the pointer; a click
 * drops it (shift-click drops and keeps placing). From the keyboard the ghost
 * starts at a free spot beside the part placed last, arrow keys move it a
 * grid step (Shift: five), Enter drops it. `.` and `,` turn it, F flips it.
 *
 *   placing → (click or Enter) placed → back to the pick tool
 */
import { GRID, snap, type QuarterTurns } from '../model/geometry';
import { PART_DEFS } from '../model/parts/registry';
import { freeSpot, placementStart } from '../model/placement';
import type { PartKind } from '../model/sheet';
import { placePart } from '../store/actions';
import { ToolMachine, type KeyInput, type PointerInput } from './machine';

const ARROWS: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, -1], ArrowDown: [0, 1] };

export class PlaceTool extends ToolMachine {
  kind: PartKind = 'resistor';
  rot: QuarterTurns = 0;
  mirror = false;
  /** called when a part has been dropped and the tool is done */
  onDone: () => void = () => {};
  /** size of the drawing area, for dropping a part from the keyboard */
  viewport: () => { width: number; height: number } = () => ({ width: 800, height: 600 });

  private viewCentre(): { x: number; y: number } {
    const v = this.store.getState().view;
    const { width, height } = this.viewport();
    return { x: (width / 2 - v.x) / v.zoom, y: (height / 2 - v.y) / v.zoom };
  }

  /** the part this tool placed last: the next one goes beside it */
  private lastId: string | null = null;

  begin(kind: PartKind): void {
    this.kind = kind;
    this.rot = PART_DEFS[kind].defaultRot;
    this.mirror = false;
    this.go('placing');
    this.showAtFreeSpot();
  }

  /** the ghost at the free spot nearest the part placed last (or the view's centre) */
  private showAtFreeSpot(): void {
    const s = this.store.getState();
    const at = freeSpot(s.sheet, this.kind, this.rot, this.mirror, placementStart(s.sheet, this.lastId, this.viewCentre()));
    this.store.setState({ ghost: { kind: this.kind, x: at.x, y: at.y, rot: this.rot, mirror: this.mirror } });
  }

  override onMove(e: PointerInput): void {
    if (this.state !== 'placing') return;
    this.store.setState({ ghost: { kind: this.kind, x: snap(e.x), y: snap(e.y), rot: this.rot, mirror: this.mirror } });
  }

  override onDown(e: PointerInput): void {
    if (this.state !== 'placing' || e.button !== 0) return;
    this.lastId = placePart(this.store, this.kind, { x: snap(e.x), y: snap(e.y) }, this.rot, this.mirror);
    this.go('placed');
    if (e.shift) {
      this.go('placing');
      if (e.sx === 0 && e.sy === 0) this.showAtFreeSpot();
      return;
    }
    this.store.setState({ ghost: null });
    this.onDone();
  }

  override onKey(k: KeyInput): boolean {
    if (this.state !== 'placing' || k.mod) return false;
    const key = k.key.toLowerCase();
    if (k.key === 'Enter') {
      if (!this.store.getState().ghost) this.showAtFreeSpot();
      const at = this.store.getState().ghost!;
      this.onDown({ x: at.x, y: at.y, sx: 0, sy: 0, button: 0, shift: k.shift, mod: false, alt: false });
      return true;
    }
    const arrow = ARROWS[k.key];
    if (arrow) {
      const g = this.store.getState().ghost;
      if (!g) this.showAtFreeSpot();
      const h = this.store.getState().ghost!;
      const n = (k.shift ? 5 : 1) * GRID;
      this.store.setState({ ghost: { ...h, x: h.x + arrow[0] * n, y: h.y + arrow[1] * n } });
      return true;
    }
    if (key === '.') {
      this.rot = ((this.rot + 1) % 4) as QuarterTurns;
    } else if (key === ',') {
      this.rot = ((this.rot + 3) % 4) as QuarterTurns;
    } else if (key === 'f') {
      this.mirror = !this.mirror;
    } else if (k.key === 'Escape') {
      this.store.setState({ ghost: null });
      this.go('idle');
      this.onDone();
      return true;
    } else return false;
    const g = this.store.getState().ghost;
    if (g) this.store.setState({ ghost: { ...g, rot: this.rot, mirror: this.mirror } });
    return true;
  }

  override exit(): void {
    this.store.setState({ ghost: null });
    if (this.state !== 'idle') this.go('idle');
  }
}
