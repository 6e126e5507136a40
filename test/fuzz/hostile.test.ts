import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { drawGrid, drawSheet, gridBudget, visibleRect } from '../../src/canvas/drawSheet';
import { drawOverlay } from '../../src/canvas/drawOverlay';
import { formatJson } from '../../src/cli/format';
import { loadModelText } from '../../src/cli/load';
import { parseCsv, resultsCsv } from '../../src/export/csv';
import { csvField } from '../../src/export/csvText';
import { sheetToSvg, svgToSheet, xmlProblem } from '../../src/export';
import { overlayLayout } from '../../src/model/drawLayout';
import { graphToSheet } from '../../src/model/fromGraph';
import type { GraphElement, GraphModel, SolveResult } from '../../src/model/graph';
import { seedIds } from '../../src/model/ids';
import { decodeSheetPayload, encodeSheetPayload, LinkError } from '../../src/model/link';
import { parseSheetText } from '../../src/model/parseSheet';
import { PART_DEFS } from '../../src/model/parts/registry';
import type { Sheet } from '../../src/model/sheet';
import { deriveCircuit } from '../../src/model/toGraph';
import { ModelRefusal, parseGraphModel, solveGraph, sweepGraph } from '../../src/solver';
import { fitView } from '../../src/store/actions';
import { createEditorStore } from '../../src/store/createEditorStore';
import { rawRows } from '../../src/ui/readings';
import { countingContext } from '../canvas/countingContext';
import { tableRows } from '../export/svgText';

/**
 * Random sheets, links and graph models, hostile on purpose (the names every
 * JavaScript object inherits, names with control and bidirectional
 * characters, long strings, numbers from 5e-324 to 1e308 and far
 * coordinates), through import, drawing, solving and export. Checked:
 * nothing throws but a refusal (one line, naming what is wrong, with no
 * hidden characters in it); no frame is more than a bounded amount of work,
 * counted in canvas calls and grid points against the sheet's size (never
 * timed); and every name that goes in comes out, in the result, the
 * readings, the CSV and the SVG.
 */

const RESERVED = ['__proto__', 'constructor', 'toString', 'hasOwnProperty', 'valueOf', 'isPrototypeOf', 'toLocaleString', '__defineSetter__'];
const HIDDEN = /[\p{Cc}\p{Cf}\p{Zl}\p{Zp}]/u;

/** Names the rule accepts: the reserved ones, spreadsheet formulas, spaces inside, other scripts, identifiers, up to 128 characters. */
const validNameArb = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...RESERVED, 'gnd', 'GND', '0', 'a b', '=1+1', '-x', '@SUM(A1)', 'n1', 'V(out)', 'Ω', '日本', 'x'.repeat(128)) },
  { weight: 3, arbitrary: fc.stringMatching(/^[A-Za-z_][A-Za-z0-9_]{0,8}$/) },
  { weight: 1, arbitrary: fc.string({ unit: 'grapheme-ascii', minLength: 1, maxLength: 12 }).filter((t) => t.trim() === t) },
);

/** Any name at all, often one the rule refuses: control characters, lone surrogates, bidirectional overrides, padding, 300 characters. */
const nameArb = fc.oneof(
  { weight: 3, arbitrary: validNameArb },
  { weight: 1, arbitrary: fc.string({ unit: 'grapheme', minLength: 1, maxLength: 12 }) },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', minLength: 1, maxLength: 8 }) },
  { weight: 1, arbitrary: fc.constantFrom('a\u202Eb', 'x\u2066y', 'z\u200B', ' pad', 'tab\t', 'line\nbreak', '') },
  { weight: 1, arbitrary: fc.string({ minLength: 129, maxLength: 300 }) },
);

