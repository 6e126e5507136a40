/**
 * The structure of the sparse LU, shared by the complex and the real variant: pivot order, the patterns
 * of L and U and their storage, and the graph work of a factorisation (after the left-looking method of
 * J. R. Gilbert and T. Peierls, SIAM J. Sci. Stat. Comput. 9(5), 1988, and KLU: T. A. Davis,
 * E. Palamadai Natarajan, "Algorithm 907: KLU", ACM TOMS 37(3), 2010).
 *
 * P A Q = L U. Column k of L and U is found by a sparse triangular solve with the columns of L already
 * computed; its pattern is the reach of A(:,q[k]) in the graph of L (iterative depth-first search with
 * symmetric pruning). Supernodes (runs of columns with L(:,j) = {row of pivot j+1} ∪ L(:,j+1)) are found
 * while factoring: a column that continues the run is stored in the order of the one before, so that four
 * columns of a run can update a column in one pass. Values are stored with `w` numbers per entry (2 for
 * complex, re and im interleaved; 1 for real); everything here is the same for both.
 */
import { sortColumns, sortInts } from './sort';
import type { LuSymbolic } from './symbolic';

/** A copy of `a` with room for `need` entries; half again as much when it has to grow past its estimate. */
function grow<T extends Int32Array | Float64Array>(a: T, need: number): T {
  let cap = a.length + (a.length >> 1);
  if (cap < need) cap = need;
  const b = new (a.constructor as { new (n: number): T })(cap);
  b.set(a);
  return b;
}

const NONE = new Int32Array(0);

// Loops that run once per factorisation sit alone in functions of their own, with nothing after them:
// the engine compiles such a loop while it runs (on-stack replacement) from the type feedback seen so far,
// and code after the loop, never run yet on a first call, would send it back to the interpreter each time.

/** [0, 1, .., n-1] */
function identity(n: number): Int32Array {
  const a = new Int32Array(n);
  for (let i = 0; i < n; i++) a[i] = i;
  return a;
}

/** a[p] = map[a[p]] for p < len */
function renumber(a: Int32Array, map: Int32Array, len: number): void {
  for (let p = 0; p < len; p++) a[p] = map[a[p]];
}

export class LuCore {
  readonly n: number;
  /** numbers per stored value: 2 complex, 1 real */
  readonly w: number;
  readonly q: Int32Array;
  readonly Ap: Int32Array;
  readonly Ai: Int32Array;
  // row permutation: pinv[row] = pivot position, prow[k] = original row
  readonly pinv: Int32Array;
  readonly prow: Int32Array;
  /** ident[i] = i: the row map of a column already in pivot positions */
  readonly ident: Int32Array;
  /** the row each column's pivot prefers before any pivot is chosen (LuSymbolic.prefer; else ident) */
  private readonly prefer: Int32Array;
  // L: unit lower, by column, row indices in pivot positions after a factorisation
  readonly Lp: Int32Array;
  Li: Int32Array;
  Lx: Float64Array;
  // U: strictly upper part by column (pivot positions, ascending), diagonal apart
  readonly Up: Int32Array;
  Ui: Int32Array;
  Ux: Float64Array;
  readonly Ud: Float64Array;
  /** dense work column, w numbers per row; zero between uses */
  readonly x: Float64Array;
  /** supernode id of each column of L (consecutive columns, nested patterns) */
  readonly sn: Int32Array;
  /** max |L(:,k)|^2, unit diagonal included, for the growth of the factors */
  readonly lmax2: Float64Array;
  // work of the graph search, held only while a factorisation runs
  private flag = NONE;
  private stack = NONE;
  private pstack = NONE;
  /** reach[top..n): the pattern of the column being factored (see reachOf) */
  reach = NONE;
  private lpend = NONE; // entries of L(:,k) the search still has to scan (symmetric pruning)
  diagOf = NONE; // column -> row preferred as its diagonal
  private ownerOf = NONE; // row -> column that prefers it
  lnz = 0;
  unz = 0;
  private snStart = 0; // first column of the supernode that column k-1 ends

