/**
 * Draw a coupled pair's T-equivalent in place on the sheet, and put the pair
 * back. Each series arm keeps its winding's outer pin and designator and is
 * turned a quarter about that pin; a new node label joins the arms' free ends
 * to the shunt arm, which starts at the first winding's common pin. A positive
 * arm becomes a plain (uncoupled) winding, a zero or negative one an
 * equivalent arm. Without a shared terminal, a second pair of labels joins the
 * two common ends (this is what removes the isolation).
 */
import { nextRef, usedRefs } from './designators';
import { pointKey, type Point, type QuarterTurns } from './geometry';
import { newId } from './ids';
import { PART_DEFS, pinPositions } from './parts/registry';
import type { Part, Sheet, SheetCoupling } from './sheet';

export interface TArms { arm1: number; arm2: number; shunt: number; shared: boolean; outerPins: [0 | 1, 0 | 1] }

/** What was taken off the sheet, to put it back exactly. */
export interface TRecord {
  coupling: SheetCoupling;
  /** the windings as they were, with their index in the parts list */
  windings: { part: Part; index: number }[];
  /** parts added for the T (arms and labels) */
  added: string[];
  centre: string;
  /** designators of the arms whose reference direction runs opposite to their winding's */
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

/** A node label at `at` whose flag points away from `from` (so it does not cover the part it names). */
function labelAt(name: string, at: Point, from: Point): Part {
  const dx = at.x - from.x;
  const dy = at.y - from.y;
  const rot: QuarterTurns = Math.abs(dx) >= Math.abs(dy) ? (dx >= 0 ? 0 : 2) : dy > 0 ? 1 : 3;
  return { id: newId('part'), kind: 'label', x: at.x, y: at.y, rot, mirror: false, ref: '', name };
}

function uniqueLabel(sheet: Sheet, base: string): string {
  const used = new Set(sheet.parts.filter((p) => PART_DEFS[p.kind].nameField).map((p) => (p.name ?? '').toLowerCase()));
  let n = base;
  for (let i = 2; used.has(n.toLowerCase()) || n.toLowerCase() === 'gnd'; i++) n = `${base}${i}`;
  return n;
}

/** Replace the coupled pair of `couplingId` with its T-equivalent drawn in place. */
export function substituteT(sheet: Sheet, couplingId: string, arms: TArms): { sheet: Sheet; record: TRecord } {
  const coupling = sheet.couplings.find((c) => c.id === couplingId);
  if (!coupling) throw new Error('that magnetic link is no longer on the sheet');
  if (coupling.windings.length !== 2) throw new Error(`${coupling.ref} links ${coupling.windings.length} windings; a T-equivalent replaces a pair`);
  const others = sheet.couplings.filter((c) => c.id !== couplingId && c.windings.some((w) => coupling.windings.includes(w)));
  if (others.length) throw new Error(`a winding of ${coupling.ref} is also linked by ${others.map((c) => c.ref).join(', ')}; a T-equivalent replaces a pair coupled only to each other`);
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
  const centre = uniqueLabel(sheet, `${coupling.ref}t`);
  const added: Part[] = [];
  const armPart = (ref: string, henries: number, a: Point, b: Point): Part => {
    const kind = henries > 0 ? 'winding' : 'arm';
    return twoPinPart({ id: newId('part'), kind, ref, value: henries, ...(kind === 'winding' ? { dot: 'first' as const } : {}) }, a, b);
  };
  const ends: Point[] = [];
  [arms.arm1, arms.arm2].forEach((h, s) => {
    const outer = pins[s][arms.outerPins[s]];
    const common = pins[s][1 - arms.outerPins[s]];
    const q = swing(outer, common);
    taken.add(pointKey(q.x, q.y));
    ends.push(q);
    used.add(windings[s].part.ref.toUpperCase());
    added.push(armPart(windings[s].part.ref, h, outer, q), labelAt(centre, q, outer));
  });
  const common1 = pins[0][1 - arms.outerPins[0]];
  const r = swing(common1, pins[0][arms.outerPins[0]]);
  taken.add(pointKey(r.x, r.y));
  added.push(armPart(nextRef('Leq', used), arms.shunt, r, common1), labelAt(centre, r, common1));
  if (!arms.shared) {
    const join = uniqueLabel({ ...sheet, parts: [...sheet.parts, ...added] }, `${coupling.ref}j`);
    // the flag goes where no wire or new arm runs from the pin
    const clear = (at: Point, avoid: Point[]): Point => {
      for (const d of [{ x: 1, y: 0 }, { x: -1, y: 0 }, { x: 0, y: -1 }, { x: 0, y: 1 }]) {
        const p = { x: at.x + 20 * d.x, y: at.y + 20 * d.y };
        const towardsArm = avoid.some((a) => Math.sign(a.x - at.x) === d.x && Math.sign(a.y - at.y) === d.y);
        if (!onWire(rest, p) && !towardsArm) return { x: at.x - d.x, y: at.y - d.y };
      }
      return { x: at.x - 1, y: at.y };
    };
    const common2 = pins[1][1 - arms.outerPins[1]];
    added.push(labelAt(join, common1, clear(common1, [r, pins[0][arms.outerPins[0]]])), labelAt(join, common2, clear(common2, [pins[1][arms.outerPins[1]]])));
  }
  return {
    sheet: { ...rest, parts: [...rest.parts, ...added] },
    record: { coupling, windings, added: added.map((p) => p.id), centre, reversed: windings.filter((_, s) => arms.outerPins[s] === 1).map((w) => w.part.ref) },
  };
}

/** Take the T's parts off and put the pair and its link back as they were. */
export function restorePair(sheet: Sheet, record: TRecord): Sheet {
  const added = new Set(record.added);
  const refs = new Set(record.windings.map((w) => w.part.ref.toUpperCase()));
  const parts = sheet.parts.filter((p) => !added.has(p.id));
  const clash = parts.find((p) => refs.has(p.ref.toUpperCase()));
  if (clash) throw new Error(`${clash.ref} is in use again on the sheet; rename it before putting the pair back`);
  const out = [...parts];
  for (const w of [...record.windings].sort((a, b) => a.index - b.index)) out.splice(Math.min(w.index, out.length), 0, w.part);
  return { ...sheet, parts: out, couplings: [...sheet.couplings, record.coupling] };
}
