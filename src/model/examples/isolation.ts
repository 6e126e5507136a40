/** Demo: a bench isolation transformer (230 V, 50 Hz) with winding resistances feeding an R‖C load. */
import { at, sheetBuilder } from './builder';

export function isolationTransformerSheet() {
  const b = sheetBuilder('Bench isolation transformer, 230 V 50 Hz', 50);
  const top = 100, bottom = 300;
  const v1 = b.part('vsource', 'V1', 100, 200, { value: 230, phaseDeg: 0 });
  const rp = b.part('resistor', 'R1', 220, top, { value: 1.8 });
  const lp = b.part('winding', 'L1', 330, 200, { value: 2.5, dot: 'first' });
  const ls = b.part('winding', 'L2', 470, 200, { value: 2.5, dot: 'first', rot: 3, mirror: true });
  const rs = b.part('resistor', 'R2', 580, top, { value: 1.8 });
  const rl = b.part('resistor', 'R3', 690, 200, { value: 100, rot: 1 });
  const cl = b.part('capacitor', 'C1', 830, 200, { value: 10e-6, rot: 1 });
  b.part('ground', '', 100, bottom);
  b.wire(b.pin(v1, 0), at(100, top), b.pin(rp, 0));
  b.wire(b.pin(rp, 1), at(330, top), b.pin(lp, 0));
  b.wire(b.pin(v1, 1), at(100, bottom));
  b.wire(b.pin(lp, 1), at(330, bottom), at(100, bottom));
  b.wire(b.pin(ls, 0), at(470, top), b.pin(rs, 0));
  b.wire(b.pin(rs, 1), at(690, top), b.pin(rl, 0));
  b.wire(at(690, top), at(830, top), b.pin(cl, 0));
  b.wire(b.pin(ls, 1), at(470, bottom), at(830, bottom), b.pin(cl, 1));
  b.wire(b.pin(rl, 1), at(690, bottom));
  b.couple('K1', [lp, ls], 0.995);
  return b.sheet;
}
