/**
 * Wire topology to nodes: which pins and wires form one electrical node.
 *
 * Rules: things touch only at wire ends and pins. A wire end or a pin that
 * lies on another wire (its end, a corner or the middle of a segment)
 * connects to it; two pins at one point connect; wires that merely cross do
 * not. Ground symbols join the node "gnd"; node labels with the same name
 * join each other. Junction marks go where three or more wire arms or pins
 * meet; a wire end touching nothing is an open end.
 */
import { pointKey, type Point } from './geometry';
import { PART_DEFS, contributes, pinPositions } from './parts/registry';
import type { Sheet } from './sheet';
import { UnionFind } from './unionFind';

export interface Topology {
  /** node name of each pin, by part index then pin index */
  pinNodes: string[][];
  /** node name of each wire, by wire index */
  wireNodes: string[];
  /** every node that touches a part pin, in order of first appearance */
  nodeNames: string[];
  /** a point on each node for its voltage tag, and which side of it the tag goes */
  anchors: Map<string, Anchor>;
  junctions: Point[];
  openEnds: Point[];
  /** ground symbols present on the sheet */
  hasGround: boolean;
}

export interface Anchor extends Point { side: 'left' | 'above'; /** length of the wire run it sits on */ run?: number }

interface Seg { lo: number; hi: number; wire: number }

