/**
 * Graph facts the solver needs before it builds a matrix: node numbering,
 * galvanically isolated parts and their reference nodes (graph-model contract,
 * "Galvanically isolated parts"). Which terminals an element joins comes from
 * its definition's roles.
 */
import type { GraphModel } from '../../model/graph';
import { UnionFind } from '../../model/unionFind';
import { ModelRefusal } from '../errors';
import { defOf } from '../elements/registry';

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

/** Joins the terminal pairs element i joins galvanically; */
export function joinGalvanic(uf: UnionFind, model: GraphModel, terminals: Int32Array, i: number): void {
  for (const [a, b] of defOf(model.elements[i]).roles.galvanic) uf.union(terminals[4 * i + a], terminals[4 * i + b]);
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
  for (let i = 0; i < elements.length; i++) joinGalvanic(parts, model, terminals, i);

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
  const drives = model.elements.map((el) => defOf(el).roles.source === 'current');
  model.elements.forEach((_el, i) => {
    if (!drives[i]) joinGalvanic(uf, model, terminals, i);
  });
  model.elements.forEach((el, i) => {
    if (!drives[i]) return;
    const a = terminals[4 * i];
    const b = terminals[4 * i + 1];
    if (uf.find(a) !== uf.find(b)) {
      const side = [] as string[];
      const root = uf.find(b);
      for (let v = 0; v < n && side.length < 6; v++) if (uf.find(v) === root) side.push(`"${nodeNames[v]}"`);
      throw new ModelRefusal(
        `element "${el.id}" (${el.kind}): it is part of a cut set of current sources — the nodes ${side.join(', ')} are joined to the rest only through current sources, ` +
          `so their current cannot balance; add a resistor (or other part) between node "${nodeNames[a]}" and node "${nodeNames[b]}" or remove the source`,
        [{ kind: 'element', id: el.id }],
      );
    }
  });
}
