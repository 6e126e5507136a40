/**
 * The schematic in sheet units as SVG: wires, junction dots, open wire ends,
 * part symbols from their definitions, designators and values, polarity dots,
 * couplings with k or M, and (when solved) current arrows and phasor tags and
 * node voltage tags, placed by the shared layout in `model/drawLayout`.
 */
import type { Point, Rect } from '../model/geometry';
import { toSheet } from '../model/geometry';
import type { RefusalCulprit, SolveResult } from '../model/graph';
import { COUPLING_TEXT, couplingGeometry } from '../model/hit';
import { PART_DEFS, partBox, partMarks } from '../model/parts/registry';
import type { Prim } from '../model/parts/types';
import type { Part, Sheet } from '../model/sheet';
import type { DerivedCircuit } from '../model/toGraph';
import { declutterTags, overlayLayout, partLabelSpot, tagBox, type Align, type OverlayLayout, type TagLayout, type TextMeasure } from '../model/drawLayout';
import { PRINT } from './palette';
import { MONO, num, textWidth, type Face } from './text';
import { escText } from './xml';

const TAG_SIZE = 10;
const REF_SIZE = 11;
const VALUE_SIZE = 10;

export interface SchematicDrawing {
  /** the extent of everything drawn, sheet units */
  box: Rect;
  /** SVG elements in sheet units; `lineWidth` is the stroke of symbols and wires in sheet units */
  render: (lineWidth: number) => string;
}

class Extent {
  x0 = Infinity; y0 = Infinity; x1 = -Infinity; y1 = -Infinity;
  point(x: number, y: number): void {
    if (x < this.x0) this.x0 = x;
    if (y < this.y0) this.y0 = y;
    if (x > this.x1) this.x1 = x;
    if (y > this.y1) this.y1 = y;
  }
  rect(r: Rect): void {
    this.point(r.x0, r.y0);
    this.point(r.x1, r.y1);
  }
  get box(): Rect {
    return Number.isFinite(this.x0) ? { x0: this.x0, y0: this.y0, x1: this.x1, y1: this.y1 } : { x0: 0, y0: 0, x1: 100, y1: 60 };
  }
}

/** The rectangle of a line of text with baseline at y. */
function textRect(s: string, x: number, y: number, size: number, align: Align, face: Face): Rect {
  const w = textWidth(s, size, face);
  const x0 = align === 'left' ? x : align === 'right' ? x - w : x - w / 2;
  return { x0, y0: y - size * 0.8, x1: x0 + w, y1: y + size * 0.25 };
}

const anchorOf = (a: Align) => (a === 'left' ? 'start' : a === 'right' ? 'end' : 'middle');

function text(s: string, x: number, y: number, o: { size: number; fill: string; align?: Align; weight?: number; font?: string; cls?: string; attrs?: string }): string {
  const anchor = o.align && o.align !== 'left' ? ` text-anchor="${anchorOf(o.align)}"` : '';
  const weight = o.weight ? ` font-weight="${o.weight}"` : '';
  const font = o.font ? ` font-family="${o.font}"` : '';
  const cls = o.cls ? ` class="${o.cls}"` : '';
  const attrs = o.attrs ? ` ${o.attrs}` : '';
  return `<text${attrs} x="${num(x)}" y="${num(y)}" font-size="${num(o.size)}" fill="${o.fill}"${anchor}${weight}${font}${cls}>${escText(s)}</text>`;
}

