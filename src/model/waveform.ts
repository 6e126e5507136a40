/**
 * Source waveforms of the time domain (contract: time-and-s-domain.md,
 * "waveform shapes"): their schema, their value at a time, and their corners
 * (the breakpoints a time-stepper must land on). A waveform's value at a jump
 * is its value just after it. One implementation for the solver (the graph
 * reader and the time domain, through src/solver/elements/waveform.ts), the
 * sheet schema and the editor's waveform preview.
 */
import { z } from 'zod';
import { finite, nonNegative, positive } from './values';

const constant = z.object({ shape: z.literal('constant'), value: finite });
const sine = z.object({
  shape: z.literal('sine'),
  amplitude: nonNegative,
  frequencyHz: positive,
  phaseDeg: finite.optional(),
  offset: finite.optional(),
  startS: nonNegative.optional(),
});
const step = z.object({ shape: z.literal('step'), before: finite, after: finite, atS: nonNegative });
const square = z
  .object({
    shape: z.literal('square'),
    low: finite,
    high: finite,
    frequencyHz: positive,
    duty: finite.refine((d) => d > 0 && d < 1, { message: 'must be between 0 and 1 (exclusive)' }).optional(),
    delayS: nonNegative.optional(),
    edgeS: nonNegative.optional(),
  })
  .superRefine((w, ctx) => {
    const period = 1 / w.frequencyHz;
    const duty = w.duty ?? 0.5;
    const edge = w.edgeS ?? 0;
    if (edge > duty * period || edge > (1 - duty) * period) {
      const room = Math.min(duty, 1 - duty) * period;
      ctx.addIssue({
        code: 'custom',
        path: ['edgeS'],
        message: `is longer than the part of the period it opens (at most ${Number(room.toPrecision(4))} s at ${w.frequencyHz} Hz and duty ${duty})`,
      });
    }
  });
const points = z
  .object({
    shape: z.literal('points'),
    timesS: z.array(finite, { message: 'must be an array of times in seconds' }).min(1, { message: 'must hold at least one time' }),
    values: z.array(finite, { message: 'must be an array of values' }).min(1, { message: 'must hold at least one value' }),
  })
  .superRefine((w, ctx) => {
    for (let i = 0; i < w.timesS.length; i++) {
      const t = w.timesS[i];
      if (!(t >= 0)) return void ctx.addIssue({ code: 'custom', path: ['timesS', i], message: 'must be 0 s or later' });
      if (i > 0 && !(t > w.timesS[i - 1])) {
        return void ctx.addIssue({ code: 'custom', path: ['timesS', i], message: `must be later than the time before it (${w.timesS[i - 1]} s)` });
      }
    }
    if (w.values.length !== w.timesS.length) {
      ctx.addIssue({ code: 'custom', path: ['values'], message: `must hold as many values as timesS has times (${w.timesS.length})` });
    }
  });

const SHAPES = { constant, sine, step, square, points } as const;
export type WaveformShape = keyof typeof SHAPES;
export const WAVEFORM_SHAPES = Object.keys(SHAPES) as WaveformShape[];

/** The `waveform` field: an object whose `shape` picks one of the shapes above. */
export const waveformSchema = z.unknown().transform((raw, ctx): Waveform => {
  const shape = (raw as { shape?: unknown } | null)?.shape;
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) {
    ctx.addIssue({ code: 'custom', message: `must be an object with a "shape" (${WAVEFORM_SHAPES.join(', ')})` });
    return z.NEVER;
  }
  const schema = typeof shape === 'string' && Object.hasOwn(SHAPES, shape) ? SHAPES[shape as keyof typeof SHAPES] : undefined;
  if (!schema) {
    ctx.addIssue({ code: 'custom', path: ['shape'], message: `must be one of ${WAVEFORM_SHAPES.map((s) => `"${s}"`).join(', ')}` });
    return z.NEVER;
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) ctx.addIssue({ ...issue, code: 'custom', path: issue.path } as never);
    return z.NEVER;
  }
  return parsed.data as Waveform;
});

export type Waveform =
  | z.infer<typeof constant>
  | z.infer<typeof sine>
  | z.infer<typeof step>
  | z.output<typeof square>
  | z.output<typeof points>;

/** The waveform's value at time t (seconds); at a jump, the value just after it. */
export function waveformAt(w: Waveform, t: number): number {
  switch (w.shape) {
    case 'constant':
      return w.value;
    case 'sine': {
      const offset = w.offset ?? 0;
      if (t < (w.startS ?? 0)) return offset;
      return offset + w.amplitude * Math.cos(2 * Math.PI * w.frequencyHz * t + ((w.phaseDeg ?? 0) * Math.PI) / 180);
    }
    case 'step':
      return t < w.atS ? w.before : w.after;
    case 'square': {
      const delay = w.delayS ?? 0;
      if (t < delay) return w.low;
      const period = 1 / w.frequencyHz;
      const duty = (w.duty ?? 0.5) * period;
      const edge = w.edgeS ?? 0;
      let tau = (t - delay) % period;
      if (tau < 0) tau += period;
      if (edge > 0 && tau < edge) return w.low + ((w.high - w.low) * tau) / edge;
      if (tau < duty) return w.high;
      if (edge > 0 && tau < duty + edge) return w.high + ((w.low - w.high) * (tau - duty)) / edge;
      return w.low;
    }
    case 'points': {
      const ts = w.timesS;
      const vs = w.values;
      if (t < ts[0]) return vs[0];
      const last = ts.length - 1;
      if (t >= ts[last]) return vs[last];
      let lo = 0;
      let hi = last;
      while (hi - lo > 1) {
        const mid = (lo + hi) >> 1;
        if (ts[mid] <= t) lo = mid;
        else hi = mid;
      }
      return vs[lo] + ((vs[hi] - vs[lo]) * (t - ts[lo])) / (ts[hi] - ts[lo]);
    }
  }
}

/**
 * Times in (0, stopS] where the waveform has a corner or a jump, ascending.
 * `limit` bounds how many are listed (a square wave over a long run has two to
 * four a period); past it the caller steps without them.
 */
export function waveformCorners(w: Waveform, stopS: number, limit = 4_000_000): number[] {
  const out: number[] = [];
  const push = (t: number) => {
    if (t > 0 && t <= stopS && out.length < limit) out.push(t);
  };
  switch (w.shape) {
    case 'constant':
      break;
    case 'sine':
      push(w.startS ?? 0);
      break;
    case 'step':
      push(w.atS);
      break;
    case 'square': {
      const delay = w.delayS ?? 0;
      const period = 1 / w.frequencyHz;
      const duty = (w.duty ?? 0.5) * period;
      const edge = w.edgeS ?? 0;
      push(delay);
      for (let k = 0; out.length < limit; k++) {
        const t0 = delay + k * period;
        if (t0 > stopS) break;
        if (k > 0) push(t0);
        if (edge > 0) push(t0 + edge);
        push(t0 + duty);
        if (edge > 0) push(t0 + duty + edge);
      }
      break;
    }
    case 'points':
      for (const t of w.timesS) push(t);
      break;
  }
  return out;
}
