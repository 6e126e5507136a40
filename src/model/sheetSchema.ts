/** zod validators for the current sheet version (the lenient part fills defaults). */
import { z } from 'zod';
import { PART_KINDS, SHEET_SCHEMA, type Sheet } from './sheet';

const finite = z.number().refine(Number.isFinite, 'must be a finite number');

export const partSchema = z.object({
  id: z.string().min(1),
  kind: z.enum(PART_KINDS as [string, ...string[]]),
  x: finite,
  y: finite,
  rot: z.union([z.literal(0), z.literal(1), z.literal(2), z.literal(3)]).default(0),
  mirror: z.boolean().default(false),
  ref: z.string().default(''),
  value: finite.optional(),
  phaseDeg: finite.optional(),
  dot: z.enum(['first', 'second']).optional(),
  name: z.string().optional(),
});

export const wireSchema = z.object({
  id: z.string().min(1),
  pts: z.array(finite).min(4).refine((a) => a.length % 2 === 0, 'needs pairs of coordinates'),
});

export const couplingSchema = z.object({
  id: z.string().min(1),
  windings: z.array(z.string()).min(2),
  by: z.enum(['k', 'M']).default('k'),
  value: finite,
});

const text = z.string().default('');

export const titleBlockSchema = z.object({
  subtitle: text, owner: text, number: text, revision: text, sheet: z.string().default('1/1'),
  drawnBy: text, checkedBy: text, approvedBy: text, status: z.string().default('draft'),
});

export const displaySchema = z.object({
  partCurrents: z.boolean().default(true),
  wireCurrents: z.boolean().default(true),
  nodeVoltages: z.boolean().default(true),
  hideKinds: z.array(z.enum(PART_KINDS as [string, ...string[]])).default([]),
  hideParts: z.array(z.string()).default([]),
});

export const sheetSchema = z.object({
  schema: z.literal(SHEET_SCHEMA),
  title: z.string().default('Untitled sheet'),
  titleBlock: titleBlockSchema.default(() => titleBlockSchema.parse({})),
  display: displaySchema.default(() => displaySchema.parse({})),
  frequencyHz: finite.refine((f) => f >= 0, 'must be 0 or more'),
  amplitudes: z.enum(['rms', 'peak']).default('rms'),
  parts: z.array(partSchema).default([]),
  wires: z.array(wireSchema).default([]),
  couplings: z.array(couplingSchema).default([]),
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