/** Mostly everyday values (1e-9 to 1e6, three digits), sometimes the extremes of doubles. */
const valueArb = fc.oneof(
  { weight: 12, arbitrary: fc.tuple(fc.integer({ min: 1, max: 999 }), fc.integer({ min: -9, max: 4 })).map(([m, e]) => m * 10 ** e) },
  { weight: 1, arbitrary: fc.constantFrom(5e-324, 1e-310, 1e-200, 1e-150, 1e-12, 1e12, 1e150, 1e200, 1e308, 0, -1, -0) },
  { weight: 1, arbitrary: fc.double() },
);

const frequencyArb = fc.oneof(
  { weight: 8, arbitrary: fc.constantFrom(0, 50, 60, 1e3, 85e3, 1e6) },
  { weight: 2, arbitrary: fc.integer({ min: 1, max: 1_000_000_000 }) },
  { weight: 1, arbitrary: fc.constantFrom(1e-3, 1e12, 1e200, 5e-324) },
);

/** A graph model with 1 to 12 elements over a pool of node names (and, often, a source and a ground). */
const modelOf = (names: fc.Arbitrary<string>): fc.Arbitrary<GraphModel> => fc
  .record({
    nodes: fc.uniqueArray(names, { minLength: 2, maxLength: 6 }),
    ids: fc.uniqueArray(names, { minLength: 12, maxLength: 12 }),
    kinds: fc.array(fc.constantFrom('resistor', 'inductor', 'capacitor', 'voltage-source', 'current-source', 'ideal-transformer', 'inductance-arm'), { minLength: 1, maxLength: 12 }),
    picks: fc.array(fc.nat(), { minLength: 48, maxLength: 48 }),
    values: fc.array(valueArb, { minLength: 12, maxLength: 12 }),
    k: fc.oneof(fc.double({ min: 0, max: 1, noNaN: true }), fc.constantFrom(1, 1.0000001, -0.1, 5e-324)),
    frequencyHz: frequencyArb,
    ground: fc.oneof({ weight: 4, arbitrary: fc.constant(0) }, { weight: 1, arbitrary: fc.nat(5) }),
    amplitudes: fc.constantFrom('rms' as const, 'peak' as const),
  })
  .map((r) => {
    const pool = ['gnd', ...r.nodes.filter((n) => n !== 'gnd')];
    const pick = (i: number) => pool[r.picks[i] % pool.length];
    const elements: GraphElement[] = r.kinds.map((kind, i): GraphElement => {
      const id = r.ids[i];
      let a = i === 0 ? pool[1] : pick(4 * i);
      let b = i === 0 ? 'gnd' : pick(4 * i + 1);
      if (a === b) b = a === 'gnd' ? pool[1] : 'gnd';
      const v = r.values[i];
      const k = i === 0 ? 'voltage-source' : kind;
      switch (k) {
        case 'resistor': return { id, kind: k, nodes: [a, b], ohms: v };
        case 'inductor': return { id, kind: k, nodes: [a, b], henries: v, dot: r.picks[4 * i + 2] % 2 ? 'first' : 'second' };
        case 'capacitor': return { id, kind: k, nodes: [a, b], farads: v };
        case 'inductance-arm': return { id, kind: k, nodes: [a, b], henries: v };
        case 'voltage-source':
        case 'current-source': return { id, kind: k, nodes: [a, b], magnitude: Math.abs(v), phaseDeg: [0, 0, 180, -30, 90, 1e300][r.picks[4 * i + 3] % 6] };
        default: {
          let c = pick(4 * i + 2);
          let d = pick(4 * i + 3);
          if (c === d) d = c === 'gnd' ? pool[1] : 'gnd';
          if (a === b) a = pool[1];
          return { id, kind: 'ideal-transformer', nodes: [a, b, c, d], ratio: v };
        }
      }
    });
    const inductors = elements.filter((e) => e.kind === 'inductor');
    const model: GraphModel = { schema: 'coilwright.graph/1', frequencyHz: r.frequencyHz, amplitudes: r.amplitudes, ground: pool[r.ground % pool.length], elements };
    if (inductors.length >= 2) model.couplings = [{ id: `K_${r.ids[11]}`.slice(0, 128), windings: [inductors[0].id, inductors[1].id], k: r.k }];
    return model;
  });

