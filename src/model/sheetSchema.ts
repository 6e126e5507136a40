/** zod validators for the current sheet version (the lenient part fills defaults). */
import { z } from 'zod';
import { nameProblem, titleProblem } from './names';
import { PART_KINDS, SHEET_SCHEMA, type Sheet } from './sheet';
import { increasingTimes, positive } from './values';
import { waveformSchema } from './waveform';
import { powerSpecProblem, type PowerSpec } from './powerTransformer';

/**
 * Bounds on what a sheet may hold. They refuse only what the editor never
 * makes: coordinates far beyond any drawing (the view and the wire topology
 * work on them exactly only within these), names and titles under the
 * shared rule of names.ts, and counts that keep every frame a bounded amount
 * of work.
 */
export const SHEET_LIMITS = {
  /** |x| and |y| of parts and wire points, in sheet units (a grid step is 10) */
  coordinate: 1_000_000,
  parts: 20_000,
  wires: 40_000,
  couplings: 10_000,
  /** corners of one wire, its two ends included */
  wirePoints: 1_000,
  windingsPerCoupling: 64,
  /** points of one source waveform, toggle times of one switch */
  waveformPoints: 10_000,
  toggles: 10_000,
} as const;

const finite = z.number().refine(Number.isFinite, 'must be a finite number');
const L = SHEET_LIMITS;
const coordinate = finite.refine((v) => Math.abs(v) <= L.coordinate, `must lie between -${L.coordinate} and ${L.coordinate} (sheet coordinates are bounded)`);

const check = (problem: (s: string) => string | null) => (s: string, ctx: z.RefinementCtx) => {
  const p = problem(s);
  if (p) ctx.addIssue({ code: 'custom', message: p });
};
const name = z.string().superRefine(check(nameProblem));
/** a designator: a name, or empty for parts that have none (ground, node labels) */
const designator = z.string().superRefine(check((s) => (s === '' ? null : nameProblem(s))));
const id = name;
const tooMany = (what: string, max: number) => `holds more than ${max} ${what}; a sheet has at most ${max}`;

const side = z.enum(['primary', 'secondary']);
const reading = z.object({ volts: finite, amps: finite, watts: finite, side });
/** a practical transformer's data: the form it was entered in, checked by the same rules as the details panel */
export const powerSpecSchema = z.object({
  form: z.enum(['circuit', 'tests', 'perUnit']),
  expansion: z.enum(['ratio', 'coupled']).default('ratio'),
  rating: z.object({ va: finite, v1: finite, v2: finite, hz: finite }),
  circuit: z.object({ ratio: finite, r1: finite, r2: finite, l1: finite, l2: finite, lm: finite.optional(), rc: finite.optional() }).optional(),
  tests: z.object({ noLoad: reading, shortCircuit: reading }).optional(),
  perUnit: z.object({ ukPct: finite, byXr: z.boolean(), xr: finite, loadLossW: finite, i0Pct: finite, p0W: finite }).optional(),
}).superRefine((spec, ctx) => {
  const p = powerSpecProblem(spec as PowerSpec);
  if (p) ctx.addIssue({ code: 'custom', path: p.field.split('.'), message: p.message });
});

export const partSchema = z.object({
  id,
  kind: z.enum(PART_KINDS as [string, ...string[]]),
  x: coordinate,
  y: coordinate,
  rot: z.union([z.literal(0), z.literal(1), z.literal(2), z.literal(3)]).default(0),
  mirror: z.boolean().default(false),
  ref: designator.default(''),
  value: finite.optional(),
  phaseDeg: finite.optional(),
  dot: z.enum(['first', 'second']).optional(),
  name: name.optional(),
  initialAmps: finite.optional(),
  initialVolts: finite.optional(),
  // the graph model's own waveform rules (src/model/waveform.ts), bounded in size like the rest of a sheet
  waveform: z.unknown().superRefine((w, ctx) => {
    const pts = (w as { timesS?: unknown } | null)?.timesS;
    if (Array.isArray(pts) && pts.length > L.waveformPoints) ctx.addIssue({ code: 'custom', path: ['timesS'], message: `has more than ${L.waveformPoints} points; a waveform has at most ${L.waveformPoints}` });
  }).pipe(waveformSchema).optional(),
  closed: z.boolean().optional(),
  onOhms: positive.optional(),
  offOhms: positive.optional(),
  togglesS: increasingTimes(0, true).refine((t) => t.length <= L.toggles, `has more than ${L.toggles} times; a switch toggles at most ${L.toggles} times`).optional(),
  power: powerSpecSchema.optional(),
  alH: positive.optional(),
});

