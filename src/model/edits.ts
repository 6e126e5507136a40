/** Pure edits of a sheet. Every function returns a new sheet and leaves its input untouched. */
import { nextRef, usedRefs } from './designators';
import { pointKey, snap, type Point, type QuarterTurns } from './geometry';
import { newId } from './ids';
import { PART_DEFS, isCouplable, pinPositions } from './parts/registry';
import type { Part, PartKind, Sheet, SheetCoupling, Wire } from './sheet';
import { moveWireEnd, tidyWire, translatePts } from './wires';

export function makePart(sheet: Sheet, kind: PartKind, x: number, y: number, rot?: QuarterTurns, mirror = false): Part {
  const def = PART_DEFS[kind];
  const part: Part = {
    id: newId('part'), kind, x: snap(x), y: snap(y), rot: rot ?? def.defaultRot, mirror,
    ref: nextRef(def.prefix, usedRefs(sheet)), ...def.defaults,
  };
  if (def.nameField) part.name = nextLabelName(sheet);
  return part;
}

function nextLabelName(sheet: Sheet): string {
  const used = new Set(sheet.parts.filter((p) => PART_DEFS[p.kind].nameField).map((p) => p.name));
  for (let i = 0; i < 26 * 4; i++) {
    const n = i < 26 ? String.fromCharCode(97 + i) : `${String.fromCharCode(97 + (i % 26))}${Math.floor(i / 26)}`;
    if (!used.has(n)) return n;
  }
  return `net${sheet.parts.length}`;
}

export function addParts(sheet: Sheet, parts: Part[]): Sheet {
  return { ...sheet, parts: [...sheet.parts, ...parts] };
}

export function addWire(sheet: Sheet, pts: number[]): { sheet: Sheet; wire: Wire | null } {
  const tidy = tidyWire(pts);
  if (tidy.length < 4 || (tidy.length === 4 && tidy[0] === tidy[2] && tidy[1] === tidy[3])) return { sheet, wire: null };
  const wire = { id: newId('wire'), pts: tidy };
  return { sheet: { ...sheet, wires: [...sheet.wires, wire] }, wire };
}

/** Wire ends sitting on the pins of the given parts, before an edit moves them. */
function attachedEnds(sheet: Sheet, partIds: Set<string>, skipWires: Set<string>) {
  const pinAt = new Map<number, { part: string; pin: number }>();
  for (const p of sheet.parts) {
    if (!partIds.has(p.id)) continue;
    pinPositions(p).forEach((q, i) => pinAt.set(pointKey(q.x, q.y), { part: p.id, pin: i }));
  }
  const ends: { wire: number; end: 0 | 1; part: string; pin: number }[] = [];
  sheet.wires.forEach((w, wi) => {
    if (skipWires.has(w.id)) return;
    const n = w.pts.length;
    const a = pinAt.get(pointKey(w.pts[0], w.pts[1]));
    const b = pinAt.get(pointKey(w.pts[n - 2], w.pts[n - 1]));
    if (a) ends.push({ wire: wi, end: 0, ...a });
    if (b) ends.push({ wire: wi, end: 1, ...b });
  });
  return ends;
}

/**
 * Change some parts (move, turn, mirror) and keep the wires that ended on
 * their pins attached: a wire with both ends carried the same way is moved
 * whole, otherwise its ends are bent to follow.
 */
export function changeParts(sheet: Sheet, ids: Set<string>, change: (p: Part) => Part, wireIds: Set<string> = new Set(), wireDelta?: Point): Sheet {
  const ends = attachedEnds(sheet, ids, wireIds);
  const parts = sheet.parts.map((p) => (ids.has(p.id) ? change(p) : p));
  const newPins = new Map<string, Point[]>();
  for (const p of parts) if (ids.has(p.id)) newPins.set(p.id, pinPositions(p));
  const wires = sheet.wires.slice();
  if (wireDelta) {
    wires.forEach((w, i) => {
      if (wireIds.has(w.id)) wires[i] = { ...w, pts: translatePts(w.pts, wireDelta.x, wireDelta.y) };
    });
  }
  const byWire = new Map<number, typeof ends>();
  for (const e of ends) byWire.set(e.wire, [...(byWire.get(e.wire) ?? []), e]);
  for (const [wi, list] of byWire) {
    const w = sheet.wires[wi];
    let pts = w.pts;
    const n = pts.length;
    const targets = list.map((e) => ({ e, to: newPins.get(e.part)![e.pin] }));
    if (targets.length === 2) {
      const d0 = { x: targets[0].to.x - pts[targets[0].e.end === 0 ? 0 : n - 2], y: targets[0].to.y - pts[targets[0].e.end === 0 ? 1 : n - 1] };
      const d1 = { x: targets[1].to.x - pts[targets[1].e.end === 0 ? 0 : n - 2], y: targets[1].to.y - pts[targets[1].e.end === 0 ? 1 : n - 1] };
      if (d0.x === d1.x && d0.y === d1.y) {
        wires[wi] = { ...w, pts: translatePts(pts, d0.x, d0.y) };
        continue;
      }
    }
    for (const { e, to } of targets) pts = moveWireEnd(pts, e.end, to.x, to.y);
    wires[wi] = { ...w, pts };
  }
  return { ...sheet, parts, wires };
}

