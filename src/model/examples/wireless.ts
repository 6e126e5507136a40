/**
 * Example: a wireless-charging pad and vehicle coil (60 µH each, k = 0.2)
 * with series compensation capacitors tuned near 85 kHz and an 8 Ω battery
 * load. The graph file examples/graphs/wireless-charging-85khz.json is
 * written from this sheet.
 */
import type { Part } from '../sheet';
import { at, sheetBuilder } from './builder';

export function wirelessPairSheet() {
  return tunedPairSheet('Wireless charging pair, series-series tuned at 85 kHz', { value: 50, phaseDeg: 0 });
}

/** The inverter's DC bus: a full bridge drives the pad with ±SQUARE_BUS_V. */
export const SQUARE_BUS_V = 50;

/**
 * Example: the same tuned pair driven from rest by a full-bridge inverter, a
 * ±50 V square wave at 85 kHz (zero-length edges), high for the first half of
 * each period. Its fundamental is (4/π)·50 V peak = 45.02 V rms (Fourier
 * series of a square wave, standard result), a sine lagging the cosine
 * reference by 90°; that fundamental is the source's phasor, so the phasor
 * view shows the steady state the time response settles into.
 */
export function wirelessSquareDriveSheet() {
  const fundamentalRms = (4 / Math.PI) * SQUARE_BUS_V / Math.SQRT2;
  return tunedPairSheet('Wireless charging pair driven by a square wave from rest (85 kHz)', {
    value: fundamentalRms,
    phaseDeg: -90,
    waveform: { shape: 'square', low: -SQUARE_BUS_V, high: SQUARE_BUS_V, frequencyHz: 85e3 },
  });
}

function tunedPairSheet(title: string, source: Partial<Part>) {
  // tuned exactly: series resonance ω0 = 1/sqrt(LC) at 85 kHz (about 58.43 nF with 60 µH)
  const C = 1 / ((2 * Math.PI * 85e3) ** 2 * 60e-6);
  const b = sheetBuilder(title, 85e3);
  const top = 100, bottom = 300;
  const v = b.part('vsource', 'Vinv', 100, 200, source);
  const cp = b.part('capacitor', 'Cp', 200, top, { value: C });
  const rcp = b.part('resistor', 'Rcp', 300, top, { value: 0.05 });
  const l1 = b.part('winding', 'Lpad', 400, 200, { value: 60e-6, dot: 'first' });
  const l2 = b.part('winding', 'Lveh', 540, 200, { value: 60e-6, dot: 'first', rot: 3, mirror: true });
  const rcs = b.part('resistor', 'Rcs', 640, top, { value: 0.05 });
  const cs = b.part('capacitor', 'Cs', 740, top, { value: C });
  const rl = b.part('resistor', 'Rbat', 850, 200, { value: 8, rot: 1 });
  b.part('ground', '', 100, bottom);
  b.wire(b.pin(v, 0), at(100, top), b.pin(cp, 0));
  b.wire(b.pin(cp, 1), b.pin(rcp, 0));
  b.wire(b.pin(rcp, 1), at(400, top), b.pin(l1, 0));
  b.wire(b.pin(v, 1), at(100, bottom));
  b.wire(b.pin(l1, 1), at(400, bottom), at(100, bottom));
  b.wire(b.pin(l2, 0), at(540, top), b.pin(rcs, 0));
  b.wire(b.pin(rcs, 1), b.pin(cs, 0));
  b.wire(b.pin(cs, 1), at(850, top), b.pin(rl, 0));
  b.wire(b.pin(l2, 1), at(540, bottom), at(850, bottom), b.pin(rl, 1));
  b.couple([l1, l2], 0.2);
  return b.sheet;
}