/** Most models have names the rule accepts (so that they solve and their names can be followed out); the rest have any names. */
const modelArb = fc.oneof({ weight: 3, arbitrary: modelOf(validNameArb) }, { weight: 1, arbitrary: modelOf(nameArb) });

/** One refusal: a single line, long enough to say something, with no character that could hide or reorder it. */
function expectRefusalLine(message: string): void {
  expect(message).not.toMatch(/\n/);
  expect(message.length).toBeGreaterThan(10);
  expect(message).not.toMatch(HIDDEN);
}

/** Solves, or returns the refusal; anything else thrown fails the test. */
function solveOrRefuse(raw: unknown): { model: GraphModel; result: SolveResult } | { refused: string } {
  try {
    const model = parseGraphModel(raw);
    return { model, result: solveGraph(model) };
  } catch (e) {
    if (!(e instanceof ModelRefusal)) throw e;
    expectRefusalLine(e.message);
    return { refused: e.message };
  }
}

const ownKeys = (o: object) => new Set(Object.keys(o));

/** Every node and element of a solved model comes out as itself: in the result, its JSON and the readings. */
function expectEveryName(model: GraphModel, result: SolveResult): void {
  const json = formatJson(result);
  expect(json).not.toMatch(/NaN|Infinity|null/);
  const parsed = JSON.parse(json) as SolveResult;
  const nodes = new Set(model.elements.flatMap((e) => e.nodes));
  for (const n of nodes) {
    expect(Object.hasOwn(result.nodes, n), `node ${JSON.stringify(n)}`).toBe(true);
    expect(Object.hasOwn(parsed.nodes, n)).toBe(true);
  }
  for (const e of model.elements) {
    expect(Object.hasOwn(result.elements, e.id), `element ${JSON.stringify(e.id)}`).toBe(true);
    expect(Object.hasOwn(parsed.elements, e.id)).toBe(true);
  }
  expect(ownKeys(result.nodes).size).toBe(nodes.size);
  const rows = new Set(rawRows(result).map((r) => r.name));
  for (const e of model.elements) expect(rows.has(e.id) || rows.has(`${e.id} primary`)).toBe(true);
  const csvNames = new Set(parseCsv(resultsCsv(model, result, 'fuzz')).slice(1).map((r) => r[0]));
  const defused = (s: string) => JSON.parse(`"${csvField(s).slice(1, -1).replace(/""/g, '\\"').replace(/\\/g, '\\\\').replace(/\\\\"/g, '\\"')}"`);
  for (const n of nodes) expect(csvNames.has(defused(n)), `CSV node ${JSON.stringify(n)}`).toBe(true);
}

/** Draws a frame as the canvas does and checks it is a bounded amount of work for the sheet's size. */
function expectBoundedFrame(sheet: Sheet, solved: { result: SolveResult } | null): void {
  const W = 1200;
  const H = 800;
  const store = createEditorStore(sheet);
  fitView(store, W, H);
  const view = store.getState().view;
  const c = countingContext();
  const budget = gridBudget(W, H);
  expect(drawGrid(c.ctx, view, W, H)).toBeLessThanOrEqual(budget.cols * budget.rows);
  const circuit = deriveCircuit(sheet);
  const points = sheet.wires.reduce((n, w) => n + w.pts.length / 2, 0);
  const links = sheet.couplings.reduce((n, k) => n + k.windings.length, 0);
  c.reset();
  drawSheet(c.ctx, sheet, { selection: new Set(), topology: circuit.topology, culprits: new Set(), view, visible: visibleRect(view, W, H) });
  // per part its symbol (a few dozen primitives at most) and texts; per wire point one segment; per junction or open end one mark
  const sheetBound = 200 * sheet.parts.length + 10 * points + 20 * links + 40 * sheet.couplings.length + 20;
  expect(c.calls()).toBeLessThanOrEqual(sheetBound);
  expect(c.longestText()).toBeLessThanOrEqual(160); // a name is at most 128 characters; value texts are short
  if (!solved) return;
  const layout = overlayLayout(sheet, circuit, solved.result);
  expect(layout.arrows.length + layout.tags.length).toBeLessThanOrEqual(4 * (sheet.parts.length + sheet.wires.length) + circuit.topology.anchors.size);
  c.reset();
  drawOverlay(c.ctx, { sheet, hidden: null, result: solved.result, circuit, refusal: null, stale: false, view, visible: visibleRect(view, W, H), hoverNode: null, readout: 'polar' });
  expect(c.calls()).toBeLessThanOrEqual(20 * (layout.arrows.length + layout.tags.length) + 20);
  expect(c.longestText()).toBeLessThanOrEqual(200);
}

