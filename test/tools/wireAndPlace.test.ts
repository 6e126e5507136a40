import { beforeEach, describe, expect, it } from 'vitest';
import { seedIds } from '../../src/model/ids';
import { emptySheet } from '../../src/model/sheet';
import { deriveTopology } from '../../src/model/topology';
import { createEditorStore } from '../../src/store/createEditorStore';
import { ToolController } from '../../src/tools/controller';
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
    tools.key(key('r')); // turn the ghost before dropping it
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
