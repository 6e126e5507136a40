/**
 * Complex sparse LU for the MNA solver, after KLU (T. A. Davis, E. Palamadai
 * Natarajan, "Algorithm 907: KLU", ACM TOMS 37(3), 2010) and the left-looking
 * method of J. R. Gilbert and T. Peierls (SIAM J. Sci. Stat. Comput. 9(5), 1988).
 *
 * P A Q = L U. Q is a fill-reducing order from AMD on A + A^T; P comes from
 * threshold partial pivoting that prefers the diagonal. Column k of L and U is
 * found by a sparse triangular solve with the columns of L already computed;
 * the nonzero pattern is the reach of A(:,q[k]) in the graph of L (iterative
 * depth-first search with symmetric pruning). When a pivot leaves the
 * diagonal, the displaced diagonal row becomes the preferred pivot of the
 * column that owned the chosen row (as KLU does), so one voltage-source branch
 * does not push every later pivot off the diagonal.
 *
 * After factor() the columns of L and U are sorted in pivot order and
 * consecutive columns of L with nested patterns are grouped into supernodes;
 * refactor() replays the numeric work without any graph search, four
 * supernode columns at a time where it can. Input values are split re/im; the
 * factors keep re and im interleaved.
 */
import { amdOrder } from './amd';
import { SingularMatrixError, type ComplexValues, type CscPattern } from './types';

export interface LuSymbolic {
  n: number;
  /** Column order: column k of the factors is column q[k] of A. */
  q: Int32Array;
  pattern: CscPattern;
}

export interface LuOptions {
  /** Diagonal preference: keep the diagonal if |diag| >= pivotTol * max |candidate|. Default 1e-3. */
  pivotTol?: number;
  /**
   * refactor() keeps a reused pivot while |pivot| >= refactorTol * max |candidate| in its column. Default 1e-4:
   * below pivotTol on purpose, so that a diagonal accepted near the threshold by factor() does not send
   * every slightly different frequency back to a full factorisation.
   */
  refactorTol?: number;
  /** A column is singular if max |candidate| <= singularTol * (largest |a_ij| in A(:,j) or |u_ij| in U(:,k)). Default 1e-14. */
  singularTol?: number;
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

/** Fill-reducing column order for the pattern (AMD on A + A^T). */
export function analyze(pattern: CscPattern): LuSymbolic {
  checkPattern(pattern);
  return { n: pattern.n, q: amdOrder(pattern), pattern };
}

function grow<T extends Int32Array | Float64Array>(a: T, need: number): T {
  let cap = a.length * 2;
  if (cap < need) cap = need;
  const b = new (a.constructor as { new (n: number): T })(cap);
  b.set(a);
  return b;
}

export class ComplexSparseLU {
  readonly sym: LuSymbolic;
  private readonly pivotTol: number;
  private readonly refactorTol: number;
  private readonly singularTol: number;
  private factored = false;

  // row permutation: pinv[row] = pivot position, prow[k] = original row
  private readonly pinv: Int32Array;
  private readonly prow: Int32Array;
  // L: unit lower, by column, row indices in pivot positions after factor()
  private readonly Lp: Int32Array;
  private Li: Int32Array;
  private Lx: Float64Array; // interleaved re, im
  // U: strictly upper part by column (pivot positions, ascending after factor()), diagonal apart
  private readonly Up: Int32Array;
  private Ui: Int32Array;
  private Ux: Float64Array; // interleaved re, im
  private readonly Ud: Float64Array; // interleaved re, im
  // workspace
  private readonly x: Float64Array; // dense column, interleaved re, im
  private readonly flag: Int32Array;
  private readonly stack: Int32Array;
  private readonly pstack: Int32Array;
  private readonly reach: Int32Array;
  private readonly lpend: Int32Array;
  private readonly sn: Int32Array; // supernode id of each column of L (consecutive columns, nested patterns)
  private readonly diagOf: Int32Array; // column -> row preferred as its diagonal
  private readonly ownerOf: Int32Array; // row -> column that prefers it

