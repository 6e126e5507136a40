import { z } from 'zod';
import { ELEMENT_FACTS } from '../../model/elementFacts';
import { computableValue, idField, twoNodes } from './schema';
import type { ElementDef } from './types';
import { stampInductance } from './inductor';

export const inductanceArmSchema = z.object({ id: idField, kind: z.literal('inductance-arm'), nodes: twoNodes, henries: computableValue });
export type InductanceArmEl = z.infer<typeof inductanceArmSchema>;

/**
 * Extension of the contract: an arm of an equivalent circuit (a T-equivalent
 * of a coupled pair). Its inductance may be zero or negative, valid for
 * analysis but not a part one can buy; it always keeps its branch current.
 */
export const inductanceArm: ElementDef<InductanceArmEl> = {
  kind: 'inductance-arm',
  schema: inductanceArmSchema,
  terminals: 2,
  roles: { galvanic: [[0, 1]], conductsDc: true, fixesVoltage: 'dc', state: 'current', ...ELEMENT_FACTS['inductance-arm'].roles },
  branches: 1,
  stamp: stampInductance,
  ports: [{ terminals: [0, 1], current: { kind: 'branch', branch: 0, gain: () => 1 } }],
  dcNote: 'a short at 0 Hz',
  initialCurrent: () => 0,
};
