/**
 * zod building blocks shared by the element definitions: node names and node
 * lists here; the numbers (finite, positive, non-negative, in the solver's
 * range) and strictly increasing time lists come from model/values.ts, which
 * the sheet schema reads with too. Each carries the wording its refusal prints.
 */
import { z } from 'zod';
import { nameProblem } from '../../model/names';

export { finite, VALUE_RANGE, computableValue, positive, nonNegative, increasingTimes } from '../../model/values';
/** A name (node, element, coupling) under the shared name rule of model/names.ts. */
export const nameRule = (s: string, ctx: z.RefinementCtx) => {
  const problem = nameProblem(s);
  if (problem) ctx.addIssue({ code: 'custom', message: problem });
};
export const nodeName = z.string().min(1, { message: 'node names must be non-empty strings' }).superRefine(nameRule);
export const twoNodes = z.tuple([nodeName, nodeName], { message: 'must list exactly two node names' });
export const fourNodes = z.tuple([nodeName, nodeName, nodeName, nodeName], {
  message: 'must list exactly four node names (primary dotted, primary other, secondary dotted, secondary other)',
});
export const idField = z.string();
