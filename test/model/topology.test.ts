import { describe, expect, it } from 'vitest';
import { deriveTopology } from '../../src/model/topology';
import { emptySheet, type Part, type Sheet } from '../../src/model/sheet';

// Pins of a resistor at (x, y), rot 0: (x-30, y) and (x+30, y) (part definition).
const R = (id: string, x: number, y: number, rot: 0 | 1 = 0): Part => ({ id, kind: 'resistor', x, y, rot, mirror: false, ref: id.toUpperCase(), value: 1 });
const W = (id: string, ...pts: number[]) => ({ id, pts });
const sheetOf = (parts: Part[], wires: { id: string; pts: number[] }[]): Sheet => ({ ...emptySheet(), parts, wires });

describe('wire topology → nodes', () => {
  it('a wire from pin to pin makes one node', () => {
    const t = deriveTopology(sheetOf([R('r1', 0, 0), R('r2', 100, 0)], [W('w1', 30, 0, 70, 0)]));
    expect(t.pinNodes[0][1]).toBe(t.pinNodes[1][0]);
    expect(t.pinNodes[0][0]).not.toBe(t.pinNodes[1][1]);
    expect(t.junctions).toEqual([]);
    expect(t.openEnds).toEqual([]);
  });

  it('a wire ending in the middle of another wire joins it with a junction mark', () => {
    // a bus from r1's right pin (30,0) to r2's left pin (130,0), and a branch from the bus's middle down to r3
    const parts = [R('r1', 0, 0), R('r2', 160, 0), R('r3', 80, 80, 1)];
    // r3 standing: pins at (80,50) and (80,110)
    const t = deriveTopology(sheetOf(parts, [W('bus', 30, 0, 130, 0), W('branch', 80, 0, 80, 50)]));
    expect(t.pinNodes[0][1]).toBe(t.pinNodes[2][0]);
    expect(t.pinNodes[1][0]).toBe(t.pinNodes[0][1]);
    expect(t.pinNodes[2][1]).not.toBe(t.pinNodes[0][1]);
    expect(t.junctions).toEqual([{ x: 80, y: 0 }]);
  });

  it('wires that only cross stay apart and show no mark', () => {
    const t = deriveTopology(sheetOf([], [W('h', 0, 0, 100, 0), W('v', 50, -50, 50, 50)]));
    expect(t.wireNodes[0]).not.toBe(t.wireNodes[1]);
    expect(t.junctions).toEqual([]);
    expect(t.openEnds).toHaveLength(4); // four loose ends
  });

  it('a wire end at the corner of another wire connects there', () => {
    const t = deriveTopology(sheetOf([], [W('l', 0, 0, 50, 0, 50, 50), W('t', 50, 0, 100, 0)]));
    expect(t.wireNodes[0]).toBe(t.wireNodes[1]);
    expect(t.junctions).toEqual([{ x: 50, y: 0 }]);
  });

  it('a pin lying on a wire joins it; a loose wire end is an open end', () => {
    const t = deriveTopology(sheetOf([R('r1', 0, 0)], [W('w', 30, -40, 30, 40)]));
    expect(t.pinNodes[0][1]).toBe(t.wireNodes[0]);
    expect(t.openEnds).toEqual(expect.arrayContaining([{ x: 30, y: -40 }, { x: 30, y: 40 }]));
    expect(t.junctions).toEqual([{ x: 30, y: 0 }]); // pin + wire passing through: three arms
  });

  it('ground symbols name the node gnd and labels with one name are one node', () => {
    const parts: Part[] = [
      R('r1', 0, 0), R('r2', 200, 0),
      { id: 'g', kind: 'ground', x: -30, y: 0, rot: 0, mirror: false, ref: '' },
      { id: 'la', kind: 'label', x: 30, y: 0, rot: 0, mirror: false, ref: '', name: 'out' },
      { id: 'lb', kind: 'label', x: 170, y: 0, rot: 0, mirror: false, ref: '', name: 'out' },
    ];
    const t = deriveTopology(sheetOf(parts, []));
    expect(t.pinNodes[0]).toEqual(['gnd', 'out']);
    expect(t.pinNodes[1][0]).toBe('out');
    expect(t.pinNodes[1][1]).toBe('n1');
    expect(t.hasGround).toBe(true);
  });
});
