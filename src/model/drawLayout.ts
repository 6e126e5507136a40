/**
 * Where the solved readings go on the sheet, without drawing them: current
 * arrows beside parts and along wires (heavier for larger currents), phasor
 * tags, node voltage tags with their leaders, designator and value spots,
 * coupling labels. Pure, so the canvas and the SVG export place things alike.
 */
import type { ComplexJson, ElementResult, SolveResult, TwoTerminalResult } from './graph';
import { toSheet, type Point, type Rect } from './geometry';
import { couplingGeometry } from './hit';
import { PART_DEFS, partBox, pinPositions } from './parts/registry';
import { angleDeg, mag } from './phasor';
import { formatAngle, formatSI, siScale } from './quantity';
import { defaultDisplay, type Part, type Sheet } from './sheet';
import { partReadings, type DerivedCircuit } from './toGraph';
import { wireFlows } from './wireFlows';

export type Align = 'left' | 'right' | 'center';

export type Readout = 'polar' | 'rect';

/**
 * A phasor as text: magnitude∠angle with an SI prefix ("2.097 A ∠-12.3°"), or
 * on request rectangular ("2.05 − j0.447 A"); an exact zero reads "0 A".
 */
export function phasorText(z: ComplexJson, unit: string, digits = 4, readout: Readout = 'polar'): string {
  const m = mag(z);
  if (m === 0) return `0 ${unit}`;
  if (readout === 'rect') return rectText(z, unit, digits);
  return `${formatSI(m, unit, digits)} ∠${formatAngle(angleDeg(z))}`;
}

/** Rectangular form sharing one SI prefix, chosen by the magnitude: "2.05 − j0.447 A". */
export function rectText(z: ComplexJson, unit: string, digits = 4): string {
  const m = mag(z);
  const { scale, prefix } = siScale(m);
  const prefixed = `${prefix}${unit}`;
  const f = (v: number) => Number((v / scale).toPrecision(digits)).toString();
  const re = Math.abs(z.re) < m * 1e-12 ? 0 : z.re;
  const im = Math.abs(z.im) < m * 1e-12 ? 0 : z.im;
  return `${f(re)} ${im < 0 ? '−' : '+'} j${f(Math.abs(im))} ${prefixed}`;
}

/** Where a part's designator goes (its value text sits one line, 12 units, below). */
export function partLabelSpot(part: Part, box: Rect): { x: number; y: number; align: Align } {
  if (PART_DEFS[part.kind].labelBelow) return { x: (box.x0 + box.x1) / 2, y: box.y1 + 14, align: 'center' };
  if (part.rot % 2 === 1) return { x: box.x1 + 6, y: (box.y0 + box.y1) / 2 - 6, align: 'left' };
  return { x: (box.x0 + box.x1) / 2, y: box.y0 - 14, align: 'center' };
}

/** An arrow; `element` names the graph element whose current a part's arrow shows (none on wires). */
export interface ArrowLayout { from: Point; to: Point; width: number; element?: string }

export interface TagLayout {
  /** the anchor point; `align` says which side of it the text runs */
  x: number;
  y: number;
  align: Align;
  kind: 'current' | 'voltage';
  text: string;
  /** a dashed leader from the tag down to the wire it names */
  leader?: { x: number; y0: number; y1: number };
}

export interface OverlayLayout { arrows: ArrowLayout[]; tags: TagLayout[] }

export interface OverlayLayoutOptions {
  /** parts whose readings are left out (being dragged) */
  hidden?: Set<string> | null;
  /** leave out the wire currents */
  noWireFlows?: boolean;
  /** node tags only for this node when there are more than `crowdedAbove` anchors (default 60) */
  crowdedAbove?: number;
  focusNode?: string | null;
  /** polar (default) or rectangular readouts */
  readout?: Readout;
  /**
   * Instantaneous values (a time response at one instant): every value is
   * real (im 0), each arrow points the way its current flows at that instant,
   * tags read the value with its sign (currents by their size: the arrow gives
   * the sense), and arrow weights are scaled by `maxAmps` (the largest current
   * of the whole run) so that they grow and shrink as the instant moves.
   */
  instant?: { maxAmps: number };
}

