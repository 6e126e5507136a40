/**
 * The solved values drawn on the sheet: an arrow beside every part and on
 * every wire that carries current, pointing along its reference direction,
 * drawn heavier for larger currents and labelled magnitude∠angle; a voltage
 * tag at each node; the culprit of a refused model marked with the one-line
 * reason. Where each goes is decided by the shared layout in model/drawLayout.
 */
import { declutterTags, overlayLayout, tagBox, type OverlayLayout, type TextMeasure } from '../model/drawLayout';
import type { SolveResult } from '../model/graph';
import type { Point, Rect } from '../model/geometry';
import { couplingGeometry } from '../model/hit';
import { partBox } from '../model/parts/registry';
import type { Sheet } from '../model/sheet';
import type { DerivedCircuit } from '../model/toGraph';
import type { Refusal, View } from '../store/types';
import { THEME } from './theme';
import { setFont } from './drawPrims';

export interface OverlayInput {
  sheet: Sheet;
  /** parts being dragged: their readings are left out until the drop */
  hidden: Set<string> | null;
  result: SolveResult | null;
  circuit: DerivedCircuit | null;
  refusal: Refusal | null;
  stale: boolean;
  view: View;
  visible: Rect;
  hoverNode: string | null;
  readout: 'polar' | 'rect';
  /** the result is one instant of a time response (real values): arrows follow each current's sign, scaled by the run's largest current */
  instant?: { maxAmps: number; timeS: number } | null;
}

function arrow(c: CanvasRenderingContext2D, from: Point, to: Point, width: number, color: string): void {
  const dx = to.x - from.x, dy = to.y - from.y;
  const len = Math.hypot(dx, dy) || 1;
  const ux = dx / len, uy = dy / len;
  const head = 5 + width * 1.2;
  c.strokeStyle = color;
  c.fillStyle = color;
  c.lineWidth = width;
  c.beginPath();
  c.moveTo(from.x, from.y);
  c.lineTo(to.x - ux * head * 0.8, to.y - uy * head * 0.8);
  c.stroke();
  c.beginPath();
  c.moveTo(to.x, to.y);
  c.lineTo(to.x - ux * head - uy * head * 0.5, to.y - uy * head + ux * head * 0.5);
  c.lineTo(to.x - ux * head + uy * head * 0.5, to.y - uy * head - ux * head * 0.5);
  c.closePath();
  c.fill();
}

const widths = new Map<string, number>();

/** Text width in the tag font; measured once per string (the same readings come back edit after edit). */
function textWidth(c: CanvasRenderingContext2D, text: string): number {
  let w = widths.get(text);
  if (w === undefined) {
    if (widths.size > 20_000) widths.clear();
    w = c.measureText(text).width;
    widths.set(text, w);
  }
  return w;
}

/** Reading tags are 11 units high: about 11 px at 100 % zoom. */
export const TAG_FONT = 11;

/** Widths in the fonts the canvas draws with (monospace tags; designators and values in the sans face). */
function measureWith(c: CanvasRenderingContext2D): TextMeasure {
  return {
    tag: (s) => { c.font = `${TAG_FONT}px ${THEME.mono}`; return textWidth(c, s); },
    label: (s, size, bold) => { c.font = `${bold ? '600 ' : ''}${size}px ${THEME.font}`; return c.measureText(s).width; },
  };
}

/** The arrows last drawn (sheet units) and whether they showed an instant of a time response (tests read them). */
export const drawnArrows: { instantS: number | null; arrows: { from: Point; to: Point; width: number; element?: string }[] } = { instantS: null, arrows: [] };

/** The boxes of the tags last drawn, in sheet units (tests read them to check that no two overlap). */
export const drawnTags: { boxes: { x0: number; y0: number; x1: number; y1: number; text: string }[] } = { boxes: [] };

