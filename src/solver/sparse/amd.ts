/**
 * Approximate minimum degree ordering of the symmetric pattern A + A^T.
 *
 * Written from the published algorithm (P. R. Amestoy, T. A. Davis, I. S.
 * Duff, "An approximate minimum degree ordering algorithm", SIAM J. Matrix
 * Anal. Appl. 17(4), 1996): a quotient graph of variables and elements kept in
 * one integer workspace with garbage collection, approximate external degrees
 * from the |Le \ Lp| counts, element absorption (aggressive), mass
 * elimination, supervariable detection by hashing, and a degree bucket list.
 * Rows that are much denser than the rest are set aside and ordered last.
 */
import type { CscPattern } from './types';

export interface AmdOptions {
  /** A node with more than max(16, min(dense * sqrt(n), denseMax)) neighbours is ordered last. Default 10; <= 0 disables. */
  dense?: number;
  /**
   * Upper bound of that threshold, default 500. Each elimination next to a node of degree d rescans its list,
   * so a few hundred nodes of degree ~10 sqrt(n) (supply rails in a large netlist) cost O(n d) each.
   */
  denseMax?: number;
  /** Absorb elements whose pattern became a subset of the new element. Default true. */
  aggressive?: boolean;
}

// node kinds
const VAR = 0; // principal variable
const NONPRINCIPAL = 1; // merged into a supervariable or mass-eliminated; see parent
const ELEMENT = 2; // eliminated, live element in the quotient graph
const ABSORBED = 3; // eliminated, element absorbed into another
const DENSE = 4; // set aside, ordered last

/** Returns perm with perm[k] = the original index eliminated k-th. */
export function amdOrder(pattern: CscPattern, options: AmdOptions = {}): Int32Array {
  return amdAnalyze(pattern, options).perm;
}

/**
 * The order of amdOrder, and `lnz`: the entries of strict L in the Cholesky factor of A + A^T in that
 * order. Each pivot (a supervariable of f variables) with an element of external degree d adds
 * f (f - 1) / 2 + f d; this is exact, as the element patterns of the quotient graph are. Rows set aside as
 * dense are counted with their own entries only, so lnz may then fall short of the true count.
 */
export function amdAnalyze(pattern: CscPattern, options: AmdOptions = {}): { perm: Int32Array; lnz: number } {
  if (pattern.n === 0) return { perm: new Int32Array(0), lnz: 0 };
  const dense = options.dense ?? 10;
  const limit = dense > 0 ? Math.max(16, Math.min(dense * Math.sqrt(pattern.n), options.denseMax ?? 500)) : Infinity;
  const g = new QuotientGraph(pattern, limit, options.aggressive ?? true);
  while (g.nel < g.nSparse) g.eliminate();
  return { perm: g.order(), lnz: g.lnz + g.denseLnz };
}

/**
 * The quotient graph. The work is split into methods called once per pivot so
 * that the engine optimises them early (one long function runs cold for long).
 */
class QuotientGraph {
  readonly n: number;
  readonly nSparse: number;
  readonly aggressive: boolean;
  iw: Int32Array; // adjacency lists: variables' lists are [elements..., variables...]; elements' lists hold variables
  pfree: number;
  readonly pe: Int32Array;
  readonly len: Int32Array;
  readonly kind: Int8Array;
  readonly nv: Int32Array; // supervariable weight (negated while in Lme)
  readonly elen: Int32Array; // number of elements at the front of a variable's list
  readonly degree: Int32Array; // variable: approx external degree; element: weighted |Le|
  readonly parent: Int32Array;
  readonly w: Int32Array; // |Le \ Lme| counters, offset by wflg
  readonly mark: Int32Array; // stamps for list comparison
  readonly hv: Int32Array; // hash of a variable's list; scratch for garbage collection
  readonly hhead: Int32Array;
  readonly hnext: Int32Array;
  readonly head: Int32Array; // degree buckets
  readonly next: Int32Array;
  readonly prev: Int32Array;
  readonly pivots: Int32Array; // pivot sequence (principal variables only)
  npiv = 0;
  nel = 0;
  lnz = 0; // entries of strict L so far
  readonly denseLnz: number; // the rows set aside: their own entries and a full block among them
  wflg = 1;
  stamp = 0;
  mindeg: number;

