/**
 * Demo: a single-phase 25 kVA, 11 kV / 240 V, 50 Hz distribution transformer
 * entered from its nameplate and its two tests (values of our own): no-load
 * on the low-voltage side at 240 V, 2.2 A, 95 W; short circuit on the
 * high-voltage side at rated current 2.273 A, 440 V, 380 W. The load is two
 * equal halves of the rated-load impedance at power factor 0.8 lagging; the
 * switch in the second half sets full load (closed) or half load (open).
 * Caution: 11 kV and 240 V kill. This is a linear study model; building,
 * testing or switching such equipment follows local electrical codes and
 * licensed practice. The graph file examples/graphs/distribution-transformer-25kva.json
 * is written from this sheet.
 */
import { specFromTests, type PowerSpec } from '../powerTransformer';
import { at, lagging, transformerFeed } from './builder';

export const DISTRIBUTION_SPEC: PowerSpec = specFromTests({ va: 25e3, v1: 11e3, v2: 240, hz: 50 }, [240, 2.2, 95, 'secondary'], [440, 25e3 / 11e3, 380, 'primary']);

/** Each half of the load: twice the rated-load impedance (240² / 25 kVA) at power factor 0.8 lagging. */
export const HALF_LOAD = lagging((2 * 240 * 240) / 25e3, 0.8, 50);

export function distributionTransformerSheet() {
  const { b, t, top, bottom } = transformerFeed('Distribution transformer 25 kVA, 11 kV / 240 V, from its tests',
    'Full load with the switch closed, half load open. 11 kV and 240 V kill: local codes and licensed practice apply', 'Vhv', 11e3, DISTRIBUTION_SPEC);
  const ra = b.part('resistor', 'Rload1', 560, 170, { value: HALF_LOAD.ohms, rot: 1 });
  const la = b.part('winding', 'Lload1', 560, 250, { value: HALF_LOAD.henries });
  const sw = b.part('switch', 'Shalf', 620, top, { closed: true });
  const rb = b.part('resistor', 'Rload2', 680, 170, { value: HALF_LOAD.ohms, rot: 1 });
  const lb = b.part('winding', 'Lload2', 680, 250, { value: HALF_LOAD.henries });
  b.wire(b.pin(t, 2), at(450, top), at(560, top), b.pin(ra, 0));
  b.wire(at(560, top), b.pin(sw, 0));
  b.wire(b.pin(sw, 1), at(680, top), b.pin(rb, 0));
  b.wire(b.pin(ra, 1), b.pin(la, 0));
  b.wire(b.pin(rb, 1), b.pin(lb, 0));
  b.wire(b.pin(la, 1), at(560, bottom), at(450, bottom));
  b.wire(b.pin(lb, 1), at(680, bottom), at(560, bottom));
  return b.sheet;
}
