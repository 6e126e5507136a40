import type { GraphModel, GraphElement } from '../model/graph';
import { ModelRefusal } from './errors';

/**
 * Graph facts the solver needs before it builds a matrix: node numbering,
 * galvanically isolated parts and their reference nodes, and the diagnosis of
 * models whose matrix would be singular (named from the graph, never as
 * "singular matrix").
 */

export class UnionFind {
  readonly parent: Int32Array;
  constructor(n: number) {
    this.parent = new Int32Array(n);
    for (let i = 0; i < n; i++) this.parent[i] = i;
  }
  find(x: number): number {
    const p = this.parent;
    while (p[x] !== x) {
      p[x] = p[p[x]];
      x = p[x];
    }
    return x;
  }
  /** Joins the sets; false when they were joined already. */
  union(a: number, b: number): boolean {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra === rb) return false;
    if (ra < rb) this.parent[rb] = ra;
    else this.parent[ra] = rb;
    return true;
  }
}

export interface Topology {
  nodeNames: string[];
  nodeIndex: Map<string, number>;
  /** node indices of element i's terminals at [4·i .. 4·i+3] (−1 past a two-terminal part's second) */
  terminals: Int32Array;
  /** node -> its reference node (ground, or the isolated part's own reference) */
  referenceOf: Int32Array;
  /** true for nodes held at 0 V (ground and each isolated part's reference) */
  isReference: Uint8Array;
  warnings: string[];
}

/** Joins an element's galvanic terminal pairs: a two-terminal part joins its nodes; a transformer joins each side. */
function joinGalvanic(uf: UnionFind, el: GraphElement, terminals: Int32Array, i: number): void {
  uf.union(terminals[4 * i], terminals[4 * i + 1]);
  if (el.kind === 'ideal-transformer') uf.union(terminals[4 * i + 2], terminals[4 * i + 3]);
}

export function buildTopology(model: GraphModel): Topology {
  const nodeIndex = new Map<string, number>();
  const nodeNames: string[] = [];
  const elements = model.elements;
  const terminals = new Int32Array(4 * elements.length).fill(-1);
  for (let i = 0; i < elements.length; i++) {
    const names = elements[i].nodes;
    for (let t = 0; t < names.length; t++) {
      let idx = nodeIndex.get(names[t]);
      if (idx === undefined) {
        idx = nodeNames.length;
        nodeIndex.set(names[t], idx);
        nodeNames.push(names[t]);
      }
      terminals[4 * i + t] = idx;
    }
  }
  const ground = nodeIndex.get(model.ground);
  if (ground === undefined) {
    throw new ModelRefusal(`node "${model.ground}": the ground node is not a terminal of any element; set "ground" to one of the model's nodes`, [{ kind: 'node', id: model.ground }]);
  }
  const n = nodeNames.length;
  const parts = new UnionFind(n);
  for (let i = 0; i < elements.length; i++) joinGalvanic(parts, elements[i], terminals, i);

  checkCurrentSourceCutSets(model, terminals, nodeNames, n);

  // Reference of each part: ground for its own part; otherwise the first node
  // of the part met when reading elements in order, each element's nodes in order.
  const refOfRoot = new Map<number, number>();
  refOfRoot.set(parts.find(ground), ground);
  for (let t = 0; t < terminals.length; t++) {
    const v = terminals[t];
    if (v < 0) continue;
    const r = parts.find(v);
    if (!refOfRoot.has(r)) refOfRoot.set(r, v);
  }
  const referenceOf = new Int32Array(n);
  const isReference = new Uint8Array(n);
  const members = new Map<number, string[]>();
  for (let v = 0; v < n; v++) {
    const r = parts.find(v);
    referenceOf[v] = refOfRoot.get(r)!;
    if (referenceOf[v] === v) isReference[v] = 1;
    if (r !== parts.find(ground)) {
      if (!members.has(r)) members.set(r, []);
      members.get(r)!.push(nodeNames[v]);
    }
  }
  const warnings: string[] = [];
  for (const [root, names] of members) {
    const ref = nodeNames[refOfRoot.get(root)!];
    warnings.push(
      `isolated part: nodes ${names.map((s) => `"${s}"`).join(', ')} have no galvanic path to ground "${model.ground}"; ` +
        `their voltages are given relative to node "${ref}", held at 0 V (currents and powers are exact)`,
    );
  }
  return { nodeNames, nodeIndex, terminals, referenceOf, isReference, warnings };
}

