import { describe, expect, it } from 'vitest';
import type { SolveResult } from '../../src/model/graph';
import { emptySheet, type Part, type Sheet } from '../../src/model/sheet';
import { wireFlows } from '../../src/model/wireFlows';

const R = (id: string, x: number, y: number, rot: 0 | 1 = 0): Part => ({ id, kind: 'resistor', x, y, rot, mirror: false, ref: id, value: 1 });
const z = (re: number, im = 0) => ({ re, im });
const two = (i: { re: number; im: number }) => ({ voltage: z(0), current: i, power: { watts: 0, vars: 0 } });

describe('currents along wires', () => {
  it('a T-junction splits the current by Kirchhoff’s current law', () => {
    // ra feeds a junction at (100,0); rb and rc (standing) take 2 A and 1 A away from it
    // ra: pins (-30,0),(30,0); rb: pins (170,0),(230,0); rc standing at (100,60): pins (100,30),(100,90)
    const sheet: Sheet = {
      ...emptySheet(),
      parts: [R('ra', 0, 0), R('rb', 200, 0), R('rc', 100, 60, 1)],
      wires: [{ id: 'w1', pts: [30, 0, 170, 0] }, { id: 'w2', pts: [100, 0, 100, 30] }],
    };
    const result = { elements: { ra: two(z(3, 1)), rb: two(z(2, 0.5)), rc: two(z(1, 0.5)) } } as unknown as SolveResult;
    const flows = wireFlows(sheet, result, new Map([['ra', 'ra'], ['rb', 'rb'], ['rc', 'rc']]));
    const along = (x: number, y: number) => flows.find((f) => f.at.x === x && f.at.y === y)!;
    // from ra's pin to the junction: all 3+1j A, flowing in +x (reference of ra is left to right)
    expect(along(65, 0).current).toEqual(z(3, 1));
    expect(along(65, 0).dir).toEqual({ x: 1, y: 0 });
    // junction to rb: 2+0.5j A; junction down to rc: 1+0.5j A (KCL: 3+1j = (2+0.5j) + (1+0.5j))
    expect(along(135, 0).current.re).toBeCloseTo(2, 12);
    expect(along(135, 0).current.im).toBeCloseTo(0.5, 12);
    expect(along(100, 15).current.re).toBeCloseTo(1, 12);
    expect(along(100, 15).dir).toEqual({ x: 0, y: 1 });
    expect(flows.every((f) => f.repeats)).toBe(true); // each equals a part's current
  });

  it('an island with one ground symbol sends the balance into it; two grounds leave it undetermined', () => {
    const g = (id: string, x: number, y: number): Part => ({ id, kind: 'ground', x, y, rot: 0, mirror: false, ref: '' });
    const sheet: Sheet = { ...emptySheet(), parts: [R('ra', 0, 0), g('g1', 100, 0)], wires: [{ id: 'w', pts: [30, 0, 100, 0] }] };
    const result = { elements: { ra: two(z(0, -2)) } } as unknown as SolveResult;
    const one = wireFlows(sheet, result, new Map([['ra', 'ra']]));
    expect(one).toHaveLength(1);
    expect(one[0].current).toEqual(z(0, 2)); // reference turned so the angle lies in (-90°, 90°]: +90°
    expect(one[0].dir).toEqual({ x: -1, y: 0 });
    const twoGrounds: Sheet = { ...sheet, parts: [...sheet.parts, g('g2', 60, 0)] };
    expect(wireFlows(twoGrounds, result, new Map([['ra', 'ra']]))).toEqual([]);
  });
});
