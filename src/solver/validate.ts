import { z } from 'zod';
import { GRAPH_SCHEMA, type GraphModel, type GraphElement, type Coupling } from '../model/graph';
import { nameProblem, shownName } from '../model/names';
import { ModelRefusal } from './errors';
import { ELEMENT_DEFS, ELEMENT_KINDS, isElementKind } from './elements/registry';
import { finite, nameRule, nonNegative } from './elements/schema';
import { mutualLimit } from '../model/mutual';
import { fastCoupling, fastElement, fastTop, plainName } from './validateFast';
export { VALUE_RANGE } from './elements/schema';

/**
 * Reads an untrusted value as a `coilwright.graph/1` graph model. Structure is
 * checked with zod; every refusal is one line naming the element, coupling or
 * field at fault and what to change.
 */

const KINDS = ELEMENT_KINDS;
const topSchema = z.object({
  schema: z.literal(GRAPH_SCHEMA, { message: `must be "${GRAPH_SCHEMA}"` }),
  frequencyHz: nonNegative,
  amplitudes: z.enum(['rms', 'peak'], { message: 'must be "rms" or "peak"' }),
  ground: z.string().min(1, { message: 'must name a node' }).superRefine(nameRule),
  elements: z.array(z.unknown(), { message: 'must be an array of elements' }).min(1, { message: 'must hold at least one element' }),
  couplings: z.array(z.unknown(), { message: 'must be an array of couplings' }).optional(),
});

const couplingSchema = z.object({
  windings: z.array(z.string(), { message: 'must be an array of inductor ids' }).min(2, { message: 'must name two or more inductors' }),
  k: finite.optional(),
  henries: finite.optional(),
});

function describe(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (v === null) return 'null';
  if (typeof v === 'string') return shownName(v);
  if (typeof v === 'number' || typeof v === 'boolean') return String(v);
  if (Array.isArray(v)) return 'an array';
  return 'an object';
}

function valueAt(obj: unknown, path: PropertyKey[]): unknown {
  let cur: unknown = obj;
  for (const key of path) {
    if (cur === null || typeof cur !== 'object') return undefined;
    cur = (cur as Record<PropertyKey, unknown>)[key];
  }
  return cur;
}