  constructor(sym: LuSymbolic, w: number) {
    const n = sym.n;
    this.n = n;
    this.w = w;
    this.q = sym.q;
    this.Ap = sym.pattern.colPtr;
    this.Ai = sym.pattern.rowIdx;
    this.pinv = new Int32Array(n);
    this.prow = new Int32Array(n);
    this.ident = identity(n);
    this.prefer = sym.prefer ?? this.ident;
    this.Lp = new Int32Array(n + 1);
    this.Up = new Int32Array(n + 1);
    // the Cholesky count of A + A^T is exact for diagonal pivots; off-diagonal ones (branch rows) add a little
    const chol = sym.cholNnz ?? 4 * sym.pattern.colPtr[n] + n;
    const est = Math.max(16, chol + (chol >> 6) + 64);
    this.Li = new Int32Array(est);
    this.Lx = new Float64Array(w * est);
    this.Ui = new Int32Array(est);
    this.Ux = new Float64Array(w * est);
    this.Ud = new Float64Array(w * n);
    this.x = new Float64Array(w * n);
    this.sn = new Int32Array(n);
    this.lmax2 = new Float64Array(n);
  }

  /** Work arrays and a clean state for factorising from column 0. */
  beginFactor(): void {
    const n = this.n;
    this.flag = new Int32Array(n).fill(-1);
    this.stack = new Int32Array(n);
    this.pstack = new Int32Array(n);
    this.reach = new Int32Array(n);
    this.lpend = new Int32Array(n);
    this.diagOf = this.prefer.slice();
    this.ownerOf = this.ident.slice();
    for (let c = 0; c < n; c++) this.ownerOf[this.diagOf[c]] = c;
    this.pinv.fill(-1);
    this.x.fill(0);
    this.lnz = 0;
    this.unz = 0;
    this.snStart = 0;
  }

  /** Releases the work arrays of the graph search. */
  endWork(): void {
    this.flag = this.stack = this.pstack = this.reach = this.lpend = this.diagOf = this.ownerOf = NONE;
  }

  /**
   * The pattern of column k = q[col] before its pivot: the reach of A(:,col) in the graph of L, in
   * topological order, as reach[top..n) (rows not yet pivotal are leaves), room for it in L and U, and
   * U(:,k)'s pattern = Ui[Up[k]..unz) (see pivotalColumns). Returns top.
   */
  columnPattern(k: number, col: number): number {
    const top = this.reachOf(k, col);
    this.room(this.n - top);
    this.pivotalColumns(top);
    return top;
  }

  /**
   * Column k after its numeric update: the pivot row (choosePivot), the rows of L(:,k) (placeL) and the
   * pruning it allows (prune). Returns the pivot row.
   */
  pivotColumn(k: number, col: number, imax: number, cmax2: number, diag2: number, tol2: number, top: number): number {
    const ipiv = this.choosePivot(k, col, imax, cmax2, diag2, tol2);
    const nU = this.unz - this.Up[k];
    this.placeL(k, ipiv, top, nU);
    if (nU > 0) this.prune(k, ipiv);
    return ipiv;
  }

  /** Reach of A(:,col) in the graph of L (iterative depth-first search, pruned); returns top. */
  private reachOf(k: number, col: number): number {
    const { n, Ap, Ai, pinv, Lp, flag, stack, pstack, reach, lpend } = this;
    const Li = this.Li;
    this.Lp[k] = this.lnz;
    this.Up[k] = this.unz;
    let top = n;
    for (let p = Ap[col], pe = Ap[col + 1]; p < pe; p++) {
      const r0 = Ai[p];
      if (flag[r0] === k) continue;
      if (pinv[r0] < 0) {
        flag[r0] = k;
        reach[--top] = r0;
        continue;
      }
      let head = 0;
      stack[0] = r0;
      flag[r0] = k;
      pstack[0] = Lp[pinv[r0]];
      while (head >= 0) {
        const j = stack[head];
        const jn = pinv[j];
        let pos = pstack[head];
        const end = Lp[jn] + lpend[jn];
        for (; pos < end; pos++) {
          const i = Li[pos];
          if (flag[i] === k) continue;
          flag[i] = k;
          const inn = pinv[i];
          if (inn < 0) {
            reach[--top] = i; // a leaf: row not yet pivotal
            continue;
          }
          pstack[head] = pos + 1;
          stack[++head] = i;
          pstack[head] = Lp[inn];
          break;
        }
        if (pos >= end) {
          head--;
          reach[--top] = j;
        }
      }
    }
    return top;
  }

