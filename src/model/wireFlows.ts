/**
 * Currents along the wires, from the solved part currents by Kirchhoff's
 * current law: each node's wires form a network; every pin feeds its part's
 * current into it, and a spanning tree carries the sums. A ground symbol or a
 * node label takes up whatever its wire island does not balance (when an
 * island has two or more of them the split is unknown and no arrow is drawn),
 * and a wire closing a loop inside one node carries no determinate current.
 */
import type { ComplexJson, SolveResult } from './graph';
import { pointKey, type Point } from './geometry';
import { PART_DEFS, pinPositions } from './parts/registry';
import type { Sheet } from './sheet';

export interface WireFlow {
  /** middle of the segment the arrow sits on, and the unit direction of the reference */
  at: Point;
  dir: Point;
  /** the current along `dir` */
  current: ComplexJson;
  /** the same reading is shown beside a part this wire ends on */
  repeats: boolean;
}

interface Edge { a: number; b: number; wire: number; len: number }

export function wireFlows(sheet: Sheet, result: SolveResult, elementOfPart: Map<string, string>): WireFlow[] {
  const ids = new Map<number, number>();
  const pts: Point[] = [];
  const vid = (x: number, y: number) => {
    const k = pointKey(x, y);
    let v = ids.get(k);
    if (v === undefined) {
      v = pts.length;
      ids.set(k, v);
      pts.push({ x, y });
    }
    return v;
  };
  // injections: current from parts into the wires at each point
  const injRe: number[] = [];
  const injIm: number[] = [];
  const free = new Set<number>();
  const partCurrents: ComplexJson[] = [];
  const addInj = (v: number, re: number, im: number) => {
    injRe[v] = (injRe[v] ?? 0) + re;
    injIm[v] = (injIm[v] ?? 0) + im;
  };
  for (const part of sheet.parts) {
    const pins = pinPositions(part);
    if (PART_DEFS[part.kind].netName) {
      free.add(vid(pins[0].x, pins[0].y));
      continue;
    }
    const r = result.elements[elementOfPart.get(part.id) ?? ''];
    if (!r) continue;
    const currents = 'current' in r ? [r.current] : r.currents;
    currents.forEach((c, side) => {
      partCurrents.push(c);
      // the current enters the part at its first pin of the pair and leaves at the second
      addInj(vid(pins[2 * side].x, pins[2 * side].y), -c.re, -c.im);
      addInj(vid(pins[2 * side + 1].x, pins[2 * side + 1].y), c.re, c.im);
    });
  }
  for (const w of sheet.wires) for (let i = 0; i < w.pts.length; i += 2) vid(w.pts[i], w.pts[i + 1]);
  // split segments wherever a point lies inside them
  const rows = new Map<number, number[]>();
  const cols = new Map<number, number[]>();
  pts.forEach((p, i) => {
    (rows.get(p.y) ?? rows.set(p.y, []).get(p.y)!).push(i);
    (cols.get(p.x) ?? cols.set(p.x, []).get(p.x)!).push(i);
  });
  const edges: Edge[] = [];
  sheet.wires.forEach((w, wi) => {
    for (let j = 0; j + 3 < w.pts.length; j += 2) {
      const [x0, y0, x1, y1] = [w.pts[j], w.pts[j + 1], w.pts[j + 2], w.pts[j + 3]];
      const horizontal = y0 === y1;
      const lo = horizontal ? Math.min(x0, x1) : Math.min(y0, y1);
      const hi = horizontal ? Math.max(x0, x1) : Math.max(y0, y1);
      const on = (horizontal ? rows.get(y0) : cols.get(x0)) ?? [];
      const stops = on.filter((v) => {
        const t = horizontal ? pts[v].x : pts[v].y;
        return t >= lo && t <= hi;
      }).sort((a, b) => (horizontal ? pts[a].x - pts[b].x : pts[a].y - pts[b].y));
      for (let s = 0; s + 1 < stops.length; s++) {
        const a = stops[s], b = stops[s + 1];
        edges.push({ a, b, wire: wi, len: Math.abs(pts[b].x - pts[a].x) + Math.abs(pts[b].y - pts[a].y) });
      }
    }
  });
  const adj: number[][] = pts.map(() => []);
  edges.forEach((e, i) => {
    adj[e.a].push(i);
    adj[e.b].push(i);
  });

  const flows: { edge: Edge; from: number; re: number; im: number }[] = [];
  const seen = new Uint8Array(pts.length);
  // one set of work arrays for every island: each point belongs to exactly one island, so an entry is
  // written by its own island before it is read and never needs clearing (no allocation per island)
  const parentEdge = new Int32Array(pts.length);
  const sRe = new Float64Array(pts.length);
  const sIm = new Float64Array(pts.length);
  for (let root = 0; root < pts.length; root++) {
    if (seen[root] || adj[root].length === 0) continue;
    // one wire island: breadth-first spanning tree
    const order: number[] = [root];
    seen[root] = 1;
    for (let q = 0; q < order.length; q++) {
      const v = order[q];
      for (const ei of adj[v]) {
        const e = edges[ei];
        const u = e.a === v ? e.b : e.a;
        if (seen[u]) continue;
        seen[u] = 1;
        parentEdge[u] = ei;
        order.push(u);
      }
    }
    const frees = order.filter((v) => free.has(v));
    if (frees.length > 1) continue;
    if (frees.length === 1) {
      let re = 0, im = 0;
      for (const v of order) { re += injRe[v] ?? 0; im += injIm[v] ?? 0; }
      addInj(frees[0], -re, -im);
    }
    for (let q = order.length - 1; q > 0; q--) {
      const v = order[q];
      const re = sRe[v] + (injRe[v] ?? 0);
      const im = sIm[v] + (injIm[v] ?? 0);
      const e = edges[parentEdge[v]];
      const p = e.a === v ? e.b : e.a;
      sRe[p] += re;
      sIm[p] += im;
      flows.push({ edge: e, from: v, re, im });
    }
  }

  let top = 0;
  for (const c of partCurrents) top = Math.max(top, Math.hypot(c.re, c.im));
  const floor = top * 1e-9;
  // one arrow per wire and distinct current: on its longest piece carrying it
  interface Pick { edge: Edge; from: number; sign: 1 | -1; re: number; im: number }
  const best = new Map<string, Pick>();
  for (const f of flows) {
    const m = Math.hypot(f.re, f.im);
    if (m <= floor || f.edge.len < 20) continue;
    // reference along the in-phase direction: the angle shown lies in (-90°, 90°]
    const sign: 1 | -1 = f.re < 0 || (f.re === 0 && f.im < 0) ? -1 : 1;
    const re = sign * f.re, im = sign * f.im;
    const key = `${f.edge.wire}:${re.toPrecision(6)}:${im.toPrecision(6)}`;
    const had = best.get(key);
    if (!had || had.edge.len < f.edge.len) best.set(key, { edge: f.edge, from: f.from, sign, re, im });
  }
  const out: WireFlow[] = [];
  for (const f of best.values()) {
    const a = pts[f.from];
    const b = pts[f.edge.a === f.from ? f.edge.b : f.edge.a];
    const len = Math.hypot(b.x - a.x, b.y - a.y);
    const dir = { x: ((b.x - a.x) / len) * f.sign + 0, y: ((b.y - a.y) / len) * f.sign + 0 }; // + 0 turns -0 into 0
    const m = Math.hypot(f.re, f.im);
    const repeats = partCurrents.some((c) => Math.abs(Math.hypot(c.re, c.im) - m) <= 1e-9 * m && Math.abs(Math.abs(c.re) - f.re) <= 1e-9 * m);
    out.push({ at: { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 }, dir, current: { re: f.re, im: f.im }, repeats });
  }
  return out;
}
