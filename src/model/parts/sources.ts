/**
 * Sources, IEC 60617 style: a circle; the voltage source has a line through
 * it along the leads, the current source a line across them. Pin 0 is the
 * reference terminal (+ for voltage, arrow tail for current). A source carries
 * its phasor (magnitude and phase) and, for the time response, may carry a
 * waveform.
 */
import type { CurrentSourceEl, VoltageSourceEl } from '../graph';
import { formatSI } from '../quantity';
import type { Part } from '../sheet';
import { waveformText } from '../waveformFields';
import { anyFinite, nonNegative, type PartDef, type Prim } from './types';

const PINS = [{ x: -30, y: 0 }, { x: 30, y: 0 }];
const ICON = { box: { x0: -32, y0: -20, x1: 32, y1: 20 }, stroke: 2.2 };
const phase = (deg: number | undefined) => (deg ? `∠${Number(deg.toFixed(2))}°` : '');
/** the phasor, and the waveform's shape when one is set (the phasor analyses use the phasor, the time response the waveform) */
const sourceText = (p: Part, unit: string) => `${formatSI(p.value ?? 0, unit, 3)}${phase(p.phaseDeg)}${p.waveform ? ` · ${waveformText(p.waveform, unit)}` : ''}`;
const withWaveform = (p: Part) => (p.waveform ? { waveform: p.waveform } : {});
const waveformOf = (el: VoltageSourceEl | CurrentSourceEl) => (el.waveform ? { waveform: el.waveform } : {});

export const vsource: PartDef = {
  kind: 'vsource', label: 'AC voltage source', shelfKey: '4', icon: ICON, prefix: 'V', pins: PINS, source: true,
  box: { x0: -30, y0: -16, x1: 30, y1: 16 }, defaultRot: 1,
  defaults: { value: 10, phaseDeg: 0 },
  fields: [
    { key: 'value', label: 'Magnitude', unit: 'V', check: nonNegative('Magnitude') },
    { key: 'phaseDeg', label: 'Phase', unit: '°', check: anyFinite('The phase') },
  ],
  draw: (_p, style) => [
    ...(style === 'ieee'
      ? ([
          // IEEE 315: a circle with a sine wave inside
          { t: 'line', p: [-30, 0, -15, 0] },
          { t: 'line', p: [15, 0, 30, 0] },
          { t: 'circle', x: 0, y: 0, r: 15 },
          { t: 'arc', x: -4, y: 0, r: 4, a0: Math.PI, a1: 2 * Math.PI },
          { t: 'arc', x: 4, y: 0, r: 4, a0: 0, a1: Math.PI },
        ] as Prim[])
      : ([
          // IEC 60617: a circle with the conductor drawn through it, and ~ for AC
          { t: 'line', p: [-30, 0, 30, 0] },
          { t: 'circle', x: 0, y: 0, r: 15 },
          { t: 'arc', x: -3, y: 9, r: 3, a0: Math.PI, a1: 2 * Math.PI },
          { t: 'arc', x: 3, y: 9, r: 3, a0: 0, a1: Math.PI },
        ] as Prim[])),
    { t: 'line', p: [-26, -12, -20, -12] },
    { t: 'line', p: [-23, -15, -23, -9] },
  ],
  valueText: (p) => sourceText(p, 'V'),
  toElement: (p, n) => ({ id: p.ref, kind: 'voltage-source', nodes: [n[0], n[1]], magnitude: p.value ?? 0, phaseDeg: p.phaseDeg ?? 0, ...withWaveform(p) }),
  fromElement: { kind: 'voltage-source', values: (el) => ({ value: (el as VoltageSourceEl).magnitude, phaseDeg: (el as VoltageSourceEl).phaseDeg, ...waveformOf(el as VoltageSourceEl) }) },
  editor: 'waveform',
};

export const isource: PartDef = {
  kind: 'isource', label: 'AC current source', shelfKey: '5', icon: ICON, prefix: 'I', pins: PINS, source: true,
  box: { x0: -30, y0: -24, x1: 30, y1: 16 }, defaultRot: 1,
  defaults: { value: 1, phaseDeg: 0 },
  fields: [
    { key: 'value', label: 'Magnitude', unit: 'A', check: nonNegative('Magnitude') },
    { key: 'phaseDeg', label: 'Phase', unit: '°', check: anyFinite('The phase') },
  ],
  draw: (_p, style) =>
    style === 'ieee'
      ? [
          // IEEE 315: a circle with the arrow of the reference direction inside
          { t: 'line', p: [-30, 0, -15, 0] },
          { t: 'line', p: [15, 0, 30, 0] },
          { t: 'circle', x: 0, y: 0, r: 15 },
          { t: 'line', p: [-9, 0, 5, 0] },
          { t: 'poly', p: [10, 0, 3, -4, 3, 4], fill: true },
        ]
      : [
          // IEC 60617: a circle with a line across the conductor; the arrow beside it
          { t: 'line', p: [-30, 0, -15, 0] },
          { t: 'line', p: [15, 0, 30, 0] },
          { t: 'circle', x: 0, y: 0, r: 15 },
          { t: 'line', p: [0, -15, 0, 15] },
          { t: 'line', p: [-10, -21, 8, -21] },
          { t: 'poly', p: [12, -21, 5, -24.5, 5, -17.5], fill: true },
        ],
  valueText: (p) => sourceText(p, 'A'),
  toElement: (p, n) => ({ id: p.ref, kind: 'current-source', nodes: [n[0], n[1]], magnitude: p.value ?? 0, phaseDeg: p.phaseDeg ?? 0, ...withWaveform(p) }),
  fromElement: { kind: 'current-source', values: (el) => ({ value: (el as CurrentSourceEl).magnitude, phaseDeg: (el as CurrentSourceEl).phaseDeg, ...waveformOf(el as CurrentSourceEl) }) },
  editor: 'waveform',
};
