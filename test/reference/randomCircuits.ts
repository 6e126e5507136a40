import fc from 'fast-check';
import type { GraphElement, GraphModel, Coupling } from '../../src/model/graph';

/**
 * Random valid circuits for property tests: a random spanning tree of
 * resistors, inductors and capacitors (reactive tree parts damped in parallel),
 * extra random edges, voltage sources on tree edges, current sources, an
 * optional ideal transformer, and disjoint coupled pairs (so the inductance
 * matrix is positive semidefinite for any k <= 1).
 */

export interface Spec {
  nodes: number;
  tree: { parent: number; kind: number; value: number }[];
  extra: { a: number; b: number; kind: number; value: number }[];
  sources: { edge: number; mag: number; phase: number }[];
  currents: { a: number; b: number; mag: number; phase: number }[];
  couplings: { i: number; j: number; k: number }[];
  transformer: boolean;
  freq: number;
  dots: boolean[];
}

/** A double in [min, max], with the subnormal and near-zero ones (which the graph reader refuses as values) as 0. */
const physical = (min: number, max: number) => fc.double({ min, max, noNaN: true }).map((v) => (Math.abs(v) < 1e-100 ? 0 : v));

/** Random circuit specifications of min..max nodes. */
export const circuitSpec = (min: number, max: number) => fc
  .integer({ min, max })
  .chain((nodes) =>
    fc.record({
      nodes: fc.constant(nodes),
      tree: fc.array(
        fc.record({ parent: fc.nat(), kind: fc.integer({ min: 0, max: 2 }), value: fc.double({ min: 0.1, max: 10, noNaN: true }) }),
        { minLength: nodes - 1, maxLength: nodes - 1 },
      ),
      extra: fc.array(
        fc.record({ a: fc.nat(nodes - 1), b: fc.nat(nodes - 1), kind: fc.integer({ min: 0, max: 2 }), value: fc.double({ min: 0.1, max: 10, noNaN: true }) }),
        { maxLength: nodes },
      ),
      sources: fc.array(fc.record({ edge: fc.nat(), mag: physical(0, 100), phase: fc.double({ min: -180, max: 180, noNaN: true }) }), { minLength: 1, maxLength: 3 }),
      currents: fc.array(fc.record({ a: fc.nat(nodes - 1), b: fc.nat(nodes - 1), mag: physical(0, 2), phase: fc.double({ min: -180, max: 180, noNaN: true }) }), { maxLength: 3 }),
      couplings: fc.array(fc.record({ i: fc.nat(), j: fc.nat(), k: physical(0, 0.98) }), { maxLength: 4 }),
      transformer: fc.boolean(),
      freq: fc.double({ min: 10, max: 1e5, noNaN: true }),
      dots: fc.array(fc.boolean(), { minLength: 200, maxLength: 200 }),
    }),
  );

export const specArb = circuitSpec(3, 60);

/** Builds a connected model: a random spanning tree plus extra edges; sources sit on tree edges only. */
export function build(s: Spec): GraphModel {
  const n = (i: number) => (i === 0 ? 'gnd' : `n${i}`);
  const elements: GraphElement[] = [];
  const part = (id: string, a: string, b: string, kind: number, value: number, dotIdx: number): GraphElement => {
    if (kind === 0) return { id, kind: 'resistor', nodes: [a, b], ohms: value * 10 };
    if (kind === 1) return { id, kind: 'inductor', nodes: [a, b], henries: value * 1e-3, dot: s.dots[dotIdx % 200] ? 'first' : 'second' };
    return { id, kind: 'capacitor', nodes: [a, b], farads: value * 1e-6 };
  };
  const treeEdges: [string, string][] = [];
  s.tree.forEach((t, i) => {
    const child = i + 1;
    const parent = t.parent % child;
    treeEdges.push([n(parent), n(child)]);
  });
  const sourceEdges = new Set(s.sources.map((src) => src.edge % treeEdges.length));
  treeEdges.forEach(([a, b], i) => {
    if (sourceEdges.has(i)) {
      const src = s.sources.find((x) => x.edge % treeEdges.length === i)!;
      elements.push({ id: `V${i}`, kind: 'voltage-source', nodes: [a, b], magnitude: src.mag, phaseDeg: src.phase });
      // a series part keeps the source's node connected through something else too
      elements.push({ id: `Rv${i}`, kind: 'resistor', nodes: [a, b], ohms: 50 });
    } else {
      const t = s.tree[i];
      // damping in parallel with reactive tree parts avoids exact lossless resonances
      elements.push(part(`T${i}`, a, b, t.kind, t.value, i));
      if (t.kind !== 0) elements.push({ id: `Rd${i}`, kind: 'resistor', nodes: [a, b], ohms: 1000 * t.value });
    }
  });
  s.extra.forEach((e, i) => {
    if (e.a === e.b) return;
    elements.push(part(`X${i}`, n(e.a), n(e.b), e.kind, e.value, 100 + i));
  });
  s.currents.forEach((c, i) => {
    if (c.a === c.b) return;
    elements.push({ id: `I${i}`, kind: 'current-source', nodes: [n(c.a), n(c.b)], magnitude: c.mag, phaseDeg: c.phase });
  });
  if (s.transformer) {
    const a = n(s.nodes - 1);
    elements.push({ id: 'TX', kind: 'ideal-transformer', nodes: [a, 'gnd', 'xs', 'gnd'], ratio: 3 });
    elements.push({ id: 'RX', kind: 'resistor', nodes: ['xs', 'gnd'], ohms: 7 });
  }
  const inductors = elements.filter((e) => e.kind === 'inductor').map((e) => e.id);
  const couplings: Coupling[] = [];
  const used = new Set<string>();
  s.couplings.forEach((c, idx) => {
    if (inductors.length < 2) return;
    const a = inductors[c.i % inductors.length];
    const b = inductors[(c.i + 1 + (c.j % (inductors.length - 1))) % inductors.length];
    // pairwise-disjoint pairs keep the inductance matrix PSD for any k <= 1
    if (a === b || used.has(a) || used.has(b)) return;
    used.add(a).add(b);
    couplings.push({ id: `K${idx}`, windings: [a, b], k: c.k });
  });
  return { schema: 'coilwright.graph/1', frequencyHz: s.freq, amplitudes: 'rms', ground: 'gnd', elements, couplings };
}

