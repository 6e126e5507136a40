/**
 * The place tool: a ghost of the chosen part follows the pointer; a click
 * drops it (shift-click drops and keeps placing). R turns and M mirrors the ghost.
 *
 *   placing → (click) placed → back to the pick tool
 */
import { snap, type QuarterTurns } from '../model/geometry';
import { PART_DEFS } from '../model/parts/registry';
import type { PartKind } from '../model/sheet';
import { placePart } from '../store/actions';
import { ToolMachine, type KeyInput, type PointerInput } from './machine';

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

  begin(kind: PartKind): void {
    this.kind = kind;
    this.rot = PART_DEFS[kind].defaultRot;
    this.mirror = false;
    this.go('placing');
  }

  override onMove(e: PointerInput): void {
    if (this.state !== 'placing') return;
    this.store.setState({ ghost: { kind: this.kind, x: snap(e.x), y: snap(e.y), rot: this.rot, mirror: this.mirror } });
  }

  override onDown(e: PointerInput): void {
    if (this.state !== 'placing' || e.button !== 0) return;
    placePart(this.store, this.kind, { x: snap(e.x), y: snap(e.y) }, this.rot, this.mirror);
    this.go('placed');
    if (e.shift) {
      this.go('placing');
      return;
    }
    this.store.setState({ ghost: null });
    this.onDone();
  }

  override onKey(k: KeyInput): boolean {
    if (this.state !== 'placing' || k.mod) return false;
    const key = k.key.toLowerCase();
    if (k.key === 'Enter') {
      const g = this.store.getState().ghost;
      const at = g ?? this.viewCentre();
      this.onDown({ x: at.x, y: at.y, sx: 0, sy: 0, button: 0, shift: k.shift, mod: false, alt: false });
      return true;
    }
    if (key === 'r') {
      this.rot = ((this.rot + 1) % 4) as QuarterTurns;
    } else if (key === 'm') {
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