function tag(c: CanvasRenderingContext2D, text: string, x: number, y: number, color: string, align: 'left' | 'right' | 'center' = 'left'): void {
  setFont(c, TAG_FONT, THEME.mono);
  const w = textWidth(c, text) + 8;
  const x0 = align === 'left' ? x : align === 'right' ? x - w : x - w / 2;
  c.fillStyle = THEME.tagFill;
  c.fillRect(x0, y - 8, w, 15);
  c.fillStyle = color;
  c.textAlign = 'left';
  c.textBaseline = 'middle';
  c.fillText(text, x0 + 4, y - 1);
}

let layoutCache: { key: unknown[]; layout: OverlayLayout } | null = null;

/** The placement of readings (shared with the SVG export), computed again only when its inputs change. */
function layoutFor(c: CanvasRenderingContext2D, o: OverlayInput, crowdedAbove: number): OverlayLayout {
  // the hovered node matters only when tags are shown on hover
  const crowded = o.circuit!.topology.anchors.size > crowdedAbove;
  const focusNode = crowded ? o.hoverNode : null;
  const key = [o.sheet, o.result, o.circuit, o.hidden, crowdedAbove, focusNode, o.readout, o.instant?.maxAmps];
  if (!layoutCache || layoutCache.key.some((k, i) => k !== key[i])) {
    // tags moved off parts, designators and each other where a nearby spot is free (the SVG places them alike)
    const raw = overlayLayout(o.sheet, o.circuit!, o.result!, { hidden: o.hidden, crowdedAbove, focusNode, readout: o.readout, instant: o.instant ? { maxAmps: o.instant.maxAmps } : undefined });
    layoutCache = { key, layout: raw.tags.length <= 400 ? declutterTags(o.sheet, raw, measureWith(c)) : raw };
  }
  return layoutCache.layout;
}

