import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { graphToSheet } from '../../src/model/fromGraph';
import type { GraphElement, GraphModel } from '../../src/model/graph';
import { emptySheet, type Part, type Sheet } from '../../src/model/sheet';
import { sheetToGraph } from '../../src/model/toGraph';
import { deriveTopology } from '../../src/model/topology';

/** Which pins share a node, as a set of "part:pin|part:pin" pairs (independent of node names). */
function pairs(sheet: Sheet): Set<string> {
  const t = deriveTopology(sheet);
  const flat = t.pinNodes.flatMap((row, i) => row.map((n, j) => ({ n, k: `${i}:${j}` })));
  const out = new Set<string>();
  for (const a of flat) for (const b of flat) if (a.k < b.k && a.n === b.n) out.add(`${a.k}|${b.k}`);
  return out;
}

const grid = fc.integer({ min: -6, max: 6 }).map((v) => v * 10);
const resistor = fc.record({ x: grid, y: grid, rot: fc.constantFrom(0 as const, 1 as const) });
const wire = fc.array(fc.tuple(grid, grid), { minLength: 2, maxLength: 4 }).map((pts) => {
  const flat: number[] = [pts[0][0], pts[0][1]];
  for (let i = 1; i < pts.length; i++) flat.push(pts[i][0], pts[i - 1][1], pts[i][0], pts[i][1]); // orthogonal steps
  return flat;
});

describe('topology properties (fast-check)', () => {
  it('moving the whole drawing by whole grid steps changes no connection', () => {
    fc.assert(
      fc.property(fc.array(resistor, { maxLength: 5 }), fc.array(wire, { maxLength: 5 }), grid, grid, (rs, ws, dx, dy) => {
        const parts: Part[] = rs.map((r, i) => ({ id: `part:${i}`, kind: 'resistor', x: r.x, y: r.y, rot: r.rot, mirror: false, ref: `R${i + 1}`, value: 1 }));
        const sheet: Sheet = { ...emptySheet(), parts, wires: ws.map((pts, i) => ({ id: `wire:${i}`, pts })) };
        const moved: Sheet = {
          ...sheet,
          parts: parts.map((p) => ({ ...p, x: p.x + dx, y: p.y + dy })),
          wires: sheet.wires.map((w) => ({ ...w, pts: w.pts.map((v, k) => v + (k % 2 ? dy : dx)) })),
        };
        expect(pairs(moved)).toEqual(pairs(sheet)); // translation invariance (a physical invariant of the drawing)
      }),
      { numRuns: 150 },
    );
  });

  it('a graph model laid out as a sheet derives the same model back', () => {
    const node = fc.constantFrom('gnd', 'a', 'b', 'c', 'd');
    const two = fc.tuple(node, node).filter(([a, b]) => a !== b);
    const element = (i: number): fc.Arbitrary<GraphElement> =>
      fc.oneof(
        two.map(([a, b]) => ({ id: `R${i}`, kind: 'resistor' as const, nodes: [a, b] as [string, string], ohms: 10 })),
        two.map(([a, b]) => ({ id: `L${i}`, kind: 'inductor' as const, nodes: [a, b] as [string, string], henries: 0.1, dot: 'second' as const })),
        two.map(([a, b]) => ({ id: `V${i}`, kind: 'voltage-source' as const, nodes: [a, b] as [string, string], magnitude: 5, phaseDeg: 30 })),
      );
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 6 }).chain((n) => fc.tuple(...Array.from({ length: n }, (_, i) => element(i)))), (elements) => {
        const model: GraphModel = { schema: 'coilwright.graph/1', frequencyHz: 60, amplitudes: 'peak', ground: 'gnd', elements };
        const back = sheetToGraph(graphToSheet(model));
        expect(back.elements).toEqual(elements);
        expect(back.amplitudes).toBe('peak');
      }),
      { numRuns: 100 },
    );
  });
});
