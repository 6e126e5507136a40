import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ModelRefusal, parseGraphModel } from '../../src/solver';
import { plainName } from '../../src/solver/validateFast';
import { nameProblem } from '../../src/model/names';
import { rlcLadder, mesh2d } from '../../scripts/bench/generators';

/**
 * The graph reader's fast path against its reference, the zod schemas alone (`fast: false`): on any input
 * both accept the same model (the same keys in the same order) or refuse with the same message and
 * culprits.
 */

function outcome(input: unknown, fast: boolean): string {
  try {
    return `model ${JSON.stringify(parseGraphModel(input, { fast }))}`;
  } catch (e) {
    if (e instanceof ModelRefusal) return `refused ${e.message} ${JSON.stringify(e.culprits)}`;
    throw e;
  }
}
let accepted = 0;
function agree(input: unknown): void {
  const zodOnly = outcome(input, false);
  expect(outcome(input, true)).toBe(zodOnly);
  if (zodOnly.startsWith('model')) accepted++;
}

const name = fc.oneof(
  fc.constantFrom('a', 'b', 'gnd', 'n 1', ' a', 'a ', '', 'x'.repeat(128), 'x'.repeat(129), 'a\u200bb', 'a\u0007', '\u00e9t\u00e9', '__proto__', 'k\u202e'),
  fc.string({ maxLength: 6 }),
);
const value = fc.oneof(
  fc.constantFrom(0, -0, 1, -1, 2.5, 1e-150, 1e150, 1e-151, 1.0000001e150, 1e-200, 1e300, Number.MAX_VALUE, 5e-324, NaN, Infinity, -Infinity, 0.25),
  fc.double(),
  fc.constantFrom('first', 'second', 'third', '1', true, false, null, {}, []),
  fc.array(name, { minLength: 0, maxLength: 5 }),
);
const KINDS = ['resistor', 'inductor', 'capacitor', 'voltage-source', 'current-source', 'ideal-transformer', 'inductance-arm', 'switch'];
const FIELDS = ['id', 'kind', 'nodes', 'ohms', 'henries', 'farads', 'dot', 'initialAmps', 'initialVolts', 'magnitude', 'phaseDeg', 'ratio', 'closed', 'waveform', 'extra', '__proto__'];
const REQUIRED: Record<string, string[]> = {
  resistor: ['ohms'], inductor: ['henries'], capacitor: ['farads'], 'voltage-source': ['magnitude', 'phaseDeg'], 'current-source': ['magnitude', 'phaseDeg'],
  'ideal-transformer': ['ratio'], 'inductance-arm': ['henries'], switch: ['closed'],
};
const VALID: Record<string, unknown> = { ohms: 10, henries: 0.01, farads: 1e-6, magnitude: 5, phaseDeg: 30, ratio: 2, dot: 'first', initialAmps: 0.1, initialVolts: 1, closed: true };

/** A mostly well-formed element of a random kind, with random fields dropped, added, spoiled or reordered. */
const element = fc
  .record({
    kind: fc.oneof({ weight: 8, arbitrary: fc.constantFrom(...KINDS) }, { weight: 1, arbitrary: fc.constantFrom('diode', 1, null) }),
    spoil: fc.oneof({ weight: 3, arbitrary: fc.constant([]) }, { weight: 2, arbitrary: fc.array(fc.tuple(fc.constantFrom(...FIELDS), value), { minLength: 1, maxLength: 2 }) }),
    drop: fc.oneof({ weight: 4, arbitrary: fc.constant([]) }, { weight: 1, arbitrary: fc.array(fc.constantFrom(...FIELDS), { minLength: 1, maxLength: 1 }) }),
    optional: fc.subarray(['dot', 'initialAmps', 'initialVolts']),
    order: fc.array(fc.nat(), { minLength: 12, maxLength: 12 }),
    nodes: fc.oneof({ weight: 6, arbitrary: fc.constant(['a', 'gnd']) }, fc.constant(['a', 'gnd', 'b', 'gnd']), fc.array(name, { minLength: 2, maxLength: 2 }), fc.array(name, { minLength: 4, maxLength: 4 })),
  })
  .map(({ kind, spoil, drop, optional, order, nodes }) => {
    const fields: [string, unknown][] = [['id', 'E1'], ['kind', kind], ['nodes', kind === 'ideal-transformer' && nodes.length === 2 ? ['a', 'gnd', 'b', 'gnd'] : nodes]];
    for (const f of REQUIRED[String(kind)] ?? ['ohms']) fields.push([f, VALID[f]]);
    for (const f of optional) fields.push([f, VALID[f]]);
    // a stable random order (a third keep the schema's order, the order writers use)
    const sorted = order[0] % 3 === 0 ? fields : fields.map((f, i) => [order[i % order.length], f] as const).sort((a, b) => a[0] - b[0]).map(([, f]) => f);
    const el: Record<string, unknown> = {};
    for (const [k, v] of sorted) if (!(drop as string[]).includes(k)) el[k] = v;
    for (const [k, v] of spoil) {
      if (k === '__proto__') Object.defineProperty(el, k, { value: v, enumerable: true, configurable: true, writable: true });
      else el[k] = v;
    }
    return el;
  });

