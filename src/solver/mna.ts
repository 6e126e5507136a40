import type { GraphModel } from '../model/graph';
import type { CscPattern } from './sparse/types';
import type { Topology } from './topology';
import type { Mutual } from './inductance';

/**
 * Modified Nodal Analysis (Ho, Ruehli and Brennan, IEEE Trans. Circuits and
 * Systems, 1975): one unknown per non-reference node, one branch current per
 * voltage source, per inductor and per ideal transformer (its primary current;
 * the secondary's follows from ratio·I_p + I_s = 0).
 *
 * Every matrix entry is c + ω·w + u/ω, so the system is stored once as those
 * three terms per slot of a fixed sparse pattern; a new frequency only
 * re-evaluates the sum. In the 'ac' form an inductor that takes part in no
 * coupling is stamped as the admittance 1/(jωL) (the u term) and needs no
 * branch current, which keeps the system smaller; the 'dc' form gives every
 * inductor a branch, since at 0 Hz it is a short.
 */
export type MnaForm = 'ac' | 'dc';

export interface MnaSystem {
  n: number;
  pattern: CscPattern;
  cRe: Float64Array;
  cIm: Float64Array;
  wRe: Float64Array;
  wIm: Float64Array;
  /** coefficient of 1/ω (imaginary), 'ac' form only */
  uIm: Float64Array;
  form: MnaForm;
  rhsRe: Float64Array;
  rhsIm: Float64Array;
  /** node index -> unknown index, −1 for reference nodes */
  nodeUnknown: Int32Array;
  /** element index -> branch unknown, −1 when the element has none */
  branchUnknown: Int32Array;
  /** unknown index -> what it is, for diagnostics */
  unknownLabel: (u: number) => { kind: 'node' | 'element'; id: string };
}

class StampList {
  rows: Int32Array;
  cols: Int32Array;
  vals: Float64Array; // cRe, cIm, wRe, wIm, uIm per stamp
  size = 0;
  constructor(capacity: number) {
    this.rows = new Int32Array(capacity);
    this.cols = new Int32Array(capacity);
    this.vals = new Float64Array(capacity * 5);
  }
  add(r: number, c: number, cRe: number, cIm: number, wRe: number, wIm: number, uIm = 0): void {
    if (r < 0 || c < 0) return;
    if (this.size === this.rows.length) this.grow();
    const s = this.size++;
    this.rows[s] = r;
    this.cols[s] = c;
    const v = s * 5;
    this.vals[v] = cRe;
    this.vals[v + 1] = cIm;
    this.vals[v + 2] = wRe;
    this.vals[v + 3] = wIm;
    this.vals[v + 4] = uIm;
  }
  private grow(): void {
    const cap = this.rows.length * 2 + 16;
    const rows = new Int32Array(cap);
    rows.set(this.rows);
    const cols = new Int32Array(cap);
    cols.set(this.cols);
    const vals = new Float64Array(cap * 5);
    vals.set(this.vals);
    this.rows = rows;
    this.cols = cols;
    this.vals = vals;
  }
}