  private room(cnt: number): void {
    const w = this.w;
    if (this.lnz + cnt > this.Li.length) {
      this.Li = grow(this.Li, this.lnz + cnt);
      this.Lx = grow(this.Lx, w * this.Li.length);
    }
    if (this.unz + cnt > this.Ui.length) {
      this.Ui = grow(this.Ui, this.unz + cnt);
      this.Ux = grow(this.Ux, w * this.Ui.length);
    }
  }

  /**
   * U(:,k)'s pattern: the pivotal rows of the reach as pivot positions, ascending (a topological order too,
   * since L(r, j) != 0 means r is pivoted after j), so that four consecutive columns of a supernode meet.
   * Ends at unz; the values are for the column update to write.
   */
  private pivotalColumns(top: number): void {
    const { n, pinv, reach, Ui } = this;
    const u0 = this.unz;
    let u = u0;
    for (let t = top; t < n; t++) {
      const jn = pinv[reach[t]];
      if (jn >= 0) Ui[u++] = jn;
    }
    if (u - u0 > 1) sortInts(Ui, u0, u, this.pstack);
    this.unz = u;
  }

  /** Zeroes x at every row of the reach (a singular column leaves it clean). */
  clearReach(top: number): void {
    const { n, w, x, reach } = this;
    for (let t = top; t < n; t++) for (let c = 0; c < w; c++) x[w * reach[t] + c] = 0;
  }

  /**
   * Threshold pivoting that prefers the diagonal: `imax` has the largest candidate |x|^2 (cmax2), the
   * preferred diagonal row diagOf[col] has diag2 (-1 if not a candidate). When the pivot leaves the diagonal,
   * the displaced diagonal row becomes the preferred pivot of the column that owned the chosen row (as KLU
   * does), so one voltage-source branch does not push every later pivot off the diagonal. Returns the row.
   */
  private choosePivot(k: number, col: number, imax: number, cmax2: number, diag2: number, tol2: number): number {
    const drow = this.diagOf[col];
    let ipiv = imax;
    if (diag2 > 0 && diag2 >= tol2 * cmax2) ipiv = drow;
    // a node and its branch (LuSymbolic.prefer crosswise): the larger of the crosswise entry and the own
    // diagonal, both within the pair (partial pivoting within the 2 × 2 block, growth at most 2 per step)
    if (ipiv === drow && drow !== col && this.prefer[col] === drow && this.pinv[col] < 0) {
      const w = this.w;
      const xr = this.x[w * col];
      const xi = w === 2 ? this.x[w * col + 1] : 0;
      const own2 = xr * xr + xi * xi;
      if (own2 > diag2) ipiv = col;
    }
    if (ipiv !== drow) {
      const c2 = this.ownerOf[ipiv];
      this.diagOf[c2] = drow;
      this.ownerOf[drow] = c2;
    }
    this.pinv[ipiv] = k;
    this.prow[k] = ipiv;
    return ipiv;
  }

  /**
   * The rows of L(:,k) (original numbers; pivot ipiv already taken) into Li[Lp[k]..lnz). When L(:,k-1) =
   * {ipiv} ∪ L(:,k) (nothing pruned column k-1 yet), column k continues k-1's supernode: ipiv moves to the
   * front of the common rows of every column of the supernode, L(:,k) is the rest of L(:,k-1) in its order,
   * and column k-1 is searched through its first row alone from now on. Values are the kernel's to store.
   */
  private placeL(k: number, ipiv: number, top: number, nU: number): void {
    const { n, Lp, flag, sn } = this;
    const Li = this.Li;
    let lnz = this.lnz;
    const cnt = n - top;
    let pos = -1;
    if (k > 0) {
      const s0 = Lp[k - 1];
      const len = lnz - s0;
      if (len >= 1 && len - 1 === cnt - nU - 1) {
        pos = -2;
        for (let t = s0; t < lnz; t++) {
          const i = Li[t];
          if (i === ipiv) pos = t - s0;
          else if (flag[i] !== k) {
            pos = -1;
            break;
          }
        }
        if (pos < 0) pos = -1;
      }
    }
    if (pos >= 0) {
      for (let c = this.snStart; c < k; c++) {
        const a = Lp[c] + (k - 1 - c);
        if (pos > 0) this.swapL(a, a + pos);
      }
      for (let t = Lp[k - 1] + 1, e = lnz; t < e; t++) Li[lnz++] = Li[t];
      this.lpend[k - 1] = 1;
      sn[k] = sn[k - 1];
    } else {
      const { pinv, reach } = this;
      for (let t = top; t < n; t++) {
        const i = reach[t];
        if (pinv[i] < 0) Li[lnz++] = i;
      }
      this.snStart = k;
      sn[k] = k;
    }
    this.lnz = lnz;
    this.lpend[k] = lnz - Lp[k];
    Lp[k + 1] = lnz;
  }

