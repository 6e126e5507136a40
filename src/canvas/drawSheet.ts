/** Draws the sheet itself: grid, wires, junctions, open ends, parts, labels, couplings, selection. */
import { GRID, type Rect } from '../model/geometry';
import { COUPLING_TEXT, couplingGeometry } from '../model/hit';
import { couplingNote } from '../model/couplingName';
import { PART_DEFS, partBox, partMarks } from '../model/parts/registry';
import type { SymbolStyle } from '../model/parts/types';
import type { Sheet } from '../model/sheet';
import { partLabelSpot } from '../model/drawLayout';
import type { Topology } from '../model/topology';
import type { View } from '../store/types';
import { drawMarks, drawnText, drawPrims, setFont } from './drawPrims';
import { THEME } from './theme';

export function visibleRect(v: View, width: number, height: number): Rect {
  return { x0: -v.x / v.zoom, y0: -v.y / v.zoom, x1: (width - v.x) / v.zoom, y1: (height - v.y) / v.zoom };
}

/** Grid dots are at least this far apart on screen (px). */
const GRID_MIN_PX = 9;

/** The most grid columns and rows a view of this size shows, whatever its numbers. */
export function gridBudget(width: number, height: number): { cols: number; rows: number } {
  const span = (px: number) => (Number.isFinite(px) && px > 0 ? Math.ceil(Math.min(px, 1e5) / GRID_MIN_PX) + 2 : 0);
  return { cols: span(width), rows: span(height) };
}

/**
 * Draws the dot grid. Every loop counts whole steps up to a limit set by the
 * view's size in pixels, so no view (far off, zoomed anyhow, even with
 * numbers beyond float precision) can make it run long. Returns the grid
 * points visited.
 */
export function drawGrid(c: CanvasRenderingContext2D, v: View, width: number, height: number): number {
  c.fillStyle = THEME.paper;
  c.fillRect(0, 0, width, height);
  if (!(v.zoom > 0) || !Number.isFinite(v.zoom) || !Number.isFinite(v.x) || !Number.isFinite(v.y)) return 0;
  let step = GRID;
  for (let k = 0; k < 64 && step * v.zoom < GRID_MIN_PX; k++) step *= 5;
  const r = visibleRect(v, width, height);
  const budget = gridBudget(width, height);
  const i0 = Math.floor(r.x0 / step);
  const j0 = Math.floor(r.y0 / step);
  const cols = Math.max(0, Math.min(budget.cols, Math.floor(r.x1 / step) - i0 + 1));
  const rows = Math.max(0, Math.min(budget.rows, Math.floor(r.y1 / step) - j0 + 1));
  const s = Math.max(1, 1.2 * Math.min(1.4, v.zoom));
  let visited = 0;
  for (let i = 0; i < cols; i++) {
    const major = (i0 + i) % 5 === 0;
    c.fillStyle = major ? THEME.gridMajor : THEME.gridDot;
    const sx = (i0 + i) * step * v.zoom + v.x;
    for (let j = 0; j < rows; j++) {
      visited++;
      if (!major && (j0 + j) % 5 !== 0 && v.zoom < 0.8) continue;
      c.fillRect(sx - s / 2, (j0 + j) * step * v.zoom + v.y - s / 2, s, s);
    }
  }
  return visited;
}

export interface SheetDrawOptions {
  selection: Set<string>;
  topology: Topology | null;
  culprits: Set<string>;
  /** parts a hazard caution is about: marked in the caution colour with a warning sign */
  hazards?: Set<string>;
  view: View;
  visible: Rect;
  style?: SymbolStyle;
}