  constructor(sym: LuSymbolic, options: LuOptions = {}) {
    this.sym = sym;
    this.pivotTol = options.pivotTol ?? 1e-3;
    this.refactorTol = options.refactorTol ?? Math.min(1e-4, this.pivotTol);
    this.singularTol = options.singularTol ?? 1e-14;
    const n = sym.n;
    this.pinv = new Int32Array(n);
    this.prow = new Int32Array(n);
    this.Lp = new Int32Array(n + 1);
    this.Up = new Int32Array(n + 1);
    const est = Math.max(16, 4 * sym.pattern.colPtr[n] + n);
    this.Li = new Int32Array(est);
    this.Lx = new Float64Array(2 * est);
    this.Ui = new Int32Array(est);
    this.Ux = new Float64Array(2 * est);
    this.Ud = new Float64Array(2 * n);
    this.x = new Float64Array(2 * n);
    this.flag = new Int32Array(n);
    this.stack = new Int32Array(n);
    this.pstack = new Int32Array(n);
    this.reach = new Int32Array(n);
    this.lpend = new Int32Array(n);
    this.sn = new Int32Array(n);
    this.diagOf = new Int32Array(n);
    this.ownerOf = new Int32Array(n);
  }

  /** Entries of L including its unit diagonal. */
  get nnzL(): number {
    return this.factored ? this.Lp[this.sym.n] + this.sym.n : 0;
  }
  /** Entries of U including its diagonal. */
  get nnzU(): number {
    return this.factored ? this.Up[this.sym.n] + this.sym.n : 0;
  }

  private checkValues(values: ComplexValues): void {
    const nz = this.sym.pattern.colPtr[this.sym.n];
    if (values.re.length < nz || values.im.length < nz) throw new RangeError(`values must hold ${nz} entries`);
  }