export const wireSchema = z.object({
  id,
  pts: z.array(coordinate)
    .min(4, 'needs at least two points')
    .max(2 * L.wirePoints, `has more than ${L.wirePoints} points; a wire has at most ${L.wirePoints}`)
    .refine((a) => a.length % 2 === 0, 'needs pairs of coordinates'),
});

export const couplingSchema = z.object({
  id,
  windings: z.array(id).min(2).max(L.windingsPerCoupling, `names more than ${L.windingsPerCoupling} windings; a link couples at most ${L.windingsPerCoupling}`),
  by: z.enum(['k', 'M']).default('k'),
  value: finite,
});

/** free text of the title block, under the same character rule as the title */
const text = z.string().superRefine(check(titleProblem)).default('');

export const titleBlockSchema = z.object({
  subtitle: text, owner: text, number: text, revision: text, sheet: z.string().default('1/1'),
  drawnBy: text, checkedBy: text, approvedBy: text, status: z.string().default('draft'),
});

export const displaySchema = z.object({
  partCurrents: z.boolean().default(true),
  wireCurrents: z.boolean().default(true),
  nodeVoltages: z.boolean().default(true),
  hideKinds: z.array(z.enum(PART_KINDS as [string, ...string[]])).default([]),
  hideParts: z.array(id).max(L.parts).default([]),
});

export const sheetSchema = z.object({
  schema: z.literal(SHEET_SCHEMA),
  title: z.string().superRefine(check(titleProblem)).default('Untitled sheet'),
  titleBlock: titleBlockSchema.default(() => titleBlockSchema.parse({})),
  display: displaySchema.default(() => displaySchema.parse({})),
  frequencyHz: finite.refine((f) => f >= 0, 'must be 0 or more'),
  amplitudes: z.enum(['rms', 'peak']).default('rms'),
  parts: z.array(partSchema).max(L.parts, tooMany('parts', L.parts)).default([]),
  wires: z.array(wireSchema).max(L.wires, tooMany('wires', L.wires)).default([]),
  couplings: z.array(couplingSchema).max(L.couplings, tooMany('links', L.couplings)).default([]),
});

/** Validate a current-version object; returns the sheet or a one-line reason. */
export function validateSheet(obj: unknown): { ok: true; sheet: Sheet } | { ok: false; reason: string } {
  const r = sheetSchema.safeParse(obj);
  if (!r.success) {
    const issue = r.error.issues[0];
    const path = issue.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('').replace(/^\./, '');
    return { ok: false, reason: `${path || 'sheet'}: ${issue.message}` };
  }
  const sheet = r.data as Sheet;
  const seen = new Set<string>();
  for (const item of [...sheet.parts, ...sheet.wires, ...sheet.couplings]) {
    if (seen.has(item.id)) return { ok: false, reason: `duplicate id ${item.id}` };
    seen.add(item.id);
  }
  const kinds = new Map(sheet.parts.map((p) => [p.id, p.kind]));
  for (const c of sheet.couplings) {
    for (const w of c.windings) {
      if (kinds.get(w) !== 'winding') return { ok: false, reason: `coupling ${c.id} names ${w}, which is not a winding on this sheet` };
    }
  }
  return { ok: true, sheet };
}

/**
 * The bounds an edit must keep (coordinates and counts of SHEET_LIMITS), checked
 * without the full schema so that every edit can afford it; null when kept.
 */
export function sheetBoundsProblem(sheet: Sheet): string | null {
  const L = SHEET_LIMITS;
  if (sheet.parts.length > L.parts) return `a sheet holds at most ${L.parts} parts`;
  if (sheet.wires.length > L.wires) return `a sheet holds at most ${L.wires} wires`;
  if (sheet.couplings.length > L.couplings) return `a sheet holds at most ${L.couplings} links`;
  const far = `parts and wires must stay within ${L.coordinate} units of the sheet's origin`;
  for (const p of sheet.parts) if (!(Math.abs(p.x) <= L.coordinate && Math.abs(p.y) <= L.coordinate)) return far;
  for (const w of sheet.wires) {
    if (w.pts.length > 2 * L.wirePoints) return `a wire has at most ${L.wirePoints} points`;
    for (const v of w.pts) if (!(Math.abs(v) <= L.coordinate)) return far;
  }
  return null;
}
