/**
 * Draw a coupled pair's T-equivalent in place on the sheet, and put the pair
 * back. Each series arm keeps its winding's outer pin and is turned a quarter
 * about that pin; wires join the arms' free ends to the shunt arm, which
 * starts at the first winding's common pin. Every arm is an equivalent arm
 * (boxed turns, no polarity dot: nothing is coupled any more) with a name of
 * its own (Lt1, Lt2 series, Lt3 shunt), so the readings never show a
 * winding's name carrying an arm's values. Without a shared terminal a wire
 * joins the two common ends (this is what removes the isolation).
 */
import { nameTable } from './names';
import { couplingName, couplingTitle } from './couplingName';
import { nextRef, usedRefs } from './designators';
import { pointKey, type Point, type QuarterTurns } from './geometry';
import { newId } from './ids';
import { partBox, pinPositions } from './parts/registry';
import type { Part, Sheet, SheetCoupling, Wire } from './sheet';
import { elbow, tidyWire } from './wires';

export interface TArms { arm1: number; arm2: number; shunt: number; shared: boolean; outerPins: [0 | 1, 0 | 1] }

/** What was taken off the sheet, to put it back exactly. */
export interface TRecord {
  coupling: SheetCoupling;
  /** the windings as they were, with their index in the parts list */
  windings: { part: Part; index: number }[];
  /** parts added for the T (its arms) */
  added: string[];
  /** wires added to join the arms */
  wires: string[];
  /** the coupling's name before it was taken off ("k₁₂") */
  name: string;
  /** each winding's designator → the designator of the series arm in its place */
  arms: Record<string, string>;
  /** designators of the windings whose arm's reference direction runs opposite to theirs */
  reversed: string[];
}

const LEN = 60;

function onWire(sheet: Sheet, p: Point): boolean {
  for (const w of sheet.wires) {
    const a = w.pts;
    for (let j = 0; j + 3 < a.length; j += 2) {
      const [x0, y0, x1, y1] = [a[j], a[j + 1], a[j + 2], a[j + 3]];
      if (x0 === x1 && p.x === x0 && p.y >= Math.min(y0, y1) && p.y <= Math.max(y0, y1)) return true;
      if (y0 === y1 && p.y === y0 && p.x >= Math.min(x0, x1) && p.x <= Math.max(x0, x1)) return true;
    }
  }
  return false;
}

/** A two-pin part whose pin 0 is at `a` and pin 1 at `b` (|b − a| = 60 along an axis). */
function twoPinPart(base: Omit<Part, 'x' | 'y' | 'rot' | 'mirror'>, a: Point, b: Point): Part {
  for (const rot of [0, 1, 2, 3] as QuarterTurns[]) {
    const p = { ...base, x: (a.x + b.x) / 2, y: (a.y + b.y) / 2, rot, mirror: false } as Part;
    const [p0, p1] = pinPositions(p);
    if (p0.x === a.x && p0.y === a.y && p1.x === b.x && p1.y === b.y) return p;
  }
  throw new Error('no placement joins those two points');
}

/** Whether the open segment a–b passes over a pin, runs along a wire, or crosses a part (a wire there would join what it should not). */
function blocked(sheet: Sheet, ax: number, ay: number, bx: number, by: number): boolean {
  const x0 = Math.min(ax, bx), x1 = Math.max(ax, bx), y0 = Math.min(ay, by), y1 = Math.max(ay, by);
  const inside = (p: Point) => p.x >= x0 && p.x <= x1 && p.y >= y0 && p.y <= y1 && !(p.x === ax && p.y === ay) && !(p.x === bx && p.y === by);
  for (const p of sheet.parts) {
    for (const q of pinPositions(p)) if (inside(q)) return true;
    const b = partBox(p);
    if (x0 < b.x1 && x1 > b.x0 && y0 < b.y1 && y1 > b.y0) return true;
  }
  for (const w of sheet.wires) {
    const a = w.pts;
    for (let j = 0; j + 3 < a.length; j += 2) {
      const [cx0, cy0, cx1, cy1] = [a[j], a[j + 1], a[j + 2], a[j + 3]];
      // collinear overlap, or a wire's end landing on this segment
      if (ay === by && cy0 === cy1 && cy0 === ay && Math.min(cx0, cx1) < x1 && Math.max(cx0, cx1) > x0) return true;
      if (ax === bx && cx0 === cx1 && cx0 === ax && Math.min(cy0, cy1) < y1 && Math.max(cy0, cy1) > y0) return true;
      if (inside({ x: cx0, y: cy0 }) || inside({ x: cx1, y: cy1 })) return true;
    }
  }
  return false;
}

/**
 * An orthogonal route from a to b that passes over no pin, runs along no
 * wire and crosses no part: the two L-shapes, then three-segment routes
 * through a column or row further and further out.
 */
function route(sheet: Sheet, a: Point, b: Point): number[] {
  const ok = (pts: number[]) => {
    for (let i = 0; i + 3 < pts.length; i += 2) if (blocked(sheet, pts[i], pts[i + 1], pts[i + 2], pts[i + 3])) return false;
    return true;
  };
  const tries: number[][] = [elbow(a.x, a.y, b.x, b.y, true), elbow(a.x, a.y, b.x, b.y, false)];
  for (let d = 20; d <= 200; d += 20) {
    for (const y of [Math.min(a.y, b.y) - d, Math.max(a.y, b.y) + d]) tries.push([a.x, a.y, a.x, y, b.x, y, b.x, b.y]);
    for (const x of [Math.min(a.x, b.x) - d, Math.max(a.x, b.x) + d]) tries.push([a.x, a.y, x, a.y, x, b.y, b.x, b.y]);
  }
  for (const t of tries) {
    const pts = tidyWire(t);
    if (ok(pts)) return pts;
  }
  throw new Error('no clear path for the wires of the T-equivalent; move the pair apart and try again');
}