  /** Swaps entries a and b of L, index and value. */
  private swapL(a: number, b: number): void {
    const { w, Li, Lx } = this;
    const ti = Li[a];
    Li[a] = Li[b];
    Li[b] = ti;
    for (let c = 0; c < w; c++) {
      const t = Lx[w * a + c];
      Lx[w * a + c] = Lx[w * b + c];
      Lx[w * b + c] = t;
    }
  }

  /**
   * Symmetric pruning (S. C. Eisenstat, J. W. H. Liu, SIAM J. Matrix Anal. Appl. 14(1), 1993): a column of
   * U(:,k) whose L holds the pivot row of column k is searched through its pivotal rows alone from now on.
   */
  private prune(k: number, ipiv: number): void {
    const { Up, Lp, pinv, lpend, sn } = this;
    const Ui = this.Ui;
    const Li = this.Li;
    for (let p = Up[k], pe = this.unz; p < pe; p++) {
      const jn = Ui[p];
      const s = Lp[jn];
      if (lpend[jn] < Lp[jn + 1] - s) continue; // already pruned (or a supernode column other than the last)
      const e = s + lpend[jn];
      let found = false;
      for (let t = s; t < e; t++) {
        if (Li[t] === ipiv) {
          found = true;
          break;
        }
      }
      if (!found) continue;
      // pivotal rows to the front; the other columns of jn's supernode (sn[jn] .. jn-1) hold the rows of
      // L(:,jn) in the same order after their first jn-c entries, and get the same swaps
      const first = sn[jn];
      let head = s;
      let tail = e - 1;
      while (head <= tail) {
        if (pinv[Li[head]] >= 0) head++;
        else if (pinv[Li[tail]] < 0) tail--;
        else {
          for (let c = first; c <= jn; c++) {
            const a = Lp[c] + (jn - c) + (head - s);
            this.swapL(a, a + (tail - head));
          }
          head++;
          tail--;
        }
      }
      lpend[jn] = head - s;
    }
  }

  /**
   * After the last column: L's rows to pivot positions, sorted ascending (U is sorted already) so that the
   * columns of a supernode are aligned for refactor() and solves; supernodes found again on the final
   * patterns; the work arrays released.
   */
  endFactor(): void {
    const { n, Lp, Up, pinv } = this;
    Lp[n] = this.lnz;
    Up[n] = this.unz;
    renumber(this.Li, pinv, this.lnz);
    sortColumns(n, Lp, this.Li, this.Lx, this.w, this.x, this.stack);
    this.findSupernodes();
    this.endWork();
  }

  /** Columns j and j+1 share a supernode when L(:,j) = {j+1} ∪ L(:,j+1) (columns sorted). */
  private findSupernodes(): void {
    const { n, Lp, Li, sn } = this;
    let id = 0;
    for (let j = 0; j < n; j++) {
      sn[j] = id;
      if (j + 1 >= n) break;
      const a = Lp[j];
      const len = Lp[j + 1] - a;
      const b = Lp[j + 1];
      let same = len >= 1 && len === Lp[j + 2] - b + 1 && Li[a] === j + 1;
      for (let t = 1; same && t < len; t++) same = Li[a + t] === Li[b + t - 1];
      if (!same) id++;
    }
  }
}
