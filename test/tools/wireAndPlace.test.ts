import { beforeEach, describe, expect, it } from 'vitest';
import { seedIds } from '../../src/model/ids';
import { emptySheet } from '../../src/model/sheet';
import { deriveTopology } from '../../src/model/topology';
import { createEditorStore } from '../../src/store/createEditorStore';
import { ToolController } from '../../src/tools/controller';
import { partBox } from '../../src/model/parts/registry';
import { placePart } from '../../src/store/actions';
import { at, key } from './helpers';

function setup() {
  const store = createEditorStore(emptySheet(), 'sheet:test');
  store.setState({ view: { x: 0, y: 0, zoom: 1 } });
  return { store, tools: new ToolController(store) };
}

describe('place tool', () => {
  beforeEach(() => seedIds(5));

  it('drops parts on the grid with designators in turn, and hands back to the pick tool', () => {
    const { store, tools } = setup();
    tools.startPlacing('resistor');
    tools.move(at(103, 97));
    expect(store.getState().ghost).toMatchObject({ kind: 'resistor', x: 100, y: 100 });
    tools.down(at(103, 97));
    expect(tools.place.trail).toEqual(['idle', 'placing', 'placed', 'idle']);
    expect(store.getState().tool).toBe('select');
    tools.startPlacing('resistor');
    tools.key(key('.')); // turn the ghost before dropping it
    tools.down(at(300, 200));
    const parts = store.getState().sheet.parts;
    expect(parts.map((p) => [p.ref, p.x, p.y, p.rot])).toEqual([['R1', 100, 100, 0], ['R2', 300, 200, 1]]);
  });

  it('shift-click keeps placing', () => {
    const { store, tools } = setup();
    tools.startPlacing('capacitor');
    tools.down(at(0, 0, { shift: true }));
    tools.down(at(100, 0, { shift: true }));
    expect(store.getState().sheet.parts.map((p) => p.ref)).toEqual(['C1', 'C2']);
    expect(store.getState().tool).toBe('place');
  });
});

describe('wire tool', () => {
  beforeEach(() => seedIds(6));

  it('draws an orthogonal wire from pin to pin and ends there', () => {
    const { store, tools } = setup();
    tools.startPlacing('resistor');
    tools.down(at(100, 100)); // pins at (70,100) and (130,100)
    tools.startPlacing('resistor');
    tools.down(at(300, 200)); // pins at (270,200) and (330,200)
    tools.use('wire');
    tools.down(at(131, 99)); // near the first part's right pin
    tools.move(at(268, 203));
    expect(store.getState().wireDraft).toEqual([130, 100, 270, 100, 270, 200]);
    tools.down(at(268, 203)); // on the second part's left pin: the wire ends
    expect(tools.wire.trail).toEqual(['idle', 'drawing', 'idle']);
    const s = store.getState().sheet;
    expect(s.wires).toHaveLength(1);
    expect(s.wires[0].pts).toEqual([130, 100, 270, 100, 270, 200]);
    const t = deriveTopology(s);
    expect(t.pinNodes[0][1]).toBe(t.pinNodes[1][0]);
  });

  it('clicks on empty sheet add corners; Enter ends the wire', () => {
    const { store, tools } = setup();
    tools.use('wire');
    tools.down(at(0, 0));
    tools.down(at(100, 0));
    tools.down(at(100, 80));
    expect(tools.wire.state).toBe('drawing');
    tools.key(key('Enter'));
    expect(store.getState().sheet.wires[0].pts).toEqual([0, 0, 100, 0, 100, 80]);
    const t = deriveTopology(store.getState().sheet);
    expect(t.openEnds).toHaveLength(2);
  });
});

describe('keyboard placing and wiring', () => {
  beforeEach(() => seedIds(9));

  it('drops each new part at a free spot beside the last one, never on top of it', () => {
    const { store, tools } = setup();
    tools.place.viewport = () => ({ width: 400, height: 300 });
    for (const kind of ['vsource', 'winding', 'winding', 'resistor'] as const) {
      tools.startPlacing(kind);
      tools.key(key('Enter'));
    }
    const parts = store.getState().sheet.parts;
    expect(parts.map((p) => p.ref)).toEqual(['V1', 'L1', 'L2', 'R1']);
    // no two boxes overlap (a geometric invariant), and each new part stands to the right of the one before
    const boxes = parts.map(partBox);
    for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) {
      const a = boxes[i], b = boxes[j];
      expect(a.x1 <= b.x0 || b.x1 <= a.x0 || a.y1 <= b.y0 || b.y1 <= a.y0, `${parts[i].ref} and ${parts[j].ref}`).toBe(true);
    }
    for (let i = 1; i < parts.length; i++) expect(parts[i].x).toBeGreaterThan(parts[i - 1].x);
    expect(parts[0]).toMatchObject({ x: 200, y: 150 }); // the first goes to the middle of the 400 × 300 view
  });

  it('moves the waiting part with the arrow keys before Enter drops it', () => {
    const { store, tools } = setup();
    tools.place.viewport = () => ({ width: 400, height: 300 });
    tools.startPlacing('capacitor');
    tools.key(key('ArrowDown'));
    tools.key(key('ArrowRight', { shift: true }));
    tools.key(key('Enter'));
    expect(store.getState().sheet.parts[0]).toMatchObject({ x: 250, y: 160 }); // one step down, five steps right (10-unit grid)
  });

  it('wires pin to pin from the keyboard: pick a pin, Enter, pick the target pin, Enter', () => {
    const { store, tools } = setup();
    placePart(store, 'resistor', { x: 100, y: 100 });
    placePart(store, 'resistor', { x: 300, y: 200 });
    tools.use('wire');
    tools.key(key(']')); // the first pin in sheet order: R1's left pin
    expect(store.getState().pinCursor).toEqual({ x: 70, y: 100 });
    tools.key(key('ArrowRight')); // the nearest pin to the right: R1's right pin
    expect(store.getState().pinCursor).toEqual({ x: 130, y: 100 });
    tools.key(key('Enter'));
    expect(tools.wire.state).toBe('drawing');
    tools.key(key('ArrowRight')); // R2's left pin, down and to the right
    expect(store.getState().pinCursor).toEqual({ x: 270, y: 200 });
    tools.key(key('Enter'));
    expect(tools.wire.state).toBe('idle');
    const wires = store.getState().sheet.wires;
    expect(wires).toHaveLength(1);
    expect(wires[0].pts).toEqual([130, 100, 270, 100, 270, 200]); // an L-shaped route, first along the longer axis
    expect(deriveTopology(store.getState().sheet).openEnds).toHaveLength(0);
  });
});
