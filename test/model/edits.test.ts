import { couplingName } from '../../src/model/couplingName';
import { beforeEach, describe, expect, it } from 'vitest';
import { refProblem } from '../../src/model/designators';
import { coupleWindings, copyFragment, deleteItems, makePart, addParts, pasteFragment, rotateParts, mirrorParts } from '../../src/model/edits';
import { seedIds } from '../../src/model/ids';
import { pinPositions } from '../../src/model/parts/registry';
import { emptySheet, type Sheet } from '../../src/model/sheet';
import { deriveTopology } from '../../src/model/topology';
import { moveWireEnd, tidyWire } from '../../src/model/wires';

function twoWindings(): Sheet {
  let s = emptySheet();
  const a = makePart(s, 'winding', 100, 100);
  s = addParts(s, [a]);
  const b = makePart(s, 'winding', 200, 100);
  s = addParts(s, [b]);
  // a wire from a's lower pin (100,130) to b's lower pin (200,130)
  return { ...s, wires: [{ id: 'wire:w', pts: [100, 130, 200, 130] }] };
}

describe('sheet edits', () => {
  beforeEach(() => seedIds(21));

  it('assign designators in turn per letter', () => {
    const s = twoWindings();
    expect(s.parts.map((p) => p.ref)).toEqual(['L1', 'L2']);
    expect(makePart(s, 'resistor', 0, 0).ref).toBe('R1');
  });

  it('turning and mirroring a part keep its wire on its pins', () => {
    const s = twoWindings();
    const id = s.parts[0].id;
    for (const next of [rotateParts(s, new Set([id])), mirrorParts(rotateParts(s, new Set([id])), new Set([id]))]) {
      const t = deriveTopology(next);
      expect(t.pinNodes[0].some((n) => t.pinNodes[1].includes(n))).toBe(true); // still joined to the other winding
      const pins = pinPositions(next.parts[0]);
      const w = next.wires[0].pts;
      expect(pins.some((p) => p.x === w[0] && p.y === w[1])).toBe(true);
    }
  });

  it('refuse a duplicate designator with a message', () => {
    const s = twoWindings();
    expect(refProblem(s, s.parts[0].id, 'L2')).toMatch(/L2 is already used/);
    expect(refProblem(s, s.parts[0].id, 'l2')).toMatch(/already used/); // designators compare without case
    expect(refProblem(s, s.parts[0].id, 'L7')).toBeNull();
    expect(refProblem(s, s.parts[0].id, '')).toMatch(/cannot be empty/);
  });

  it('paste gives fresh ids and designators and keeps couplings inside the copy', () => {
    const base = twoWindings();
    const { sheet } = coupleWindings(base, base.parts.map((p) => p.id), 0.7);
    const all = new Set([...sheet.parts.map((p) => p.id), ...sheet.wires.map((w) => w.id)]);
    const r = pasteFragment(sheet, copyFragment(sheet, all), 300, 0);
    expect(r.sheet.parts.map((p) => p.ref)).toEqual(['L1', 'L2', 'L3', 'L4']);
    // each pasted coupling is named by its own windings: k₁₂ and k₃₄ (no designator of its own)
    expect(r.sheet.couplings.map((c) => couplingName(r.sheet, c))).toEqual(['k₁₂', 'k₃₄']);
    expect(r.sheet.couplings[1].windings).toEqual(r.sheet.parts.slice(2).map((p) => p.id));
    expect(new Set(r.sheet.parts.map((p) => p.id)).size).toBe(4);
  });

  it('removing a coupled winding removes a coupling left with one winding', () => {
    const base = twoWindings();
    const { sheet } = coupleWindings(base, base.parts.map((p) => p.id));
    expect(deleteItems(sheet, new Set([sheet.parts[0].id])).couplings).toEqual([]);
  });
});


describe('wire ends following a pin', () => {
  it('a straight wire gets an elbow and stays orthogonal', () => {
    // from (0,0) to (100,0), the first end moved to (20,40): horizontal run kept, then down to it
    const pts = moveWireEnd([0, 0, 100, 0], 0, 20, 40);
    expect(pts).toEqual([20, 40, 20, 0, 100, 0]);
    for (let i = 0; i + 3 < pts.length; i += 2) expect(pts[i] === pts[i + 2] || pts[i + 1] === pts[i + 3]).toBe(true);
  });

  it('a bent wire moves the neighbouring corner along', () => {
    expect(moveWireEnd([0, 0, 50, 0, 50, 80], 1, 60, 90)).toEqual([0, 0, 60, 0, 60, 90]);
  });

  it('tidying drops repeated points and straight-run corners', () => {
    expect(tidyWire([0, 0, 0, 0, 50, 0, 100, 0, 100, 40])).toEqual([0, 0, 100, 0, 100, 40]);
  });
});