const isTwo = (r: ElementResult): r is TwoTerminalResult => 'current' in r;

/** Arrow stroke width for a current of magnitude m when the largest is `maxI`. */
export function currentWeight(m: number, maxI: number): number {
  return 1 + 2.6 * Math.sqrt(m / (maxI || 1));
}

/** An instantaneous value as a tag: "-12.3 V"; a current by its size ("1.5 A"), as its arrow gives its sense. */
export function instantText(v: number, unit: string, signed: boolean, digits = 4): string {
  const x = signed ? v : Math.abs(v);
  return x === 0 ? `0 ${unit}` : formatSI(x, unit, digits);
}

export function overlayLayout(sheet: Sheet, circuit: DerivedCircuit, result: SolveResult, o: OverlayLayoutOptions = {}): OverlayLayout {
  const instant = o.instant;
  const currentText = (z: ComplexJson) => (instant ? instantText(z.re, 'A', false) : phasorText(z, 'A', 4, o.readout));
  const voltageText = (z: ComplexJson) => (instant ? instantText(z.re, 'V', true) : phasorText(z, 'V', 4, o.readout));
  /** −1 where an instantaneous current flows against its reference direction */
  const sense = (z: ComplexJson) => (instant && z.re < 0 ? -1 : 1);
  const arrows: ArrowLayout[] = [];
  const tags: TagLayout[] = [];
  const display = sheet.display ?? defaultDisplay();
  const partsById = new Map<string, Part>();
  for (const p of sheet.parts) partsById.set(p.id, p);
  // an expanded part (a practical transformer) reads as one part at its terminals
  const byPart = partReadings(circuit, result);
  const elements = byPart.elements;
  let maxI = 0;
  for (const id in elements) {
    const r = elements[id];
    maxI = Math.max(maxI, isTwo(r) ? mag(r.current) : Math.max(mag(r.currents[0]), mag(r.currents[1])));
  }
  if (instant && instant.maxAmps > 0) maxI = instant.maxAmps;
  const floor = maxI * 1e-9;
  const weight = (m: number) => currentWeight(m, maxI);
  const pushArrow = (c: Point, d: Point, half: number, m: number, element?: string) =>
    arrows.push({ from: { x: c.x - d.x * half, y: c.y - d.y * half }, to: { x: c.x + d.x * half, y: c.y + d.y * half }, width: weight(m), ...(element ? { element } : {}) });

  for (const id in elements) {
    const partId = byPart.partOfElement.get(id);
    const part = partId ? partsById.get(partId) : undefined;
    if (!part || o.hidden?.has(part.id)) continue;
    // what the sheet's display settings leave out
    if (!display.partCurrents || display.hideKinds.includes(part.kind) || display.hideParts.includes(part.id)) continue;
    const r = elements[id];
    if (isTwo(r)) {
      const m = mag(r.current);
      if (m <= floor || m === 0) continue;
      const [p0, p1] = pinPositions(part);
      const mid = { x: (p0.x + p1.x) / 2, y: (p0.y + p1.y) / 2 };
      const vertical = Math.abs(p1.y - p0.y) > Math.abs(p1.x - p0.x);
      const sg = sense(r.current);
      const d = vertical ? { x: 0, y: sg * Math.sign(p1.y - p0.y) } : { x: sg * Math.sign(p1.x - p0.x), y: 0 };
      const box = partBox(part);
      const off = vertical ? { x: box.x0 - 9, y: mid.y } : { x: mid.x, y: box.y1 + 9 };
      pushArrow(off, d, 11, m, id);
      const text = currentText(r.current);
      if (vertical) tags.push({ x: box.x1 + 3, y: mid.y + 25, align: 'left', kind: 'current', text });
      else tags.push({ x: off.x, y: off.y + 15, align: 'center', kind: 'current', text });
    } else {
      r.currents.forEach((cur, side) => {
        const m = mag(cur);
        if (m <= floor) return;
        const lx = PART_DEFS[part.kind].pins[2 * side].x;
        const inward = side === 0 ? 1 : -1;
        const [a, b] = [toSheet(part, lx + inward * 6, -38), toSheet(part, lx + inward * 24, -38)];
        arrows.push(sense(cur) > 0 ? { from: a, to: b, width: weight(m), element: id } : { from: b, to: a, width: weight(m), element: id });
        const t = toSheet(part, lx + inward * 15, -50);
        tags.push({ x: t.x, y: t.y, align: 'center', kind: 'current', text: currentText(cur) });
      });
    }
  }

  if (!o.noWireFlows && display.wireCurrents) {
    const elementOfPart = new Map<string, string>();
    for (const [el, part] of byPart.partOfElement) elementOfPart.set(part, el);
    for (const f of wireFlows(sheet, { ...result, elements }, elementOfPart)) {
      const sg = sense(f.current);
      pushArrow(f.at, { x: sg * f.dir.x, y: sg * f.dir.y }, 7, mag(f.current));
      if (f.repeats) continue;
      const text = currentText(f.current);
      if (f.dir.y === 0) tags.push({ x: f.at.x, y: f.at.y + 14, align: 'center', kind: 'current', text });
      else tags.push({ x: f.at.x + 8, y: f.at.y, align: 'left', kind: 'current', text });
    }
  }

  const anchors = circuit.topology.anchors;
  const crowded = anchors.size > (o.crowdedAbove ?? 60);
  for (const name in result.nodes) {
    if (name === circuit.model.ground || !display.nodeVoltages) continue;
    if (crowded && name !== o.focusNode) continue;
    const at = anchors.get(name);
    if (!at) continue;
    const text = `${name}: ${voltageText(result.nodes[name])}`;
    if (at.side === 'left') {
      // clear of the part standing below the anchor (a winding's turns bulge to one side)
      let right = at.x;
      for (const p of sheet.parts) {
        const b = partBox(p);
        if (at.x >= b.x0 && at.x <= b.x1 && at.y >= b.y0 - 1 && at.y + 7 <= b.y1) right = Math.min(right, b.x0 + 2);
      }
      tags.push({ x: right - 8, y: at.y + 7, align: 'right', kind: 'voltage', text });
    }
    else if ((at.run ?? 0) >= 90) tags.push({ x: at.x, y: at.y - 9, align: 'center', kind: 'voltage', text });
    // a short run between parts: the tag is lifted above their labels, with a leader down to the wire
    else tags.push({ x: at.x, y: at.y - 42, align: 'center', kind: 'voltage', text, leader: { x: at.x, y0: at.y - 2, y1: at.y - 36 } });
  }
  return { arrows, tags };
}