function primSvg(p: Prim, ink: string): string {
  switch (p.t) {
    case 'line': {
      const pts: string[] = [];
      for (let i = 0; i + 1 < p.p.length; i += 2) pts.push(`${num(p.p[i])},${num(p.p[i + 1])}`);
      return `<polyline points="${pts.join(' ')}"/>`;
    }
    case 'poly': {
      const pts: string[] = [];
      for (let i = 0; i + 1 < p.p.length; i += 2) pts.push(`${num(p.p[i])},${num(p.p[i + 1])}`);
      return p.fill ? `<polygon points="${pts.join(' ')}" fill="${ink}" stroke="none"/>` : `<polygon points="${pts.join(' ')}"/>`;
    }
    case 'rect':
      return `<rect x="${num(p.x)}" y="${num(p.y)}" width="${num(p.w)}" height="${num(p.h)}"/>`;
    case 'circle':
      return p.fill
        ? `<circle cx="${num(p.x)}" cy="${num(p.y)}" r="${num(p.r)}" fill="${ink}" stroke="none"/>`
        : `<circle cx="${num(p.x)}" cy="${num(p.y)}" r="${num(p.r)}"/>`;
    case 'arc': {
      // as a canvas arc: from a0 to a1 with growing angle, which is clockwise on a y-down sheet
      let span = p.a1 - p.a0;
      while (span <= 0) span += 2 * Math.PI;
      if (span >= 2 * Math.PI - 1e-9) return `<circle cx="${num(p.x)}" cy="${num(p.y)}" r="${num(p.r)}"/>`;
      const x0 = p.x + p.r * Math.cos(p.a0), y0 = p.y + p.r * Math.sin(p.a0);
      const x1 = p.x + p.r * Math.cos(p.a1), y1 = p.y + p.r * Math.sin(p.a1);
      return `<path d="M${num(x0, 3)} ${num(y0, 3)}A${num(p.r)} ${num(p.r)} 0 ${span > Math.PI ? 1 : 0} 1 ${num(x1, 3)} ${num(y1, 3)}"/>`;
    }
    case 'text':
      return '';
  }
}

function arrowSvg(from: Point, to: Point, width: number, color: string): string {
  const dx = to.x - from.x, dy = to.y - from.y;
  const len = Math.hypot(dx, dy) || 1;
  const ux = dx / len, uy = dy / len;
  const head = 5 + width * 1.2;
  const sx = to.x - ux * head * 0.8, sy = to.y - uy * head * 0.8;
  const a = { x: to.x - ux * head - uy * head * 0.5, y: to.y - uy * head + ux * head * 0.5 };
  const b = { x: to.x - ux * head + uy * head * 0.5, y: to.y - uy * head - ux * head * 0.5 };
  return `<line x1="${num(from.x)}" y1="${num(from.y)}" x2="${num(sx)}" y2="${num(sy)}" stroke="${color}" stroke-width="${num(width)}"/>`
    + `<polygon points="${num(to.x)},${num(to.y)} ${num(a.x)},${num(a.y)} ${num(b.x)},${num(b.y)}" fill="${color}" stroke="none"/>`;
}

const MEASURE: TextMeasure = {
  tag: (s) => textWidth(s, TAG_SIZE, 'mono'),
  label: (s, size, bold) => textWidth(s, size, bold ? 'bold' : 'sans'),
};

const tagRect = (t: TagLayout): Rect => tagBox(t, MEASURE);

function tagSvg(t: TagLayout): string {
  const color = t.kind === 'current' ? PRINT.current : PRINT.voltage;
  const r = tagRect(t);
  let out = '';
  if (t.leader) {
    out += `<line x1="${num(t.leader.x)}" y1="${num(t.leader.y0)}" x2="${num(t.leader.x)}" y2="${num(t.leader.y1)}" stroke="${color}" stroke-width="0.8" stroke-dasharray="2 2"/>`;
  }
  out += `<rect x="${num(r.x0)}" y="${num(r.y0)}" width="${num(r.x1 - r.x0)}" height="14" rx="2" fill="${PRINT.tagFill}" fill-opacity="0.9" stroke="${color}" stroke-opacity="0.35" stroke-width="0.6"/>`;
  out += text(t.text, r.x0 + 4, t.y + 2.6, { size: TAG_SIZE, fill: color, font: MONO, cls: t.kind === 'current' ? 'tag-i' : 'tag-v' });
  return out;
}

/** Sheet items a refusal names: part and coupling ids, and node names. */
export interface Marked { items: Set<string>; nodes: Set<string> }

export function markedBy(circuit: DerivedCircuit, culprits: RefusalCulprit[] = []): Marked {
  const items = new Set<string>();
  const nodes = new Set<string>();
  for (const c of culprits) {
    if (!c.id) continue;
    if (c.kind === 'element') {
      const id = circuit.partOfElement.get(c.id);
      if (id) items.add(id);
    } else if (c.kind === 'coupling') {
      const id = circuit.couplingOfId.get(c.id);
      if (id) items.add(id);
    } else if (c.kind === 'node') nodes.add(c.id);
  }
  return { items, nodes };
}

