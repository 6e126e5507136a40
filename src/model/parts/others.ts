/** Ideal transformer, ground (IEC 60617 earth) and node label. */
import { rectOfLocal, toSheet } from '../geometry';
import type { IdealTransformerEl } from '../graph';
import type { Part } from '../sheet';
import { turns, positive, type PartDef, type Prim } from './types';

/** Four turns standing upright at x, bulging to the left (dir 1) or right (-1), between y = -20 and 20. */
export function coil(x: number, dir: 1 | -1): Prim[] {
  const out: Prim[] = [];
  for (let i = 0; i < 4; i++) {
    const cy = -15 + 10 * i;
    out.push({ t: 'arc', x, y: cy, r: 5, a0: dir < 0 ? Math.PI / 2 : -Math.PI / 2, a1: dir < 0 ? (3 * Math.PI) / 2 : Math.PI / 2 });
  }
  return out;
}

/**
 * A turns ratio as the trade writes it: "200 : 1" when the primary has more
 * turns, "1 : 200" when fewer (so a 1:200 current transformer never reads
 * "0.005 : 1"), four significant figures.
 */
export function ratioText(r: number, sep: string): string {
  const n = (v: number) => Number(v.toPrecision(4)).toString();
  if (!(r > 0) || !Number.isFinite(r)) return `${n(r)}${sep}1`;
  return r >= 1 ? `${n(r)}${sep}1` : `1${sep}${n(1 / r)}`;
}

export const transformer: PartDef = {
  kind: 'transformer', label: 'Ideal transformer', shelfKey: '6', prefix: 'T',
  icon: { box: { x0: -44, y0: -36, x1: 44, y1: 36 }, stroke: 3 }, labelBelow: true,
  pins: [{ x: -40, y: -30 }, { x: -40, y: 30 }, { x: 40, y: -30 }, { x: 40, y: 30 }],
  box: { x0: -40, y0: -32, x1: 40, y1: 32 }, defaultRot: 0,
  defaults: { value: 1 },
  fields: [{
    key: 'value', label: 'Turns ratio (primary : secondary)', unit: '', check: positive('Turns ratio'),
    editText: (v) => ratioText(v, ':'), hint: 'e.g. 1:200, 1000:5, 2.5:1 or a number',
  }],
  draw: () => [
    { t: 'line', p: [-40, -30, -10, -30, -10, -20] },
    { t: 'line', p: [-40, 30, -10, 30, -10, 20] },
    ...coil(-10, 1),
    { t: 'line', p: [40, -30, 10, -30, 10, -20] },
    { t: 'line', p: [40, 30, 10, 30, 10, 20] },
    ...coil(10, -1),
    { t: 'line', p: [-2, -22, -2, 22] },
    { t: 'line', p: [2, -22, 2, 22] },
    { t: 'circle', x: -19, y: -22, r: 2.5, fill: true },
    { t: 'circle', x: 19, y: -22, r: 2.5, fill: true },
  ],
  valueText: (p) => ratioText(p.value ?? 1, ' : '),
  toElement: (p, n) => ({ id: p.ref, kind: 'ideal-transformer', nodes: [n[0], n[1], n[2], n[3]], ratio: p.value ?? 1 }),
  fromElement: { kind: 'ideal-transformer', values: (el) => ({ value: (el as IdealTransformerEl).ratio }) },
};

export const ground: PartDef = {
  kind: 'ground', label: 'Ground', shelfKey: '7', prefix: '',
  icon: { box: { x0: -16, y0: -4, x1: 16, y1: 22 }, stroke: 2.2 },
  pins: [{ x: 0, y: 0 }],
  box: { x0: -12, y0: -2, x1: 12, y1: 20 }, defaultRot: 0,
  defaults: {},
  fields: [],
  draw: () => [
    { t: 'line', p: [0, 0, 0, 10] },
    { t: 'line', p: [-12, 10, 12, 10] },
    { t: 'line', p: [-8, 14, 8, 14] },
    { t: 'line', p: [-4, 18, 4, 18] },
  ],
  valueText: () => '',
  netName: () => 'gnd',
};

export const labelWidth = (name: string) => 14 + 7 * Math.max(1, name.length);

const LABEL_BOX = { x0: 0, y0: -8, x1: 40, y1: 8 };
const labelBox = (p: Part) => ({ ...LABEL_BOX, x1: labelWidth(p.name ?? '') });

/** Where a node label's name is written (baseline start), upright whatever the label's turn. */
function labelNameSpot(p: Part): { x: number; y: number } {
  const box = rectOfLocal(p, labelBox(p));
  const pin = toSheet(p, 0, 0);
  const flipped = p.rot === 2 || (p.mirror && p.rot === 0);
  return { x: flipped ? box.x0 + 4 : pin.x + 9, y: pin.y + 3.5 + (p.rot % 2 ? 16 : 0) };
}

export const label: PartDef = {
  kind: 'label', label: 'Node label', shelfKey: '8', prefix: '',
  icon: { box: { x0: -4, y0: -14, x1: 36, y1: 14 }, stroke: 2.2 },
  pins: [{ x: 0, y: 0 }],
  box: LABEL_BOX, boxOf: labelBox, defaultRot: 0,
  nameField: { label: 'Node name', hint: 'Labels with the same name are one node' },
  marks: (p) => {
    const at = labelNameSpot(p);
    return [{ t: 'text', x: at.x, y: at.y, s: p.name ?? '', size: 10, mono: true, bold: true, role: 'node-label' }];
  },
  defaults: { name: 'a' },
  fields: [],
  draw: (p) => {
    const w = labelWidth(p.name ?? '');
    return [{ t: 'poly', p: [0, 0, 7, -8, w, -8, w, 8, 7, 8] }];
  },
  valueText: () => '',
  netName: (p) => p.name ?? '',
};

export { turns };
