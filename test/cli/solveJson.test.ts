import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { jsonPieces } from '../../src/cli/format';
import { keyOrder, solveJsonPieces } from '../../src/cli/solveJson';
import { loadModelText } from '../../src/cli/load';
import { ModelRefusal, parseGraphModel, SolverSession, solveGraph } from '../../src/solver';
import type { GraphModel } from '../../src/model/graph';
import { mesh2d, rlcLadder } from '../../scripts/bench/generators';
import { build, specArb } from '../reference/randomCircuits';

/**
 * The `solve` writer that reads the solution arrays directly must print the very text the result objects
 * printed through the general JSON writer (format.ts), byte for byte: the reference is that older path,
 * run on the same model.
 */

type Outcome = { text: string } | { refused: string };
function oldPath(model: GraphModel): Outcome {
  try {
    return { text: [...jsonPieces(solveGraph(model))].join('') };
  } catch (e) {
    if (e instanceof ModelRefusal) return { refused: e.message };
    throw e;
  }
}
function newPath(model: GraphModel): Outcome & { pieces?: number } {
  try {
    const session = new SolverSession(model);
    const pieces = [...solveJsonPieces(session, session.solveRaw(model.frequencyHz))];
    return { text: pieces.join(''), pieces: pieces.length };
  } catch (e) {
    if (e instanceof ModelRefusal) return { refused: e.message };
    throw e;
  }
}
let solved = 0;
function same(model: GraphModel): void {
  const a = oldPath(model);
  const { pieces: _, ...b } = newPath(model);
  expect(b).toEqual(a);
  if ('text' in a) solved++;
}

const root = join(__dirname, '..', '..');
const files = [
  ...readdirSync(join(root, 'examples', 'graphs')).map((f) => join(root, 'examples', 'graphs', f)),
  ...readdirSync(join(root, 'examples', 'sheets')).map((f) => join(root, 'examples', 'sheets', f)),
  ...readdirSync(join(root, 'test', 'fixtures', 'golden')).filter((f) => f.endsWith('.json')).map((f) => join(root, 'test', 'fixtures', 'golden', f)),
].filter((f) => f.endsWith('.json'));

describe('solve writer straight from the solution arrays', () => {
  for (const file of files) {
    it(`prints what the result objects printed: ${file.slice(root.length + 1)}`, async () => {
      const { model } = await loadModelText(readFileSync(file, 'utf8'), file);
      const r = newPath(model);
      expect('text' in r).toBe(true);
      same(model);
    });
  }

  it('prints what the result objects printed on generator ladders and meshes, in pieces of about a megabyte', () => {
    for (const m of [rlcLadder(200), rlcLadder(20000), mesh2d(400), rlcLadder(400, { frequencyHz: 0 }), { ...mesh2d(144), amplitudes: 'peak' as const }]) {
      const model = parseGraphModel(JSON.parse(JSON.stringify(m)));
      same(model);
    }
    const big = newPath(parseGraphModel(rlcLadder(20000)));
    expect(big.pieces).toBeGreaterThan(2);
  });

  // names an object lists first (canonical integers below 2^32 - 1) and names that only look like them
  const NAMES = ['0', '1', '2', '10', '9', '007', '-1', '1.5', '4294967294', '4294967295', '42', 'x', '__proto__', 'constructor', 'n 1', '\u00e9', '"q"', '1e3'];
  it('lists names in the order the result tables always had, index names first', () => {
    const names = ['b', '10', 'a', '2', '4294967295', '4294967294', '007', '0'];
    const order = [...keyOrder(names)].map((i) => names[i]);
    const table: Record<string, number> = Object.create(null);
    for (const n of names) table[n] = 0;
    expect(order).toEqual(Object.keys(table));
  });

  it('prints what the result objects printed on random circuits with tricky names, rms, peak and DC', () => {
    const before = solved;
    fc.assert(
      fc.property(specArb, fc.array(fc.nat(NAMES.length * 3), { minLength: 80, maxLength: 80 }), fc.constantFrom('rms', 'peak'), fc.boolean(), (spec, picks, amplitudes, dc) => {
        const built = build(spec);
        // rename nodes and elements: some to a tricky name, the rest kept (distinct by construction)
        const rename = new Map<string, string>();
        const taken = new Set<string>();
        let p = 0;
        const nameFor = (old: string) => {
          if (!rename.has(old)) {
            const pick = picks[p++ % picks.length];
            const candidate = pick < NAMES.length ? NAMES[pick] : old;
            rename.set(old, taken.has(candidate) ? old : candidate);
            taken.add(rename.get(old)!);
          }
          return rename.get(old)!;
        };
        const elements = built.elements.map((el) => ({ ...el, nodes: el.nodes.map(nameFor) }));
        const ground = nameFor(built.ground);
        for (const el of elements) {
          const name = nameFor(`element:${el.id}`);
          if (name !== `element:${el.id}`) el.id = name;
        }
        const ids = new Map(built.elements.map((el, i) => [el.id, elements[i].id]));
        const couplings = (built.couplings ?? []).map((c) => ({ ...c, windings: c.windings.map((w) => ids.get(w)!) }));
        const raw = { ...built, amplitudes, frequencyHz: dc ? 0 : built.frequencyHz, ground, elements, couplings };
        let model: GraphModel;
        try {
          model = parseGraphModel(JSON.parse(JSON.stringify(raw)));
        } catch (e) {
          if (e instanceof ModelRefusal) return; // a renaming that collides (an element named as a coupling) is not this test's matter
          throw e;
        }
        same(model);
      }),
      { numRuns: 120, seed: 14 },
    );
    // about half solve (DC refuses many: loops of windings, cut sets of capacitors), and both paths refuse alike
    expect(solved - before).toBeGreaterThan(40);
  });
});
