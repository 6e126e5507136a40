import { describe, expect, it } from 'vitest';
import { gridShape, mesh2d, mulberry32, nodeNames, probeNode, rlcLadder, star } from '../../scripts/bench/generators';
import type { GraphElement, GraphModel } from '../../src/model/graph';

/** Nodes reachable from ground through elements (couplings do not join nodes). */
function reachableFromGround(model: GraphModel): Set<string> {
  const adj = new Map<string, string[]>();
  const link = (a: string, b: string) => {
    if (!adj.has(a)) adj.set(a, []);
    adj.get(a)!.push(b);
  };
  for (const el of model.elements) {
    const pairs = el.kind === 'ideal-transformer' ? [[0, 1], [2, 3]] : [[0, 1]];
    for (const [i, j] of pairs) {
      link(el.nodes[i], el.nodes[j]);
      link(el.nodes[j], el.nodes[i]);
    }
  }
  const seen = new Set([model.ground]);
  const stack = [model.ground];
  while (stack.length) for (const next of adj.get(stack.pop()!) ?? []) if (!seen.has(next)) (seen.add(next), stack.push(next));
  return seen;
}

function valueOf(el: GraphElement): number {
  switch (el.kind) {
    case 'resistor': return el.ohms;
    case 'inductor':
    case 'inductance-arm': return el.henries;
    case 'capacitor': return el.farads;
    case 'ideal-transformer': return el.ratio;
    case 'voltage-source':
    case 'current-source': return el.magnitude;
    default: throw new Error(`the generators make no ${el.kind}`);
  }
}

function checkCommon(model: GraphModel) {
  expect(model.schema).toBe('coilwright.graph/1'); // the interchange's schema tag (graph-model spec)
  expect(['rms', 'peak']).toContain(model.amplitudes);
  const ids = model.elements.map((e) => e.id);
  expect(new Set(ids).size).toBe(ids.length); // ids unique (graph-model spec: duplicate id is refused)
  for (const el of model.elements) {
    const v = valueOf(el);
    expect(Number.isFinite(v) && v > 0).toBe(true); // R, L, C > 0 and finite (graph-model spec value ranges)
    expect(el.nodes[0]).not.toBe(el.nodes[1]); // no part shorted onto one node (common practice)
  }
  // Every inductor in at most one coupling with 0.3 <= k <= 0.9: each 2x2 block is positive
  // definite (k < 1), so the whole inductance matrix is (energy argument, field notes).
  const inductors = new Map(model.elements.filter((e) => e.kind === 'inductor').map((e) => [e.id, e]));
  const coupled = new Set<string>();
  for (const c of model.couplings ?? []) {
    expect(c.windings).toHaveLength(2);
    for (const w of c.windings) {
      expect(inductors.has(w)).toBe(true); // couplings name existing inductors (graph-model spec)
      expect(coupled.has(w)).toBe(false);
      coupled.add(w);
    }
    expect(c.k).toBeGreaterThanOrEqual(0.3); // brief: k ~ 0.3 .. 0.9
    expect(c.k).toBeLessThanOrEqual(0.9);
  }
  // Every node tied to ground through parts: nothing floats (graph-model spec: undetermined node is refused).
  expect(reachableFromGround(model).size).toBe(nodeNames(model).size);
}

describe('mulberry32', () => {
  it('is deterministic per seed and stays in [0, 1)', () => {
    const a = mulberry32(7);
    const b = mulberry32(7);
    const c = mulberry32(8);
    const xs = Array.from({ length: 1000 }, () => a());
    expect(xs).toEqual(Array.from({ length: 1000 }, () => b())); // same seed, same stream (definition of a seeded PRNG)
    expect(xs.slice(0, 5)).not.toEqual(Array.from({ length: 5 }, () => c()));
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...xs)).toBeLessThan(1);
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length;
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.05); // uniform mean 1/2, sd of the mean 0.009 at n=1000 (common statistics)
  });
});

