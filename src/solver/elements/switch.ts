import { z } from 'zod';
import { ELEMENT_FACTS } from '../../model/elementFacts';
import { idField, increasingTimes, positive, twoNodes } from './schema';
import { conductance, type ElementDef } from './types';

export const switchSchema = z
  .object({
    id: idField,
    kind: z.literal('switch'),
    nodes: twoNodes,
    /** its state at t = 0, and in solve, sweep and tf */
    closed: z.boolean({ message: 'must be true (closed) or false (open)' }),
    onOhms: positive.optional(),
    offOhms: positive.optional(),
    /** times at which the time domain flips its state */
    togglesS: increasingTimes(0, true).optional(),
  })
  .superRefine((el, ctx) => {
    const on = el.onOhms ?? SWITCH_ON_OHMS;
    const off = el.offOhms ?? SWITCH_OFF_OHMS;
    if (!(off > on)) {
      ctx.addIssue({ code: 'custom', path: ['offOhms'], message: `must be greater than onOhms (${on} Ω)` });
    }
  });
export type SwitchEl = z.output<typeof switchSchema>;

export const SWITCH_ON_OHMS = 0.001;
export const SWITCH_OFF_OHMS = 1e9;

/** The switch's resistance in a state. */
export function switchOhms(el: SwitchEl, closed: boolean): number {
  return closed ? (el.onOhms ?? SWITCH_ON_OHMS) : (el.offOhms ?? SWITCH_OFF_OHMS);
}

/** A resistor of onOhms when closed and offOhms when open (contract: time-and-s-domain.md). */
export const switchDef: ElementDef<SwitchEl> = {
  kind: 'switch',
  schema: switchSchema as z.ZodType<SwitchEl>,
  terminals: 2,
  roles: { galvanic: [[0, 1]], conductsDc: true, fixesVoltage: 'never', ...ELEMENT_FACTS.switch.roles },
  branches: 0,
  stamp: (el, at, state) => conductance(at, 1 / switchOhms(el, state.closed ?? el.closed)),
  ports: [{ terminals: [0, 1], current: { kind: 'resistance', ohms: (el, state) => switchOhms(el, state.closed ?? el.closed) } }],
};