  /** Full factorisation with threshold partial pivoting. Throws SingularMatrixError(original column). */
  factor(values: ComplexValues): void {
    this.checkValues(values);
    this.factored = false;
    const n = this.sym.n;
    const { colPtr: Ap, rowIdx: Ai } = this.sym.pattern;
    const Axr = values.re;
    const Axi = values.im;
    const q = this.sym.q;
    const { pinv, prow, Lp, Up, Ud, x, flag, stack, pstack, reach, lpend, diagOf, ownerOf } = this;
    let Li = this.Li;
    let Lx = this.Lx;
    let Ui = this.Ui;
    let Ux = this.Ux;
    const tol2 = this.pivotTol * this.pivotTol;
    const sing2 = this.singularTol * this.singularTol;
    pinv.fill(-1);
    flag.fill(-1);
    x.fill(0);
    for (let i = 0; i < n; i++) {
      diagOf[i] = i;
      ownerOf[i] = i;
    }
    let lnz = 0;
    let unz = 0;

    for (let k = 0; k < n; k++) {
      const col = q[k];
      Lp[k] = lnz;
      Up[k] = unz;

      // ---- reach of A(:,col) in the graph of L, in topological order ----
      let top = n;
      let amax2 = 0;
      for (let p = Ap[col], pe = Ap[col + 1]; p < pe; p++) {
        const r0 = Ai[p];
        const vr = Axr[p];
        const vi = Axi[p];
        x[2 * r0] = vr;
        x[2 * r0 + 1] = vi;
        const a2 = vr * vr + vi * vi;
        if (a2 > amax2) amax2 = a2;
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

      // ensure room for this column
      const cnt = n - top;
      if (lnz + cnt > Li.length) {
        Li = this.Li = grow(Li, lnz + cnt);
        Lx = this.Lx = grow(Lx, 2 * Li.length);
      }
      if (unz + cnt > Ui.length) {
        Ui = this.Ui = grow(Ui, unz + cnt);
        Ux = this.Ux = grow(Ux, 2 * Ui.length);
      }

      // ---- numeric: x = L \ A(:,col) over the reach; U part out, find pivot ----
      let cmax2 = 0;
      let ipiv = -1;
      let diag2 = -1;
      const drow = diagOf[col];
      let scale2 = amax2;
      for (let t = top; t < n; t++) {
        const j = reach[t];
        const jn = pinv[j];
        const vr = x[2 * j];
        const vi = x[2 * j + 1];
        if (jn < 0) {
          const a2 = vr * vr + vi * vi;
          if (a2 > cmax2 || ipiv < 0) {
            cmax2 = a2;
            ipiv = j;
          }
          if (j === drow) diag2 = a2;
          continue;
        }
        Ui[unz] = jn;
        Ux[2 * unz] = vr;
        Ux[2 * unz + 1] = vi;
        unz++;
        const u2 = vr * vr + vi * vi;
        if (u2 > scale2) scale2 = u2;
        if (vr === 0 && vi === 0) continue;
        for (let p = Lp[jn], pe = Lp[jn + 1]; p < pe; p++) {
          const i2 = 2 * Li[p];
          const lr = Lx[2 * p];
          const li = Lx[2 * p + 1];
          x[i2] -= lr * vr - li * vi;
          x[i2 + 1] -= lr * vi + li * vr;
        }
      }
      if (ipiv < 0 || cmax2 === 0 || cmax2 <= sing2 * scale2) {
        for (let t = top; t < n; t++) {
          x[2 * reach[t]] = 0;
          x[2 * reach[t] + 1] = 0;
        }
        throw new SingularMatrixError(col);
      }
      if (diag2 > 0 && diag2 >= tol2 * cmax2) ipiv = drow;
      else if (ipiv !== drow) {
        // the column that preferred ipiv as its diagonal now prefers this column's diagonal row (as in KLU);
        // without this one off-diagonal pivot (a voltage-source branch) would push the next ones off too
        const c2 = ownerOf[ipiv];
        diagOf[c2] = drow;
        ownerOf[drow] = c2;
      }

      const pr = x[2 * ipiv];
      const pi = x[2 * ipiv + 1];
      const d = pr * pr + pi * pi;
      const ir = pr / d;
      const ii = -pi / d;
      Ud[2 * k] = pr;
      Ud[2 * k + 1] = pi;
      pinv[ipiv] = k;
      prow[k] = ipiv;
      for (let t = top; t < n; t++) {
        const i = reach[t];
        if (pinv[i] < 0) {
          const vr = x[2 * i];
          const vi = x[2 * i + 1];
          Li[lnz] = i;
          Lx[2 * lnz] = vr * ir - vi * ii;
          Lx[2 * lnz + 1] = vr * ii + vi * ir;
          lnz++;
        }
        x[2 * i] = 0;
        x[2 * i + 1] = 0;
      }
      lpend[k] = lnz - Lp[k];
      Lp[k + 1] = lnz;

      // ---- symmetric pruning (Eisenstat and Liu): columns of U(:,k) whose L holds the pivot row ----
      for (let p = Up[k]; p < unz; p++) {
        const jn = Ui[p];
        const s = Lp[jn];
        if (lpend[jn] < Lp[jn + 1] - s) continue; // already pruned
        const e = s + lpend[jn];
        let found = false;
        for (let t = s; t < e; t++) {
          if (Li[t] === ipiv) {
            found = true;
            break;
          }
        }
        if (!found) continue;
        // pivotal rows to the front
        let head = s;
        let tail = e - 1;
        while (head <= tail) {
          if (pinv[Li[head]] >= 0) head++;
          else if (pinv[Li[tail]] < 0) tail--;
          else {
            const ti = Li[head];
            Li[head] = Li[tail];
            Li[tail] = ti;
            const tr = Lx[2 * head];
            Lx[2 * head] = Lx[2 * tail];
            Lx[2 * tail] = tr;
            const tm = Lx[2 * head + 1];
            Lx[2 * head + 1] = Lx[2 * tail + 1];
            Lx[2 * tail + 1] = tm;
            head++;
            tail--;
          }
        }
        lpend[jn] = head - s;
      }
    }
    Lp[n] = lnz;
    Up[n] = unz;
    for (let p = 0; p < lnz; p++) Li[p] = pinv[Li[p]];
    // ascending pivot order: U in a topological order for refactor(), L columns of a supernode aligned
    this.sortColumns(Lp, Li, Lx);
    this.sortColumns(Up, Ui, Ux);
    this.findSupernodes();
    this.factored = true;
  }

  /** Sorts the row indices of every column ascending (values along) by transposing twice. */
  private sortColumns(cp: Int32Array, ci: Int32Array, cx: Float64Array): void {
    const n = this.sym.n;
    const nz = cp[n];
    // the row-wise copy is temporary: keeping it would add half again to the factors' memory
    const ti = new Int32Array(nz);
    const tx = new Float64Array(2 * nz);
    const rp = this.stack; // n entries of scratch
    rp.fill(0);
    for (let p = 0; p < nz; p++) rp[ci[p]]++;
    let sum = 0;
    for (let i = 0; i < n; i++) {
      const c = rp[i];
      rp[i] = sum;
      sum += c;
    }
    for (let j = 0; j < n; j++) {
      for (let p = cp[j], pe = cp[j + 1]; p < pe; p++) {
        const q = rp[ci[p]]++;
        ti[q] = j;
        tx[2 * q] = cx[2 * p];
        tx[2 * q + 1] = cx[2 * p + 1];
      }
    }
    const next = this.pstack;
    for (let j = 0; j < n; j++) next[j] = cp[j];
    for (let i = 0, q = 0; i < n; i++) {
      for (const qe = rp[i]; q < qe; q++) {
        const p = next[ti[q]]++;
        ci[p] = i;
        cx[2 * p] = tx[2 * q];
        cx[2 * p + 1] = tx[2 * q + 1];
      }
    }
  }

  /** Columns j and j+1 share a supernode when L(:,j) = {j+1} ∪ L(:,j+1) (columns sorted). */
  private findSupernodes(): void {
    const n = this.sym.n;
    const { Lp, Li, sn } = this;
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

  /**
   * Numeric factorisation reusing the pivot sequence and the L/U patterns of the
   * last factor(), without any graph search. Falls back to factor() (and returns
   * false) when a pivot is zero, below refactorTol of its column or fails the
   * singular test; also returns false when there was no factorisation to reuse.
   */
  refactor(values: ComplexValues): boolean {
    if (!this.factored) {
      this.factor(values);
      return false;
    }
    this.checkValues(values);
    const n = this.sym.n;
    for (let k = 0; k < n; k++) {
      if (!this.refactorColumn(k, values.re, values.im)) {
        this.factor(values);
        return false;
      }
    }
    return true;
  }

  /** Column k of L and U from the stored patterns; false if its pivot is no longer acceptable. */
  private refactorColumn(k: number, Axr: Float64Array, Axi: Float64Array): boolean {
    const { colPtr: Ap, rowIdx: Ai } = this.sym.pattern;
    const { pinv, Lp, Up, Ud, x, sn } = this;
    const Li = this.Li;
    const Lx = this.Lx;
    const Ui = this.Ui;
    const Ux = this.Ux;
    const tol2 = this.refactorTol * this.refactorTol;
    const sing2 = this.singularTol * this.singularTol;
    const col = this.sym.q[k];
    let scale2 = 0;
    for (let p = Ap[col], pe = Ap[col + 1]; p < pe; p++) {
      const i2 = 2 * pinv[Ai[p]];
      const vr = Axr[p];
      const vi = Axi[p];
      x[i2] = vr;
      x[i2 + 1] = vi;
      const a2 = vr * vr + vi * vi;
      if (a2 > scale2) scale2 = a2;
    }
    for (let p = Up[k], pe = Up[k + 1]; p < pe; p++) {
      const j = Ui[p];
      if (p + 3 < pe && Ui[p + 3] === j + 3 && sn[j] === sn[j + 3]) {
        // four consecutive columns of one supernode: a 4x4 triangular solve, then one pass over
        // their common rows (half the index loads and scattered x accesses of four single passes)
        const a0 = Lp[j];
        const a1 = Lp[j + 1];
        const a2 = Lp[j + 2];
        const a3 = Lp[j + 3];
        const a4 = Lp[j + 4];
        const j2 = 2 * j;
        const v0r = x[j2];
        const v0i = x[j2 + 1];
        let lr = Lx[2 * a0];
        let li = Lx[2 * a0 + 1];
        const v1r = x[j2 + 2] - (lr * v0r - li * v0i);
        const v1i = x[j2 + 3] - (lr * v0i + li * v0r);
        lr = Lx[2 * a0 + 2];
        li = Lx[2 * a0 + 3];
        let mr = Lx[2 * a1];
        let mi = Lx[2 * a1 + 1];
        const v2r = x[j2 + 4] - (lr * v0r - li * v0i) - (mr * v1r - mi * v1i);
        const v2i = x[j2 + 5] - (lr * v0i + li * v0r) - (mr * v1i + mi * v1r);
        lr = Lx[2 * a0 + 4];
        li = Lx[2 * a0 + 5];
        mr = Lx[2 * a1 + 2];
        mi = Lx[2 * a1 + 3];
        const nr = Lx[2 * a2];
        const ni = Lx[2 * a2 + 1];
        const v3r = x[j2 + 6] - (lr * v0r - li * v0i) - (mr * v1r - mi * v1i) - (nr * v2r - ni * v2i);
        const v3i = x[j2 + 7] - (lr * v0i + li * v0r) - (mr * v1i + mi * v1r) - (nr * v2i + ni * v2r);
        for (let t = 0; t < 8; t++) x[j2 + t] = 0;
        const u = 2 * p;
        Ux[u] = v0r;
        Ux[u + 1] = v0i;
        Ux[u + 2] = v1r;
        Ux[u + 3] = v1i;
        Ux[u + 4] = v2r;
        Ux[u + 5] = v2i;
        Ux[u + 6] = v3r;
        Ux[u + 7] = v3i;
        const u2 = Math.max(v0r * v0r + v0i * v0i, v1r * v1r + v1i * v1i, v2r * v2r + v2i * v2i, v3r * v3r + v3i * v3i);
        if (u2 > scale2) scale2 = u2;
        // common rows: L(:,j+3); column j+c holds them from offset 3-c
        const o0 = 2 * (a0 + 3 - a3);
        const o1 = 2 * (a1 + 2 - a3);
        const o2 = 2 * (a2 + 1 - a3);
        for (let t = a3; t < a4; t++) {
          const i2 = 2 * Li[t];
          const t2 = 2 * t;
          const b0r = Lx[t2 + o0];
          const b0i = Lx[t2 + o0 + 1];
          const b1r = Lx[t2 + o1];
          const b1i = Lx[t2 + o1 + 1];
          const b2r = Lx[t2 + o2];
          const b2i = Lx[t2 + o2 + 1];
          const b3r = Lx[t2];
          const b3i = Lx[t2 + 1];
          x[i2] -= b0r * v0r - b0i * v0i + (b1r * v1r - b1i * v1i) + (b2r * v2r - b2i * v2i) + (b3r * v3r - b3i * v3i);
          x[i2 + 1] -= b0r * v0i + b0i * v0r + (b1r * v1i + b1i * v1r) + (b2r * v2i + b2i * v2r) + (b3r * v3i + b3i * v3r);
        }
        p += 3;
        continue;
      }
      const j2 = 2 * j;
      const vr = x[j2];
      const vi = x[j2 + 1];
      x[j2] = 0;
      x[j2 + 1] = 0;
      Ux[2 * p] = vr;
      Ux[2 * p + 1] = vi;
      const u2 = vr * vr + vi * vi;
      if (u2 > scale2) scale2 = u2;
      if (vr === 0 && vi === 0) continue;
      for (let t = Lp[j], te = Lp[j + 1]; t < te; t++) {
        const i2 = 2 * Li[t];
        const lr = Lx[2 * t];
        const li = Lx[2 * t + 1];
        x[i2] -= lr * vr - li * vi;
        x[i2 + 1] -= lr * vi + li * vr;
      }
    }
    const pr = x[2 * k];
    const pi = x[2 * k + 1];
    x[2 * k] = 0;
    x[2 * k + 1] = 0;
    const d = pr * pr + pi * pi;
    let cmax2 = d;
    const ls = Lp[k];
    const le = Lp[k + 1];
    for (let t = ls; t < le; t++) {
      const i2 = 2 * Li[t];
      const a2 = x[i2] * x[i2] + x[i2 + 1] * x[i2 + 1];
      if (a2 > cmax2) cmax2 = a2;
    }
    if (d === 0 || d < tol2 * cmax2 || cmax2 <= sing2 * scale2) {
      for (let t = ls; t < le; t++) {
        x[2 * Li[t]] = 0;
        x[2 * Li[t] + 1] = 0;
      }
      return false;
    }
    const ir = pr / d;
    const ii = -pi / d;
    Ud[2 * k] = pr;
    Ud[2 * k + 1] = pi;
    for (let t = ls; t < le; t++) {
      const i2 = 2 * Li[t];
      const vr = x[i2];
      const vi = x[i2 + 1];
      Lx[2 * t] = vr * ir - vi * ii;
      Lx[2 * t + 1] = vr * ii + vi * ir;
      x[i2] = 0;
      x[i2 + 1] = 0;
    }
    return true;
  }

  /** Solves A x = b in place: on return bRe/bIm hold x. */
  solve(bRe: Float64Array, bIm: Float64Array): void {
    if (!this.factored) throw new Error('ComplexSparseLU.solve called before factor()');
    const n = this.sym.n;
    if (bRe.length < n || bIm.length < n) throw new RangeError(`right-hand side must hold ${n} entries`);
    const { prow, Lp, Up, Ud, x } = this;
    const q = this.sym.q;
    const Li = this.Li;
    const Lx = this.Lx;
    const Ui = this.Ui;
    const Ux = this.Ux;
    for (let k = 0; k < n; k++) {
      const r = prow[k];
      x[2 * k] = bRe[r];
      x[2 * k + 1] = bIm[r];
    }
    for (let k = 0; k < n; k++) {
      const vr = x[2 * k];
      const vi = x[2 * k + 1];
      if (vr === 0 && vi === 0) continue;
      for (let p = Lp[k], pe = Lp[k + 1]; p < pe; p++) {
        const i2 = 2 * Li[p];
        const lr = Lx[2 * p];
        const li = Lx[2 * p + 1];
        x[i2] -= lr * vr - li * vi;
        x[i2 + 1] -= lr * vi + li * vr;
      }
    }
    for (let k = n - 1; k >= 0; k--) {
      const ar = x[2 * k];
      const ai = x[2 * k + 1];
      const dr = Ud[2 * k];
      const di = Ud[2 * k + 1];
      const d = dr * dr + di * di;
      const vr = (ar * dr + ai * di) / d;
      const vi = (ai * dr - ar * di) / d;
      x[2 * k] = vr;
      x[2 * k + 1] = vi;
      if (vr === 0 && vi === 0) continue;
      for (let p = Up[k], pe = Up[k + 1]; p < pe; p++) {
        const i2 = 2 * Ui[p];
        const ur = Ux[2 * p];
        const ui = Ux[2 * p + 1];
        x[i2] -= ur * vr - ui * vi;
        x[i2 + 1] -= ur * vi + ui * vr;
      }
    }
    for (let k = 0; k < n; k++) {
      const c = q[k];
      bRe[c] = x[2 * k];
      bIm[c] = x[2 * k + 1];
      x[2 * k] = 0;
      x[2 * k + 1] = 0;
    }
  }
}
