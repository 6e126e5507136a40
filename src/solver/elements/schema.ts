/**
 * zod building blocks shared by the element definitions: numbers that must be
 * finite, positive or non-negative, node names and node lists, and strictly
 * increasing time lists. Each carries the wording its refusal prints.
 */
import { z } from 'zod';

export const finite = z.number().refine(Number.isFinite, { message: 'must be a finite number' });
export const positive = finite.refine((v) => v > 0, { message: 'must be greater than 0' });
export const nonNegative = finite.refine((v) => v >= 0, { message: 'must be 0 or more' });
export const nodeName = z.string().min(1, { message: 'node names must be non-empty strings' });
export const twoNodes = z.tuple([nodeName, nodeName], { message: 'must list exactly two node names' });
export const fourNodes = z.tuple([nodeName, nodeName, nodeName, nodeName], {
  message: 'must list exactly four node names (primary dotted, primary other, secondary dotted, secondary other)',
});
export const idField = z.string();

/** A list of times in seconds, each finite, above (or at) `min` and above the one before. */
export function increasingTimes(min: number, strictMin: boolean) {
  return z.array(finite, { message: 'must be an array of times in seconds' }).superRefine((times, ctx) => {
    for (let i = 0; i < times.length; i++) {
      const t = times[i];
      if (strictMin ? !(t > min) : !(t >= min)) {
        ctx.addIssue({ code: 'custom', path: [i], message: `must be ${strictMin ? 'greater than' : 'at least'} ${min} s` });
        return;
      }
      if (i > 0 && !(t > times[i - 1])) {
        ctx.addIssue({ code: 'custom', path: [i], message: `must be later than the time before it (${times[i - 1]} s)` });
        return;
      }
    }
  });
}