export function buildMna(model: GraphModel, topo: Topology, mutuals: Mutual[], form: MnaForm = 'dc'): MnaSystem {
  const coupled = new Uint8Array(model.elements.length);
  for (const mu of mutuals) coupled[mu.a] = coupled[mu.b] = 1;
  const nNodes = topo.nodeNames.length;
  const nodeUnknown = new Int32Array(nNodes).fill(-1);
  const unknownOwner: number[] = [];
  let n = 0;
  for (let v = 0; v < nNodes; v++) {
    if (!topo.isReference[v]) {
      nodeUnknown[v] = n++;
      unknownOwner.push(v);
    }
  }
  const nodeCount = n;
  const branchUnknown = new Int32Array(model.elements.length).fill(-1);
  model.elements.forEach((el, i) => {
    const needsBranch = el.kind === 'inductor' ? form === 'dc' || coupled[i] === 1 : el.kind === 'voltage-source' || el.kind === 'ideal-transformer';
    if (needsBranch) {
      branchUnknown[i] = n++;
      unknownOwner.push(i);
    }
  });

  const st = new StampList(model.elements.length * 5 + mutuals.length * 2 + n);
  for (let u = 0; u < n; u++) st.add(u, u, 0, 0, 0, 0);
  const rhsRe = new Float64Array(n);
  const rhsIm = new Float64Array(n);

  const admittance = (a: number, b: number, cRe: number, wIm: number, uIm = 0) => {
    const ua = nodeUnknown[a];
    const ub = nodeUnknown[b];
    st.add(ua, ua, cRe, 0, 0, wIm, uIm);
    st.add(ub, ub, cRe, 0, 0, wIm, uIm);
    st.add(ua, ub, -cRe, 0, 0, -wIm, -uIm);
    st.add(ub, ua, -cRe, 0, 0, -wIm, -uIm);
  };
  /** Branch current unknown k flowing from node a to node b through the element: KCL columns and the constraint row's voltage terms. */
  const branch = (k: number, a: number, b: number, gain: number) => {
    const ua = nodeUnknown[a];
    const ub = nodeUnknown[b];
    st.add(ua, k, gain, 0, 0, 0);
    st.add(ub, k, -gain, 0, 0, 0);
    st.add(k, ua, gain, 0, 0, 0);
    st.add(k, ub, -gain, 0, 0, 0);
  };

  model.elements.forEach((el, i) => {
    const o = 4 * i;
    const n0 = topo.terminals[o];
    const n1 = topo.terminals[o + 1];
    const k = branchUnknown[i];
    switch (el.kind) {
      case 'resistor':
        admittance(n0, n1, 1 / el.ohms, 0);
        break;
      case 'capacitor':
        admittance(n0, n1, 0, el.farads);
        break;
      case 'inductor':
        if (k < 0) {
          admittance(n0, n1, 0, 0, -1 / el.henries); // 1/(jωL) = −j/(ωL)
          break;
        }
        branch(k, n0, n1, 1);
        st.add(k, k, 0, 0, 0, -el.henries); // V_a − V_b − jωL·I = 0
        break;
      case 'voltage-source': {
        branch(k, n0, n1, 1);
        const ph = (el.phaseDeg * Math.PI) / 180;
        rhsRe[k] = el.magnitude * Math.cos(ph);
        rhsIm[k] = el.magnitude * Math.sin(ph);
        break;
      }
      case 'current-source': {
        const ph = (el.phaseDeg * Math.PI) / 180;
        const re = el.magnitude * Math.cos(ph);
        const im = el.magnitude * Math.sin(ph);
        const ua = nodeUnknown[n0];
        const ub = nodeUnknown[n1];
        if (ua >= 0) {
          rhsRe[ua] -= re;
          rhsIm[ua] -= im;
        }
        if (ub >= 0) {
          rhsRe[ub] += re;
          rhsIm[ub] += im;
        }
        break;
      }
      case 'ideal-transformer':
        // I_p enters the primary dot; I_s = −ratio·I_p enters the secondary dot.
        // Constraint: (V_p+ − V_p−) − ratio·(V_s+ − V_s−) = 0. Symmetric stamp.
        branch(k, n0, n1, 1);
        branch(k, topo.terminals[o + 2], topo.terminals[o + 3], -el.ratio);
        break;
    }
  });
  for (const mu of mutuals) {
    const ka = branchUnknown[mu.a];
    const kb = branchUnknown[mu.b];
    st.add(ka, kb, 0, 0, 0, -mu.m);
    st.add(kb, ka, 0, 0, 0, -mu.m);
  }

  const { pattern, slotOf } = compress(n, st);
  const nnz = pattern.rowIdx.length;
  const cRe = new Float64Array(nnz);
  const cIm = new Float64Array(nnz);
  const wRe = new Float64Array(nnz);
  const wIm = new Float64Array(nnz);
  const uIm = new Float64Array(nnz);
  for (let s = 0; s < st.size; s++) {
    const slot = slotOf[s];
    const v = s * 5;
    uIm[slot] += st.vals[v + 4];
    cRe[slot] += st.vals[v];
    cIm[slot] += st.vals[v + 1];
    wRe[slot] += st.vals[v + 2];
    wIm[slot] += st.vals[v + 3];
  }
  const unknownLabel = (u: number) =>
    u < nodeCount
      ? { kind: 'node' as const, id: topo.nodeNames[unknownOwner[u]] }
      : { kind: 'element' as const, id: model.elements[unknownOwner[u]].id };
  return { n, pattern, cRe, cIm, wRe, wIm, uIm, form, rhsRe, rhsIm, nodeUnknown, branchUnknown, unknownLabel };
}

/** Triplets to CSC with sorted, unique rows per column; slotOf maps each triplet to its entry. */
function compress(n: number, st: StampList): { pattern: CscPattern; slotOf: Int32Array } {
  const count = st.size;
  const colCount = new Int32Array(n + 1);
  for (let s = 0; s < count; s++) colCount[st.cols[s] + 1]++;
  for (let j = 0; j < n; j++) colCount[j + 1] += colCount[j];
  const order = new Int32Array(count);
  const fill = colCount.slice();
  for (let s = 0; s < count; s++) order[fill[st.cols[s]]++] = s;
  const slotOf = new Int32Array(count);
  const colPtr = new Int32Array(n + 1);
  const rowsOut = new Int32Array(count);
  const mark = new Int32Array(n).fill(-1);
  let nnz = 0;
  for (let j = 0; j < n; j++) {
    colPtr[j] = nnz;
    const first = nnz;
    for (let p = colCount[j]; p < colCount[j + 1]; p++) {
      const r = st.rows[order[p]];
      if (mark[r] < 0) {
        mark[r] = 0;
        rowsOut[nnz++] = r;
      }
    }
    // columns are short: insertion sort in place
    for (let a = first + 1; a < nnz; a++) {
      const v = rowsOut[a];
      let b = a - 1;
      while (b >= first && rowsOut[b] > v) {
        rowsOut[b + 1] = rowsOut[b];
        b--;
      }
      rowsOut[b + 1] = v;
    }
    for (let t = first; t < nnz; t++) mark[rowsOut[t]] = t;
    for (let p = colCount[j]; p < colCount[j + 1]; p++) slotOf[order[p]] = mark[st.rows[order[p]]];
    for (let t = first; t < nnz; t++) mark[rowsOut[t]] = -1;
  }
  colPtr[n] = nnz;
  return { pattern: { n, colPtr, rowIdx: rowsOut.slice(0, nnz) }, slotOf };
}