function checkCurrentSourceCutSets(model: GraphModel, terminals: Int32Array, nodeNames: string[], n: number): void {
  const uf = new UnionFind(n);
  model.elements.forEach((el, i) => {
    if (el.kind !== 'current-source') joinGalvanic(uf, el, terminals, i);
  });
  model.elements.forEach((el, i) => {
    if (el.kind !== 'current-source') return;
    const a = terminals[4 * i];
    const b = terminals[4 * i + 1];
    if (uf.find(a) !== uf.find(b)) {
      const side = [] as string[];
      const root = uf.find(b);
      for (let v = 0; v < n && side.length < 6; v++) if (uf.find(v) === root) side.push(`"${nodeNames[v]}"`);
      throw new ModelRefusal(
        `element "${el.id}" (current-source): it is part of a cut set of current sources — the nodes ${side.join(', ')} are joined to the rest only through current sources, ` +
          `so their current cannot balance; add a resistor (or other part) between node "${nodeNames[a]}" and node "${nodeNames[b]}" or remove the source`,
        [{ kind: 'element', id: el.id }],
      );
    }
  });
}

/**
 * Diagnoses what would make the MNA matrix singular at this frequency:
 * nodes whose voltage nothing fixes (at 0 Hz, reached only through capacitors
 * or current sources), and loops of ideal voltage constraints (voltage
 * sources, ideal-transformer windings, and at 0 Hz inductors, which are shorts).
 */
export function checkSolvable(model: GraphModel, topo: Topology, frequencyHz: number): void {
  const dc = frequencyHz === 0;
  const n = topo.nodeNames.length;
  const { terminals, nodeNames } = topo;

  if (dc) {
    // Each node must reach its reference through parts that conduct at 0 Hz.
    const uf = new UnionFind(n);
    model.elements.forEach((el, i) => {
      if (el.kind !== 'capacitor' && el.kind !== 'current-source') joinGalvanic(uf, el, terminals, i);
    });
    for (let v = 0; v < n; v++) {
      if (uf.find(v) !== uf.find(topo.referenceOf[v])) {
        const via = model.elements.filter((el) => el.nodes.includes(nodeNames[v])).map((el) => `"${el.id}"`);
        throw new ModelRefusal(
          `node "${nodeNames[v]}": its voltage is undetermined at 0 Hz — it is reached only through capacitors or current sources (${via.join(', ')}), which pass no direct current; ` +
            `add a resistor from it to the circuit or solve at a frequency above 0 Hz`,
          [{ kind: 'node', id: nodeNames[v] }],
        );
      }
    }
    for (const el of model.elements) {
      if ((el.kind === 'voltage-source' || el.kind === 'current-source') && el.phaseDeg % 180 !== 0) {
        throw new ModelRefusal(`element "${el.id}" (${el.kind}): at 0 Hz a source's phaseDeg must be 0 or 180, got ${el.phaseDeg}; set it to 0 (or 180 for a reversed source)`, [{ kind: 'element', id: el.id }]);
      }
    }
  }

  checkVoltageConstraints(model, topo, dc);
}

/**
 * The voltage constraints (voltage sources, at 0 Hz inductors, and each ideal
 * transformer's V_p − ratio·V_s = 0) must be independent, or they fix one
 * voltage twice. Plain branches are checked with a spanning forest (a loop is
 * a cycle); transformer rows are then reduced against each other over the
 * node classes that forest leaves, and a row that vanishes is a loop.
 */
