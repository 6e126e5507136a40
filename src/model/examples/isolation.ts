/**
 * Demo: a 230 V / 50 Hz 1:1 bench isolation transformer with winding
 * resistances and core loss (a resistance across the magnetising branch),
 * feeding a 105.8 Ω load on its floating secondary. The graph file
 * examples/graphs/isolation-transformer-230v.json is written from this sheet.
 */
import { at, sheetBuilder } from './builder';

export function isolationTransformerSheet() {
  const b = sheetBuilder('Bench isolation transformer, 230 V 50 Hz', 50);
  const top = 100, bottom = 300;
  const v = b.part('vsource', 'Vmains', 100, 200, { value: 230, phaseDeg: 0 });
  const rp = b.part('resistor', 'Rp', 210, top, { value: 1.8 });
  const rc = b.part('resistor', 'Rcore', 320, 200, { value: 25000, rot: 1 });
  const lp = b.part('winding', 'Lp', 430, 200, { value: 3.2, dot: 'first' });
  const ls = b.part('winding', 'Ls', 570, 200, { value: 3.2, dot: 'first', rot: 3, mirror: true });
  const rs = b.part('resistor', 'Rs', 680, top, { value: 1.8 });
  const rl = b.part('resistor', 'Rload', 790, 200, { value: 105.8, rot: 1 });
  b.part('ground', '', 100, bottom);
  b.wire(b.pin(v, 0), at(100, top), b.pin(rp, 0));
  b.wire(b.pin(rp, 1), at(320, top), b.pin(rc, 0));
  b.wire(at(320, top), at(430, top), b.pin(lp, 0));
  b.wire(b.pin(v, 1), at(100, bottom));
  b.wire(b.pin(rc, 1), at(320, bottom), at(100, bottom));
  b.wire(b.pin(lp, 1), at(430, bottom), at(320, bottom));
  b.wire(b.pin(ls, 0), at(570, top), b.pin(rs, 0));
  b.wire(b.pin(rs, 1), at(790, top), b.pin(rl, 0));
  b.wire(b.pin(ls, 1), at(570, bottom), at(790, bottom), b.pin(rl, 1));
  b.couple([lp, ls], 0.998);
  return b.sheet;
}
