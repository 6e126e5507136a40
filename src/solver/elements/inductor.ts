import { z } from 'zod';
import { ELEMENT_FACTS } from '../../model/elementFacts';
import { finite, idField, positive, twoNodes } from './schema';
import { branchIncidence, type ElementDef, type StampTarget } from './types';

export const inductorSchema = z.object({
  id: idField,
  kind: z.literal('inductor'),
  nodes: twoNodes,
  henries: positive,
  dot: z.enum(['first', 'second'], { message: 'must be "first" or "second"' }).optional(),
  /** i(0) in the reference direction, for the time domain (default 0) */
  initialAmps: finite.optional(),
});
export type InductorEl = z.infer<typeof inductorSchema>;

/** Branch form of an inductance L: its current is unknown k, its row reads v − L·di/dt = 0. */
export function stampInductance(el: { henries: number }, at: StampTarget): void {
  const k = at.branch(0);
  branchIncidence(at, k, 0, 1, 1);
  at.c(k, k, -el.henries);
}

/**
 * An inductance, which couplings may name as a winding. Branch form: its
 * current is an unknown and its row reads v − L·di/dt − Σ M·di_j/dt = 0 (the
 * mutual terms come from the couplings). At AC the phasor engine may instead
 * stamp it through the reciprocal inductance matrix (src/solver/core/windings.ts).
 */
export const inductor: ElementDef<InductorEl> = {
  kind: 'inductor',
  schema: inductorSchema,
  terminals: 2,
  roles: { galvanic: [[0, 1]], conductsDc: true, fixesVoltage: 'dc', state: 'current', ...ELEMENT_FACTS.inductor.roles },
  branches: 1,
  stamp: stampInductance,
  ports: [{ terminals: [0, 1], current: { kind: 'branch', branch: 0, gain: () => 1 } }],
  sweepable: ELEMENT_FACTS.inductor.sweepable,
  dcNote: 'a short at 0 Hz',
  initialCurrent: (el) => el.initialAmps ?? 0,
};

/** d = +1 when the winding's dot is on nodes[0], −1 when on nodes[1]. */
export function dotSign(el: { dot?: 'first' | 'second' }): 1 | -1 {
  return el.dot === 'second' ? -1 : 1;
}