/** First zod issue as "field must …, got …". */
function firstIssue(error: z.ZodError, input: unknown): string {
  const issue = error.issues[0];
  const path = issue.path.filter((p) => typeof p === 'string' || typeof p === 'number');
  const field = path.length ? path.map((p) => (typeof p === 'number' ? `[${p}]` : p)).join('.').replace(/\.\[/g, '[') : 'value';
  const got = valueAt(input, issue.path as PropertyKey[]);
  let message = issue.message;
  if (typeof got === 'number' && !Number.isFinite(got)) {
    return `${field} must be a finite number, got ${got} (a number beyond floating-point range)`;
  }
  if (issue.code === 'invalid_type' || message.startsWith('Invalid input')) {
    message = got === undefined ? 'is missing' : `has the wrong type (${describe(got)})`;
    return `${field} ${message}`;
  }
  return `${field} ${message}, got ${describe(got)}`;
}

function label(raw: unknown, index: number): string {
  const id = (raw as { id?: unknown } | null)?.id;
  return typeof id === 'string' && id.length > 0 ? `element "${id}"` : `element #${index + 1}`;
}

export interface ReadOptions {
  /** false: every part through the zod schemas (the fast path's reference in tests) */
  fast?: boolean;
}

export function parseGraphModel(input: unknown, options: ReadOptions = {}): GraphModel {
  const fast = options.fast !== false;
  if (input === null || typeof input !== 'object' || Array.isArray(input)) {
    throw new ModelRefusal(`file: expected a JSON object with "schema": "${GRAPH_SCHEMA}", got ${describe(input)}`, [{ kind: 'file' }]);
  }
  const schemaField = (input as { schema?: unknown }).schema;
  if (schemaField !== GRAPH_SCHEMA) {
    const hint =
      typeof schemaField === 'string' && schemaField.startsWith('coilwright.graph/')
        ? ' (a newer version than this tool reads: update Coilwright)'
        : '';
    throw new ModelRefusal(`file: "schema" must be "${GRAPH_SCHEMA}", got ${describe(schemaField)}${hint}`, [{ kind: 'file' }]);
  }
  let top = fast ? fastTop(input as Record<string, unknown>) : null;
  if (!top) {
    const parsed = topSchema.safeParse(input);
    if (!parsed.success) throw new ModelRefusal(`model: ${firstIssue(parsed.error, input)}`, [{ kind: 'model' }]);
    top = parsed.data;
  }

  const elements: GraphElement[] = [];
  const seen = new Map<string, number>();
  const raws = top.elements;
  for (let index = 0; index < raws.length; index++) {
    const raw = raws[index];
    if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) {
      throw new ModelRefusal(`${label(raw, index)}: expected an object, got ${describe(raw)}`, [{ kind: 'element' }]);
    }
    const r = raw as Record<string, unknown>;
    const id = r.id;
    if (typeof id !== 'string' || id.length === 0) {
      throw new ModelRefusal(`${label(raw, index)}: "id" must be a non-empty string, got ${describe(r.id)}`, [{ kind: 'element' }]);
    }
    const idProblem = fast && plainName(id) ? null : nameProblem(id);
    if (idProblem) throw new ModelRefusal(`element #${index + 1}: "id" ${idProblem}, got ${describe(id)}`, [{ kind: 'element' }]);
    const before = seen.get(id);
    if (before !== undefined) {
      throw new ModelRefusal(`element "${id}": duplicate id (elements #${before + 1} and #${index + 1}); give each element its own id`, [{ kind: 'element', id }]);
    }
    seen.set(id, index);
    const kind = r.kind;
    if (!isElementKind(kind)) {
      throw new ModelRefusal(`element "${id}": unknown kind ${describe(kind)}; use one of ${KINDS.join(', ')}`, [{ kind: 'element', id }]);
    }
    let el = fast ? fastElement(kind, r) : null;
    if (!el) {
      const parsed = ELEMENT_DEFS[kind].schema.safeParse(r);
      if (!parsed.success) {
        throw new ModelRefusal(`element "${id}" (${kind}): ${firstIssue(parsed.error, r)}`, [{ kind: 'element', id }]);
      }
      el = parsed.data as GraphElement;
    }
    const nodes = el.nodes;
    // a part with both ends on one node is physical (a shorted turn, a shorted winding, a source whose ends
    // meet) and the equations stay defined; only a voltage source there contradicts itself
    if (nodes.length === 2 && nodes[0] === nodes[1] && kind === 'voltage-source') {
      throw new ModelRefusal(`element "${id}" (${kind}): both terminals are on node "${nodes[0]}"; connect it between two different nodes or remove it`, [{ kind: 'element', id }]);
    }
    if (nodes.length === 4 && nodes[0] === nodes[1] && nodes[2] === nodes[3]) {
      throw new ModelRefusal(`element "${id}" (ideal-transformer): both windings have both terminals on one node, so its current is undetermined; connect a winding between two different nodes`, [{ kind: 'element', id }]);
    }
    elements.push(el);
  }

  // one id map: `seen` gives each element's index
  const byId = (id: string): GraphElement | undefined => {
    const i = seen.get(id);
    return i === undefined ? undefined : elements[i];
  };
  const couplings: Coupling[] = [];
  const pairOwner = new Map<string, string>();
  const couplingIds = new Set<string>();
  (top.couplings ?? []).forEach((raw, index) => {
    const rid = (raw as { id?: unknown } | null)?.id;
    const name = typeof rid === 'string' && rid.length > 0 ? `coupling "${rid}"` : `coupling #${index + 1}`;
    if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) {
      throw new ModelRefusal(`${name}: expected an object, got ${describe(raw)}`, [{ kind: 'coupling' }]);
    }
    if (typeof rid !== 'string' || rid.length === 0) {
      throw new ModelRefusal(`${name}: "id" must be a non-empty string`, [{ kind: 'coupling' }]);
    }
    const idProblem = nameProblem(rid);
    if (idProblem) throw new ModelRefusal(`coupling #${index + 1}: "id" ${idProblem}, got ${describe(rid)}`, [{ kind: 'coupling' }]);
    if (seen.has(rid) || couplingIds.has(rid)) {
      throw new ModelRefusal(`coupling "${rid}": duplicate id; give each element and coupling its own id`, [{ kind: 'coupling', id: rid }]);
    }
    let fields = fast ? fastCoupling(raw as Record<string, unknown>) : null;
    if (!fields) {
      const parsed = couplingSchema.safeParse(raw);
      if (!parsed.success) throw new ModelRefusal(`${name}: ${firstIssue(parsed.error, raw)}`, [{ kind: 'coupling', id: rid }]);
      fields = parsed.data;
    }
    const { windings, k, henries } = fields;
    if ((k === undefined) === (henries === undefined)) {
      throw new ModelRefusal(`${name}: give either "k" (coupling coefficient) or "henries" (mutual inductance), not ${k === undefined ? 'neither' : 'both'}`, [{ kind: 'coupling', id: rid }]);
    }
    for (const w of windings) {
      const el = byId(w);
      if (!el) throw new ModelRefusal(`${name}: winding ${shownName(w)} is not an element of this model; name an inductor's id`, [{ kind: 'coupling', id: rid }]);
      if (!ELEMENT_DEFS[el.kind].roles.winding) throw new ModelRefusal(`${name}: "${w}" is a ${el.kind}, not an inductor; only inductors can be coupled`, [{ kind: 'coupling', id: rid }, { kind: 'element', id: w }]);
    }
    if (new Set(windings).size !== windings.length) {
      throw new ModelRefusal(`${name}: names a winding more than once; list each inductor once`, [{ kind: 'coupling', id: rid }]);
    }
    if (k !== undefined && (k < 0 || k > 1)) {
      throw new ModelRefusal(`${name}: k = ${k} is out of range; the coupling coefficient must be between 0 and 1`, [{ kind: 'coupling', id: rid }]);
    }
    if (henries !== undefined) {
      if (windings.length !== 2) {
        throw new ModelRefusal(`${name}: "henries" couples exactly two windings, got ${windings.length}; use "k" for three or more`, [{ kind: 'coupling', id: rid }]);
      }
      const [l1, l2] = windings.map((w) => (byId(w) as { henries: number }).henries);
      const mMax = mutualLimit(l1, l2);
      if (henries < 0 || henries > mMax * (1 + 1e-12)) {
        throw new ModelRefusal(`${name}: M = ${henries} H is out of range; it must be between 0 and sqrt(L1·L2) = ${fmt(mMax)} H (k = ${fmt(henries / mMax)} > 1)`, [{ kind: 'coupling', id: rid }]);
      }
    }
    for (let i = 0; i < windings.length; i++) {
      for (let j = i + 1; j < windings.length; j++) {
        const key = [windings[i], windings[j]].sort().join('\u0000');
        const owner = pairOwner.get(key);
        if (owner) {
          throw new ModelRefusal(`${name}: windings "${windings[i]}" and "${windings[j]}" are already coupled by "${owner}"; couple each pair once`, [{ kind: 'coupling', id: rid }]);
        }
        pairOwner.set(key, rid);
      }
    }
    couplingIds.add(rid);
    couplings.push(k !== undefined ? { id: rid, windings: [...windings], k } : { id: rid, windings: [...windings], henries });
  });

  return {
    schema: GRAPH_SCHEMA,
    frequencyHz: top.frequencyHz,
    amplitudes: top.amplitudes,
    ground: top.ground,
    elements,
    couplings,
  };
}

export function fmt(v: number): string {
  return Number(v.toPrecision(4)).toString();
}
