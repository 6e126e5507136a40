/**
 * The pick tool: click to select (shift adds or removes), drag parts and
 * wires (one undo step, committed on release), drag on empty sheet for a
 * selection box, click a winding's polarity dot to move it to the other end.
 *
 *   idle → pointing_item → dragging → idle
 *   idle → pointing_canvas → brushing → idle
 *   idle → pointing_dot → idle (dot swapped) | dragging
 *   idle → pointing_item (a wire alone) → sliding (its segment moves sideways, ends stay) → idle
 */
import { moveSelection, tidyWires } from '../model/edits';
import { nearestSegment, slideSegment } from '../model/wires';
import { normRect, snap, type Point } from '../model/geometry';
import { hitTest, itemsInBox } from '../model/hit';
import type { Sheet } from '../model/sheet';
import { commit, flipDot, setSelection } from '../store/actions';
import { ToolMachine, type KeyInput, type PointerInput } from './machine';

export class SelectTool extends ToolMachine {
  private start: Point = { x: 0, y: 0 };
  private startScreen: Point = { x: 0, y: 0 };
  private startSheet: Sheet | null = null;
  private itemId: string | null = null;
  private wasSelected = false;
  private shift = false;
  private segment = 0;

  override onDown(e: PointerInput): void {
    if (e.button !== 0) return;
    const s = this.store.getState();
    this.start = { x: e.x, y: e.y };
    this.startScreen = { x: e.sx, y: e.sy };
    this.startSheet = s.sheet;
    this.shift = e.shift;
    const hit = hitTest(s.sheet, e, this.tol());
    if (hit.type === 'none') {
      if (!e.shift) setSelection(this.store, []);
      this.go('pointing_canvas');
      return;
    }
    this.itemId = hit.id;
    this.wasSelected = s.selection.includes(hit.id);
    if (e.shift) {
      setSelection(this.store, this.wasSelected ? s.selection.filter((id) => id !== hit.id) : [...s.selection, hit.id]);
    } else if (!this.wasSelected) {
      setSelection(this.store, [hit.id]);
    }
    this.go(hit.type === 'dot' ? 'pointing_dot' : 'pointing_item');
  }

  override onMove(e: PointerInput): void {
    const moved = Math.hypot(e.sx - this.startScreen.x, e.sy - this.startScreen.y) > 3;
    if ((this.state === 'pointing_item' || this.state === 'pointing_dot') && moved) {
      if (this.itemId && !this.store.getState().selection.includes(this.itemId)) setSelection(this.store, [this.itemId]);
      const sel = this.store.getState().selection;
      const wire = sel.length === 1 ? this.startSheet!.wires.find((w) => w.id === sel[0]) : undefined;
      if (wire) {
        this.segment = nearestSegment(wire.pts, this.start.x, this.start.y);
        this.go('sliding');
      } else this.go('dragging');
    }
    if (this.state === 'sliding') {
      const sheet = this.startSheet!;
      const id = this.store.getState().selection[0];
      const dx = snap(e.x - this.start.x);
      const dy = snap(e.y - this.start.y);
      this.store.setState({ preview: { ...sheet, wires: sheet.wires.map((w) => (w.id === id ? { ...w, pts: slideSegment(w.pts, this.segment, dx, dy) } : w)) } });
      return;
    }
    if (this.state === 'dragging') {
      const dx = snap(e.x - this.start.x);
      const dy = snap(e.y - this.start.y);
      const sheet = this.startSheet!;
      this.store.setState({ preview: moveSelection(sheet, new Set(this.store.getState().selection), dx, dy) });
      return;
    }
    if (this.state === 'pointing_canvas' && moved) this.go('brushing');
    if (this.state === 'brushing') this.store.setState({ box: normRect(this.start, e) });
  }

  override onUp(e: PointerInput): void {
    const s = this.store.getState();
    switch (this.state) {
      case 'sliding':
      case 'dragging': {
        const sel = new Set(s.selection);
        const preview = s.preview;
        if (preview && preview !== this.startSheet) {
          const wireIds = new Set(preview.wires.filter((w, i) => w !== this.startSheet!.wires[i] || sel.has(w.id)).map((w) => w.id));
          commit(this.store, tidyWires(preview, wireIds));
        } else this.store.setState({ preview: null });
        break;
      }
      case 'brushing': {
        const inBox = itemsInBox(s.sheet, normRect(this.start, e));
        setSelection(this.store, this.shift ? [...new Set([...s.selection, ...inBox])] : inBox);
        this.store.setState({ box: null });
        break;
      }
      case 'pointing_dot':
        if (this.itemId) flipDot(this.store, this.itemId);
        break;
      case 'pointing_item':
        if (!this.shift && this.wasSelected && this.itemId) setSelection(this.store, [this.itemId]);
        break;
    }
    this.startSheet = null;
    this.itemId = null;
    this.go('idle');
  }

  override onKey(k: KeyInput): boolean {
    if (k.key !== 'Escape') return false;
    if (this.state === 'dragging' || this.state === 'sliding') this.store.setState({ preview: null });
    if (this.state === 'brushing') this.store.setState({ box: null });
    if (this.state !== 'idle') {
      this.go('idle');
      return true;
    }
    if (this.store.getState().selection.length) {
      setSelection(this.store, []);
      return true;
    }
    return false;
  }

  override exit(): void {
    this.store.setState({ preview: null, box: null });
    if (this.state !== 'idle') this.go('idle');
  }
}
