/** Example: a 100 A current transformer (1 : 100 turns) with its burden resistor. */
import { at, sheetBuilder } from './builder';

export function currentTransformerSheet() {
  const b = sheetBuilder('Current transformer 100 A : 1 A with burden', 50);
  const top = 100, bottom = 300;
  const i1 = b.part('isource', 'I1', 100, 200, { value: 100, phaseDeg: 0, rot: 3 });
  const l1 = b.part('winding', 'L1', 280, 200, { value: 10e-6, dot: 'first' });
  // inductance goes with turns squared: 100 turns → 10⁴ × the one-turn primary
  const l2 = b.part('winding', 'L2', 420, 200, { value: 0.1, dot: 'first', rot: 3, mirror: true });
  const rw = b.part('resistor', 'R1', 540, top, { value: 0.3 });
  const rb = b.part('resistor', 'R2', 660, 200, { value: 1, rot: 1 });
  b.part('ground', '', 100, bottom);
  b.part('ground', '', 540, bottom);
  b.part('label', '', 660, top, { name: 'burden' });
  b.wire(b.pin(i1, 1), at(100, top), at(280, top), b.pin(l1, 0));
  b.wire(b.pin(i1, 0), at(100, bottom));
  b.wire(b.pin(l1, 1), at(280, bottom), at(100, bottom));
  b.wire(b.pin(l2, 0), at(420, top), b.pin(rw, 0));
  b.wire(b.pin(rw, 1), at(660, top), b.pin(rb, 0));
  b.wire(b.pin(l2, 1), at(420, bottom), at(660, bottom), b.pin(rb, 1));
  b.couple('K1', [l1, l2], 0.9995);
  return b.sheet;
}
