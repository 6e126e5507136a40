/**
 * Layout of the phasor diagram: how long each arrow is drawn (a short phasor
 * keeps a shaft longer than its head, the part beyond its true length dotted)
 * and where its label goes: beside its tip, clear of every arrow, of both
 * axes and of the labels placed before it; a label with no free place is left
 * to the legend.
 */

export interface Box { x0: number; y0: number; x1: number; y1: number }

export interface PhasorItem { x: number; y: number; label: string; width: number }

export interface PhasorPlaced {
  /** the tip as drawn (at least `minLength` from the origin) and the true tip */
  tip: { x: number; y: number };
  trueTip: { x: number; y: number };
  lengthened: boolean;
  /** the label's box and its text anchor point (start of the text, baseline); null when it has no free place */
  label: Box | null;
  at: { x: number; y: number } | null;
}

export const LABEL_HEIGHT = 12;

function segmentHitsBox(ax: number, ay: number, bx: number, by: number, r: Box): boolean {
  // Liang–Barsky clipping of the segment against the box
  let t0 = 0;
  let t1 = 1;
  const dx = bx - ax;
  const dy = by - ay;
  const edges: [number, number][] = [[-dx, ax - r.x0], [dx, r.x1 - ax], [-dy, ay - r.y0], [dy, r.y1 - ay]];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return false;
      continue;
    }
    const t = q / p;
    if (p < 0) {
      if (t > t1) return false;
      if (t > t0) t0 = t;
    } else {
      if (t < t0) return false;
      if (t < t1) t1 = t;
    }
  }
  return true;
}

const overlaps = (a: Box, b: Box) => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;

/**
 * Places arrows and labels for phasors whose tips are given in diagram units
 * (origin at the centre, y down). `axis` is the half-length of both axes;
 * `bounds` the area labels must stay in; `reserved` boxes already taken (axis names).
 */
export function layoutPhasors(items: PhasorItem[], opts: { minLength: number; axis: number; bounds: Box; reserved?: Box[] }): PhasorPlaced[] {
  const { minLength, axis, bounds } = opts;
  const arrows = items.map((p) => {
    const len = Math.hypot(p.x, p.y);
    const lengthened = len > 0 && len < minLength;
    const k = lengthened ? minLength / len : 1;
    return { tip: { x: p.x * k, y: p.y * k }, trueTip: { x: p.x, y: p.y }, lengthened, len };
  });
  const taken: Box[] = [...(opts.reserved ?? [])];
  // an arrow's shaft and head: the segment from the origin to the tip, thickened by the head's half-width
  const hitsArrow = (b: Box) => arrows.some((a) => a.len > 0 && segmentHitsBox(0, 0, a.tip.x, a.tip.y, { x0: b.x0 - 3, y0: b.y0 - 3, x1: b.x1 + 3, y1: b.y1 + 3 }));
  const hitsAxis = (b: Box) => segmentHitsBox(-axis, 0, axis, 0, { ...b, y0: b.y0 - 1, y1: b.y1 + 1 }) || segmentHitsBox(0, -axis, 0, axis, { ...b, x0: b.x0 - 1, x1: b.x1 + 1 });
  const inside = (b: Box) => b.x0 >= bounds.x0 && b.x1 <= bounds.x1 && b.y0 >= bounds.y0 && b.y1 <= bounds.y1;
  return items.map((p, i) => {
    const a = arrows[i];
    const base = { tip: a.tip, trueTip: a.trueTip, lengthened: a.lengthened };
    if (a.len === 0) return { ...base, label: null, at: null };
    const theta = Math.atan2(a.tip.y, a.tip.x);
    // candidates around the tip: beyond it, then turned either way, then further out
    for (const d of [8, 18, 30, 44, 60]) {
      for (const turn of [0, 0.5, -0.5, 1, -1, 1.6, -1.6, 2.2, -2.2, Math.PI]) {
        const ang = theta + turn;
        const cx = a.tip.x + d * Math.cos(ang);
        const cy = a.tip.y + d * Math.sin(ang);
        // the box extends away from the tip: to the right of the point when it lies right of the tip
        const right = Math.cos(ang) >= -1e-9;
        const x0 = right ? cx : cx - p.width;
        const down = Math.sin(ang);
        const y0 = down > 0.5 ? cy : down < -0.5 ? cy - LABEL_HEIGHT : cy - LABEL_HEIGHT / 2;
        const box = { x0, y0, x1: x0 + p.width, y1: y0 + LABEL_HEIGHT };
        if (!inside(box) || hitsAxis(box) || hitsArrow(box) || taken.some((t) => overlaps(t, box))) continue;
        taken.push(box);
        return { ...base, label: box, at: { x: box.x0, y: box.y1 - 2.5 } };
      }
    }
    return { ...base, label: null, at: null };
  });
}

export { segmentHitsBox, overlaps };
