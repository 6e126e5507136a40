/**
 * Demo: a 250 VA, 400 V / 24 V, 50 Hz control transformer entered per unit
 * (values of our own): impedance voltage 6 %, load loss 10 W, no-load current
 * 8 %, no-load loss 6 W; it feeds a 200 VA contactor-coil load at power factor
 * 0.6 lagging. Caution: the 400 V primary kills; this is a linear study model,
 * and wiring or testing a control panel follows local electrical codes and
 * licensed practice. The graph file examples/graphs/control-transformer-per-unit.json
 * is written from this sheet.
 */
import type { PowerSpec } from '../powerTransformer';
import { at, lagging, transformerFeed } from './builder';

export const CONTROL_SPEC: PowerSpec = {
  form: 'perUnit',
  expansion: 'ratio',
  rating: { va: 250, v1: 400, v2: 24, hz: 50 },
  perUnit: { ukPct: 6, byXr: false, xr: 0, loadLossW: 10, i0Pct: 8, p0W: 6 },
};

/** 200 VA at 24 V, power factor 0.6 lagging: |Z| = 24² / 200. */
export const COIL_LOAD = lagging((24 * 24) / 200, 0.6, 50);

export function controlTransformerSheet() {
  const { b, t, top, bottom } = transformerFeed('Control transformer 250 VA, 400 V / 24 V, per unit',
    'The 400 V primary kills: local codes and licensed practice apply', 'Vsupply', 400, CONTROL_SPEC);
  const r = b.part('resistor', 'Rcoils', 560, 170, { value: COIL_LOAD.ohms, rot: 1 });
  const l = b.part('winding', 'Lcoils', 560, 250, { value: COIL_LOAD.henries });
  b.wire(b.pin(t, 2), at(450, top), at(560, top), b.pin(r, 0));
  b.wire(b.pin(r, 1), b.pin(l, 0));
  b.wire(b.pin(l, 1), at(560, bottom), at(450, bottom));
  return b.sheet;
}
