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
 * Every matrix entry is c + j(ω·w + u/ω), so the system is stored once as those
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
  /** real part of each entry (frequency independent) */
  cRe: Float64Array;
  /** imaginary part per unit ω */
  wIm: Float64Array;
  /** imaginary part times ω ('ac' form only) */
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

/** Which term of c + jω·w + u/(jω)… a stamp feeds: every stamp has exactly one. */
const REAL = 0; // constant real part (conductances, ±1 incidences, ratios)
const OMEGA = 1; // imaginary part times ω (capacitances, −L, −M)
const INV_OMEGA = 2; // imaginary part over ω (−1/L of an admittance-form inductor)
type Term = typeof REAL | typeof OMEGA | typeof INV_OMEGA;

class StampList {
  rows: Int32Array;
  cols: Int32Array;
  terms: Uint8Array;
  vals: Float64Array;
  size = 0;
  constructor(capacity: number) {
    this.rows = new Int32Array(capacity);
    this.cols = new Int32Array(capacity);
    this.terms = new Uint8Array(capacity);
    this.vals = new Float64Array(capacity);
  }
  add(r: number, c: number, term: Term, v: number): void {
    if (r < 0 || c < 0) return;
    if (this.size === this.rows.length) this.grow();
    const s = this.size++;
    this.rows[s] = r;
    this.cols[s] = c;
    this.terms[s] = term;
    this.vals[s] = v;
  }
  private grow(): void {
    const cap = this.rows.length * 2 + 16;
    const grown = <T extends Int32Array | Uint8Array | Float64Array>(a: T, make: (n: number) => T): T => {
      const b = make(cap);
      b.set(a as never);
      return b;
    };
    this.rows = grown(this.rows, (n) => new Int32Array(n));
    this.cols = grown(this.cols, (n) => new Int32Array(n));
    this.terms = grown(this.terms, (n) => new Uint8Array(n));
    this.vals = grown(this.vals, (n) => new Float64Array(n));
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
    const needsBranch =
      el.kind === 'inductor' ? form === 'dc' || coupled[i] === 1 : el.kind === 'voltage-source' || el.kind === 'ideal-transformer' || el.kind === 'inductance-arm';
    if (needsBranch) {
      branchUnknown[i] = n++;
      unknownOwner.push(i);
    }
  });

  const st = new StampList(model.elements.length * 5 + mutuals.length * 2 + n);
  for (let u = 0; u < n; u++) st.add(u, u, REAL, 0);
  const rhsRe = new Float64Array(n);
  const rhsIm = new Float64Array(n);

  const admittance = (a: number, b: number, term: Term, y: number) => {
    const ua = nodeUnknown[a];
    const ub = nodeUnknown[b];
    st.add(ua, ua, term, y);
    st.add(ub, ub, term, y);
    st.add(ua, ub, term, -y);
    st.add(ub, ua, term, -y);
  };
  /** Branch current unknown k flowing from node a to node b through the element: KCL columns and the constraint row's voltage terms. */
  const branch = (k: number, a: number, b: number, gain: number) => {
    const ua = nodeUnknown[a];
    const ub = nodeUnknown[b];
    st.add(ua, k, REAL, gain);
    st.add(ub, k, REAL, -gain);
    st.add(k, ua, REAL, gain);
    st.add(k, ub, REAL, -gain);
  };

  model.elements.forEach((el, i) => {
    const o = 4 * i;
    const n0 = topo.terminals[o];
    const n1 = topo.terminals[o + 1];
    const k = branchUnknown[i];
    switch (el.kind) {
      case 'resistor':
        admittance(n0, n1, REAL, 1 / el.ohms);
        break;
      case 'capacitor':
        admittance(n0, n1, OMEGA, el.farads);
        break;
      case 'inductance-arm':
      case 'inductor':
        if (k < 0) {
          admittance(n0, n1, INV_OMEGA, -1 / el.henries); // 1/(jωL) = −j/(ωL)
          break;
        }
        branch(k, n0, n1, 1);
        st.add(k, k, OMEGA, -el.henries); // V_a − V_b − jωL·I = 0
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
    st.add(ka, kb, OMEGA, -mu.m);
    st.add(kb, ka, OMEGA, -mu.m);
  }

  const { pattern, slotOf } = compress(n, st);
  const nnz = pattern.rowIdx.length;
  const cRe = new Float64Array(nnz);
  const wIm = new Float64Array(nnz);
  const uIm = new Float64Array(nnz);
  const byTerm = [cRe, wIm, uIm];
  for (let s = 0; s < st.size; s++) byTerm[st.terms[s]][slotOf[s]] += st.vals[s];
  const unknownLabel = (u: number) =>
    u < nodeCount
      ? { kind: 'node' as const, id: topo.nodeNames[unknownOwner[u]] }
      : { kind: 'element' as const, id: model.elements[unknownOwner[u]].id };
  return { n, pattern, cRe, wIm, uIm, form, rhsRe, rhsIm, nodeUnknown, branchUnknown, unknownLabel };
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