type Mutation = (s: Record<string, any>) => void;
const mutationArb: fc.Arbitrary<Mutation> = fc.oneof(
  fc.tuple(fc.nat(), fc.constantFrom(1e20, -1e300, 1_000_001, 5e-324, 999_999.5)).map(([i, v]): Mutation => (s) => { if (s.parts.length) s.parts[i % s.parts.length].x = v; }),
  fc.tuple(fc.nat(), fc.nat(), fc.constantFrom(4e15, -2e6)).map(([i, j, v]): Mutation => (s) => { if (s.wires.length) { const w = s.wires[i % s.wires.length]; w.pts[j % w.pts.length] = v; } }),
  fc.tuple(fc.nat(), nameArb).map(([i, n]): Mutation => (s) => { if (s.parts.length) s.parts[i % s.parts.length].ref = n; }),
  fc.tuple(fc.nat(), nameArb).map(([i, n]): Mutation => (s) => { const l = s.parts.filter((p: any) => p.kind === 'label'); if (l.length) l[i % l.length].name = n; }),
  fc.oneof(fc.string({ maxLength: 250 }), fc.constantFrom('x'.repeat(3_000_000), 'T\u202Eitle', 'Bench,=1+1')).map((t): Mutation => (s) => { s.title = t; }),
  fc.nat().map((i): Mutation => (s) => { if (s.wires.length) s.wires[i % s.wires.length].pts = Array.from({ length: 2100 }, (_, k) => 10 * k); }),
  fc.nat().map((i): Mutation => (s) => { if (s.parts.length > 1) s.parts[i % s.parts.length].id = s.parts[0].id; }),
  fc.constantFrom<Mutation>((s) => { delete s.frequencyHz; }, (s) => { s.parts = 'oops'; }, (s) => { s.couplings = [{ id: 'c:x', windings: ['nowhere', 'none'], value: 0.5 }]; }, () => {}),
);