/** Parts that carry a designator and value text. */
export function hasDesignator(part: Part): boolean {
  return PART_DEFS[part.kind].prefix !== '';
}

export interface TextMeasure {
  /** width of a reading tag's text (10-unit monospace) */
  tag: (text: string) => number;
  /** width of a designator (11-unit, bold) or value (10-unit) text */
  label: (text: string, size: number, bold: boolean) => number;
}

/** The box a tag's background covers. */
export function tagBox(t: TagLayout, m: TextMeasure): Rect {
  const w = m.tag(t.text) + 8;
  const x0 = t.align === 'left' ? t.x : t.align === 'right' ? t.x - w : t.x - w / 2;
  return { x0, y0: t.y - 8, x1: x0 + w, y1: t.y + 6 };
}

const overlap = (a: Rect, b: Rect) =>
  Math.max(0, Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0)) * Math.max(0, Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0));

/**
 * Moves reading tags off parts, designators, coupling labels, arrows and
 * each other where a nearby spot is free: each tag tries a few offsets and
 * keeps the one that covers least, moves costing a little (ties go to the
 * usual spot). Current tags are placed first, then node voltages. Returns a
 * new layout; the arrows stay where they are.
 */
export function declutterTags(sheet: Sheet, layout: OverlayLayout, m: TextMeasure): OverlayLayout {
  const hard: Rect[] = [];
  const soft: Rect[] = [];
  for (const p of sheet.parts) {
    const box = partBox(p);
    hard.push(box);
    const def = PART_DEFS[p.kind];
    if (!def.prefix) continue;
    const spot = partLabelSpot(p, box);
    for (const [s, size, bold, dy] of [[p.ref, 11, true, 0], [def.valueText(p), 10, false, 12]] as const) {
      const w = m.label(s, size, bold);
      const x0 = spot.align === 'left' ? spot.x : spot.align === 'right' ? spot.x - w : spot.x - w / 2;
      hard.push({ x0, y0: spot.y + dy - size * 0.8, x1: x0 + w, y1: spot.y + dy + size * 0.25 });
    }
  }
  for (const c of sheet.couplings) hard.push(couplingGeometry(sheet, c).box);
  for (const w of sheet.wires) {
    for (let i = 0; i + 3 < w.pts.length; i += 2) {
      const [x0, y0, x1, y1] = [w.pts[i], w.pts[i + 1], w.pts[i + 2], w.pts[i + 3]];
      soft.push({ x0: Math.min(x0, x1) - 1, y0: Math.min(y0, y1) - 1, x1: Math.max(x0, x1) + 1, y1: Math.max(y0, y1) + 1 });
    }
  }
  for (const a of layout.arrows) {
    // the shaft and the head's half-width across it
    const len = Math.hypot(a.to.x - a.from.x, a.to.y - a.from.y) || 1;
    const across = (5 + a.width * 1.2) / 2 + 1;
    const px = (Math.abs(a.to.y - a.from.y) / len) * across + 1;
    const py = (Math.abs(a.to.x - a.from.x) / len) * across + 1;
    hard.push({ x0: Math.min(a.from.x, a.to.x) - px, y0: Math.min(a.from.y, a.to.y) - py, x1: Math.max(a.from.x, a.to.x) + px, y1: Math.max(a.from.y, a.to.y) + py });
  }
  const tags = layout.tags.map((t) => ({ ...t }));
  // current tags first (they belong next to their arrows), then the node voltages
  const order = [...tags.filter((t) => t.kind === 'current'), ...tags.filter((t) => t.kind === 'voltage')];
  for (const t of order) {
    const moves: [number, number][] = t.kind === 'current'
      ? t.align === 'left'
        ? [[0, 0], [0, 14], [0, -14], [0, 28]]
        : [[0, 0], [0, -14], [0, 14], [-30, 0], [30, 0]]
      : t.leader
        ? [[0, 0], [0, -12], [-30, 0], [30, 0], [0, -24], [-30, -12], [30, -12]]
        : t.align === 'right'
          ? [[0, 0], [0, -15], [0, -29], [0, 18], [-12, -15], [0, 32]]
          : [[0, 0], [0, -12], [-40, 0], [40, 0], [0, 20], [0, -24]];
    // a lifted tag may instead hang just below its wire, without a leader
    const below = t.leader ? t.leader.y0 + 2 + 16 - t.y : null;
    if (below !== null) moves.push([0, below]);
    let best: { dx: number; dy: number; score: number } | null = null;
    for (const [dx, dy] of moves) {
      const r = tagBox({ ...t, x: t.x + dx, y: t.y + dy }, m);
      let score = (Math.abs(dx) + Math.abs(dy === below ? 10 : dy)) * (t.kind === 'current' ? 1.5 : 0.5);
      for (const h of hard) score += overlap(r, h);
      for (const s of soft) score += 4 * overlap(r, s);
      if (!best || score < best.score - 1e-9) best = { dx, dy, score };
    }
    if (best && (best.dx || best.dy)) {
      t.x += best.dx;
      t.y += best.dy;
      if (t.leader) t.leader = best.dy === below ? undefined : { ...t.leader, y1: t.leader.y1 + best.dy };
    }
    hard.push(tagBox(t, m));
    if (t.leader) soft.push({ x0: t.leader.x - 1, y0: Math.min(t.leader.y0, t.leader.y1), x1: t.leader.x + 1, y1: Math.max(t.leader.y0, t.leader.y1) });
  }
  return { arrows: layout.arrows, tags };
}
