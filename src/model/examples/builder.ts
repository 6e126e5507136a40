/** A small helper to write example sheets by hand. */
import { elbow } from '../wires';
import type { QuarterTurns, Point } from '../geometry';
import { newId } from '../ids';
import { PART_DEFS, pinPositions } from '../parts/registry';
import { emptySheet, type Part, type PartKind, type Sheet } from '../sheet';

export function sheetBuilder(title: string, frequencyHz: number) {
  const sheet: Sheet = { ...emptySheet(title), frequencyHz };
  return {
    sheet,
    part(kind: PartKind, ref: string, x: number, y: number, opts: Partial<Part> & { rot?: QuarterTurns } = {}): Part {
      const def = PART_DEFS[kind];
      const p: Part = { id: newId('part'), kind, x, y, rot: def.defaultRot, mirror: false, ref, ...def.defaults, ...opts };
      sheet.parts.push(p);
      return p;
    },
    pin(p: Part, i: number): Point {
      return pinPositions(p)[i];
    },
    /** a wire through the given points (each step must be orthogonal, or an elbow is made) */
    wire(...pts: Point[]): void {
      const flat: number[] = [pts[0].x, pts[0].y];
      for (let i = 1; i < pts.length; i++) {
        const seg = elbow(pts[i - 1].x, pts[i - 1].y, pts[i].x, pts[i].y);
        flat.push(...seg.slice(2));
      }
      sheet.wires.push({ id: newId('wire'), pts: flat });
    },
    couple(windings: Part[], value: number, by: 'k' | 'M' = 'k'): void {
      sheet.couplings.push({ id: newId('coupling'), windings: windings.map((w) => w.id), by, value });
    },
  };
}

export const at = (x: number, y: number): Point => ({ x, y });
