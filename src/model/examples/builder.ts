/** A small helper to write example sheets by hand. */
import { elbow } from '../wires';
import type { QuarterTurns, Point } from '../geometry';
import { newId } from '../ids';
import { PART_DEFS, pinPositions } from '../parts/registry';
import { emptySheet, type Part, type PartKind, type Sheet } from '../sheet';
import type { PowerSpec } from '../powerTransformer';

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

/**
 * A practical transformer T1 at (400, 210) fed by a voltage source at (200, 210),
 * both grounded on the rail at y = 320; returns the transformer and the rails
 * its secondary load hangs between (top y = 100 from its dotted pin, bottom y = 320).
 */
export function transformerFeed(title: string, subtitle: string, sourceRef: string, volts: number, spec: PowerSpec) {
  const b = sheetBuilder(title, spec.rating.hz);
  b.sheet.titleBlock.subtitle = subtitle;
  const top = 100, bottom = 320;
  const v = b.part('vsource', sourceRef, 200, 210, { value: volts, phaseDeg: 0 });
  const t = b.part('power', 'T1', 400, 210, { power: spec });
  b.part('ground', '', 200, bottom);
  b.part('ground', '', 450, bottom);
  b.wire(b.pin(v, 0), at(200, 180), b.pin(t, 0));
  b.wire(b.pin(v, 1), at(200, bottom));
  b.wire(b.pin(t, 1), at(350, bottom), at(200, bottom));
  b.wire(b.pin(t, 3), at(450, bottom));
  return { b, t, top, bottom };
}

/** A load of impedance |z| at power factor pf lagging, as a series R and L at hz. */
export function lagging(z: number, pf: number, hz: number): { ohms: number; henries: number } {
  return { ohms: pf * z, henries: (Math.sqrt(1 - pf * pf) * z) / (2 * Math.PI * hz) };
}