  constructor(pattern: CscPattern, denseLimit: number, aggressive: boolean) {
    this.aggressive = aggressive;
    const n = pattern.n;
    const colPtr = pattern.colPtr;
    const rowIdx = pattern.rowIdx;

    // ---- symmetric pattern without the diagonal, deduplicated ----
    const len = new Int32Array(n);
    for (let j = 0; j < n; j++) {
      for (let p = colPtr[j], e = colPtr[j + 1]; p < e; p++) {
        const i = rowIdx[p];
        if (i !== j) {
          len[i]++;
          len[j]++;
        }
      }
    }
    const pe = new Int32Array(n);
    let total = 0;
    for (let i = 0; i < n; i++) {
      pe[i] = total;
      total += len[i];
    }
    let iw = new Int32Array(Math.max(total + (total >> 1) + 2 * n, 16));
    {
      const fill = new Int32Array(n);
      for (let j = 0; j < n; j++) {
        for (let p = colPtr[j], e = colPtr[j + 1]; p < e; p++) {
          const i = rowIdx[p];
          if (i !== j) {
            iw[pe[i] + fill[i]++] = j;
            iw[pe[j] + fill[j]++] = i;
          }
        }
      }
    }
    const pfree = total;

    const kind = new Int8Array(n);
    const nv = new Int32Array(n); // supervariable weight (negated while in Lme)
    const elen = new Int32Array(n); // number of elements at the front of a variable's list
    const degree = new Int32Array(n); // variable: approx external degree; element: weighted |Le|
    const parent = new Int32Array(n).fill(-1);
    const w = new Int32Array(n); // |Le \ Lme| counters, offset by wflg
    const mark = new Int32Array(n); // stamps for deduplication and list comparison
    const hv = new Int32Array(n); // hash of a variable's list; scratch for garbage collection
    const hhead = new Int32Array(n).fill(-1);
    const hnext = new Int32Array(n);
    const head = new Int32Array(n + 1).fill(-1); // degree buckets
    const next = new Int32Array(n);
    const prev = new Int32Array(n);
    let stamp = 0;

    // deduplicate lists (a_ij and a_ji both present)
    for (let i = 0; i < n; i++) {
      stamp++;
      mark[i] = stamp;
      const s = pe[i];
      let d = s;
      for (let p = s, e = s + len[i]; p < e; p++) {
        const j = iw[p];
        if (mark[j] !== stamp) {
          mark[j] = stamp;
          iw[d++] = j;
        }
      }
      len[i] = d - s;
    }

    // dense rows are set aside and ordered last
    let nDense = 0;
    let denseLnz = 0; // entries between sparse and dense rows
    if (denseLimit < n) {
      for (let i = 0; i < n; i++) {
        if (len[i] > denseLimit) {
          kind[i] = DENSE;
          nDense++;
        }
      }
      if (nDense > 0 && nDense < n) {
        for (let i = 0; i < n; i++) {
          if (kind[i] === DENSE) continue;
          const s = pe[i];
          let d = s;
          for (let p = s, e = s + len[i]; p < e; p++) {
            const j = iw[p];
            if (kind[j] !== DENSE) iw[d++] = j;
          }
          denseLnz += len[i] - (d - s);
          len[i] = d - s;
        }
      } else if (nDense === n) {
        for (let i = 0; i < n; i++) kind[i] = VAR;
        nDense = 0;
      }
    }
    const nSparse = n - nDense;
    this.denseLnz = denseLnz + (nDense * (nDense - 1)) / 2;
    let mindeg = n;
    for (let i = n - 1; i >= 0; i--) {
      if (kind[i] === DENSE) continue;
      nv[i] = 1;
      degree[i] = len[i];
      const h = head[len[i]];
      next[i] = h;
      prev[i] = -1;
      if (h !== -1) prev[h] = i;
      head[len[i]] = i;
      if (len[i] < mindeg) mindeg = len[i];
    }
    this.n = n;
    this.nSparse = n - nDense;
    this.iw = iw;
    this.pfree = pfree;
    this.pe = pe;
    this.len = len;
    this.kind = kind;
    this.nv = nv;
    this.elen = elen;
    this.degree = degree;
    this.parent = parent;
    this.w = w;
    this.mark = mark;
    this.hv = hv;
    this.hhead = hhead;
    this.hnext = hnext;
    this.head = head;
    this.next = next;
    this.prev = prev;
    this.stamp = stamp;
    this.mindeg = mindeg;
    this.pivots = new Int32Array(this.nSparse);
  }

  private bucketInsert(i: number, d: number): void {
    const head = this.head;
    const h = head[d];
    this.next[i] = h;
    this.prev[i] = -1;
    if (h !== -1) this.prev[h] = i;
    head[d] = i;
  }

  private bucketRemove(i: number, d: number): void {
    const next = this.next;
    const prev = this.prev;
    const nx = next[i];
    const pv = prev[i];
    if (nx !== -1) prev[nx] = pv;
    if (pv !== -1) next[pv] = nx;
    else this.head[d] = nx;
  }

