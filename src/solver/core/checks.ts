/**
 * Diagnoses from the graph what would make the system singular, so a refusal
 * names the cause (never "singular matrix"): nodes nothing fixes at 0 Hz, and
 * loops of ideal voltage constraints. The roles come from the element
 * definitions.
 */
import type { GraphModel } from '../../model/graph';
import { UnionFind } from '../../model/unionFind';
import { ModelRefusal } from '../errors';
import { defOf } from '../elements/registry';
import { joinGalvanic, type Topology } from './topology';

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
      if (defOf(el).roles.conductsDc) joinGalvanic(uf, model, terminals, i);
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
      if (defOf(el).roles.source && (el as { phaseDeg: number }).phaseDeg % 180 !== 0) {
        throw new ModelRefusal(`element "${el.id}" (${el.kind}): at 0 Hz a source's phaseDeg must be 0 or 180, got ${(el as { phaseDeg: number }).phaseDeg}; set it to 0 (or 180 for a reversed source)`, [{ kind: 'element', id: el.id }]);
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
    const def = defOf(el);
    let label: string | null = null;
    if (def.roles.fixesVoltage === 'always') label = `"${el.id}"`;
    else if (def.roles.fixesVoltage === 'dc' && dc) label = `"${el.id}" (${def.dcNote ?? 'a short at 0 Hz'})`;
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
    const ratioOf = defOf(el).ratio;
    if (!ratioOf) return;
    const ratio = ratioOf(el as never);
    const nodes = terminals.subarray(4 * i, 4 * i + 4);
    const row = new Map<number, number>();
    const add = (v: number, c: number) => {
      const cls = uf.find(v);
      if (cls === zero) return;
      row.set(cls, (row.get(cls) ?? 0) + c);
    };
    add(nodes[0], 1);
    add(nodes[1], -1);
    add(nodes[2], -ratio);
    add(nodes[3], ratio);
    const scale = Math.max(1, ratio);
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
        `element "${el.id}" (${el.kind}): its windings ${names.length ? `and ${[...new Set(names)].join(', ')} ` : ''}form a loop of ${kindOfLoop}, which fixes one voltage twice; add a series resistance in the loop or remove one of them`,
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
