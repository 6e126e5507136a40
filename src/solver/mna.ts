import type { GraphModel, InductorEl } from '../model/graph';
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

/** One row of Γ = L⁻¹: the partner windings (element indices, itself included) and their entries. */
export interface GammaRow {
  others: number[];
  gamma: number[];
}

/**
 * In the 'ac' form, inductors need no branch current when their (dot-signed)
 * inductance matrix can be inverted safely: the nodal approach stamps
 * Γ = L⁻¹ as the admittance Γ/(jω). An uncoupled inductor is the 1×1 case
 * (Γ = 1/L). A group of coupled windings whose matrix is near singular (k
 * close to 1, where Γ would lose precision) keeps its branch currents.
 * Equivalence of the two forms: V = jωL·I ⇔ I = L⁻¹·V/(jω) (standard).
 */
function reciprocalInductances(model: GraphModel, mutuals: Mutual[]): Map<number, GammaRow> {
  const out = new Map<number, GammaRow>();
  const partners = new Map<number, Mutual[]>();
  for (const mu of mutuals) {
    if (!partners.has(mu.a)) partners.set(mu.a, []);
    if (!partners.has(mu.b)) partners.set(mu.b, []);
    partners.get(mu.a)!.push(mu);
    partners.get(mu.b)!.push(mu);
  }
  const seen = new Set<number>();
  model.elements.forEach((el, i) => {
    if (el.kind !== 'inductor') return;
    if (!partners.has(i)) {
      out.set(i, { others: [i], gamma: [1 / el.henries] });
      return;
    }
    if (seen.has(i)) return;
    // the group of windings linked to i through couplings
    const group: number[] = [];
    const stack = [i];
    seen.add(i);
    while (stack.length) {
      const w = stack.pop()!;
      group.push(w);
      for (const mu of partners.get(w)!) {
        const o = mu.a === w ? mu.b : mu.a;
        if (!seen.has(o)) {
          seen.add(o);
          stack.push(o);
        }
      }
    }
    const n = group.length;
    if (n > 64) return; // large groups keep branch currents (dense inverse not worth it)
    const pos = new Map(group.map((e, t) => [e, t]));
    const l = new Float64Array(n * n);
    group.forEach((e, t) => (l[t * n + t] = (model.elements[e] as InductorEl).henries));
    for (const w of group) {
      for (const mu of partners.get(w)!) {
        if (mu.a !== w) continue;
        const a = pos.get(mu.a)!;
        const b = pos.get(mu.b)!;
        l[a * n + b] += mu.m;
        l[b * n + a] += mu.m;
      }
    }
    const gamma = invertWellConditioned(l, n);
    if (!gamma) return;
    group.forEach((e, t) => out.set(e, { others: group, gamma: Array.from(gamma.subarray(t * n, t * n + n)) }));
  });
  return out;
}

/**
 * Inverse of a symmetric positive definite matrix, or null when its
 * unit-diagonal scaling has a Cholesky pivot below 0.05 (for a pair: k above
 * about 0.975), where the inverse would lose too many digits.
 */
function invertWellConditioned(l: Float64Array, n: number): Float64Array | null {
  const d = new Float64Array(n);
  for (let t = 0; t < n; t++) d[t] = Math.sqrt(l[t * n + t]);
  const a = new Float64Array(n * n);
  for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) a[r * n + c] = l[r * n + c] / (d[r] * d[c]);
  // Gauss-Jordan on the scaled matrix (SPD: no pivoting needed), checking pivots
  const inv = new Float64Array(n * n);
  for (let t = 0; t < n; t++) inv[t * n + t] = 1;
  for (let p = 0; p < n; p++) {
    const piv = a[p * n + p];
    if (!(piv > 0.05)) return null;
    for (let c = 0; c < n; c++) {
      a[p * n + c] /= piv;
      inv[p * n + c] /= piv;
    }
    for (let r = 0; r < n; r++) {
      if (r === p) continue;
      const f = a[r * n + p];
      if (f === 0) continue;
      for (let c = 0; c < n; c++) {
        a[r * n + c] -= f * a[p * n + c];
        inv[r * n + c] -= f * inv[p * n + c];
      }
    }
  }
  // undo the scaling: L⁻¹ = D⁻¹·A⁻¹·D⁻¹
  for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) inv[r * n + c] /= d[r] * d[c];
  return inv;
}

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
  /** element -> its row of the reciprocal inductance matrix Γ = L⁻¹, for inductors stamped as admittances */
  reciprocal: Map<number, GammaRow>;
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
  const reciprocal = form === 'ac' ? reciprocalInductances(model, mutuals) : new Map<number, GammaRow>();
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
      el.kind === 'inductor' ? !reciprocal.has(i) : el.kind === 'voltage-source' || el.kind === 'ideal-transformer' || el.kind === 'inductance-arm';
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
      case 'inductor': {
        const row = reciprocal.get(i);
        if (row) {
          // I_i = Σ_j Γ_ij·V_j / (jω): a (multi-port) admittance −jΓ/ω between the windings' terminals
          for (let t = 0; t < row.others.length; t++) {
            const o2 = 4 * row.others[t];
            const ua = nodeUnknown[n0];
            const ub = nodeUnknown[n1];
            const uc = nodeUnknown[topo.terminals[o2]];
            const ud = nodeUnknown[topo.terminals[o2 + 1]];
            const g = -row.gamma[t];
            st.add(ua, uc, INV_OMEGA, g);
            st.add(ua, ud, INV_OMEGA, -g);
            st.add(ub, uc, INV_OMEGA, -g);
            st.add(ub, ud, INV_OMEGA, g);
          }
          break;
        }
        branch(k, n0, n1, 1);
        st.add(k, k, OMEGA, -el.henries); // V_a − V_b − jωL·I = 0
        break;
      }
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
    if (ka < 0 || kb < 0) continue; // stamped through Γ above
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
  return { n, pattern, cRe, wIm, uIm, form, reciprocal, rhsRe, rhsIm, nodeUnknown, branchUnknown, unknownLabel };
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