  /** Compacts the live lists to the front of iw; grows iw if `need` more entries still do not fit. */
  private collect(need: number): void {
    const { n, kind, len, pe, hv } = this;
    let iw = this.iw;
    for (let i = 0; i < n; i++) {
      const k = kind[i];
      if ((k === VAR || k === ELEMENT) && len[i] > 0) {
        hv[i] = iw[pe[i]];
        iw[pe[i]] = -(i + 1);
      }
    }
    const pfree = this.pfree;
    let src = 0;
    let dst = 0;
    while (src < pfree) {
      const v = iw[src];
      if (v < 0) {
        const i = -v - 1;
        const l = len[i];
        pe[i] = dst;
        iw[dst++] = hv[i];
        for (let t = 1; t < l; t++) iw[dst++] = iw[src + t];
        src += l;
      } else {
        src++;
      }
    }
    if (dst + need > iw.length) {
      const bigger = new Int32Array(Math.max(2 * iw.length, dst + need + n));
      bigger.set(iw.subarray(0, dst));
      iw = bigger;
    }
    this.iw = iw;
    this.pfree = dst;
  }

  /** Eliminates one pivot of minimum approximate degree (with its supervariable and mass-eliminated variables). */
  eliminate(): void {
    const { n, nSparse, aggressive, pe, len, kind, nv, elen, degree, parent, w, mark, hv, hhead, hnext, head } = this;
    let iw = this.iw;
    let pfree = this.pfree;
    let nel = this.nel;
    let wflg = this.wflg;
    let mindeg = this.mindeg;
    let stamp = this.stamp;
    // ---- pivot of minimum approximate degree ----
    while (mindeg < n && head[mindeg] === -1) mindeg++;
    const me = head[mindeg];
    this.bucketRemove(me, mindeg);
    let nvpiv = nv[me];
    nel += nvpiv;
    this.pivots[this.npiv++] = me;

    // ---- new element Lme = (Ame ∪ ⋃ Le, e ∈ Eme) \ me ----
    const elenme = elen[me];
    let bound = len[me] - elenme;
    for (let p = pe[me], e = p + elenme; p < e; p++) {
      const el = iw[p];
      if (kind[el] === ELEMENT) bound += len[el];
    }
    if (pfree + bound > iw.length) {
      this.pfree = pfree;
      this.collect(bound);
      iw = this.iw;
      pfree = this.pfree;
    }
    const pme = pe[me];
    const lenme = len[me];
    const start = pfree;
    let degme = 0;
    nv[me] = -nvpiv;
    for (let p = pme, e = pme + lenme; p < e; p++) {
      const j = iw[p];
      if (p < pme + elenme) {
        if (kind[j] !== ELEMENT) continue;
        for (let q = pe[j], qe = q + len[j]; q < qe; q++) {
          const i = iw[q];
          const nvi = nv[i];
          if (nvi > 0 && kind[i] === VAR) {
            degme += nvi;
            nv[i] = -nvi;
            iw[pfree++] = i;
            this.bucketRemove(i, degree[i]);
          }
        }
        kind[j] = ABSORBED;
        parent[j] = me;
      } else {
        const nvi = nv[j];
        if (nvi > 0 && kind[j] === VAR) {
          degme += nvi;
          nv[j] = -nvi;
          iw[pfree++] = j;
          this.bucketRemove(j, degree[j]);
        }
      }
    }
    const end = pfree;
    kind[me] = ELEMENT;
    pe[me] = start;
    len[me] = end - start;
    elen[me] = 0;

    // ---- |Le \ Lme| for every element e adjacent to Lme ----
    let lemax = 0;
    for (let t = start; t < end; t++) {
      const i = iw[t];
      const nvi = -nv[i];
      for (let p = pe[i], e = p + elen[i]; p < e; p++) {
        const el = iw[p];
        if (kind[el] !== ELEMENT) continue;
        let we = w[el];
        if (we >= wflg) we -= nvi;
        else {
          const de = degree[el];
          if (de > lemax) lemax = de;
          we = de + wflg - nvi;
        }
        w[el] = we;
      }
    }

    // ---- degree update, list pruning, absorption, mass elimination ----
    for (let t = start; t < end; t++) {
      const i = iw[t];
      const nvi = -nv[i];
      const pi = pe[i];
      const elni = elen[i];
      const leni = len[i];
      let deg = 0;
      let hash = 0;
      let dst = pi;
      for (let p = pi, e = pi + elni; p < e; p++) {
        const el = iw[p];
        if (kind[el] !== ELEMENT) continue;
        const dext = w[el] - wflg;
        if (dext > 0) {
          deg += dext;
          iw[dst++] = el;
          hash += el;
        } else if (aggressive) {
          kind[el] = ABSORBED;
          parent[el] = me;
        } else {
          iw[dst++] = el;
          hash += el;
        }
      }
      const nelem = dst - pi;
      for (let p = pi + elni, e = pi + leni; p < e; p++) {
        const j = iw[p];
        const nvj = nv[j];
        if (nvj > 0 && kind[j] === VAR) {
          deg += nvj;
          iw[dst++] = j;
          hash += j;
        }
      }
      if (nelem === 0 && dst === pi) {
        // only adjacent to me: eliminate together with me
        nv[i] = 0;
        kind[i] = NONPRINCIPAL;
        parent[i] = me;
        nvpiv += nvi;
        nel += nvi;
        degme -= nvi;
        len[i] = 0;
        elen[i] = 0;
      } else {
        if (deg < degree[i]) degree[i] = deg;
        // insert me as an element: first variable moves to the end
        iw[dst] = iw[pi + nelem];
        iw[pi + nelem] = me;
        len[i] = dst + 1 - pi;
        elen[i] = nelem + 1;
        hv[i] = (hash + me) % n;
      }
    }
    nv[me] = nvpiv;
    degree[me] = degme;
    this.lnz += (nvpiv * (nvpiv - 1)) / 2 + nvpiv * degme;
    wflg += lemax + 1;
    if (wflg > 0x3fffffff - n) {
      w.fill(0);
      wflg = 1;
    }

    // ---- supervariable detection among Lme ----
    for (let t = start; t < end; t++) {
      const i = iw[t];
      if (nv[i] >= 0) continue;
      const h = hv[i];
      hnext[i] = hhead[h];
      hhead[h] = i;
    }
    for (let t = start; t < end; t++) {
      const i0 = iw[t];
      if (nv[i0] >= 0) continue;
      const h = hv[i0];
      let a = hhead[h];
      if (a === -1) continue;
      hhead[h] = -1;
      while (a !== -1) {
        let b = hnext[a];
        if (b !== -1) {
          const pa = pe[a];
          const la = len[a];
          const ea = elen[a];
          stamp++;
          for (let p = pa, e = pa + la; p < e; p++) mark[iw[p]] = stamp;
          let prevb = a;
          while (b !== -1) {
            const nb = hnext[b];
            let same = len[b] === la && elen[b] === ea;
            if (same) {
              for (let p = pe[b], e = p + la; p < e; p++) {
                if (mark[iw[p]] !== stamp) {
                  same = false;
                  break;
                }
              }
            }
            if (same) {
              nv[a] += nv[b]; // both negative
              nv[b] = 0;
              kind[b] = NONPRINCIPAL;
              parent[b] = a;
              len[b] = 0;
              elen[b] = 0;
              hnext[prevb] = nb;
            } else {
              prevb = b;
            }
            b = nb;
          }
        }
        a = hnext[a];
      }
    }

    // ---- finalise degrees, prune Lme ----
    const nleft = nSparse - nel;
    let d = start;
    for (let t = start; t < end; t++) {
      const i = iw[t];
      const nvi = -nv[i];
      if (nvi <= 0) continue;
      nv[i] = nvi;
      let deg = degree[i] + degme - nvi;
      if (deg > nleft - nvi) deg = nleft - nvi;
      if (deg < 0) deg = 0;
      degree[i] = deg;
      this.bucketInsert(i, deg);
      if (deg < mindeg) mindeg = deg;
      iw[d++] = i;
    }
    len[me] = d - start;
    pfree = d;
    this.pfree = pfree;
    this.nel = nel;
    this.wflg = wflg;
    this.mindeg = mindeg;
    this.stamp = stamp;
  }