describe('fuzzed hostile input, end to end', () => {
  it('graph models: solved with every name out, or refused in one clean line', () => {
    fc.assert(
      fc.property(modelArb, (model) => {
        const r = solveOrRefuse(JSON.parse(JSON.stringify(model)));
        if ('refused' in r) return;
        expectEveryName(r.model, r.result);
        const freqs = [r.model.frequencyHz || 1, 2 * (r.model.frequencyHz || 1)];
        try {
          const sweep = sweepGraph(r.model, freqs);
          for (const e of r.model.elements) expect(Object.hasOwn(sweep.elements, e.id)).toBe(true);
          expect(formatJson(sweep)).not.toMatch(/NaN|Infinity|null/);
        } catch (e) {
          if (!(e instanceof ModelRefusal)) throw e;
          expectRefusalLine(e.message);
        }
      }),
      { numRuns: 600, seed: 20261202 },
    );
  });

  it('graph model files through the command line reader: no throw but a refusal', async () => {
    await fc.assert(
      fc.asyncProperty(modelArb, fc.nat(), async (model, cut) => {
        const text = JSON.stringify(model);
        for (const t of [text, text.slice(0, cut % (text.length + 1))]) {
          try {
            const { model: m } = await loadModelText(t, 'fuzz.json');
            expectEveryName(m, solveGraph(m));
          } catch (e) {
            if (!(e instanceof ModelRefusal)) throw e;
            expectRefusalLine(e.message);
          }
        }
      }),
      { numRuns: 200, seed: 20261203 },
    );
  });

  it('sheets and their links: imported alike, drawn in bounded work, solved or refused, exported with every name', async () => {
    await fc.assert(
      fc.asyncProperty(modelArb, fc.oneof({ weight: 3, arbitrary: fc.constant([]) }, { weight: 2, arbitrary: fc.array(mutationArb, { minLength: 1, maxLength: 2 }) }), async (model, mutations) => {
        seedIds(77);
        const raw = JSON.parse(JSON.stringify(graphToSheet(model, 'Fuzzed bench'))) as Record<string, any>;
        for (const m of mutations) m(raw);
        const text = JSON.stringify(raw);
        let sheet: Sheet | null = null;
        let fileReason = '';
        try {
          sheet = parseSheetText(text);
        } catch (e) {
          expect(e).toBeInstanceOf(Error);
          fileReason = (e as Error).message;
          expectRefusalLine(fileReason);
          expect(fileReason).toMatch(/^Sheet is damaged: |^Not a Coilwright sheet/);
        }
        // the same sheet in a link: the same verdict, never anything but a LinkError
        if (text.length < 3_500_000) {
          try {
            expect(await decodeSheetPayload(await encodeSheetPayload(raw as Sheet))).toEqual(sheet);
          } catch (e) {
            if (!(e instanceof LinkError)) throw e;
            expect(sheet).toBeNull();
            expectRefusalLine(e.message);
          }
        }
        if (!sheet) return;
        const circuit = deriveCircuit(sheet);
        const r = solveOrRefuse(circuit.model);
        expectBoundedFrame(sheet, 'result' in r ? r : null);
        const svg = sheetToSvg(sheet, 'result' in r ? r.result : null, { date: '2026-12-02', version: 'fuzz' });
        expect(xmlProblem(svg)).toBeNull();
        expect(svgToSheet(svg)).toEqual(sheet);
        if ('refused' in r) return;
        expectEveryName(r.model, r.result);
        // the parts' designators and the node labels' names, on the drawing's table
        const shown = new Set(tableRows(svg).map((x) => x.name));
        for (const p of sheet.parts) {
          if (!PART_DEFS[p.kind].toElement) continue;
          expect(shown.has(p.ref) || shown.has(`${p.ref} primary`), `designator ${JSON.stringify(p.ref)}`).toBe(true);
        }
        // a label's name is a node of the circuit when a part is wired to it (a label left alone names nothing)
        const wired = new Set(r.model.elements.flatMap((e) => e.nodes));
        for (const p of sheet.parts) {
          if (p.kind === 'label' && wired.has(p.name!) && p.name !== r.model.ground) expect(shown.has(p.name!), `node ${JSON.stringify(p.name)}`).toBe(true);
        }
      }),
      { numRuns: 300, seed: 20261204 },
    );
  });

  it('arbitrary link payloads are refused with a LinkError, never thrown otherwise', async () => {
    const good = await encodeSheetPayload(graphToSheet({ schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd', elements: [{ id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 }] }));
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.string({ maxLength: 200 }), fc.tuple(fc.nat(good.length), fc.string({ maxLength: 3 })).map(([at, s]) => good.slice(0, at) + s + good.slice(at + s.length))), async (payload) => {
        try {
          await decodeSheetPayload(payload);
        } catch (e) {
          if (!(e instanceof LinkError)) throw e;
          expectRefusalLine(e.message);
        }
      }),
      { numRuns: 300, seed: 20261205 },
    );
  });
});
