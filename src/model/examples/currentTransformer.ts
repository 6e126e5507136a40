/**
 * Example: a 100 A bus bar through a 1:1000 current transformer (20 µH one
 * turn, 20 H secondary: inductance goes with turns squared), 4 Ω secondary
 * winding, 1 Ω burden. The graph file
 * examples/graphs/current-transformer-burden.json is written from this sheet.
 */
import type { Part } from '../sheet';
import { at, sheetBuilder } from './builder';

type Builder = ReturnType<typeof sheetBuilder>;

/** The bus bar (a 100 A rms current source at the given phase) and the CT's two windings. */
export function ctParts(b: Builder, phaseDeg: number) {
  const i1 = b.part('isource', 'Iline', 100, 200, { value: 100, phaseDeg, rot: 3 });
  const l1 = b.part('winding', 'Lbar', 280, 200, { value: 20e-6, dot: 'first' });
  const l2 = b.part('winding', 'Lsec', 420, 200, { value: 20, dot: 'first', rot: 3, mirror: true });
  return { i1, l1, l2 };
}

/** The bus bar's loop through the one-turn primary. */
export function ctPrimaryWires(b: Builder, i1: Part, l1: Part) {
  const top = 100, bottom = 300;
  b.wire(b.pin(i1, 1), at(100, top), at(280, top), b.pin(l1, 0));
  b.wire(b.pin(i1, 0), at(100, bottom));
  b.wire(b.pin(l1, 1), at(280, bottom), at(100, bottom));
}

export function currentTransformerSheet() {
  const b = sheetBuilder('Current transformer 100 A : 0.1 A with burden', 50);
  const top = 100, bottom = 300;
  const { i1, l1, l2 } = ctParts(b, 0);
  const rw = b.part('resistor', 'Rsec', 540, top, { value: 4 });
  const rb = b.part('resistor', 'Rburden', 660, 200, { value: 1, rot: 1 });
  b.part('ground', '', 100, bottom);
  b.part('ground', '', 540, bottom);
  b.part('label', '', 660, top, { name: 'burden' });
  ctPrimaryWires(b, i1, l1);
  b.wire(b.pin(l2, 0), at(420, top), b.pin(rw, 0));
  b.wire(b.pin(rw, 1), at(660, top), b.pin(rb, 0));
  b.wire(b.pin(l2, 1), at(420, bottom), at(660, bottom), b.pin(rb, 1));
  b.couple([l1, l2], 0.999);
  return b.sheet;
}
