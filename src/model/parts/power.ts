/**
 * A practical two-winding transformer: one symbol on the sheet, its data in
 * one of three forms (src/model/powerTransformer.ts), and in the graph model
 * the elements of its equivalent circuit (src/model/powerExpansion.ts). Our
 * own symbol: two windings on a solid core bar, a small box on each outer
 * lead for the winding's resistance, polarity dots at the first pins of each
 * side.
 */
import { formatSI } from '../quantity';
import { expandPower } from '../powerExpansion';
import { defaultPowerSpec } from '../powerTransformer';
import { coil } from './others';
import type { PartDef, Prim } from './types';

const side = (s: 1 | -1): Prim[] => [
  { t: 'line', p: [50 * s, -30, 40 * s, -30] },
  { t: 'rect', x: s > 0 ? 26 : -40, y: -34, w: 14, h: 8 },
  { t: 'line', p: [26 * s, -30, 14 * s, -30, 14 * s, -20] },
  { t: 'line', p: [50 * s, 30, 14 * s, 30, 14 * s, 20] },
  ...coil(14 * s, s),
];

export const powerTransformer: PartDef = {
  kind: 'power', label: 'Practical transformer', shelfKey: 'x', prefix: 'T',
  icon: { box: { x0: -54, y0: -38, x1: 54, y1: 38 }, stroke: 3 }, labelBelow: true,
  pins: [{ x: -50, y: -30 }, { x: -50, y: 30 }, { x: 50, y: -30 }, { x: 50, y: 30 }],
  box: { x0: -50, y0: -36, x1: 50, y1: 34 }, defaultRot: 0,
  defaults: { power: defaultPowerSpec() },
  fields: [],
  editor: 'power',
  draw: () => [
    ...side(-1),
    ...side(1),
    { t: 'rect', x: -3, y: -22, w: 6, h: 44 },
    { t: 'line', p: [0, -22, 0, 22] },
    { t: 'circle', x: -23, y: -21, r: 2.5, fill: true },
    { t: 'circle', x: 23, y: -21, r: 2.5, fill: true },
  ],
  valueText: (p) => {
    const r = (p.power ?? defaultPowerSpec()).rating;
    return `${formatSI(r.va, 'VA', 3)} ${formatSI(r.v1, 'V', 4)} / ${formatSI(r.v2, 'V', 4)}`;
  },
  expand: (p, n) => expandPower(p.ref, p.power ?? defaultPowerSpec(), n),
};