const model = (elements: unknown[], top: Record<string, unknown> = {}, couplings?: unknown[]) => ({
  schema: 'coilwright.graph/1',
  frequencyHz: 50,
  amplitudes: 'rms',
  ground: 'gnd',
  elements,
  ...(couplings ? { couplings } : {}),
  ...top,
});

describe('graph reader fast path', () => {
  it('agrees with the zod schemas on elements (verdict, message, the model built)', () => {
    const before = accepted;
    fc.assert(fc.property(fc.array(element, { minLength: 1, maxLength: 3 }), (els) => {
      els.forEach((el, i) => (el.id = typeof el.id === 'string' ? `${el.id}_${i}` : el.id));
      agree(model([...els, { id: 'R0', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 1 }]));
    }), { numRuns: 3000, seed: 14 });
    // both outcomes are well represented
    expect(accepted - before).toBeGreaterThan(300);
  });

  it('agrees with the zod schemas on the model top', () => {
    const top = fc.record(
      { frequencyHz: value, amplitudes: fc.oneof(fc.constantFrom('rms', 'peak', 'RMS'), value), ground: fc.oneof(name, value), elements: fc.oneof(fc.constant([{ id: 'R', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 1 }]), value), couplings: fc.oneof(fc.constant([]), value) },
      { requiredKeys: [] },
    );
    fc.assert(fc.property(top, (t) => agree(model([{ id: 'R', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 1 }], t))), { numRuns: 2000, seed: 14 });
  });

  it('agrees with the zod schemas on couplings', () => {
    const inductors = [
      { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: 0.01 },
      { id: 'L2', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.04 },
      { id: 'L3', kind: 'inductor', nodes: ['c', 'gnd'], henries: 0.09 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 3 },
    ];
    const coupling = fc.record(
      { id: fc.oneof(fc.constantFrom('K1', 'K2', 'L1', ''), value), windings: fc.oneof(fc.subarray(['L1', 'L2', 'L3', 'R1', 'L9', 'L1']), value), k: fc.oneof(fc.constantFrom(0, 0.5, 1, 1.5, -0.1), value), henries: fc.oneof(fc.constantFrom(0.01, 0.02, 0.07), value) },
      { requiredKeys: ['id', 'windings'] },
    );
    fc.assert(fc.property(fc.array(coupling, { maxLength: 3 }), (cs) => agree(model(inductors, {}, cs))), { numRuns: 2000, seed: 14 });
  });

  it('agrees with the zod schemas on generator ladders and meshes', () => {
    for (const m of [rlcLadder(2000), mesh2d(400), rlcLadder(100, { frequencyHz: 0 })]) agree(JSON.parse(JSON.stringify(m)));
    // a part whose fields come in the schema's order is taken as it is, not copied
    const raw = JSON.parse(JSON.stringify(rlcLadder(100)));
    expect(parseGraphModel(raw).elements[3]).toBe(raw.elements[3]);
  });

  it('takes a name for plain only when the name rule accepts it', () => {
    fc.assert(fc.property(fc.oneof(name, fc.string({ maxLength: 140 }), fc.string({ unit: 'grapheme', maxLength: 8 })), (s) => {
      if (plainName(s)) expect(nameProblem(s)).toBeNull();
    }), { numRuns: 3000, seed: 14 });
    for (const s of ['a', 'n 1', 'Vin', 'a0_b-3.x', '\u00e9t\u00e9']) expect(plainName(s)).toBe(true);
    for (const s of ['', ' a', 'a ', 'a\u200bb', 'x'.repeat(129)]) expect(plainName(s)).toBe(false);
  });
});
