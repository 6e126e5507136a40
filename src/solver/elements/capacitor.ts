import { z } from 'zod';
import { ELEMENT_FACTS } from '../../model/elementFacts';
import { finite, idField, positive, twoNodes } from './schema';
import { conductance, type ElementDef } from './types';

export const capacitorSchema = z.object({
  id: idField,
  kind: z.literal('capacitor'),
  nodes: twoNodes,
  farads: positive,
  /** v(0) = V(nodes[0]) − V(nodes[1]), for the time domain (default 0) */
  initialVolts: finite.optional(),
});
export type CapacitorEl = z.infer<typeof capacitorSchema>;

/** A capacitance: i = C·dv/dt (phasor: jωC·V); open at 0 Hz. */
export const capacitor: ElementDef<CapacitorEl> = {
  kind: 'capacitor',
  schema: capacitorSchema,
  terminals: 2,
  roles: { galvanic: [[0, 1]], conductsDc: false, fixesVoltage: 'never', state: 'voltage', ...ELEMENT_FACTS.capacitor.roles },
  branches: 0,
  stamp: (el, at) => conductance(at, el.farads, 'c'),
  ports: [{ terminals: [0, 1], current: { kind: 'capacitance', farads: (el) => el.farads } }],
  sweepable: ELEMENT_FACTS.capacitor.sweepable,
  initialCharge: (el, node, put) => {
    const q = el.farads * (el.initialVolts ?? 0);
    put(node(0), q);
    put(node(1), -q);
  },
};
