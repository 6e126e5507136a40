/** Symbolic analysis of the sparse LU: the checked pattern and its fill-reducing column order. */
import { amdAnalyze } from './amd';
import type { CscPattern } from './types';

export interface LuSymbolic {
  n: number;
  /** Column order: column k of the factors is column q[k] of A. */
  q: Int32Array;
  pattern: CscPattern;
  /**
   * Entries of strict L for the Cholesky pattern of A + A^T in the order q (from the ordering itself):
   * what L and U each hold when every pivot stays on the diagonal. It sizes the factors up front.
   */
  cholNnz?: number;
  /**
   * The row each column's pivot prefers (factor() keeps it when it passes the threshold, as it does a
   * diagonal); a permutation. Absent: the diagonal. See AnalyzeOptions.follow.
   */
  prefer?: Int32Array;
}

function checkPattern(pattern: CscPattern): void {
  const { n, colPtr, rowIdx } = pattern;
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`bad matrix order ${n}`);
  if (colPtr.length !== n + 1 || colPtr[0] !== 0) throw new RangeError('colPtr must have n+1 entries starting at 0');
  if (rowIdx.length < colPtr[n]) throw new RangeError('rowIdx shorter than colPtr[n]');
  for (let j = 0; j < n; j++) {
    let last = -1;
    for (let p = colPtr[j], e = colPtr[j + 1]; p < e; p++) {
      const i = rowIdx[p];
      if (i <= last || i >= n) throw new RangeError(`column ${j}: row indices must be ascending, unique and < n`);
      last = i;
    }
  }
}

export interface AnalyzeOptions {
  /**
   * Unknowns from `branchFrom` on are branch currents of MNA, the others node voltages. A branch current's
   * diagonal may be far below its incidence entries (jωL at a low frequency, R of a small resistor, 0 for a
   * voltage source): ordered on its own, minimum degree eliminates it before its nodes, threshold pivoting
   * then leaves the diagonal and the rows it takes break the order (fill and growth far above the
   * prediction). Instead the nodes are ordered (AMD) on the pattern the branches induce among them (two
   * nodes meet where a branch, or two coupled branches, join them: the pattern of the nodal form), and each
   * branch goes right after the first of its nodes so ordered, its partner; a node is the partner of at most
   * one branch while another of its nodes is free. The pair is a 2 × 2 block [[y, 1], [1, −z]] (y the node's
   * admittance left by what went before, z the branch's impedance) whose elimination leaves on the later
   * nodes what the nodal form's elimination of that node leaves, fill included. Its pivots are preferred
   * crosswise (the node's column in the branch row, the branch's column in the node row: size 1 whatever y
   * and z while |y·z| is small), and the threshold test of factor() takes the diagonal where |y·z| is large.
   */
  branchFrom?: number;
}

/** Fill-reducing column order for the pattern (AMD on A + A^T), with the size of the factors it implies. */
export function analyze(pattern: CscPattern, options: AnalyzeOptions = {}): LuSymbolic {
  checkPattern(pattern);
  const nb = options.branchFrom ?? pattern.n;
  if (!(nb > 0 && nb < pattern.n)) {
    const { perm, lnz } = amdAnalyze(pattern);
    return { n: pattern.n, q: perm, pattern, cholNnz: lnz };
  }
  const { q, prefer } = branchOrder(pattern, nb);
  return { n: pattern.n, q, pattern, cholNnz: choleskyCount(pattern, q), prefer };
}

