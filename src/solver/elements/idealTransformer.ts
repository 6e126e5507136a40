import { z } from 'zod';
import { ELEMENT_FACTS } from '../../model/elementFacts';
import { fourNodes, idField, positive } from './schema';
import { branchIncidence, type ElementDef } from './types';

export const idealTransformerSchema = z.object({ id: idField, kind: z.literal('ideal-transformer'), nodes: fourNodes, ratio: positive });
export type IdealTransformerEl = z.infer<typeof idealTransformerSchema>;

/**
 * V_p = ratio·V_s and ratio·I_p + I_s = 0, both currents entering the dotted
 * terminals (nodes = primary dotted, primary other, secondary dotted, secondary
 * other). One branch unknown, the primary current; the stamp is symmetric.
 */
export const idealTransformer: ElementDef<IdealTransformerEl> = {
  kind: 'ideal-transformer',
  schema: idealTransformerSchema,
  terminals: 4,
  roles: { galvanic: [[0, 1], [2, 3]], conductsDc: true, fixesVoltage: 'never', ...ELEMENT_FACTS['ideal-transformer'].roles },
  branches: 1,
  stamp: (el, at) => {
    const k = at.branch(0);
    branchIncidence(at, k, 0, 1, 1);
    branchIncidence(at, k, 2, 3, -el.ratio);
  },
  ports: [
    { terminals: [0, 1], current: { kind: 'branch', branch: 0, gain: () => 1 } },
    { terminals: [2, 3], current: { kind: 'branch', branch: 0, gain: (el) => -el.ratio } },
  ],
  ratio: (el) => el.ratio,
};

