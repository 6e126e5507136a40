import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { layoutPhasors, overlaps, segmentHitsBox } from '../../../src/ui/analysis/phasorLayout';

const R = 130;
const bounds = { x0: -R - 118, y0: -R - 22, x1: R + 118, y1: R + 22 };

describe('phasor diagram layout', () => {
  it('clips a segment against a box as geometry says', () => {
    const box = { x0: 0, y0: 0, x1: 10, y1: 10 };
    expect(segmentHitsBox(-5, 5, 15, 5, box)).toBe(true); // passes through (geometry)
    expect(segmentHitsBox(-5, -5, -1, 20, box)).toBe(false); // wholly left of it
    expect(segmentHitsBox(5, 5, 6, 6, box)).toBe(true); // wholly inside
  });
  it('draws a short phasor longer than its head and keeps its true tip', () => {
    const [p] = layoutPhasors([{ x: 2, y: -1, label: 'I(R1) ∠26.6°', width: 60 }], { minLength: 30, axis: R + 10, bounds });
    expect(p.lengthened).toBe(true);
    expect(Math.hypot(p.tip.x, p.tip.y)).toBeCloseTo(30, 9);
    expect(Math.atan2(p.tip.y, p.tip.x)).toBeCloseTo(Math.atan2(-1, 2), 12); // same direction (geometry)
    expect(p.trueTip).toEqual({ x: 2, y: -1 });
  });
  it('puts no label over another, over an arrow or over an axis, for any set of phasors', () => {
    fc.assert(fc.property(fc.array(fc.tuple(fc.double({ min: -R, max: R, noNaN: true }), fc.double({ min: -R, max: R, noNaN: true }), fc.integer({ min: 30, max: 100 })), { minLength: 1, maxLength: 6 }), (ps) => {
      const items = ps.map(([x, y, w], i) => ({ x, y, width: w, label: `p${i}` }));
      const placed = layoutPhasors(items, { minLength: 30, axis: R + 10, bounds });
      const boxes = placed.map((p) => p.label).filter((b): b is NonNullable<typeof b> => !!b);
      for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) expect(overlaps(boxes[i], boxes[j])).toBe(false);
      for (const b of boxes) {
        expect(segmentHitsBox(-R - 10, 0, R + 10, 0, b)).toBe(false);
        expect(segmentHitsBox(0, -R - 10, 0, R + 10, b)).toBe(false);
        for (const p of placed) if (p.tip.x || p.tip.y) expect(segmentHitsBox(0, 0, p.tip.x, p.tip.y, b)).toBe(false);
        expect(b.x0 >= bounds.x0 && b.x1 <= bounds.x1 && b.y0 >= bounds.y0 && b.y1 <= bounds.y1).toBe(true);
      }
    }), { seed: 12, numRuns: 300 });
  });
});