/** Replace the coupled pair of `couplingId` with its T-equivalent drawn in place. */
export function substituteT(sheet: Sheet, couplingId: string, arms: TArms): { sheet: Sheet; record: TRecord } {
  const coupling = sheet.couplings.find((c) => c.id === couplingId);
  if (!coupling) throw new Error('that magnetic link is no longer on the sheet');
  const name = couplingTitle(sheet, coupling);
  if (coupling.windings.length !== 2) throw new Error(`${name} links ${coupling.windings.length} windings; a T-equivalent replaces a pair`);
  const others = sheet.couplings.filter((c) => c.id !== couplingId && c.windings.some((w) => coupling.windings.includes(w)));
  if (others.length) throw new Error(`a winding of ${name} is also coupled by ${others.map((c) => couplingTitle(sheet, c)).join(', ')}; a T-equivalent replaces a pair coupled only to each other`);
  const windings = coupling.windings.map((id) => {
    const index = sheet.parts.findIndex((p) => p.id === id);
    return { part: sheet.parts[index], index };
  });
  const gone = new Set(coupling.windings);
  const rest: Sheet = { ...sheet, parts: sheet.parts.filter((p) => !gone.has(p.id)), couplings: sheet.couplings.filter((c) => c.id !== couplingId) };
  const taken = new Set<number>();
  for (const p of rest.parts) for (const q of pinPositions(p)) taken.add(pointKey(q.x, q.y));
  const free = (p: Point) => !taken.has(pointKey(p.x, p.y)) && !onWire(rest, p);
  const pins = windings.map((w) => pinPositions(w.part));
  // the free end of an arm that turns about `pivot`, away from `from`
  const swing = (pivot: Point, from: Point): Point => {
    const dx = Math.sign(from.x - pivot.x);
    const dy = Math.sign(from.y - pivot.y);
    const tries = [{ x: -dy, y: dx }, { x: dy, y: -dx }, { x: -dx, y: -dy }, { x: dx, y: dy }];
    for (const t of tries) {
      const q = { x: pivot.x + LEN * t.x, y: pivot.y + LEN * t.y };
      if (free(q)) return q;
    }
    throw new Error('no room beside the winding to draw the T-equivalent; move the pair apart and try again');
  };
  const used = usedRefs(rest);
  const added: Part[] = [];
  const wires: Wire[] = [];
  const armPart = (henries: number, a: Point, b: Point): Part =>
    twoPinPart({ id: newId('part'), kind: 'arm', ref: nextRef('Lt', used), value: henries }, a, b);
  const wire = (a: Point, b: Point) => {
    const now: Sheet = { ...rest, parts: [...rest.parts, ...added], wires: [...rest.wires, ...wires] };
    wires.push({ id: newId('wire'), pts: route(now, a, b) });
  };
  const ends: Point[] = [];
  const armOf = nameTable<string>();
  [arms.arm1, arms.arm2].forEach((h, s) => {
    const outer = pins[s][arms.outerPins[s]];
    const common = pins[s][1 - arms.outerPins[s]];
    const q = swing(outer, common);
    taken.add(pointKey(q.x, q.y));
    ends.push(q);
    const arm = armPart(h, outer, q);
    armOf[windings[s].part.ref] = arm.ref;
    added.push(arm);
  });
  const common1 = pins[0][1 - arms.outerPins[0]];
  const r = swing(common1, pins[0][arms.outerPins[0]]);
  taken.add(pointKey(r.x, r.y));
  added.push(armPart(arms.shunt, r, common1));
  // the centre node: the two series arms' free ends and the shunt arm's top, joined by wires
  wire(ends[0], ends[1]);
  wire(r, ends[0]);
  if (!arms.shared) wire(common1, pins[1][1 - arms.outerPins[1]]);
  return {
    sheet: { ...rest, parts: [...rest.parts, ...added], wires: [...rest.wires, ...wires] },
    record: {
      coupling, windings, added: added.map((p) => p.id), wires: wires.map((w) => w.id), name: couplingName(sheet, coupling),
      arms: armOf, reversed: windings.filter((_, s) => arms.outerPins[s] === 1).map((w) => w.part.ref),
    },
  };
}

/** Take the T's parts off and put the pair and its link back as they were. */
export function restorePair(sheet: Sheet, record: TRecord): Sheet {
  const added = new Set(record.added);
  const addedWires = new Set(record.wires);
  const refs = new Set(record.windings.map((w) => w.part.ref.toUpperCase()));
  const parts = sheet.parts.filter((p) => !added.has(p.id));
  const clash = parts.find((p) => refs.has(p.ref.toUpperCase()));
  if (clash) throw new Error(`${clash.ref} is in use again on the sheet; rename it before putting the pair back`);
  const out = [...parts];
  for (const w of [...record.windings].sort((a, b) => a.index - b.index)) out.splice(Math.min(w.index, out.length), 0, w.part);
  return { ...sheet, parts: out, wires: sheet.wires.filter((w) => !addedWires.has(w.id)), couplings: [...sheet.couplings, record.coupling] };
}