export function drawSchematic(sheet: Sheet, circuit: DerivedCircuit, result: SolveResult | null, marked: Marked = { items: new Set(), nodes: new Set() }): SchematicDrawing {
  const ext = new Extent();
  const partsById = new Map<string, Part>();
  for (const p of sheet.parts) partsById.set(p.id, p);

  for (const w of sheet.wires) for (let i = 0; i + 1 < w.pts.length; i += 2) ext.point(w.pts[i], w.pts[i + 1]);
  const labels: { ref: string; value: string; x: number; y: number; align: Align; bad: boolean }[] = [];
  for (const p of sheet.parts) {
    const box = partBox(p);
    ext.rect(box);
    const def = PART_DEFS[p.kind];
    if (def.prefix) {
      const spot = partLabelSpot(p, box);
      const value = def.valueText(p);
      labels.push({ ref: p.ref, value, ...spot, bad: marked.items.has(p.id) });
      ext.rect(textRect(p.ref, spot.x, spot.y, REF_SIZE, spot.align, 'bold'));
      ext.rect(textRect(value, spot.x, spot.y + 12, VALUE_SIZE, spot.align, 'sans'));
    }
  }
  // a coupling whose windings are all gone has nowhere to be drawn
  const drawable = sheet.couplings.filter((cp) => cp.windings.some((id) => partsById.has(id)));
  const couplings = drawable.map((cp) => {
    const g = couplingGeometry(sheet, cp);
    const label = g.text;
    const box = g.box;
    // the label box holds the text with room on each side, however the print font measures it
    const need = textWidth(label, COUPLING_TEXT, 'bold') + 14;
    const w = Math.max(box.x1 - box.x0, need);
    const wide = { x0: g.label.x - w / 2, y0: box.y0, x1: g.label.x + w / 2, y1: box.y1 };
    ext.rect(wide);
    const ends = cp.windings.map((id) => partsById.get(id)).filter((w): w is Part => !!w).map((w) => {
      const b = partBox(w);
      return { x: (b.x0 + b.x1) / 2, y: b.y0 - 2 };
    });
    return { at: g.label, label, box: wide, ends, bad: marked.items.has(cp.id) };
  });
  let overlay: OverlayLayout = { arrows: [], tags: [] };
  if (result) {
    overlay = declutterTags(sheet, overlayLayout(sheet, circuit, result), MEASURE);
    for (const a of overlay.arrows) {
      ext.point(a.from.x, a.from.y);
      ext.point(a.to.x, a.to.y);
    }
    for (const t of overlay.tags) ext.rect(tagRect(t));
  }

  const render = (lw: number): string => {
    const out: string[] = [];
    out.push(`<g id="wires" fill="none" stroke="${PRINT.wire}" stroke-width="${num(lw, 3)}" stroke-linecap="round" stroke-linejoin="round">`);
    for (const w of sheet.wires) {
      const pts: string[] = [];
      for (let i = 0; i + 1 < w.pts.length; i += 2) pts.push(`${num(w.pts[i])},${num(w.pts[i + 1])}`);
      out.push(`<polyline points="${pts.join(' ')}"/>`);
    }
    out.push('</g>');
    out.push(`<g id="junctions" fill="${PRINT.wire}">`);
    for (const j of circuit.topology.junctions) out.push(`<circle cx="${num(j.x)}" cy="${num(j.y)}" r="3.2"/>`);
    out.push('</g>');
    if (circuit.topology.openEnds.length) {
      out.push(`<g id="open-ends" fill="${PRINT.paper}" stroke="${PRINT.pinOpen}" stroke-width="${num(lw, 3)}">`);
      for (const e of circuit.topology.openEnds) out.push(`<circle cx="${num(e.x)}" cy="${num(e.y)}" r="3"/>`);
      out.push('</g>');
    }

    out.push(`<g id="couplings">`);
    for (const c of couplings) {
      const d = c.ends.map((e) => `M${num(c.at.x)} ${num(c.at.y + 8)}L${num(e.x)} ${num(e.y)}`).join('');
      const color = c.bad ? PRINT.error : PRINT.coupling;
      if (d) out.push(`<path d="${d}" fill="none" stroke="${color}" stroke-width="${num(lw * 0.8, 3)}" stroke-dasharray="5 4"/>`);
      out.push(`<rect x="${num(c.box.x0)}" y="${num(c.box.y0)}" width="${num(c.box.x1 - c.box.x0)}" height="${num(c.box.y1 - c.box.y0)}" rx="2" fill="${c.bad ? PRINT.errorFill : PRINT.couplingFill}" stroke="${color}" stroke-width="${num(lw * 0.6, 3)}"/>`);
      // the label's double space is kept, as on the canvas
      out.push(text(c.label, c.at.x, c.at.y + 3.8, { size: COUPLING_TEXT, fill: color, align: 'center', weight: 600, cls: c.bad ? 'coupling culprit' : 'coupling' }));
    }
    out.push('</g>');

    if (marked.items.size || marked.nodes.size) {
      out.push(`<g id="culprits" fill="${PRINT.errorFill}" stroke="${PRINT.error}" stroke-width="${num(lw * 0.7, 3)}" stroke-dasharray="3 3">`);
      for (const p of sheet.parts) {
        if (!marked.items.has(p.id)) continue;
        const b = partBox(p);
        out.push(`<rect class="culprit" x="${num(b.x0 - 4)}" y="${num(b.y0 - 4)}" width="${num(b.x1 - b.x0 + 8)}" height="${num(b.y1 - b.y0 + 8)}"/>`);
      }
      for (const n of marked.nodes) {
        const at = circuit.topology.anchors.get(n);
        if (at) out.push(`<circle class="culprit" cx="${num(at.x)}" cy="${num(at.y)}" r="7" fill="none"/>`);
      }
      out.push('</g>');
    }
    out.push(`<g id="parts" fill="none" stroke="${PRINT.ink}" stroke-width="${num(lw, 3)}" stroke-linecap="round" stroke-linejoin="round">`);
    for (const p of sheet.parts) {
      const prims = PART_DEFS[p.kind].draw(p);
      const tf = [`translate(${num(p.x)} ${num(p.y)})`];
      if (p.rot) tf.push(`rotate(${p.rot * 90})`);
      if (p.mirror) tf.push('scale(-1 1)');
      out.push(`<g transform="${tf.join(' ')}">${prims.map((q) => primSvg(q, PRINT.ink)).join('')}</g>`);
      for (const q of prims) {
        if (q.t !== 'text') continue;
        const at = toSheet(p, q.x, q.y);
        out.push(text(q.s, at.x, at.y, { size: q.size, fill: PRINT.ink, attrs: 'stroke="none"' }));
      }
      for (const m of partMarks(p)) if (m.t === 'dot') out.push(`<circle cx="${num(m.x)}" cy="${num(m.y)}" r="${num(m.r)}" fill="${PRINT.ink}" stroke="none" class="${m.role}"/>`);
    }
    out.push('</g>');

    out.push(`<g id="part-labels" stroke="none">`);
    for (const l of labels) {
      out.push(text(l.ref, l.x, l.y, { size: REF_SIZE, fill: l.bad ? PRINT.error : PRINT.label, align: l.align, weight: 600, cls: 'ref' }));
      out.push(text(l.value, l.x, l.y + 12, { size: VALUE_SIZE, fill: PRINT.value, align: l.align, cls: 'value' }));
    }
    for (const p of sheet.parts) {
      for (const m of partMarks(p)) {
        if (m.t === 'text') out.push(text(m.s, m.x, m.y, { size: m.size, fill: PRINT.ink, weight: m.bold ? 600 : undefined, font: m.mono ? MONO : undefined, cls: m.role }));
      }
    }
    out.push('</g>');

    if (result) {
      out.push(`<g id="current-arrows" stroke-linecap="round">`);
      for (const a of overlay.arrows) out.push(arrowSvg(a.from, a.to, a.width, PRINT.current));
      out.push('</g>');
      out.push(`<g id="tags">`);
      // voltage tags first, so that current tags (nearer their arrows) stay on top
      for (const t of overlay.tags) if (t.kind === 'voltage') out.push(tagSvg(t));
      for (const t of overlay.tags) if (t.kind === 'current') out.push(tagSvg(t));
      out.push('</g>');
    }
    return out.join('\n');
  };
  return { box: ext.box, render };
}