export function drawOverlay(c: CanvasRenderingContext2D, o: OverlayInput): void {
  const v = o.view;
  c.save();
  c.translate(v.x, v.y);
  c.scale(v.zoom, v.zoom);
  c.lineCap = 'round';
  const inView = (p: Point) => p.x > o.visible.x0 - 80 && p.x < o.visible.x1 + 80 && p.y > o.visible.y0 - 40 && p.y < o.visible.y1 + 40;

  drawnArrows.arrows = [];
  drawnArrows.instantS = o.instant ? o.instant.timeS : null;
  if (o.result && o.circuit) {
    // zoomed far out every node tag would overlap: then only the one under the pointer is shown
    const layout = layoutFor(c, o, v.zoom < 0.6 ? -1 : 60);
    const m = measureWith(c);
    drawnTags.boxes = [];
    const currentColor = o.stale ? THEME.stale : THEME.current;
    const voltageColor = o.stale ? THEME.stale : THEME.voltage;
    for (const a of layout.arrows) {
      if (!inView(a.to)) continue;
      arrow(c, a.from, a.to, a.width, currentColor);
      drawnArrows.arrows.push(a);
    }
    const currentLabels = v.zoom > 0.5;
    for (const t of layout.tags) {
      if (!inView(t)) continue;
      if (t.kind === 'current' && !currentLabels) continue;
      const color = t.kind === 'current' ? currentColor : voltageColor;
      // kept inside the view: a tag that would be cut at an edge slides in
      const b = tagBox(t, m);
      const dx = b.x0 < o.visible.x0 + 2 ? o.visible.x0 + 2 - b.x0 : b.x1 > o.visible.x1 - 2 ? o.visible.x1 - 2 - b.x1 : 0;
      const dy = b.y0 < o.visible.y0 + 2 ? o.visible.y0 + 2 - b.y0 : b.y1 > o.visible.y1 - 2 ? o.visible.y1 - 2 - b.y1 : 0;
      const box = { x0: b.x0 + dx, y0: b.y0 + dy, x1: b.x1 + dx, y1: b.y1 + dy, text: t.text };
      // a tag with no free spot left waits under the pointer: it shows when its node is hovered
      const hovered = t.kind === 'voltage' && o.hoverNode !== null && t.text.startsWith(`${o.hoverNode}: `);
      if (!hovered && drawnTags.boxes.some((q) => q.x0 < box.x1 && box.x0 < q.x1 && q.y0 < box.y1 && box.y0 < q.y1)) continue;
      if (t.leader) {
        c.strokeStyle = color;
        c.lineWidth = 0.8;
        c.setLineDash([2, 2]);
        c.beginPath();
        c.moveTo(t.leader.x, t.leader.y0);
        c.lineTo(t.leader.x, t.leader.y1);
        c.stroke();
        c.setLineDash([]);
      }
      tag(c, t.text, t.x + dx, t.y + dy, color, t.align);
      drawnTags.boxes.push(box);
    }
  }

  if (o.refusal && o.refusal.circuit) {
    // a node at fault gets a ring where its tag would be
    for (const cu of o.refusal.culprits) {
      const at = cu.kind === 'node' && cu.id ? o.refusal.circuit.topology.anchors.get(cu.id) : undefined;
      if (!at) continue;
      c.strokeStyle = THEME.error;
      c.lineWidth = 2;
      c.beginPath();
      c.arc(at.x, at.y, 7, 0, Math.PI * 2);
      c.stroke();
    }
    const spot = culpritSpot(o);
    if (spot) {
      setFont(c, 11, THEME.font, '600');
      const text = o.refusal.message.length > 110 ? `${o.refusal.message.slice(0, 107)}…` : o.refusal.message;
      const w = c.measureText(text).width + 12;
      spot.x = Math.max(o.visible.x0 + 4, Math.min(spot.x, o.visible.x1 - w - 4));
      c.fillStyle = '#fff5f4';
      c.strokeStyle = THEME.error;
      c.lineWidth = 1;
      c.fillRect(spot.x, spot.y - 26, w, 18);
      c.strokeRect(spot.x, spot.y - 26, w, 18);
      c.fillStyle = THEME.error;
      c.textAlign = 'left';
      c.textBaseline = 'middle';
      c.fillText(text, spot.x + 6, spot.y - 17);
    }
  }
  c.restore();
}

/** Where on the sheet the refusal's culprit is. */
export function culpritSpot(o: Pick<OverlayInput, 'refusal' | 'sheet'>): Point | null {
  const current = o.refusal?.circuit;
  if (!o.refusal || !current) return null;
  for (const cu of o.refusal.culprits) {
    if (!cu.id) continue;
    if (cu.kind === 'element') {
      const pid = current.partOfElement.get(cu.id);
      const part = o.sheet.parts.find((p) => p.id === pid);
      if (part) {
        const b = partBox(part);
        return { x: b.x0, y: b.y0 - 6 };
      }
    } else if (cu.kind === 'coupling') {
      const cid = current.couplingOfId.get(cu.id);
      const cp = o.sheet.couplings.find((c) => c.id === cid);
      if (cp) {
        const g = couplingGeometry(o.sheet, cp);
        return { x: g.label.x - 34, y: g.label.y - 12 };
      }
    } else if (cu.kind === 'node') {
      const at = current.topology.anchors.get(cu.id);
      if (at) return { x: at.x, y: at.y - 8 };
    }
  }
  return null;
}

/** Sheet item ids (parts, couplings) named by a refusal, for marking in red. */
export function culpritIds(refusal: Refusal | null): Set<string> {
  const out = new Set<string>();
  const current = refusal?.circuit;
  if (!refusal || !current) return out;
  for (const cu of refusal.culprits) {
    if (!cu.id) continue;
    const pid = cu.kind === 'element' ? current.partOfElement.get(cu.id) : cu.kind === 'coupling' ? current.couplingOfId.get(cu.id) : undefined;
    if (pid) out.add(pid);
  }
  return out;
}
