/**
 * Drawing the sheet while a drag is under way: what stays still is drawn once
 * into a bitmap, and each frame only copies it and draws the moving items
 * (the selection, the wires ending on it and its couplings) on top.
 */
import { movingItems } from '../model/edits';
import type { Sheet } from '../model/sheet';
import type { EditorState } from '../store/types';
import { drawSheet, type SheetDrawOptions } from './drawSheet';

const without = (s: Sheet, ids: Set<string>): Sheet => ({
  ...s, parts: s.parts.filter((p) => !ids.has(p.id)), wires: s.wires.filter((w) => !ids.has(w.id)), couplings: s.couplings.filter((c) => !ids.has(c.id)),
});

const only = (s: Sheet, ids: Set<string>): Sheet => {
  const couplings = s.couplings.filter((c) => ids.has(c.id));
  // a moving coupling needs both its windings to be drawn, the still one included
  const windings = new Set(couplings.flatMap((c) => c.windings));
  return { ...s, parts: s.parts.filter((p) => ids.has(p.id) || windings.has(p.id)), wires: s.wires.filter((w) => ids.has(w.id)), couplings };
};

export class DragDrawing {
  private still: { key: unknown[]; canvas: HTMLCanvasElement; moving: Set<string> } | null = null;

  reset(): void {
    this.still = null;
  }

  draw(c: CanvasRenderingContext2D, s: EditorState, options: SheetDrawOptions, width: number, height: number): void {
    const key = [s.sheet, s.selection, s.view, width, height, s.symbols];
    if (!this.still || this.still.key.some((k, i) => k !== key[i])) {
      const moving = movingItems(s.sheet, options.selection);
      const ratio = window.devicePixelRatio || 1;
      const canvas = document.createElement('canvas');
      canvas.width = Math.ceil(width * ratio);
      canvas.height = Math.ceil(height * ratio);
      const off = canvas.getContext('2d')!;
      off.scale(ratio, ratio);
      drawSheet(off, without(s.sheet, moving), options);
      this.still = { key, canvas, moving };
    }
    c.save();
    c.setTransform(1, 0, 0, 1, 0, 0);
    c.drawImage(this.still.canvas, 0, 0);
    c.restore();
    drawSheet(c, only(s.preview ?? s.sheet, this.still.moving), { ...options, topology: null });
  }
}
