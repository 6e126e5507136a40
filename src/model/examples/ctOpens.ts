/**
 * Example: the 1:1000 current transformer of the burden example (100 A bus
 * bar, 20 µH one turn, 20 H secondary, k = 0.999, 4 Ω winding), now with
 * 4.7 nF of stray capacitance across its terminals (winding and leads) and a
 * switch in series with the 1 Ω burden that opens at 25 ms, at the crest of
 * the secondary current. The secondary current then has nowhere to go but
 * the stray capacitance: the secondary rings at 1/(2π·√(Ls·C)) ≈ 519 Hz with
 * a crest of about i·√(Ls/C) ≈ 9 kV on a linear core (energy ½·Ls·i² handed
 * to ½·C·v², derived by hand), on top of the ω·M·I of the open secondary. A
 * real core saturates and clips it into kilovolt spikes each half cycle: a
 * CT secondary is shorted before its burden is removed (common practice).
 * The bus current is a sine from t = 0 (phase −90°: it starts at zero).
 * The graph file examples/graphs/current-transformer-burden-opens.json is
 * written from this sheet.
 */
import type { Sheet } from '../sheet';
import { at, sheetBuilder } from './builder';
import { ctParts, ctPrimaryWires } from './currentTransformer';

/** the instant the burden switch opens, seconds: the crest of a 50 Hz sine starting at zero, one period on */
export const CT_OPENS_AT_S = 0.025;

export function currentTransformerOpensSheet(): Sheet {
  const b = sheetBuilder('Current transformer whose burden is opened under load (100 A : 0.1 A)', 50);
  const top = 100, bottom = 300;
  const { i1, l1, l2 } = ctParts(b, -90);
  const rw = b.part('resistor', 'Rsec', 540, top, { value: 4 });
  const cs = b.part('capacitor', 'Cstray', 640, 200, { value: 4.7e-9, rot: 1 });
  const sw = b.part('switch', 'Sburden', 740, top, { closed: true, togglesS: [CT_OPENS_AT_S] });
  const rb = b.part('resistor', 'Rburden', 840, 200, { value: 1, rot: 1 });
  b.part('ground', '', 100, bottom);
  b.part('ground', '', 540, bottom);
  b.part('label', '', 590, top, { name: 'terminal' });
  ctPrimaryWires(b, i1, l1);
  b.wire(b.pin(l2, 0), at(420, top), b.pin(rw, 0));
  b.wire(b.pin(rw, 1), at(640, top), b.pin(cs, 0));
  b.wire(at(640, top), b.pin(sw, 0));
  b.wire(b.pin(sw, 1), at(840, top), b.pin(rb, 0));
  b.wire(b.pin(l2, 1), at(420, bottom), at(640, bottom), b.pin(cs, 1));
  b.wire(at(640, bottom), at(840, bottom), b.pin(rb, 1));
  b.couple([l1, l2], 0.999);
  return b.sheet;
}