export function drawSheet(c: CanvasRenderingContext2D, sheet: Sheet, o: SheetDrawOptions): void {
  const { view: v, visible } = o;
  drawnText.sizes.clear();
  c.save();
  c.translate(v.x, v.y);
  c.scale(v.zoom, v.zoom);
  c.lineCap = 'round';
  c.lineJoin = 'round';
  const lw = Math.max(1.4, 1 / v.zoom);

  // wires
  c.lineWidth = lw;
  for (const w of sheet.wires) {
    const sel = o.selection.has(w.id);
    c.strokeStyle = sel ? THEME.select : THEME.wire;
    c.lineWidth = sel ? lw * 2 : lw;
    c.beginPath();
    c.moveTo(w.pts[0], w.pts[1]);
    for (let i = 2; i < w.pts.length; i += 2) c.lineTo(w.pts[i], w.pts[i + 1]);
    c.stroke();
  }
  if (o.topology) {
    c.fillStyle = THEME.wire;
    for (const j of o.topology.junctions) {
      c.beginPath();
      c.arc(j.x, j.y, 3.2, 0, Math.PI * 2);
      c.fill();
    }
    c.strokeStyle = THEME.pinOpen;
    c.lineWidth = lw;
    for (const e of o.topology.openEnds) {
      c.beginPath();
      c.arc(e.x, e.y, 3, 0, Math.PI * 2);
      c.stroke();
    }
  }

  // couplings: dashed chain between winding centres, k or M beside it
  for (const cp of sheet.couplings) {
    const g = couplingGeometry(sheet, cp);
    const sel = o.selection.has(cp.id);
    const bad = o.culprits.has(cp.id);
    c.strokeStyle = bad ? THEME.error : sel ? THEME.select : THEME.coupling;
    c.lineWidth = lw;
    c.setLineDash([5, 4]);
    c.beginPath();
    for (const id of cp.windings) {
      const w = sheet.parts.find((q) => q.id === id);
      if (!w) continue;
      const b = partBox(w);
      c.moveTo(g.label.x, g.label.y + 8);
      c.lineTo((b.x0 + b.x1) / 2, b.y0 - 2);
    }
    c.stroke();
    c.setLineDash([]);
    const { text, box } = g;
    c.fillStyle = sel ? '#e8f0fa' : bad ? '#fbeae8' : '#fbf3e4';
    c.fillRect(box.x0, box.y0, box.x1 - box.x0, box.y1 - box.y0);
    c.strokeRect(box.x0, box.y0, box.x1 - box.x0, box.y1 - box.y0);
    c.fillStyle = bad ? THEME.error : THEME.coupling;
    setFont(c, COUPLING_TEXT, THEME.font, '600');
    c.textAlign = 'center';
    c.textBaseline = 'middle';
    c.fillText(text, g.label.x, g.label.y);
    // the pair's effective turns ratio and k, small, under the label
    const note = couplingNote(sheet, cp);
    if (note) {
      c.font = `${COUPLING_TEXT - 1}px ${THEME.font}`;
      const half = c.measureText(note).width / 2 + 4;
      c.fillStyle = '#fbf8f1';
      c.fillRect(g.label.x - half, box.y1 + 1, 2 * half, COUPLING_TEXT + 3);
      c.fillStyle = bad ? THEME.error : THEME.coupling;
      c.fillText(note, g.label.x, box.y1 + 2.5 + COUPLING_TEXT / 2);
    }
    c.textBaseline = 'alphabetic';
  }

  // parts
  c.lineWidth = lw;
  c.textBaseline = 'alphabetic';
  const detail = v.zoom > 0.45;
  for (const p of sheet.parts) {
    const box = partBox(p);
    if (box.x1 < visible.x0 - 60 || box.x0 > visible.x1 + 60 || box.y1 < visible.y0 - 40 || box.y0 > visible.y1 + 40) continue;
    const def = PART_DEFS[p.kind];
    const sel = o.selection.has(p.id);
    const bad = o.culprits.has(p.id);
    if (sel || bad) {
      c.fillStyle = bad ? THEME.errorFill : THEME.selectFill;
      c.strokeStyle = bad ? THEME.error : THEME.select;
      c.setLineDash([3, 3]);
      c.fillRect(box.x0 - 4, box.y0 - 4, box.x1 - box.x0 + 8, box.y1 - box.y0 + 8);
      c.strokeRect(box.x0 - 4, box.y0 - 4, box.x1 - box.x0 + 8, box.y1 - box.y0 + 8);
      c.setLineDash([]);
    }
    if (o.hazards?.has(p.id)) {
      c.strokeStyle = THEME.hazard;
      c.fillStyle = THEME.hazardFill;
      c.lineWidth = 2;
      c.setLineDash([5, 3]);
      c.fillRect(box.x0 - 7, box.y0 - 7, box.x1 - box.x0 + 14, box.y1 - box.y0 + 14);
      c.strokeRect(box.x0 - 7, box.y0 - 7, box.x1 - box.x0 + 14, box.y1 - box.y0 + 14);
      c.setLineDash([]);
      c.fillStyle = THEME.hazard;
      c.font = `700 14px ${THEME.font}`;
      c.textAlign = 'center';
      c.fillText('⚠', box.x0 - 7, box.y0 - 9);
      c.lineWidth = lw;
    }
    drawPrims(c, p, def.draw(p, o.style), bad ? THEME.error : sel ? THEME.select : THEME.ink);
    drawMarks(c, partMarks(p), bad ? THEME.error : THEME.ink);
    if (detail && def.prefix) {
      const spot = partLabelSpot(p, box);
      c.textAlign = spot.align;
      setFont(c, 12, THEME.font, '600');
      c.fillStyle = bad ? THEME.error : THEME.label;
      c.fillText(p.ref, spot.x, spot.y);
      setFont(c, 11, THEME.font);
      c.fillStyle = THEME.value;
      c.fillText(def.valueText(p), spot.x, spot.y + 12);
    }
  }
  c.restore();
}