  order(): Int32Array {
    const { n, nSparse, kind, parent, pivots, npiv, hv } = this;
    const perm = new Int32Array(n);
    // ---- ordering: each pivot followed by the variables eliminated with it ----
    const rank = new Int32Array(n).fill(-1);
    for (let k = 0; k < npiv; k++) rank[pivots[k]] = k;
    const count = new Int32Array(npiv + 1);
    const root = hv; // reuse
    for (let i = 0; i < n; i++) {
      if (kind[i] === DENSE) continue;
      let r = i;
      while (rank[r] < 0) r = parent[r];
      // path compression
      let c = i;
      while (rank[c] < 0) {
        const nx = parent[c];
        parent[c] = r;
        c = nx;
      }
      root[i] = r;
      count[rank[r] + 1]++;
    }
    for (let k = 0; k < npiv; k++) count[k + 1] += count[k];
    // pivot first within its group
    for (let k = 0; k < npiv; k++) perm[count[k]++] = pivots[k];
    for (let i = 0; i < n; i++) {
      if (kind[i] === DENSE || rank[i] >= 0) continue;
      perm[count[rank[root[i]]]++] = i;
    }
    let k = nSparse;
    for (let i = 0; i < n; i++) if (kind[i] === DENSE) perm[k++] = i;
    return perm;
  }
}
