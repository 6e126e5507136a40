/**
 * The graph reader's fast path (validate.ts): accepts a well-formed element, coupling or model top without
 * the schema library, and answers null for anything doubtful, which then goes through the zod schemas as
 * before, so every refusal keeps its exact wording. What it accepts, zod accepts too, and the element it
 * returns equals zod's output key for key and in the same order (the object read itself, not a copy, when
 * its keys already come in the schema's order). test/solver/validateFast.test.ts compares the two.
 */
import { computable } from '../model/values';
import { MAX_NAME_CHARS, nameProblem } from '../model/names';
import type { GraphElement } from '../model/graph';
import type { ElementKind } from './elements/registry';

type Check = (v: unknown) => boolean;

const finite: Check = (v) => typeof v === 'number' && Number.isFinite(v);
const positive: Check = (v) => typeof v === 'number' && v > 0 && computable(v);
const nonNegative: Check = (v) => typeof v === 'number' && v >= 0 && computable(v);
const anyComputable: Check = (v) => typeof v === 'number' && computable(v);
const dot: Check = (v) => v === 'first' || v === 'second';
const string: Check = (v) => typeof v === 'string';

/**
 * A name the shared name rule surely accepts (model/names.ts): 1–128 printable ASCII characters, spaces
 * only inside; anything else is asked of the rule itself.
 */
export function plainName(v: unknown): boolean {
  if (typeof v !== 'string') return false;
  const n = v.length;
  if (n === 0 || n > MAX_NAME_CHARS) return false;
  for (let i = 0; i < n; i++) {
    const c = v.charCodeAt(i);
    if (c > 0x7e || c < 0x20 || (c === 0x20 && (i === 0 || i === n - 1))) return nameProblem(v) === null;
  }
  return true;
}

const nodeList = (count: number): Check => (v) => {
  if (!Array.isArray(v) || v.length !== count) return false;
  for (let i = 0; i < count; i++) if (!plainName(v[i])) return false;
  return true;
};
const twoNodes = nodeList(2);
const fourNodes = nodeList(4);

/** Fields of a kind in its zod schema's order (elements/*.ts), each with its check; `?` marks an optional one. */
const SHAPES: Partial<Record<ElementKind, [string, Check][]>> = {
  resistor: [['id', string], ['kind', string], ['nodes', twoNodes], ['ohms', positive]],
  inductor: [['id', string], ['kind', string], ['nodes', twoNodes], ['henries', positive], ['dot?', dot], ['initialAmps?', finite]],
  capacitor: [['id', string], ['kind', string], ['nodes', twoNodes], ['farads', positive], ['initialVolts?', finite]],
  'voltage-source': [['kind', string], ['id', string], ['nodes', twoNodes], ['magnitude', nonNegative], ['phaseDeg', finite]],
  'current-source': [['kind', string], ['id', string], ['nodes', twoNodes], ['magnitude', nonNegative], ['phaseDeg', finite]],
  'ideal-transformer': [['id', string], ['kind', string], ['nodes', fourNodes], ['ratio', positive]],
  'inductance-arm': [['id', string], ['kind', string], ['nodes', twoNodes], ['henries', anyComputable]],
};

interface Shape {
  keys: string[];
  checks: Check[];
  /** field name → position (no prototype, so "__proto__" is just an unknown field) */
  at: Record<string, number>;
  required: number;
}
const COMPILED: Partial<Record<ElementKind, Shape>> = {};
for (const [kind, fields] of Object.entries(SHAPES) as [ElementKind, [string, Check][]][]) {
  const at: Record<string, number> = Object.create(null);
  let required = 0;
  const keys = fields.map(([k], i) => {
    const name = k.replace(/\?$/, '');
    at[name] = i;
    if (!k.endsWith('?')) required |= 1 << i;
    return name;
  });
  COMPILED[kind] = { keys, checks: fields.map(([, c]) => c), at, required };
}

/**
 * Element `raw` of a known `kind` (its id already checked) when it is surely well formed, else null.
 * Any field the fast path does not know (a waveform, a switch, a stray key) makes it null.
 */
export function fastElement(kind: ElementKind, raw: Record<string, unknown>): GraphElement | null {
  const shape = COMPILED[kind];
  if (!shape) return null;
  let seen = 0;
  let last = -1;
  let inOrder = true;
  for (const k in raw) {
    const i = shape.at[k];
    if (i === undefined || !shape.checks[i](raw[k])) return null;
    if (i < last) inOrder = false;
    last = i;
    seen |= 1 << i;
  }
  if ((seen & shape.required) !== shape.required) return null;
  if (inOrder) return raw as unknown as GraphElement;
  // the schema's order, as zod would build it
  const out: Record<string, unknown> = {};
  for (const k of shape.keys) if (k in raw) out[k] = raw[k];
  return out as unknown as GraphElement;
}

/** The model's top fields when surely well formed (the schema field already checked), else null. */
export function fastTop(input: Record<string, unknown>): { frequencyHz: number; amplitudes: 'rms' | 'peak'; ground: string; elements: unknown[]; couplings?: unknown[] } | null {
  const { frequencyHz, amplitudes, ground, elements, couplings } = input;
  if (!nonNegative(frequencyHz) || (amplitudes !== 'rms' && amplitudes !== 'peak') || !plainName(ground)) return null;
  if (!Array.isArray(elements) || elements.length === 0 || (couplings !== undefined && !Array.isArray(couplings))) return null;
  return { frequencyHz: frequencyHz as number, amplitudes, ground: ground as string, elements, couplings: couplings as unknown[] | undefined };
}

/** A coupling's fields when surely well formed, else null. */
export function fastCoupling(raw: Record<string, unknown>): { windings: string[]; k?: number; henries?: number } | null {
  const { windings, k, henries } = raw;
  if (!Array.isArray(windings) || windings.length < 2) return null;
  for (let i = 0; i < windings.length; i++) if (typeof windings[i] !== 'string') return null;
  if ((k !== undefined && !finite(k)) || (henries !== undefined && !finite(henries))) return null;
  return { windings, k: k as number | undefined, henries: henries as number | undefined };
}
