/**
 * Dense complex MNA of a graph model, for timing a general-purpose dense
 * solver (mathjs `lusolve`) on the same equations the sparse solver handles.
 * Unknowns: non-ground node voltages in order met, then one branch current per
 * voltage source and inductor and two per ideal transformer (the same
 * formulation as scripts/bench/scipy_yardstick.py).
 */
import type { GraphModel, InductorEl } from '../../src/model/graph';

export interface DenseMna {
  n: number;
  /** row-major n x n */
  re: Float64Array;
  im: Float64Array;
  bRe: Float64Array;
  bIm: Float64Array;
  nodeIndex: Map<string, number>;
}

/** Number of MNA unknowns buildDenseMna would make, without allocating the matrix. */
export function mnaSize(model: GraphModel): number {
  const nodes = new Set<string>();
  let branches = 0;
  for (const el of model.elements) {
    for (const name of el.nodes) if (name !== model.ground) nodes.add(name);
    if (el.kind === 'voltage-source' || el.kind === 'inductor') branches += 1;
    else if (el.kind === 'ideal-transformer') branches += 2;
  }
  return nodes.size + branches;
}

export function buildDenseMna(model: GraphModel, frequencyHz = model.frequencyHz): DenseMna {
  const nodeIndex = new Map<string, number>();
  for (const el of model.elements) for (const name of el.nodes) if (name !== model.ground && !nodeIndex.has(name)) nodeIndex.set(name, nodeIndex.size);
  let n = nodeIndex.size;
  const branch = new Map<string, number>();
  const inductors = new Map<string, InductorEl>();
  for (const el of model.elements) {
    if (el.kind === 'voltage-source' || el.kind === 'inductor') branch.set(el.id, n++);
    else if (el.kind === 'ideal-transformer') (branch.set(el.id, n), (n += 2));
    if (el.kind === 'inductor') inductors.set(el.id, el);
  }
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  const bRe = new Float64Array(n);
  const bIm = new Float64Array(n);
  const w = 2 * Math.PI * frequencyHz;
  const idx = (name: string) => (name === model.ground ? -1 : nodeIndex.get(name)!);
  const add = (i: number, j: number, vr: number, vi: number) => {
    if (i < 0 || j < 0) return;
    re[i * n + j] += vr;
    im[i * n + j] += vi;
  };
  const admittance = (a: number, c: number, yr: number, yi: number) => {
    add(a, a, yr, yi);
    add(c, c, yr, yi);
    add(a, c, -yr, -yi);
    add(c, a, -yr, -yi);
  };
  const incidence = (a: number, c: number, k: number) => {
    add(a, k, 1, 0);
    add(c, k, -1, 0);
    add(k, a, 1, 0);
    add(k, c, -1, 0);
  };
  for (const el of model.elements) {
    const nd = el.nodes.map(idx);
    switch (el.kind) {
      case 'resistor':
        admittance(nd[0], nd[1], 1 / el.ohms, 0);
        break;
      case 'capacitor':
        admittance(nd[0], nd[1], 0, w * el.farads);
        break;
      case 'inductor': {
        const k = branch.get(el.id)!;
        incidence(nd[0], nd[1], k);
        add(k, k, 0, -w * el.henries);
        break;
      }
      case 'voltage-source': {
        const k = branch.get(el.id)!;
        incidence(nd[0], nd[1], k);
        const ph = (el.phaseDeg * Math.PI) / 180;
        bRe[k] += el.magnitude * Math.cos(ph);
        bIm[k] += el.magnitude * Math.sin(ph);
        break;
      }
      case 'current-source': {
        const ph = (el.phaseDeg * Math.PI) / 180;
        const jr = el.magnitude * Math.cos(ph);
        const ji = el.magnitude * Math.sin(ph);
        if (nd[0] >= 0) (bRe[nd[0]] -= jr, (bIm[nd[0]] -= ji));
        if (nd[1] >= 0) (bRe[nd[1]] += jr, (bIm[nd[1]] += ji));
        break;
      }
      case 'ideal-transformer': {
        const kp = branch.get(el.id)!;
        const ks = kp + 1;
        add(nd[0], kp, 1, 0);
        add(nd[1], kp, -1, 0);
        add(nd[2], ks, 1, 0);
        add(nd[3], ks, -1, 0);
        add(kp, nd[0], 1, 0);
        add(kp, nd[1], -1, 0);
        add(kp, nd[2], -el.ratio, 0);
        add(kp, nd[3], el.ratio, 0);
        add(ks, kp, el.ratio, 0);
        add(ks, ks, 1, 0);
        break;
      }
    }
  }
  for (const c of model.couplings ?? []) {
    for (let i = 0; i < c.windings.length; i++)
      for (let j = i + 1; j < c.windings.length; j++) {
        const li = inductors.get(c.windings[i])!;
        const lj = inductors.get(c.windings[j])!;
        const m = c.k !== undefined ? c.k * Math.sqrt(li.henries * lj.henries) : c.henries!;
        const d = (li.dot === 'second' ? -1 : 1) * (lj.dot === 'second' ? -1 : 1);
        const ki = branch.get(li.id)!;
        const kj = branch.get(lj.id)!;
        add(ki, kj, 0, -w * m * d);
        add(kj, ki, 0, -w * m * d);
      }
  }
  return { n, re, im, bRe, bIm, nodeIndex };
}
