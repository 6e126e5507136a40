/**
 * The descriptor system every analysis works on, built once from the element
 * definitions (Modified Nodal Analysis; Ho, Ruehli and Brennan, IEEE Trans.
 * Circuits and Systems, 1975):
 *
 *     G·x + C·dx/dt + Γ·∫x dt = B·u(t)          phasor: (G + jωC + Γ/(jω))·X = B·U
 *
 * x holds the voltage of every non-reference node and the branch currents the
 * elements ask for. The inductance matrix with its dot signs sits in C (branch
 * rows of windings: v − L·di/dt − Σ M·di_j/dt = 0). Γ is empty in the full
 * form that the time domain and the s-domain use; the phasor engine may stamp
 * groups of windings through their reciprocal inductance matrix instead
 * (`reduced`), which needs no branch currents. G, C and Γ share one sparse
 * pattern, stored as one value per slot each, so a new frequency or a new time
 * step only re-evaluates a sum over the slots.
 */
import type { GraphModel } from '../../model/graph';
import type { CscPattern } from '../sparse/types';
import { defOf, type StampState, type StampTarget } from '../elements/registry';
import { branchIncidence } from '../elements/types';
import type { ResistorEl } from '../elements/resistor';
import type { Topology } from './topology';
import type { GammaRow, Mutual } from './windings';

export interface DescriptorOptions {
  /** windings (element index) stamped through Γ = L⁻¹ instead of a branch current; none by default */
  reduced?: Map<number, GammaRow>;
  /** per-element stamp state (a switch's position); each element's own fields by default */
  state?: (elementIndex: number) => StampState;
  /**
   * resistors (element index) given a branch current, row V − R·I = 0, instead of the conductance 1/R: a
   * resistance far below its neighbours' keeps its current and voltage exact that way (its node voltages
   * differ only in digits the nodal form rounds away); none by default
   */
  branchResistors?: Set<number>;
}

export interface Descriptor {
  /** number of unknowns */
  n: number;
  /** unknowns 0 .. nodeCount−1 are node voltages, the rest branch currents */
  nodeCount: number;
  pattern: CscPattern;
  /** G, C and Γ, one value per slot of the pattern */
  g: Float64Array;
  c: Float64Array;
  inv: Float64Array;
  /** B: the right-hand-side entries of element i's source are srcRow/srcCoef[srcPtr[i] .. srcPtr[i+1]) */
  srcPtr: Int32Array;
  srcRow: Int32Array;
  srcCoef: Float64Array;
  /** node index -> unknown index, −1 for reference nodes */
  nodeUnknown: Int32Array;
  /** element index -> its first branch unknown, −1 when it has none */
  branchUnknown: Int32Array;
  /** windings stamped through Γ (empty in the full form) */
  reduced: Map<number, GammaRow>;
  mutuals: Mutual[];
  /** unknown index -> what it is, for refusals */
  unknownLabel: (u: number) => { kind: 'node' | 'element'; id: string };
}

const G = 0;
const C = 1;
const INV = 2;

/** Builds the descriptor of a model: unknowns, pattern, G, C, Γ and B. */
export function buildDescriptor(model: GraphModel, topo: Topology, mutuals: Mutual[], options: DescriptorOptions = {}): Descriptor {
  const reduced = options.reduced ?? new Map<number, GammaRow>();
  const stateOf = options.state ?? (() => NO_STATE);
  const branchResistors = options.branchResistors ?? new Set<number>();
  const elements = model.elements;
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
  const branchUnknown = new Int32Array(elements.length).fill(-1);
  for (let i = 0; i < elements.length; i++) {
    const count = reduced.has(i) ? 0 : branchResistors.has(i) ? 1 : defOf(elements[i]).branches;
    if (count > 0) {
      branchUnknown[i] = n;
      for (let b = 0; b < count; b++) unknownOwner.push(i);
      n += count;
    }
  }

  const st = new StampList(elements.length * 5 + mutuals.length * 2 + n);
  for (let u = 0; u < n; u++) st.add(u, u, G, 0);
  const srcPtr = new Int32Array(elements.length + 1);
  const srcRow: number[] = [];
  const srcCoef: number[] = [];

  const terminals = topo.terminals;
  let cur = 0; // the element being stamped
  const target: StampTarget = {
    node: (t) => nodeUnknown[terminals[4 * cur + t]],
    branch: (b) => branchUnknown[cur] + b,
    g: (r, c, v) => st.add(r, c, G, v),
    c: (r, c, v) => st.add(r, c, C, v),
    b: (r, v) => {
      if (r < 0) return;
      srcRow.push(r);
      srcCoef.push(v);
    },
  };
  for (let i = 0; i < elements.length; i++) {
    cur = i;
    srcPtr[i] = srcRow.length;
    const row = reduced.get(i);
    if (row) stampReduced(st, row, i, terminals, nodeUnknown);
    else if (branchResistors.has(i)) {
      const k = branchUnknown[i];
      branchIncidence(target, k, 0, 1, 1);
      st.add(k, k, G, -(elements[i] as ResistorEl).ohms);
    } else defOf(elements[i]).stamp(elements[i] as never, target, stateOf(i));
  }
  srcPtr[elements.length] = srcRow.length;
  for (const mu of mutuals) {
    const ka = branchUnknown[mu.a];
    const kb = branchUnknown[mu.b];
    if (ka < 0 || kb < 0) continue; // stamped through Γ
    st.add(ka, kb, C, -mu.m);
    st.add(kb, ka, C, -mu.m);
  }

  const { pattern, slotOf } = compress(n, st);
  const nnz = pattern.rowIdx.length;
  const values = [new Float64Array(nnz), new Float64Array(nnz), new Float64Array(nnz)];
  for (let s = 0; s < st.size; s++) values[st.terms[s]][slotOf[s]] += st.vals[s];
  const unknownLabel = (u: number) =>
    u < nodeCount
      ? { kind: 'node' as const, id: topo.nodeNames[unknownOwner[u]] }
      : { kind: 'element' as const, id: elements[unknownOwner[u]].id };
  return {
    n, nodeCount, pattern, g: values[G], c: values[C], inv: values[INV],
    srcPtr, srcRow: Int32Array.from(srcRow), srcCoef: Float64Array.from(srcCoef),
    nodeUnknown, branchUnknown, reduced, mutuals, unknownLabel,
  };
}

