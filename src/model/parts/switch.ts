/**
 * A switch: a resistance of onOhms when closed and offOhms when open (graph
 * kind `switch`). Its state at t = 0 is the one the phasor, sweep and s-domain
 * analyses use; the time response flips it at each toggle time. Our own
 * symbol: a blade hinged at the first contact, resting on the second when
 * closed and lifted when open; a small turning arrow over it when it has
 * toggle times.
 */
import type { SwitchEl } from '../graph';
import { formatSI } from '../quantity';
import type { Part } from '../sheet';
import { positive, type PartDef, type Prim } from './types';

export const SWITCH_DEFAULTS = { onOhms: 0.001, offOhms: 1e9 } as const;

/** Where the blade ends: on the second contact when closed, lifted when open. */
const bladeEnd = (closed: boolean) => (closed ? { x: 12, y: -2.5 } : { x: 9, y: -15 });

function turningArrow(): Prim[] {
  // a three-quarter circle with its head: "changes state in time"
  return [
    { t: 'arc', x: 0, y: -22, r: 4.5, a0: Math.PI * 0.9, a1: Math.PI * 2.3 },
    { t: 'poly', p: [-4.6, -20.9, -6.8, -24.6, -2.4, -24.2], fill: true },
  ];
}

export const switchPart: PartDef = {
  kind: 'switch', label: 'Switch', shelfKey: '9', prefix: 'S',
  icon: { box: { x0: -32, y0: -28, x1: 32, y1: 12 }, stroke: 2.2 },
  pins: [{ x: -30, y: 0 }, { x: 30, y: 0 }],
  box: { x0: -30, y0: -27, x1: 30, y1: 5 }, defaultRot: 0,
  defaults: { closed: true, onOhms: SWITCH_DEFAULTS.onOhms, offOhms: SWITCH_DEFAULTS.offOhms, togglesS: [] },
  fields: [
    { key: 'onOhms', label: 'Resistance when closed', unit: 'Ω', check: positive('The closed resistance'), hint: 'small: contacts and leads, e.g. 1m' },
    { key: 'offOhms', label: 'Resistance when open', unit: 'Ω', check: positive('The open resistance'), hint: 'large: the leakage across the open contacts, e.g. 1G' },
  ],
  draw: (p, style) => {
    const end = bladeEnd(p.closed !== false);
    const out: Prim[] = style === 'ieee'
      ? [
          // IEEE 315 style: open circles at the contacts, the blade from the first
          { t: 'line', p: [-30, 0, -15, 0] },
          { t: 'circle', x: -12, y: 0, r: 3 },
          { t: 'circle', x: 12, y: 0, r: 3 },
          { t: 'line', p: [15, 0, 30, 0] },
          { t: 'line', p: [-10, -2, end.x, end.y - 1.5] },
        ]
      : [
          // IEC 60617 style: the leads, a hinge dot, a contact face on the second lead
          { t: 'line', p: [-30, 0, -12, 0] },
          { t: 'circle', x: -12, y: 0, r: 1.8, fill: true },
          { t: 'line', p: [12, 0, 30, 0] },
          { t: 'line', p: [12, 0, 12, -5] },
          { t: 'line', p: [-12, 0, end.x + 2, end.y] },
        ];
    if (p.togglesS?.length) out.push(...turningArrow());
    return out;
  },
  valueText: (p) => switchText(p),
  toElement: (p, n) => {
    const el: SwitchEl = {
      id: p.ref, kind: 'switch', nodes: [n[0], n[1]], closed: p.closed !== false,
      onOhms: p.onOhms ?? SWITCH_DEFAULTS.onOhms, offOhms: p.offOhms ?? SWITCH_DEFAULTS.offOhms,
    };
    if (p.togglesS?.length) el.togglesS = [...p.togglesS];
    return el;
  },
  fromElement: {
    kind: 'switch',
    values: (el) => {
      const s = el as SwitchEl;
      return { closed: s.closed, onOhms: s.onOhms ?? SWITCH_DEFAULTS.onOhms, offOhms: s.offOhms ?? SWITCH_DEFAULTS.offOhms, togglesS: [...(s.togglesS ?? [])] };
    },
  },
  editor: 'switch',
};

/** "closed", "open, closes at 2 ms", "closed, flips at 1 ms, 3 ms …". */
export function switchText(p: Part): string {
  const state = p.closed === false ? 'open' : 'closed';
  const t = p.togglesS ?? [];
  if (!t.length) return state;
  const verb = t.length === 1 ? (p.closed === false ? 'closes' : 'opens') : 'flips';
  const shown = t.slice(0, 2).map((x) => formatSI(x, 's', 3)).join(', ');
  return `${state}, ${verb} at ${shown}${t.length > 2 ? ` and ${t.length - 2} more` : ''}`;
}
