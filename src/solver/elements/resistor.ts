import { z } from 'zod';
import { ELEMENT_FACTS } from '../../model/elementFacts';
import { idField, positive, twoNodes } from './schema';
import { conductance, type ElementDef } from './types';

export const resistorSchema = z.object({ id: idField, kind: z.literal('resistor'), nodes: twoNodes, ohms: positive });
export type ResistorEl = z.infer<typeof resistorSchema>;

/** A resistance: i = v/R from nodes[0] to nodes[1]. */
export const resistor: ElementDef<ResistorEl> = {
  kind: 'resistor',
  schema: resistorSchema,
  terminals: 2,
  roles: { galvanic: [[0, 1]], conductsDc: true, fixesVoltage: 'never', ...ELEMENT_FACTS.resistor.roles },
  branches: 0,
  stamp: (el, at) => conductance(at, 1 / el.ohms),
  ports: [{ terminals: [0, 1], current: { kind: 'resistance', ohms: (el) => el.ohms } }],
  sweepable: ELEMENT_FACTS.resistor.sweepable,
};