function checkVoltageConstraints(model: GraphModel, topo: Topology, dc: boolean): void {
  const n = topo.nodeNames.length;
  const { terminals } = topo;
  const adj: { to: number; label: string }[][] = Array.from({ length: n }, () => []);
  const uf = new UnionFind(n);
  // every reference node is held at 0 V: one class
  let firstRef = -1;
  for (let v = 0; v < n; v++) {
    if (!topo.isReference[v]) continue;
    if (firstRef < 0) firstRef = v;
    else uf.union(firstRef, v);
  }
  const kindOfLoop = dc ? 'voltage sources, ideal-transformer windings and inductors (shorts at 0 Hz)' : 'voltage sources and ideal-transformer windings';
  model.elements.forEach((el, i) => {
    let label: string | null = null;
    if (el.kind === 'voltage-source') label = `"${el.id}"`;
    else if ((el.kind === 'inductor' || el.kind === 'inductance-arm') && dc) label = `"${el.id}" (a short at 0 Hz)`;
    if (label === null) return;
    const a = terminals[4 * i];
    const b = terminals[4 * i + 1];
    if (!uf.union(a, b)) {
      const loop = [label, ...findPath(adj, a, b)];
      throw new ModelRefusal(
        `element "${el.id}": ${loop.join(', ')} form a loop of ${kindOfLoop}, which fixes one voltage twice; add a series resistance in the loop or remove one of them`,
        [{ kind: 'element', id: el.id }],
      );
    }
    adj[a].push({ to: b, label });
    adj[b].push({ to: a, label });
  });

  // Transformer rows over node classes; the reference class is the dropped coordinate.
  const zero = firstRef >= 0 ? uf.find(firstRef) : -1;
  const pivots: { pivot: number; row: Map<number, number>; ids: Set<string> }[] = [];
  model.elements.forEach((el, i) => {
    if (el.kind !== 'ideal-transformer') return;
    const nodes = terminals.subarray(4 * i, 4 * i + 4);
    const row = new Map<number, number>();
    const add = (v: number, c: number) => {
      const cls = uf.find(v);
      if (cls === zero) return;
      row.set(cls, (row.get(cls) ?? 0) + c);
    };
    add(nodes[0], 1);
    add(nodes[1], -1);
    add(nodes[2], -el.ratio);
    add(nodes[3], el.ratio);
    const scale = Math.max(1, el.ratio);
    const ids = new Set([el.id]);
    for (const p of pivots) {
      const c = row.get(p.pivot);
      if (c === undefined || Math.abs(c) <= 1e-12 * scale) continue;
      const factor = c / p.row.get(p.pivot)!;
      for (const [cls, v] of p.row) row.set(cls, (row.get(cls) ?? 0) - factor * v);
      for (const id of p.ids) ids.add(id);
    }
    let pivot = -1;
    let best = 1e-9 * scale;
    for (const [cls, v] of row) {
      if (Math.abs(v) > best) {
        best = Math.abs(v);
        pivot = cls;
      }
    }
    if (pivot < 0) {
      const others: string[] = [];
      for (const [a, b] of [[nodes[0], nodes[1]], [nodes[2], nodes[3]]]) {
        if (uf.find(a) === uf.find(b)) others.push(...findPath(adj, a, b));
      }
      ids.delete(el.id);
      const names = [...[...ids].map((id) => `"${id}"`), ...others];
      throw new ModelRefusal(
        `element "${el.id}" (ideal-transformer): its windings ${names.length ? `and ${[...new Set(names)].join(', ')} ` : ''}form a loop of ${kindOfLoop}, which fixes one voltage twice; add a series resistance in the loop or remove one of them`,
        [{ kind: 'element', id: el.id }],
      );
    }
    pivots.push({ pivot, row, ids });
  });
}

function findPath(adj: { to: number; label: string }[][], from: number, to: number): string[] {
  const prev = new Map<number, { node: number; label: string }>();
  const queue = [from];
  prev.set(from, { node: -1, label: '' });
  while (queue.length) {
    const v = queue.shift()!;
    if (v === to) break;
    for (const e of adj[v]) {
      if (!prev.has(e.to)) {
        prev.set(e.to, { node: v, label: e.label });
        queue.push(e.to);
      }
    }
  }
  const labels: string[] = [];
  let cur = to;
  while (cur !== from && prev.has(cur)) {
    const p = prev.get(cur)!;
    labels.push(p.label);
    cur = p.node;
  }
  return labels;
}
