import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { loadModelText } from '../../src/cli/load';
import { ModelRefusal, solveGraph, sweepGraph } from '../../src/solver';

/**
 * Garbage in never crashes the reader or the solver: every input either
 * solves to finite numbers or is refused with one ModelRefusal line.
 * (Contract: "never answered with NaN, Infinity or a silent zero".)
 */

const good = {
  schema: 'coilwright.graph/1',
  frequencyHz: 50,
  amplitudes: 'rms',
  ground: 'gnd',
  elements: [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 0 },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 10 },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.1, dot: 'first' },
    { id: 'L2', kind: 'inductor', nodes: ['c', 'gnd'], henries: 0.2 },
    { id: 'C1', kind: 'capacitor', nodes: ['c', 'gnd'], farads: 1e-6 },
    { id: 'I1', kind: 'current-source', nodes: ['gnd', 'c'], magnitude: 0.1, phaseDeg: 45 },
    { id: 'T1', kind: 'ideal-transformer', nodes: ['a', 'gnd', 'd', 'gnd'], ratio: 2 },
    { id: 'R2', kind: 'resistor', nodes: ['d', 'gnd'], ohms: 4 },
  ],
  couplings: [{ id: 'K1', windings: ['L1', 'L2'], k: 0.5 }],
};

async function attempt(text: string): Promise<'solved' | 'refused'> {
  try {
    const { model } = await loadModelText(text, 'fuzz.json');
    const r = solveGraph(model);
    const json = JSON.stringify(r);
    if (/NaN|Infinity|null/.test(json)) throw new Error(`non-finite result for ${text.slice(0, 200)}`);
    return 'solved';
  } catch (e) {
    if (e instanceof ModelRefusal) {
      expect(e.message).not.toMatch(/\n/);
      expect(e.message.length).toBeGreaterThan(10);
      return 'refused';
    }
    throw e;
  }
}

/** A value of any JSON shape, numbers including extremes. */
const anyJson = fc.letrec((tie) => ({
  value: fc.oneof(
    { depthSize: 'small' },
    fc.constantFrom(null, true, false, 0, -0, 1e308, -1e308, 5e-324, '', 'gnd', 'resistor', 'inductor', 'first', 'coilwright.graph/1'),
    fc.double(),
    fc.string(),
    fc.array(tie('value'), { maxLength: 4 }),
    fc.dictionary(fc.constantFrom('id', 'kind', 'nodes', 'ohms', 'henries', 'farads', 'k', 'windings', 'magnitude', 'phaseDeg', 'ratio', 'dot'), tie('value'), { maxKeys: 5 }),
  ),
})).value;

/** The good model with one field somewhere replaced by arbitrary JSON. */
const mutated = fc.tuple(fc.nat(), fc.constantFrom('id', 'kind', 'nodes', 'ohms', 'henries', 'farads', 'magnitude', 'phaseDeg', 'ratio', 'dot', 'windings', 'k', 'frequencyHz', 'ground', 'amplitudes', 'schema'), anyJson).map(([i, key, v]) => {
  const m = structuredClone(good) as Record<string, unknown> & typeof good;
  if (['frequencyHz', 'ground', 'amplitudes', 'schema'].includes(key)) (m as Record<string, unknown>)[key] = v;
  else if (key === 'windings' || key === 'k') (m.couplings[0] as Record<string, unknown>)[key] = v;
  else (m.elements[i % m.elements.length] as Record<string, unknown>)[key] = v;
  return JSON.stringify(m);
});

describe('fuzzed input', () => {
  it('the unmutated model solves', async () => {
    expect(await attempt(JSON.stringify(good))).toBe('solved');
  });

  it('arbitrary strings and bytes are refused, never thrown', async () => {
    await fc.assert(fc.asyncProperty(fc.string({ maxLength: 300 }), async (s) => void (await attempt(s))), { numRuns: 300, seed: 1 });
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ maxLength: 300 }), async (b) => void (await attempt(Buffer.from(b).toString('utf8')))),
      { numRuns: 200, seed: 2 },
    );
  });

  it('arbitrary JSON values are refused, never thrown', async () => {
    await fc.assert(fc.asyncProperty(anyJson, async (v) => void (await attempt(JSON.stringify(v) ?? 'undefined'))), { numRuns: 300, seed: 3 });
  });

  it('a valid model with any one field mutated solves or is refused', async () => {
    await fc.assert(fc.asyncProperty(mutated, async (t) => void (await attempt(t))), { numRuns: 500, seed: 4 });
  });

  it('every truncation of a valid file is refused', async () => {
    const text = JSON.stringify(good);
    for (let cut = 0; cut < text.length; cut += 7) expect(await attempt(text.slice(0, cut))).toBe('refused');
  });

  it('sweeps with odd frequency lists never yield non-finite numbers', async () => {
    const { model } = await loadModelText(JSON.stringify(good), 'good.json');
    const out = sweepGraph(model, [0.001, 1, 50, 1e6, 1e12], ['a', 'L2']);
    expect(JSON.stringify(out)).not.toMatch(/NaN|Infinity|null/);
  });
});