export function deriveTopology(sheet: Sheet): Topology {
  const parts = sheet.parts;
  const wires = sheet.wires;
  // items: pins first (flattened), then wires
  const pinBase: number[] = [];
  const pinPos: Point[] = [];
  const pinPart: number[] = [];
  for (let i = 0; i < parts.length; i++) {
    pinBase.push(pinPos.length);
    for (const p of pinPositions(parts[i])) {
      pinPos.push(p);
      pinPart.push(i);
    }
  }
  const nPins = pinPos.length;
  const uf = new UnionFind(nPins + wires.length);

  // points where things end: pins and wire ends
  const atPoint = new Map<number, number[]>();
  const add = (k: number, item: number) => {
    const l = atPoint.get(k);
    if (l) l.push(item); else atPoint.set(k, [item]);
  };
  for (let i = 0; i < nPins; i++) add(pointKey(pinPos[i].x, pinPos[i].y), i);
  const hSegs = new Map<number, Seg[]>();
  const vSegs = new Map<number, Seg[]>();
  for (let w = 0; w < wires.length; w++) {
    const p = wires[w].pts;
    const n = p.length;
    add(pointKey(p[0], p[1]), nPins + w);
    add(pointKey(p[n - 2], p[n - 1]), nPins + w);
    for (let j = 0; j + 3 < n; j += 2) {
      const x0 = p[j], y0 = p[j + 1], x1 = p[j + 2], y1 = p[j + 3];
      if (y0 === y1 && x0 !== x1) {
        const l = hSegs.get(y0) ?? [];
        l.push({ lo: Math.min(x0, x1), hi: Math.max(x0, x1), wire: w });
        hSegs.set(y0, l);
      } else if (x0 === x1 && y0 !== y1) {
        const l = vSegs.get(x0) ?? [];
        l.push({ lo: Math.min(y0, y1), hi: Math.max(y0, y1), wire: w });
        vSegs.set(x0, l);
      }
    }
  }

  const junctions: Point[] = [];
  const openEnds: Point[] = [];
  for (const [key, items] of atPoint) {
    for (let i = 1; i < items.length; i++) uf.union(items[0], items[i]);
    const first = items[0];
    const pt = first < nPins ? pinPos[first] : wireEndAt(wires[first - nPins].pts, key);
    // wires passing through this point (not ending here) join and count twice
    const through = new Set<number>();
    for (const s of hSegs.get(pt.y) ?? []) if (pt.x >= s.lo && pt.x <= s.hi) through.add(s.wire);
    for (const s of vSegs.get(pt.x) ?? []) if (pt.y >= s.lo && pt.y <= s.hi) through.add(s.wire);
    let degree = 0;
    let wireArms = 0;
    for (const it of items) {
      if (it < nPins) degree += 1;
      else {
        const ends = endsAt(wires[it - nPins].pts, key);
        degree += ends;
        wireArms += ends;
        through.delete(it - nPins);
      }
    }
    for (const w of through) {
      uf.union(first, nPins + w);
      degree += 2;
      wireArms += 2;
    }
    if (degree >= 3 && wireArms >= 1) junctions.push(pt);
    if (degree === 1 && wireArms === 1) openEnds.push(pt);
  }

  // ground symbols and labels impose names and join by name
  const byName = new Map<string, number>();
  let hasGround = false;
  for (let i = 0; i < parts.length; i++) {
    const def = PART_DEFS[parts[i].kind];
    if (!def.netName) continue;
    const name = def.netName(parts[i]);
    if (def.netName?.(parts[i]) === 'gnd') hasGround = true;
    if (!name) continue;
    const item = pinBase[i];
    const other = byName.get(name);
    if (other === undefined) byName.set(name, item); else uf.union(other, item);
  }
  const rootName = new Map<number, string>();
  for (const [name, item] of byName) {
    const r = uf.find(item);
    const had = rootName.get(r);
    // ground wins; otherwise the first label name met
    if (had === undefined || name === 'gnd') rootName.set(r, name);
  }

  // name the remaining nodes n1, n2 … in order of first appearance
  const used = new Set(rootName.values());
  let counter = 1;
  const nameOf = (item: number): string => {
    const r = uf.find(item);
    let n = rootName.get(r);
    if (n === undefined) {
      do n = `n${counter++}`; while (used.has(n));
      used.add(n);
      rootName.set(r, n);
    }
    return n;
  };
  const pinNodes: string[][] = [];
  const nodeNames: string[] = [];
  const seen = new Set<string>();
  const anchors = new Map<string, Anchor>();
  for (let i = 0; i < parts.length; i++) {
    const count = PART_DEFS[parts[i].kind].pins.length;
    const row: string[] = [];
    for (let j = 0; j < count; j++) {
      const n = nameOf(pinBase[i] + j);
      row.push(n);
      if (!seen.has(n)) {
        seen.add(n);
        nodeNames.push(n);
      }
    }
    // the upper pin of a standing two-terminal part is a tidy place for its node's tag
    if (count === 2 && contributes(PART_DEFS[parts[i].kind])) {
      const a = pinPos[pinBase[i]], b = pinPos[pinBase[i] + 1];
      if (a.x === b.x) {
        const upper = a.y < b.y ? 0 : 1;
        const n = row[upper];
        if (!anchors.has(n)) anchors.set(n, { ...pinPos[pinBase[i] + upper], side: 'left' });
      }
    }
    pinNodes.push(row);
  }
  const wireNodes: string[] = [];
  const longest = new Map<string, number>();
  for (let w = 0; w < wires.length; w++) {
    const n = nameOf(nPins + w);
    wireNodes.push(n);
    const a = anchors.get(n);
    if (!seen.has(n) || (a && a.side === 'left')) continue;
    const p = wires[w].pts;
    for (let j = 0; j + 3 < p.length; j += 2) {
      const len = Math.abs(p[j + 2] - p[j]) + Math.abs(p[j + 3] - p[j + 1]);
      if (p[j + 1] === p[j + 3] && len > (longest.get(n) ?? 0)) {
        longest.set(n, len);
        anchors.set(n, { x: (p[j] + p[j + 2]) / 2, y: p[j + 1], side: 'above', run: len });
      }
    }
  }
  for (let i = 0; i < parts.length; i++) {
    pinNodes[i].forEach((n, j) => {
      if (!anchors.has(n)) anchors.set(n, { ...pinPos[pinBase[i] + j], side: 'above' });
    });
  }
  return { pinNodes, wireNodes, nodeNames, anchors, junctions, openEnds, hasGround };
}

function wireEndAt(pts: number[], key: number): Point {
  const n = pts.length;
  if (pointKey(pts[0], pts[1]) === key) return { x: pts[0], y: pts[1] };
  return { x: pts[n - 2], y: pts[n - 1] };
}

function endsAt(pts: number[], key: number): number {
  const n = pts.length;
  return (pointKey(pts[0], pts[1]) === key ? 1 : 0) + (pointKey(pts[n - 2], pts[n - 1]) === key ? 1 : 0);
}
