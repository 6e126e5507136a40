/**
 * zod building blocks for the numbers of the graph model and of the sheet:
 * finite, positive or non-negative values in the solver's range, and strictly
 * increasing time lists. Each carries the wording its refusal prints. The
 * solver's element definitions (src/solver/elements) and the sheet schema read
 * values with the same rules.
 */
import { z } from 'zod';

export const finite = z.number().refine(Number.isFinite, { message: 'must be a finite number' });
/**
 * Values the solver computes with: zero, or between 1e-150 and 1e150 in size.
 * Its pivots compare squared magnitudes, which overflow past about 1e154
 * (IEEE 754 doubles), so a 5e-324 Ω resistor (a conductance of Infinity)
 * or a 1e-200 Ω one would otherwise end as a matrix it cannot factor.
 */
export const VALUE_RANGE = 1e150;
/** Zero, or between 1e-150 and 1e150 in size (false for NaN and the infinities). */
export const computable = (v: number) => v === 0 || (Math.abs(v) >= 1 / VALUE_RANGE && Math.abs(v) <= VALUE_RANGE);
const rangeMessage = { message: 'must lie between 1e-150 and 1e150 in size (the solver computes in double precision)' };
/** A finite value in the solver's range, of either sign. */
export const computableValue = finite.refine(computable, rangeMessage);
export const positive = finite.refine((v) => v > 0, { message: 'must be greater than 0' }).refine(computable, rangeMessage);
export const nonNegative = finite.refine((v) => v >= 0, { message: 'must be 0 or more' }).refine(computable, rangeMessage);

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
