/** Example: a wireless-charging coil pair with series compensation capacitors, tuned near 85 kHz. */
import { at, sheetBuilder } from './builder';

export function wirelessPairSheet() {
  const f = 85e3;
  const L = 60e-6;
  const C = 1 / ((2 * Math.PI * f) ** 2 * L); // series resonance ω0 = 1/sqrt(LC)
  const b = sheetBuilder('Wireless charging pair, series-series tuned at 85 kHz', f);
  const top = 100, bottom = 300;
  const v1 = b.part('vsource', 'V1', 100, 200, { value: 100, phaseDeg: 0 });
  const c1 = b.part('capacitor', 'C1', 200, top, { value: C });
  const r1 = b.part('resistor', 'R1', 300, top, { value: 0.05 });
  const l1 = b.part('winding', 'L1', 400, 200, { value: L, dot: 'first' });
  const l2 = b.part('winding', 'L2', 540, 200, { value: L, dot: 'first', rot: 3, mirror: true });
  const c2 = b.part('capacitor', 'C2', 640, top, { value: C });
  const r2 = b.part('resistor', 'R2', 740, top, { value: 0.05 });
  const rl = b.part('resistor', 'R3', 850, 200, { value: 8, rot: 1 });
  b.part('ground', '', 100, bottom);
  b.wire(b.pin(v1, 0), at(100, top), b.pin(c1, 0));
  b.wire(b.pin(c1, 1), b.pin(r1, 0));
  b.wire(b.pin(r1, 1), at(400, top), b.pin(l1, 0));
  b.wire(b.pin(v1, 1), at(100, bottom));
  b.wire(b.pin(l1, 1), at(400, bottom), at(100, bottom));
  b.wire(b.pin(l2, 0), at(540, top), b.pin(c2, 0));
  b.wire(b.pin(c2, 1), b.pin(r2, 0));
  b.wire(b.pin(r2, 1), at(850, top), b.pin(rl, 0));
  b.wire(b.pin(l2, 1), at(540, bottom), at(850, bottom), b.pin(rl, 1));
  b.couple('K1', [l1, l2], 0.2);
  return b.sheet;
}
