/** Resistor, winding and capacitor: two pins at (-30,0) and (30,0). */
import { toSheet } from '../geometry';
import type { CapacitorEl, InductanceArmEl, InductorEl, ResistorEl } from '../graph';
import { formatSI } from '../quantity';
import { anyFinite, positive, turns, type PartDef } from './types';

const PINS = [{ x: -30, y: 0 }, { x: 30, y: 0 }];
const ICON = { box: { x0: -32, y0: -20, x1: 32, y1: 20 }, stroke: 2.2 };

export const resistor: PartDef = {
  kind: 'resistor', label: 'Resistor', shelfKey: '1', icon: ICON, prefix: 'R', pins: PINS,
  box: { x0: -30, y0: -8, x1: 30, y1: 8 }, defaultRot: 0,
  defaults: { value: 100 },
  fields: [{ key: 'value', label: 'Resistance', unit: 'Ω', check: positive('Resistance') }],
  draw: (_p, style) =>
    style === 'ieee'
      ? [{ t: 'line', p: [-30, 0, -15, 0, -12.5, -6, -7.5, 6, -2.5, -6, 2.5, 6, 7.5, -6, 12.5, 6, 15, 0, 30, 0] }] // zigzag (IEEE 315)
      : [
          { t: 'line', p: [-30, 0, -15, 0] },
          { t: 'rect', x: -15, y: -6, w: 30, h: 12 }, // rectangle (IEC 60617)
          { t: 'line', p: [15, 0, 30, 0] },
        ],
  valueText: (p) => formatSI(p.value ?? 0, 'Ω', 3),
  toElement: (p, n) => ({ id: p.ref, kind: 'resistor', nodes: [n[0], n[1]], ohms: p.value ?? 0 }),
  fromElement: { kind: 'resistor', values: (el) => ({ value: (el as ResistorEl).ohms }) },
};

export const winding: PartDef = {
  kind: 'winding', label: 'Winding', shelfKey: '2', icon: ICON, prefix: 'L', pins: PINS,
  box: { x0: -30, y0: -12, x1: 30, y1: 4 }, defaultRot: 1,
  defaults: { value: 0.01, dot: 'first', initialAmps: 0 },
  fields: [
    { key: 'value', label: 'Inductance', unit: 'H', check: positive('Inductance') },
    { key: 'initialAmps', label: 'Initial current i(0)', unit: 'A', check: anyFinite('Initial current'), hint: 'at t = 0, from the first terminal to the second through it (the time response starts from it)' },
  ],
  draw: () => [
    { t: 'line', p: [-30, 0, -20, 0] },
    ...turns(-20, 0),
    { t: 'line', p: [20, 0, 30, 0] },
  ],
  valueText: (p) => formatSI(p.value ?? 0, 'H', 3),
  toElement: (p, n) => ({ id: p.ref, kind: 'inductor', nodes: [n[0], n[1]], henries: p.value ?? 0, dot: p.dot ?? 'first', ...(p.initialAmps ? { initialAmps: p.initialAmps } : {}) }),
  dotAt: (p) => ({ x: p.dot === 'second' ? 24 : -24, y: -9 }),
  marks: (p) => {
    const d = toSheet(p, p.dot === 'second' ? 24 : -24, -9);
    return [{ t: 'dot', x: d.x, y: d.y, r: 2.8, role: 'polarity-dot' }];
  },
  fromElement: { kind: 'inductor', values: (el) => ({ value: (el as InductorEl).henries, dot: (el as InductorEl).dot ?? 'first', initialAmps: (el as InductorEl).initialAmps ?? 0 }) },
  couplable: true,
};

/** An arm of an equivalent circuit: boxed turns mark an inductance for analysis only (it may be negative). */
export const arm: PartDef = {
  kind: 'arm', label: 'Equivalent arm', shelfKey: '', icon: ICON, prefix: 'Leq', pins: PINS,
  box: { x0: -30, y0: -12, x1: 30, y1: 6 }, defaultRot: 1,
  defaults: { value: 0.001 },
  fields: [{ key: 'value', label: 'Inductance (may be negative)', unit: 'H', check: anyFinite('The inductance') }],
  draw: () => [
    { t: 'line', p: [-30, 0, -20, 0] },
    ...turns(-20, 0),
    { t: 'line', p: [20, 0, 30, 0] },
    { t: 'rect', x: -23, y: -10, w: 46, h: 14 },
  ],
  // the precision of the tables: an arm of 11.96 H reads 11.96 H, not 12 H
  valueText: (p) => `${formatSI(p.value ?? 0, 'H', 4)} (equivalent)`,
  toElement: (p, n) => ({ id: p.ref, kind: 'inductance-arm', nodes: [n[0], n[1]], henries: p.value ?? 0 }),
  fromElement: { kind: 'inductance-arm', values: (el) => ({ value: (el as InductanceArmEl).henries }) },
};

export const capacitor: PartDef = {
  kind: 'capacitor', label: 'Capacitor', shelfKey: '3', icon: ICON, prefix: 'C', pins: PINS,
  box: { x0: -30, y0: -13, x1: 30, y1: 13 }, defaultRot: 0,
  defaults: { value: 1e-6, initialVolts: 0 },
  fields: [
    { key: 'value', label: 'Capacitance', unit: 'F', check: positive('Capacitance') },
    { key: 'initialVolts', label: 'Initial voltage v(0)', unit: 'V', check: anyFinite('Initial voltage'), hint: 'at t = 0, the first terminal against the second (the time response starts from it)' },
  ],
  draw: () => [
    { t: 'line', p: [-30, 0, -4, 0] },
    { t: 'line', p: [-4, -12, -4, 12] },
    { t: 'line', p: [4, -12, 4, 12] },
    { t: 'line', p: [4, 0, 30, 0] },
  ],
  valueText: (p) => formatSI(p.value ?? 0, 'F', 3),
  toElement: (p, n) => ({ id: p.ref, kind: 'capacitor', nodes: [n[0], n[1]], farads: p.value ?? 0, ...(p.initialVolts ? { initialVolts: p.initialVolts } : {}) }),
  fromElement: { kind: 'capacitor', values: (el) => ({ value: (el as CapacitorEl).farads, initialVolts: (el as CapacitorEl).initialVolts ?? 0 }) },
};