const NO_STATE: StampState = {};

/** How far below every other resistance at its nodes a resistance gets a branch current (1e-3: three decades). */
const SMALL_RESISTANCE = 1e-3;

/**
 * Resistors between two non-reference nodes that each have another resistor, with a resistance below
 * SMALL_RESISTANCE times every such neighbour's: a 1 µΩ bar between 1 GΩ parts has node voltages that agree to 15 digits,
 * so its current from their difference would be mostly rounding; a branch current keeps it exact.
 */
export function smallResistors(model: GraphModel, topo: Topology): Set<number> {
  // per node: its smallest resistance, the resistor giving it, and the second smallest (typed arrays, no
  // object per node); a reference node is everyone's neighbour and fixes its own voltage exactly: only
  // other nodes count
  const nNodes = topo.nodeNames.length;
  const has = new Uint8Array(nNodes);
  const least = new Float64Array(nNodes);
  const by = new Int32Array(nNodes);
  const second = new Float64Array(nNodes);
  const { terminals, isReference } = topo;
  const elements = model.elements;
  const note = (v: number, ohms: number, i: number) => {
    if (isReference[v]) return;
    if (!has[v]) {
      has[v] = 1;
      least[v] = ohms;
      by[v] = i;
      second[v] = Infinity;
    } else if (ohms < least[v]) {
      second[v] = least[v];
      least[v] = ohms;
      by[v] = i;
    } else if (ohms < second[v]) second[v] = ohms;
  };
  for (let i = 0; i < elements.length; i++) {
    const el = elements[i];
    if (el.kind !== 'resistor') continue;
    note(terminals[4 * i], el.ohms, i);
    note(terminals[4 * i + 1], el.ohms, i);
  }
  const out = new Set<number>();
  for (let i = 0; i < elements.length; i++) {
    const el = elements[i];
    if (el.kind !== 'resistor') continue;
    let others = Infinity;
    for (let t = 0; t < 2; t++) {
      const v = terminals[4 * i + t];
      // no other resistor at this node (or a reference node): 0, so no branch
      const neighbour = has[v] ? (by[v] === i ? second[v] : least[v]) : 0;
      others = Math.min(others, Number.isFinite(neighbour) ? neighbour : 0);
    }
    if (el.ohms < SMALL_RESISTANCE * others) out.add(i);
  }
  return out;
}

/**
 * A winding of a reduced group: I_i = Σ_j Γ_ij·V_j/(jω), an admittance
 * Γ/(jω) between its terminals and each partner's (V = jωL·I ⇔ I = L⁻¹·V/(jω), standard).
 */
function stampReduced(st: StampList, row: GammaRow, i: number, terminals: Int32Array, nodeUnknown: Int32Array): void {
  const ua = nodeUnknown[terminals[4 * i]];
  const ub = nodeUnknown[terminals[4 * i + 1]];
  for (let t = 0; t < row.others.length; t++) {
    const o2 = 4 * row.others[t];
    const uc = nodeUnknown[terminals[o2]];
    const ud = nodeUnknown[terminals[o2 + 1]];
    const g = row.gamma[t];
    st.add(ua, uc, INV, g);
    st.add(ua, ud, INV, -g);
    st.add(ub, uc, INV, -g);
    st.add(ub, ud, INV, g);
  }
}

/**
 * The right-hand side B·u for given source values: `re`/`im` of element i's
 * source value at valueRe[i]/valueIm[i] (elements without a source are skipped).
 */
export function rightHandSide(d: Descriptor, valueRe: ArrayLike<number>, valueIm: ArrayLike<number> | null, outRe: Float64Array, outIm: Float64Array | null): void {
  outRe.fill(0);
  outIm?.fill(0);
  const { srcPtr, srcRow, srcCoef } = d;
  for (let i = 0; i + 1 < srcPtr.length; i++) {
    for (let p = srcPtr[i]; p < srcPtr[i + 1]; p++) {
      const r = srcRow[p];
      outRe[r] += srcCoef[p] * valueRe[i];
      if (outIm && valueIm) outIm[r] += srcCoef[p] * valueIm[i];
    }
  }
}

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
  add(r: number, c: number, term: number, v: number): void {
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
