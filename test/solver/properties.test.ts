import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { solveGraph, tellegenResidual } from '../../src/solver';
import type { GraphElement, GraphModel, Coupling, SolveResult, ComplexJson } from '../../src/model/graph';
import { referenceSolve } from '../reference/dense-mna';
import { cabs } from '../helpers';

/**
 * Property tests on random valid circuits of up to 60 nodes. Checks: an
 * independent dense solve (mathjs lusolve), Kirchhoff's current law at every
 * node, Tellegen's theorem (Tellegen, 1952), and the dot rules of the contract
 * (flipping both dots of a pair changes nothing; flipping one equals −M).
 */

interface Spec {
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

const specArb = fc
  .integer({ min: 3, max: 60 })
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
      sources: fc.array(fc.record({ edge: fc.nat(), mag: fc.double({ min: 0, max: 100, noNaN: true }), phase: fc.double({ min: -180, max: 180, noNaN: true }) }), { minLength: 1, maxLength: 3 }),
      currents: fc.array(fc.record({ a: fc.nat(nodes - 1), b: fc.nat(nodes - 1), mag: fc.double({ min: 0, max: 2, noNaN: true }), phase: fc.double({ min: -180, max: 180, noNaN: true }) }), { maxLength: 3 }),
      couplings: fc.array(fc.record({ i: fc.nat(), j: fc.nat(), k: fc.double({ min: 0, max: 0.98, noNaN: true }) }), { maxLength: 4 }),
      transformer: fc.boolean(),
      freq: fc.double({ min: 10, max: 1e5, noNaN: true }),
      dots: fc.array(fc.boolean(), { minLength: 200, maxLength: 200 }),
    }),
  );

/** Builds a connected model: a random spanning tree plus extra edges; sources sit on tree edges only. */
function build(s: Spec): GraphModel {
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

function close(a: ComplexJson, b: ComplexJson, scale: number, rel: number): boolean {
  return Math.hypot(a.re - b.re, a.im - b.im) <= rel * scale + 1e-12;
}

function maxNodeVoltage(r: SolveResult): number {
  return Math.max(1e-12, ...Object.values(r.nodes).map(cabs));
}

function terminalCurrents(r: SolveResult, m: GraphModel): Map<string, ComplexJson> {
  const sum = new Map<string, ComplexJson>();
  const addTo = (node: string, c: ComplexJson, sign: number) => {
    const s = sum.get(node) ?? { re: 0, im: 0 };
    sum.set(node, { re: s.re + sign * c.re, im: s.im + sign * c.im });
  };
  for (const e of m.elements) {
    const res = r.elements[e.id];
    if ('currents' in res && e.kind === 'ideal-transformer') {
      addTo(e.nodes[0], res.currents[0], 1);
      addTo(e.nodes[1], res.currents[0], -1);
      addTo(e.nodes[2], res.currents[1], 1);
      addTo(e.nodes[3], res.currents[1], -1);
    } else if ('current' in res) {
      addTo(e.nodes[0], res.current, 1);
      addTo(e.nodes[1], res.current, -1);
    }
  }
  return sum;
}

describe('random circuits', () => {
  it('agree with an independent dense solve (mathjs lusolve) to 1e-9', () => {
    fc.assert(
      fc.property(specArb, (s) => {
        const m = build(s);
        const r = solveGraph(m);
        const ref = referenceSolve(m);
        const scale = maxNodeVoltage(r);
        for (const [name, v] of ref.nodes) {
          if (!close(r.nodes[name], v, scale, 1e-9)) throw new Error(`node ${name}: ${JSON.stringify(r.nodes[name])} vs reference ${JSON.stringify(v)}`);
        }
      }),
      { numRuns: 25, seed: 20261201 },
    );
  });

  it('satisfy KCL at every node and Tellegen within 1e-9 of the largest element power', () => {
    fc.assert(
      fc.property(specArb, (s) => {
        const m = build(s);
        const r = solveGraph(m);
        const currents = Object.values(r.elements).flatMap((e) => ('currents' in e ? e.currents : [e.current]));
        const scale = Math.max(1e-12, ...currents.map(cabs));
        for (const [node, c] of terminalCurrents(r, m)) {
          // KCL: the currents leaving a node sum to zero
          if (cabs(c) > 1e-9 * scale) throw new Error(`KCL at ${node}: ${cabs(c)} vs scale ${scale}`);
        }
        // Tellegen's theorem (Tellegen, 1952)
        expect(tellegenResidual(r).relative).toBeLessThan(1e-9);
      }),
      { numRuns: 40, seed: 7 },
    );
  });

  it('flipping both dots of a pair changes nothing; flipping one equals negating M', () => {
    fc.assert(
      fc.property(specArb, (s) => {
        const m = build(s);
        if (!m.couplings?.length) return;
        const pair = m.couplings[0].windings;
        const flip = (mm: GraphModel, ids: string[]): GraphModel => ({
          ...mm,
          elements: mm.elements.map((e) => (e.kind === 'inductor' && ids.includes(e.id) ? { ...e, dot: e.dot === 'second' ? 'first' : 'second' } : e)),
        });
        const a = solveGraph(m);
        const both = solveGraph(flip(m, pair));
        const scale = maxNodeVoltage(a);
        for (const name of Object.keys(a.nodes)) {
          if (!close(both.nodes[name], a.nodes[name], scale, 1e-9)) throw new Error(`both-dot flip changed node ${name}`);
        }
        // one dot flipped (every coupling has one pair here) vs the reference with every M negated
        const singles = m.couplings.map((c) => c.windings[0]);
        const one = solveGraph(flip(m, singles));
        const ref = referenceSolve(m, -1);
        const s2 = maxNodeVoltage(one);
        for (const [name, v] of ref.nodes) {
          if (!close(one.nodes[name], v, s2, 1e-9)) throw new Error(`single flip vs −M differs at ${name}`);
        }
      }),
      { numRuns: 20, seed: 99 },
    );
  });
});
