/**
 * Example: one 230 V / 50 Hz supply switched onto two identical unloaded
 * transformers, one at the crest of the wave (t = 0) and one at its zero
 * crossing (t = 5 ms, the sine's startS). Linear core: 4 H magnetising
 * inductance, 4 Ω primary winding, 30 kΩ core-loss resistance, secondary open.
 * Switched in at the zero, the magnetising current starts with an offset
 * equal to its steady-state peak and so reaches about twice that peak, the
 * offset decaying with τ = Lp/(Rp ∥ Rcore), about 1 s; switched in at the
 * crest it starts in its steady state (standard result, from memory). A real
 * core saturates on that offset flux and draws many times more. The graph
 * file examples/graphs/transformer-switch-in-230v.json is written from this sheet.
 */
import type { Sheet } from '../sheet';
import { at, sheetBuilder } from './builder';

/** the mains crest, volts: 230 V rms */
const CREST = 230 * Math.SQRT2;

export function transformerSwitchInSheet(): Sheet {
  const b = sheetBuilder('Transformer switched in at the crest and at the zero of the mains (230 V, 50 Hz)', 50);
  const top = 100, bottom = 300;
  const side = (dx: number, tag: string, startS: number) => {
    const v = b.part('vsource', `V${tag}`, 100 + dx, 200, {
      value: 230, phaseDeg: 0,
      waveform: { shape: 'sine', amplitude: CREST, frequencyHz: 50, startS },
    });
    const rp = b.part('resistor', `Rp${tag}`, 210 + dx, top, { value: 4 });
    const rc = b.part('resistor', `Rcore${tag}`, 320 + dx, 200, { value: 30e3, rot: 1 });
    const lp = b.part('winding', `Lp${tag}`, 430 + dx, 200, { value: 4, dot: 'first' });
    const ls = b.part('winding', `Ls${tag}`, 570 + dx, 200, { value: 4, dot: 'first', rot: 3, mirror: true });
    b.part('label', '', 570 + dx, top, { name: `open_${tag.toLowerCase()}` });
    b.wire(b.pin(v, 0), at(100 + dx, top), b.pin(rp, 0));
    b.wire(b.pin(rp, 1), at(320 + dx, top), b.pin(rc, 0));
    b.wire(at(320 + dx, top), at(430 + dx, top), b.pin(lp, 0));
    b.wire(b.pin(v, 1), at(100 + dx, bottom));
    b.wire(b.pin(rc, 1), at(320 + dx, bottom), at(100 + dx, bottom));
    b.wire(b.pin(lp, 1), at(430 + dx, bottom), at(320 + dx, bottom));
    b.wire(b.pin(ls, 0), at(570 + dx, top));
    b.couple([lp, ls], 0.998);
  };
  side(0, 'crest', 0);
  side(600, 'zero', 0.005);
  b.part('ground', '', 100, bottom);
  b.part('ground', '', 700, bottom);
  return b.sheet;
}
