import { z } from 'zod';
import { ELEMENT_FACTS } from '../../model/elementFacts';
import { finite, idField, nonNegative, twoNodes } from './schema';
import { waveformSchema } from './waveform';
import { branchIncidence, type ElementDef } from './types';

const sourceFields = {
  id: idField,
  nodes: twoNodes,
  magnitude: nonNegative,
  phaseDeg: finite,
  /** the source's value over time (time domain); without it the source follows its phasor */
  waveform: waveformSchema.optional(),
};

export const voltageSourceSchema = z.object({ kind: z.literal('voltage-source'), ...sourceFields });
export const currentSourceSchema = z.object({ kind: z.literal('current-source'), ...sourceFields });
export type VoltageSourceEl = z.infer<typeof voltageSourceSchema>;
export type CurrentSourceEl = z.infer<typeof currentSourceSchema>;

/** magnitude∠phaseDeg as (re, im). */
function phasor(el: { magnitude: number; phaseDeg: number }) {
  const ph = (el.phaseDeg * Math.PI) / 180;
  return { re: el.magnitude * Math.cos(ph), im: el.magnitude * Math.sin(ph) };
}

/** V(nodes[0]) − V(nodes[1]) = u; its current, from nodes[0] to nodes[1] through it, is a branch unknown. */
export const voltageSource: ElementDef<VoltageSourceEl> = {
  kind: 'voltage-source',
  schema: voltageSourceSchema,
  terminals: 2,
  roles: { galvanic: [[0, 1]], conductsDc: true, fixesVoltage: 'always', ...ELEMENT_FACTS['voltage-source'].roles },
  branches: 1,
  stamp: (_el, at) => {
    const k = at.branch(0);
    branchIncidence(at, k, 0, 1, 1);
    at.b(k, 1);
  },
  ports: [{ terminals: [0, 1], current: { kind: 'branch', branch: 0, gain: () => 1 } }],
  phasor,
};

/** Drives u through itself from nodes[0] to nodes[1] (out of its nodes[1] terminal into the circuit). */
export const currentSource: ElementDef<CurrentSourceEl> = {
  kind: 'current-source',
  schema: currentSourceSchema,
  terminals: 2,
  roles: { galvanic: [[0, 1]], conductsDc: false, fixesVoltage: 'never', ...ELEMENT_FACTS['current-source'].roles },
  branches: 0,
  stamp: (_el, at) => {
    at.b(at.node(0), -1);
    at.b(at.node(1), 1);
  },
  ports: [{ terminals: [0, 1], current: { kind: 'source' } }],
  phasor,
};
