import { beforeEach, describe, expect, it } from 'vitest';
import { seedIds } from '../../src/model/ids';
import { emptySheet, type Sheet } from '../../src/model/sheet';
import { pinPositions } from '../../src/model/parts/registry';
import { createEditorStore } from '../../src/store/createEditorStore';
import { ToolController } from '../../src/tools/controller';
import { at, key } from './helpers';

function setup(sheet: Sheet) {
  const store = createEditorStore(sheet, 'sheet:test');
  store.setState({ view: { x: 0, y: 0, zoom: 1 } });
  return { store, tools: new ToolController(store) };
}

// a resistor at (100, 100) (pins at 70 and 130), a wire from its right pin to (200, 100)
const base = (): Sheet => ({
  ...emptySheet(),
  parts: [
    { id: 'part:r', kind: 'resistor', x: 100, y: 100, rot: 0, mirror: false, ref: 'R1', value: 10 },
    { id: 'part:l', kind: 'winding', x: 300, y: 100, rot: 0, mirror: false, ref: 'L1', value: 1, dot: 'first' },
  ],
  wires: [{ id: 'wire:a', pts: [130, 100, 200, 100, 200, 150] }],
});

describe('pick tool as a state machine', () => {
  beforeEach(() => seedIds(3));

  it('a click selects a part', () => {
    const { store, tools } = setup(base());
    tools.down(at(100, 100));
    tools.up(at(100, 100));
    expect(tools.select.trail).toEqual(['idle', 'pointing_item', 'idle']);
    expect(store.getState().selection).toEqual(['part:r']);
  });

  it('a drag moves the part, keeps its wire attached, and is one undo step', () => {
    const { store, tools } = setup(base());
    const before = store.temporal.getState().pastStates.length;
    tools.down(at(100, 100));
    for (let i = 1; i <= 5; i++) tools.move(at(100 + 8 * i, 100 + 8 * i));
    expect(store.getState().preview).not.toBeNull();
    expect(store.getState().sheet.parts[0].x).toBe(100); // nothing committed during the drag
    tools.up(at(140, 140));
    expect(tools.select.trail).toEqual(['idle', 'pointing_item', 'dragging', 'idle']);
    const s = store.getState().sheet;
    expect(s.parts[0]).toMatchObject({ x: 140, y: 140 }); // 40 = the drag snapped to the 10-unit grid
    const pin = pinPositions(s.parts[0])[1];
    expect(s.wires[0].pts.slice(0, 2)).toEqual([pin.x, pin.y]); // the wire still ends on the moved pin
    expect(s.wires[0].pts.slice(-2)).toEqual([200, 150]); // its far end stays
    expect(store.temporal.getState().pastStates.length).toBe(before + 1);
    store.temporal.getState().undo();
    expect(store.getState().sheet.parts[0]).toMatchObject({ x: 100, y: 100 });
  });

  it('dragging on empty sheet selects what the box holds; shift-click adds', () => {
    const { store, tools } = setup(base());
    tools.down(at(50, 60));
    tools.move(at(150, 140));
    expect(store.getState().box).toEqual({ x0: 50, y0: 60, x1: 150, y1: 140 });
    tools.up(at(150, 140));
    expect(tools.select.trail).toEqual(['idle', 'pointing_canvas', 'brushing', 'idle']);
    expect(store.getState().selection).toEqual(['part:r']);
    tools.down(at(300, 100, { shift: true }));
    tools.up(at(300, 100, { shift: true }));
    expect(store.getState().selection).toEqual(['part:r', 'part:l']);
  });

  it('a click on a winding dot moves it to the other end', () => {
    const { store, tools } = setup(base());
    // the dot of an unturned winding at (300,100) sits at (276, 91) (winding definition)
    tools.down(at(276, 91));
    tools.up(at(276, 91));
    expect(tools.select.trail).toEqual(['idle', 'pointing_dot', 'idle']);
    expect(store.getState().sheet.parts[1].dot).toBe('second');
  });

  it('Escape cancels a drag and leaves the sheet as it was', () => {
    const { store, tools } = setup(base());
    const sheet = store.getState().sheet;
    tools.down(at(100, 100));
    tools.move(at(160, 100));
    expect(tools.key(key('Escape'))).toBe(true);
    expect(store.getState().preview).toBeNull();
    expect(store.getState().sheet).toBe(sheet);
  });
});

describe('sliding a wire segment', () => {
  it('moves the grabbed segment sideways and keeps both ends on their pins', () => {
    const { store, tools } = setup(base());
    // the wire runs (130,100) → (200,100) → (200,150); grab its vertical piece and pull it right by 30
    tools.down(at(200, 130));
    tools.up(at(200, 130));
    tools.down(at(200, 130));
    tools.move(at(215, 130));
    tools.move(at(230, 131));
    tools.up(at(230, 131));
    expect(tools.select.trail.slice(-3)).toEqual(['pointing_item', 'sliding', 'idle']);
    expect(store.getState().sheet.wires[0].pts).toEqual([130, 100, 230, 100, 230, 150, 200, 150]); // the far end stays at (200,150)
  });
});