/** The order and preferred pivots of AnalyzeOptions.branchFrom. */
function branchOrder(pattern: CscPattern, nb: number): { q: Int32Array; prefer: Int32Array } {
  const n = pattern.n;
  const { deg, adj } = adjacency(pattern);
  // the nodes' pattern: direct neighbours, and nodes reached through one branch or two adjacent branches
  const mark = new Int32Array(n).fill(-1);
  const cp = new Int32Array(nb + 1);
  const ci: number[] = [];
  const rows: number[] = [];
  const add = (c: number, r: number): void => {
    if (r < nb && mark[r] !== c) {
      mark[r] = c;
      rows.push(r);
    }
  };
  for (let c = 0; c < nb; c++) {
    rows.length = 0;
    add(c, c);
    for (let p = deg[c]; p < deg[c + 1]; p++) {
      const u = adj[p];
      add(c, u);
      if (u < nb) continue;
      for (let t = deg[u]; t < deg[u + 1]; t++) {
        const w = adj[t];
        add(c, w);
        if (w < nb) continue;
        for (let s = deg[w]; s < deg[w + 1]; s++) add(c, adj[s]);
      }
    }
    rows.sort((a, b) => a - b);
    for (const r of rows) ci.push(r);
    cp[c + 1] = ci.length;
  }
  const { perm } = amdAnalyze({ n: nb, colPtr: cp, rowIdx: Int32Array.from(ci) });
  const rank = new Int32Array(nb);
  for (let k = 0; k < nb; k++) rank[perm[k]] = k;
  // each branch's partner: its first node in the order, a free one first
  const partner = new Int32Array(n - nb).fill(-1);
  const taken = new Uint8Array(nb);
  const prefer = new Int32Array(n);
  for (let u = 0; u < n; u++) prefer[u] = u;
  for (let u = nb; u < n; u++) {
    let best = -1;
    for (let p = deg[u]; p < deg[u + 1]; p++) {
      const v = adj[p];
      if (v >= nb) continue;
      if (best < 0 || taken[best] > taken[v] || (taken[best] === taken[v] && rank[v] < rank[best])) best = v;
    }
    partner[u - nb] = best;
    if (best >= 0 && !taken[best]) {
      taken[best] = 1;
      prefer[best] = u;
      prefer[u] = best;
    }
  }
  // expand: each node, then the branches it partners (in their order); branches without a node last
  const start = new Int32Array(nb + 1);
  for (let u = nb; u < n; u++) if (partner[u - nb] >= 0) start[partner[u - nb] + 1]++;
  for (let v = 0; v < nb; v++) start[v + 1] += start[v];
  const next = start.slice(0, nb);
  const byNode = new Int32Array(start[nb]);
  for (let u = nb; u < n; u++) if (partner[u - nb] >= 0) byNode[next[partner[u - nb]]++] = u;
  const q = new Int32Array(n);
  let k = 0;
  for (let t = 0; t < nb; t++) {
    const v = perm[t];
    q[k++] = v;
    for (let s = start[v]; s < start[v + 1]; s++) q[k++] = byNode[s];
  }
  for (let u = nb; u < n; u++) if (partner[u - nb] < 0) q[k++] = u;
  return { q, prefer };
}

/**
 * Entries of strict L in the Cholesky factor of A + A^T in the order q: the elimination tree (J. W. H. Liu,
 * "The role of elimination trees in sparse factorization", SIAM J. Matrix Anal. Appl. 11(1), 1990, with
 * path compression), then each row's subtree walked once (row i of L is the union of the tree paths from
 * the neighbours k < i of i up to i).
 */
function choleskyCount(pattern: CscPattern, q: Int32Array): number {
  const n = pattern.n;
  const pinv = new Int32Array(n);
  for (let k = 0; k < n; k++) pinv[q[k]] = k;
  // neighbours of each permuted index (both triangles; the walk takes the lower one)
  const { deg, adj } = adjacency(pattern, pinv);
  const parent = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n).fill(-1);
  for (let i = 0; i < n; i++) {
    for (let p = deg[i]; p < deg[i + 1]; p++) {
      let k = adj[p];
      while (k !== -1 && k < i) {
        const next = ancestor[k];
        ancestor[k] = i;
        if (next === -1) parent[k] = i;
        k = next;
      }
    }
  }
  const flag = new Int32Array(n).fill(-1);
  let lnz = 0;
  for (let i = 0; i < n; i++) {
    flag[i] = i;
    for (let p = deg[i]; p < deg[i + 1]; p++) {
      for (let k = adj[p]; k < i && flag[k] !== i; k = parent[k]) {
        flag[k] = i;
        lnz++;
      }
    }
  }
  return lnz;
}

/** Neighbours of each index in A + A^T without the diagonal: adj[deg[i] .. deg[i+1]), indices relabelled by `map`. */
function adjacency(pattern: CscPattern, map?: Int32Array): { deg: Int32Array; adj: Int32Array } {
  const { n, colPtr, rowIdx } = pattern;
  const id = map ?? Int32Array.from({ length: n }, (_, i) => i);
  const deg = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      if (i === j) continue;
      deg[id[i] + 1]++;
      deg[id[j] + 1]++;
    }
  }
  for (let k = 0; k < n; k++) deg[k + 1] += deg[k];
  const at = deg.slice(0, n);
  const adj = new Int32Array(deg[n]);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      if (i === j) continue;
      adj[at[id[i]]++] = id[j];
      adj[at[id[j]]++] = id[i];
    }
  }
  return { deg, adj };
}