describe('rlcLadder', () => {
  it.each([100, 1000, 10000])('has exactly %i nodes and a valid structure', (n) => {
    const model = rlcLadder(n);
    expect(nodeNames(model).size).toBe(n); // ground + a0 + two nodes per section
    checkCommon(model);
    const sections = (n - 2) / 2;
    expect(model.elements).toHaveLength(1 + 4 * sections); // source + R, L, C, shunt R per section
    // one coupling per ten sections (i % 10 == 5 with a next section)
    expect(model.couplings).toHaveLength(Math.floor((sections - 7) / 10) + 1);
  });

  it('is deterministic and seed-dependent', () => {
    expect(JSON.stringify(rlcLadder(1000, { seed: 3 }))).toBe(JSON.stringify(rlcLadder(1000, { seed: 3 })));
    expect(JSON.stringify(rlcLadder(1000, { seed: 3 }))).not.toBe(JSON.stringify(rlcLadder(1000, { seed: 4 })));
  });

  it('keeps values in their bands', () => {
    const model = rlcLadder(2000);
    for (const el of model.elements) {
      if (el.kind === 'inductor') expect(el.henries).toBeGreaterThanOrEqual(9.99e-6), expect(el.henries).toBeLessThanOrEqual(1.001e-3);
      if (el.kind === 'capacitor') expect(el.farads).toBeGreaterThanOrEqual(0.999e-9), expect(el.farads).toBeLessThanOrEqual(100.1e-9);
      if (el.kind === 'resistor' && el.id.startsWith('Rsh')) expect(el.ohms).toBeGreaterThanOrEqual(999);
    }
    expect(model.couplings![0].windings).toEqual(['L5', 'L6']); // section 5 with its neighbour 6
  });

  it('probes the far end of the ladder', () => {
    expect(probeNode('ladder', rlcLadder(100))).toBe('a49'); // 49 sections: a0 .. a49
  });
});

describe('mesh2d', () => {
  it('splits sizes into near-square grids', () => {
    expect(gridShape(100)).toEqual({ rows: 10, cols: 10 });
    expect(gridShape(1000)).toEqual({ rows: 25, cols: 40 });
    expect(gridShape(10000)).toEqual({ rows: 100, cols: 100 });
    expect(gridShape(100000)).toEqual({ rows: 250, cols: 400 });
  });

  it.each([100, 1000, 10000])('has exactly %i nodes and a valid structure', (n) => {
    const model = mesh2d(n);
    expect(nodeNames(model).size).toBe(n);
    checkCommon(model);
    const { rows, cols } = gridShape(n);
    const edges = rows * (cols - 1) + cols * (rows - 1); // grid graph edge count
    const sources = model.elements.filter((e) => e.kind === 'voltage-source' || e.kind === 'current-source');
    expect(model.elements.length - sources.length).toBe(edges);
    expect(sources.length).toBeGreaterThanOrEqual(4);
    for (const s of sources) {
      // sources tie an interior node to the ground corner, never ground to itself
      expect(s.nodes).toContain(model.ground);
      expect(s.nodes.filter((x) => x === model.ground)).toHaveLength(1);
    }
    expect(model.couplings!.length).toBeGreaterThan(0);
  });

  it('gives every interior node a resistor, an inductor and a capacitor', () => {
    const model = mesh2d(400);
    const kinds = new Map<string, Set<string>>();
    for (const el of model.elements) for (const n of el.nodes) (kinds.get(n) ?? kinds.set(n, new Set()).get(n)!).add(el.kind);
    const { rows, cols } = gridShape(400);
    for (let r = 1; r < rows - 1; r++)
      for (let c = 1; c < cols - 1; c++) {
        const k = kinds.get(`n${r}_${c}`)!;
        expect(k.has('resistor') && k.has('inductor') && k.has('capacitor')).toBe(true);
      }
  });

  it('is deterministic', () => {
    expect(JSON.stringify(mesh2d(1000))).toBe(JSON.stringify(mesh2d(1000)));
  });

  it('probes a node near the centre', () => {
    expect(probeNode('mesh', mesh2d(100))).toBe('n5_6');
  });
});

describe('star', () => {
  it.each([3, 100, 10000])('has exactly %i nodes, all but ground joined to the hub', (n) => {
    const model = star(n);
    expect(nodeNames(model).size).toBe(n); // ground, hub, n - 2 leaves
    checkCommon(model);
    expect(model.elements).toHaveLength(1 + 2 * (n - 2)); // source, then a resistor to the hub and one to ground per leaf
    const hubDegree = model.elements.filter((e) => e.nodes.includes('hub')).length;
    expect(hubDegree).toBe(n - 1); // every leaf and the source: a star (graph definition)
    expect(probeNode('star', model)).toBe('s0');
  });

  it('is deterministic', () => {
    expect(JSON.stringify(star(500, { seed: 5 }))).toBe(JSON.stringify(star(500, { seed: 5 })));
  });
});