/** Ids of what a drag of the selection moves: the selected parts and wires, and every wire ending on a selected part. */
export function movingItems(sheet: Sheet, selection: Set<string>): Set<string> {
  const out = new Set<string>();
  const partIds = new Set<string>();
  for (const p of sheet.parts) if (selection.has(p.id)) { partIds.add(p.id); out.add(p.id); }
  for (const w of sheet.wires) if (selection.has(w.id)) out.add(w.id);
  for (const e of attachedEnds(sheet, partIds, out)) out.add(sheet.wires[e.wire].id);
  for (const c of sheet.couplings) if (c.windings.some((w) => partIds.has(w))) out.add(c.id);
  return out;
}

export function moveSelection(sheet: Sheet, ids: Set<string>, dx: number, dy: number): Sheet {
  if (dx === 0 && dy === 0) return sheet;
  const partIds = new Set(sheet.parts.filter((p) => ids.has(p.id)).map((p) => p.id));
  const wireIds = new Set(sheet.wires.filter((w) => ids.has(w.id)).map((w) => w.id));
  return changeParts(sheet, partIds, (p) => ({ ...p, x: p.x + dx, y: p.y + dy }), wireIds, { x: dx, y: dy });
}

export function tidyWires(sheet: Sheet, ids?: Set<string>): Sheet {
  return { ...sheet, wires: sheet.wires.map((w) => (!ids || ids.has(w.id) ? { ...w, pts: tidyWire(w.pts) } : w)) };
}

export function rotateParts(sheet: Sheet, ids: Set<string>, quarters: 1 | 2 | 3 = 1): Sheet {
  return changeParts(sheet, ids, (p) => ({ ...p, rot: (((p.rot + quarters) % 4) as QuarterTurns) }));
}

export function mirrorParts(sheet: Sheet, ids: Set<string>): Sheet {
  return changeParts(sheet, ids, (p) => ({ ...p, mirror: !p.mirror }));
}

export function flipDots(sheet: Sheet, ids: Set<string>): Sheet {
  return {
    ...sheet,
    parts: sheet.parts.map((p) => (ids.has(p.id) && isCouplable(p) ? { ...p, dot: p.dot === 'second' ? 'first' : 'second' } : p)),
  };
}

export function deleteItems(sheet: Sheet, ids: Set<string>): Sheet {
  const parts = sheet.parts.filter((p) => !ids.has(p.id));
  const couplings: SheetCoupling[] = [];
  for (const c of sheet.couplings) {
    if (ids.has(c.id)) continue;
    const windings = c.windings.filter((w) => !ids.has(w));
    if (windings.length >= 2) couplings.push(windings.length === c.windings.length ? c : { ...c, windings, by: windings.length > 2 ? 'k' : c.by });
  }
  return { ...sheet, parts, wires: sheet.wires.filter((w) => !ids.has(w.id)), couplings };
}

export function updatePart(sheet: Sheet, id: string, patch: Partial<Part>): Sheet {
  return { ...sheet, parts: sheet.parts.map((p) => (p.id === id ? { ...p, ...patch } : p)) };
}

export function updateCoupling(sheet: Sheet, id: string, patch: Partial<SheetCoupling>): Sheet {
  return { ...sheet, couplings: sheet.couplings.map((c) => (c.id === id ? { ...c, ...patch } : c)) };
}

/** Couple the given windings with coefficient k (one coupling, named K1, K2 …). */
export function coupleWindings(sheet: Sheet, windingIds: string[], k = 0.9): { sheet: Sheet; coupling: SheetCoupling } {
  const coupling: SheetCoupling = { id: newId('coupling'), windings: windingIds, by: 'k', value: k };
  return { sheet: { ...sheet, couplings: [...sheet.couplings, coupling] }, coupling };
}

export interface Fragment { parts: Part[]; wires: Wire[]; couplings: SheetCoupling[] }

export function copyFragment(sheet: Sheet, ids: Set<string>): Fragment {
  const parts = sheet.parts.filter((p) => ids.has(p.id));
  const partIds = new Set(parts.map((p) => p.id));
  return {
    parts,
    wires: sheet.wires.filter((w) => ids.has(w.id)),
    couplings: sheet.couplings.filter((c) => c.windings.every((w) => partIds.has(w))),
  };
}

/** Paste a fragment with fresh ids and designators, offset by (dx, dy). Returns the new ids. */
export function pasteFragment(sheet: Sheet, frag: Fragment, dx: number, dy: number): { sheet: Sheet; ids: string[] } {
  const used = usedRefs(sheet);
  const idMap = new Map<string, string>();
  const parts = frag.parts.map((p) => {
    const id = newId('part');
    idMap.set(p.id, id);
    return { ...p, id, x: p.x + dx, y: p.y + dy, ref: nextRef(PART_DEFS[p.kind].prefix, used) };
  });
  const wires = frag.wires.map((w) => ({ id: newId('wire'), pts: translatePts(w.pts, dx, dy) }));
  const couplings = frag.couplings.map((c) => ({ ...c, id: newId('coupling'), ref: nextRef('K', used), windings: c.windings.map((w) => idMap.get(w)!) }));
  return {
    sheet: { ...sheet, parts: [...sheet.parts, ...parts], wires: [...sheet.wires, ...wires], couplings: [...sheet.couplings, ...couplings] },
    ids: [...parts.map((p) => p.id), ...wires.map((w) => w.id), ...couplings.map((c) => c.id)],
  };
}
