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
 * Supernodes (runs of columns with L(:,j) = {row of pivot j+1} ∪ L(:,j+1)) are
 * found while factoring: a column that continues the run is stored in the
 * order of the one before, so that four columns of a run can update a column
 * in one pass (update4), in factor() as in refactor(). factor() applies the
 * columns of the reach in ascending pivot order for that; a non-last column of
 * a run is searched through its first row alone. L and U are sized up front
 * from the Cholesky count of A + A^T that the ordering reports, and L is
 * sorted in place at the end (sort.ts: a run-aware merge sort, as the lists a
 * depth-first search leaves defeat a quicksort); refactor() replays the numeric work without any
 * graph search. solve() checks the backward error of its answer and refines
 * it when threshold pivoting has cost digits. Input values are split re/im;
 * the factors keep re and im interleaved.
 */
import { amdAnalyze } from './amd';
import { sortColumns, sortInts } from './sort';
import { SingularMatrixError, type ComplexValues, type CscPattern } from './types';

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
  /**
   * When the factors show growth (see solve), solve() refines x while its normwise backward error is above
   * this, at most two steps. Default 1e-14; Infinity never refines.
   */
  refineTol?: number;
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

/** Fill-reducing column order for the pattern (AMD on A + A^T), with the size of the factors it implies. */
export function analyze(pattern: CscPattern): LuSymbolic {
  checkPattern(pattern);
  const { perm, lnz } = amdAnalyze(pattern);
  return { n: pattern.n, q: perm, pattern, cholNnz: lnz };
}

/** A copy of `a` with room for `need` entries; half again as much when it has to grow past its estimate. */
function grow<T extends Int32Array | Float64Array>(a: T, need: number): T {
  let cap = a.length + (a.length >> 1);
  if (cap < need) cap = need;
  const b = new (a.constructor as { new (n: number): T })(cap);
  b.set(a);
  return b;
}

/**
 * Applies four consecutive columns j..j+3 of one supernode of L to the dense column x: a 4x4 unit
 * lower triangular solve for their pivot rows, then one pass over their common rows (half the index
 * loads and scattered x accesses of four single passes). Column j holds the pivot rows of j+1..j+3
 * first, then the rows of column j+3 in the same order; likewise j+1 and j+2. r0..r3 are the offsets
 * in x (2 * row) of the four pivot rows. Writes the four U entries to Ux from entry u, clears them in
 * x, and returns the largest squared magnitude among them.
 */
function update4(
  x: Float64Array,
  Lp: Int32Array,
  Li: Int32Array,
  Lx: Float64Array,
  j: number,
  r0: number,
  r1: number,
  r2: number,
  r3: number,
  Ux: Float64Array,
  u: number,
): number {
  const a0 = Lp[j];
  const a1 = Lp[j + 1];
  const a2 = Lp[j + 2];
  const a3 = Lp[j + 3];
  const a4 = Lp[j + 4];
  const v0r = x[r0];
  const v0i = x[r0 + 1];
  let lr = Lx[2 * a0];
  let li = Lx[2 * a0 + 1];
  const v1r = x[r1] - (lr * v0r - li * v0i);
  const v1i = x[r1 + 1] - (lr * v0i + li * v0r);
  lr = Lx[2 * a0 + 2];
  li = Lx[2 * a0 + 3];
  let mr = Lx[2 * a1];
  let mi = Lx[2 * a1 + 1];
  const v2r = x[r2] - (lr * v0r - li * v0i) - (mr * v1r - mi * v1i);
  const v2i = x[r2 + 1] - (lr * v0i + li * v0r) - (mr * v1i + mi * v1r);
  lr = Lx[2 * a0 + 4];
  li = Lx[2 * a0 + 5];
  mr = Lx[2 * a1 + 2];
  mi = Lx[2 * a1 + 3];
  const nr = Lx[2 * a2];
  const ni = Lx[2 * a2 + 1];
  const v3r = x[r3] - (lr * v0r - li * v0i) - (mr * v1r - mi * v1i) - (nr * v2r - ni * v2i);
  const v3i = x[r3 + 1] - (lr * v0i + li * v0r) - (mr * v1i + mi * v1r) - (nr * v2i + ni * v2r);
  x[r0] = 0;
  x[r0 + 1] = 0;
  x[r1] = 0;
  x[r1 + 1] = 0;
  x[r2] = 0;
  x[r2 + 1] = 0;
  x[r3] = 0;
  x[r3 + 1] = 0;
  const u2 = 2 * u;
  Ux[u2] = v0r;
  Ux[u2 + 1] = v0i;
  Ux[u2 + 2] = v1r;
  Ux[u2 + 3] = v1i;
  Ux[u2 + 4] = v2r;
  Ux[u2 + 5] = v2i;
  Ux[u2 + 6] = v3r;
  Ux[u2 + 7] = v3i;
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
  return Math.max(v0r * v0r + v0i * v0i, v1r * v1r + v1i * v1i, v2r * v2r + v2i * v2i, v3r * v3r + v3i * v3i);
}

/**
 * Growth G of the factors (see solve) up to which solve() does not check its residual. Measured on 4,000
 * random matrices with growth from threshold pivoting (test/solver/sparse/lu.test.ts family): backward
 * error at most 4.1e-15 for G <= 16 (1.0e-14 for G <= 32); MNA matrices of the benchmark circuits have
 * G of 1 to 15.
 */
const GROWTH_UNCHECKED = 16;

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
  private readonly sn: Int32Array; // supernode id of each column of L (consecutive columns, nested patterns)
  // the values last factored and work vectors of solve's residual
  private readonly refineTol: number;
  // growth of the factors: lmax2[k] = max |L(:,k)|^2 (unit diagonal included); growth2 = G^2 with
  // G = max_k max|L(:,k)| max|U(k,:)| / max|A|, the size of |L||U| that bounds the backward error
  private readonly lmax2: Float64Array;
  private growth2 = Infinity;
  private g2 = 0; // running max of |l|^2 |u|^2 and of |a|^2 during refactor()
  private a2 = 0;
  // allocated the first time the growth calls for a residual check
  private aRe = new Float64Array(0);
  private aIm = new Float64Array(0);
  private kRe = new Float64Array(0); // b
  private kIm = new Float64Array(0);
  private rRe = new Float64Array(0); // residual, then correction
  private rIm = new Float64Array(0);

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
    // the Cholesky count of A + A^T is exact for diagonal pivots; off-diagonal ones (branch rows) add a little
    const chol = sym.cholNnz ?? 4 * sym.pattern.colPtr[n] + n;
    const est = Math.max(16, chol + (chol >> 6) + 64);
    this.Li = new Int32Array(est);
    this.Lx = new Float64Array(2 * est);
    this.Ui = new Int32Array(est);
    this.Ux = new Float64Array(2 * est);
    this.Ud = new Float64Array(2 * n);
    this.x = new Float64Array(2 * n);
    this.sn = new Int32Array(n);
    this.refineTol = options.refineTol ?? 1e-14;
    this.lmax2 = new Float64Array(n);
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
    const { pinv, prow, Lp, Up, Ud, x, sn } = this;
    // work arrays of the graph search, held only while factor() runs
    const flag = new Int32Array(n);
    const stack = new Int32Array(n);
    const pstack = new Int32Array(n);
    const reach = new Int32Array(n);
    const lpend = new Int32Array(n); // entries of L(:,k) the search still has to scan (symmetric pruning)
    const diagOf = new Int32Array(n); // column -> row preferred as its diagonal
    const ownerOf = new Int32Array(n); // row -> column that prefers it
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
    let snStart = 0; // first column of the supernode that column k-1 ends
    const lmax2 = this.lmax2;
    let g2 = 0; // max over k of max|L(:,k)|^2 max|U(k,:)|^2
    let aAll2 = 0; // max |a_ij|^2

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
      // The pivotal columns of the reach are applied in ascending order (a topological order too, since
      // L(r, j) != 0 means r is pivoted after j), so that four consecutive columns of a supernode meet
      // and go through update4. The DFS stack is free again and holds them.
      let m = 0;
      for (let t = top; t < n; t++) {
        const jn = pinv[reach[t]];
        if (jn >= 0) stack[m++] = jn;
      }
      sortInts(stack, 0, m, pstack);
      if (amax2 > aAll2) aAll2 = amax2;
      let scale2 = amax2;
      for (let s = 0; s < m; s++) {
        const jn = stack[s];
        if (s + 3 < m && stack[s + 3] === jn + 3 && sn[jn] === sn[jn + 3]) {
          Ui[unz] = jn;
          Ui[unz + 1] = jn + 1;
          Ui[unz + 2] = jn + 2;
          Ui[unz + 3] = jn + 3;
          const u2 = update4(x, Lp, Li, Lx, jn, 2 * prow[jn], 2 * prow[jn + 1], 2 * prow[jn + 2], 2 * prow[jn + 3], Ux, unz);
          if (u2 > scale2) scale2 = u2;
          for (let c = 0; c < 4; c++) {
            const w = 2 * (unz + c);
            const gg = lmax2[jn + c] * (Ux[w] * Ux[w] + Ux[w + 1] * Ux[w + 1]);
            if (gg > g2) g2 = gg;
          }
          unz += 4;
          s += 3;
          continue;
        }
        const j2 = 2 * prow[jn];
        const vr = x[j2];
        const vi = x[j2 + 1];
        x[j2] = 0;
        x[j2 + 1] = 0;
        Ui[unz] = jn;
        Ux[2 * unz] = vr;
        Ux[2 * unz + 1] = vi;
        unz++;
        const u2 = vr * vr + vi * vi;
        if (u2 > scale2) scale2 = u2;
        if (lmax2[jn] * u2 > g2) g2 = lmax2[jn] * u2;
        if (vr === 0 && vi === 0) continue;
        for (let p = Lp[jn], pe = Lp[jn + 1]; p < pe; p++) {
          const i2 = 2 * Li[p];
          const lr = Lx[2 * p];
          const li = Lx[2 * p + 1];
          x[i2] -= lr * vr - li * vi;
          x[i2 + 1] -= lr * vi + li * vr;
        }
      }
      let cmax2 = 0;
      let ipiv = -1;
      let diag2 = -1;
      const drow = diagOf[col];
      for (let t = top; t < n; t++) {
        const j = reach[t];
        if (pinv[j] >= 0) continue;
        const vr = x[2 * j];
        const vi = x[2 * j + 1];
        const a2 = vr * vr + vi * vi;
        if (a2 > cmax2 || ipiv < 0) {
          cmax2 = a2;
          ipiv = j;
        }
        if (j === drow) diag2 = a2;
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
      x[2 * ipiv] = 0;
      x[2 * ipiv + 1] = 0;
      lmax2[k] = cmax2 / d; // the multipliers are the candidates over the pivot
      if (cmax2 > g2) g2 = cmax2; // lmax2[k] |u_kk|^2

      // ---- supernode: does L(:,k-1) = {ipiv} ∪ L(:,k)? (nothing pruned column k-1 yet) ----
      let pos = -1;
      if (k > 0) {
        const s0 = Lp[k - 1];
        const len = lnz - s0;
        if (len >= 1 && len - 1 === cnt - m - 1) {
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
        // ipiv to the front of the common rows of every column of the supernode, so that they stay aligned
        for (let c = snStart; c < k; c++) {
          const a = Lp[c] + (k - 1 - c);
          const b = a + pos;
          if (a === b) continue;
          const ti = Li[a];
          Li[a] = Li[b];
          Li[b] = ti;
          const tr = Lx[2 * a];
          const tm = Lx[2 * a + 1];
          Lx[2 * a] = Lx[2 * b];
          Lx[2 * a + 1] = Lx[2 * b + 1];
          Lx[2 * b] = tr;
          Lx[2 * b + 1] = tm;
        }
        // L(:,k) = the rest of L(:,k-1), in its order
        const s0 = Lp[k - 1] + 1;
        const e0 = lnz;
        for (let t = s0; t < e0; t++) {
          const i = Li[t];
          const vr = x[2 * i];
          const vi = x[2 * i + 1];
          Li[lnz] = i;
          Lx[2 * lnz] = vr * ir - vi * ii;
          Lx[2 * lnz + 1] = vr * ii + vi * ir;
          lnz++;
          x[2 * i] = 0;
          x[2 * i + 1] = 0;
        }
        // column k-1 is now reached through its first row alone (the rest is L(:,k)): prune it to that
        lpend[k - 1] = 1;
        sn[k] = sn[k - 1];
      } else {
        for (let t = top; t < n; t++) {
          const i = reach[t];
          if (pinv[i] < 0) {
            const vr = x[2 * i];
            const vi = x[2 * i + 1];
            Li[lnz] = i;
            Lx[2 * lnz] = vr * ir - vi * ii;
            Lx[2 * lnz + 1] = vr * ii + vi * ir;
            lnz++;
            x[2 * i] = 0;
            x[2 * i + 1] = 0;
          }
        }
        snStart = k;
        sn[k] = k;
      }
      lpend[k] = lnz - Lp[k];
      Lp[k + 1] = lnz;

      // ---- symmetric pruning (Eisenstat and Liu): columns of U(:,k) whose L holds the pivot row ----
      for (let p = Up[k]; p < unz; p++) {
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
              const b = a + (tail - head);
              const ti = Li[a];
              Li[a] = Li[b];
              Li[b] = ti;
              const tr = Lx[2 * a];
              const tm = Lx[2 * a + 1];
              Lx[2 * a] = Lx[2 * b];
              Lx[2 * a + 1] = Lx[2 * b + 1];
              Lx[2 * b] = tr;
              Lx[2 * b + 1] = tm;
            }
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
    sortColumns(n, Lp, Li, Lx, 2, x, stack); // U is sorted already
    this.growth2 = aAll2 > 0 ? g2 / aAll2 : Infinity;
    if (this.checksResidual()) this.keepValues(values);
    this.findSupernodes();
    this.factored = true;
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
    this.g2 = 0;
    this.a2 = 0;
    for (let k = 0; k < n; k++) {
      if (!this.refactorColumn(k, values.re, values.im)) {
        this.factor(values);
        return false;
      }
    }
    this.growth2 = this.a2 > 0 ? this.g2 / this.a2 : Infinity;
    if (this.checksResidual()) this.keepValues(values);
    return true;
  }

  /** Column k of L and U from the stored patterns; false if its pivot is no longer acceptable. */
  private refactorColumn(k: number, Axr: Float64Array, Axi: Float64Array): boolean {
    const { colPtr: Ap, rowIdx: Ai } = this.sym.pattern;
    const { pinv, Lp, Up, Ud, x, sn, lmax2 } = this;
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
    if (scale2 > this.a2) this.a2 = scale2;
    let g2 = 0;
    for (let p = Up[k], pe = Up[k + 1]; p < pe; p++) {
      const j = Ui[p];
      if (p + 3 < pe && Ui[p + 3] === j + 3 && sn[j] === sn[j + 3]) {
        // four consecutive columns of one supernode
        const j2 = 2 * j;
        const u2 = update4(x, Lp, Li, Lx, j, j2, j2 + 2, j2 + 4, j2 + 6, Ux, p);
        if (u2 > scale2) scale2 = u2;
        for (let c = 0; c < 4; c++) {
          const w = 2 * (p + c);
          const gg = lmax2[j + c] * (Ux[w] * Ux[w] + Ux[w + 1] * Ux[w + 1]);
          if (gg > g2) g2 = gg;
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
      if (lmax2[j] * u2 > g2) g2 = lmax2[j] * u2;
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
    lmax2[k] = cmax2 / d;
    if (cmax2 > g2) g2 = cmax2;
    if (g2 > this.g2) this.g2 = g2;
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

  /** solve() checks its residual when the growth of the factors is above GROWTH_UNCHECKED (or unknown). */
  private checksResidual(): boolean {
    return !(this.growth2 <= GROWTH_UNCHECKED * GROWTH_UNCHECKED);
  }

  /** Keeps a copy of the values just factored, for the residual of solve(). */
  private keepValues(values: ComplexValues): void {
    const n = this.sym.n;
    const nz = this.sym.pattern.colPtr[n];
    if (this.aRe.length !== nz || this.kRe.length !== n) {
      this.aRe = new Float64Array(nz);
      this.aIm = new Float64Array(nz);
      this.kRe = new Float64Array(n);
      this.kIm = new Float64Array(n);
      this.rRe = new Float64Array(n);
      this.rIm = new Float64Array(n);
    }
    this.aRe.set(values.re.length === nz ? values.re : values.re.subarray(0, nz));
    this.aIm.set(values.im.length === nz ? values.im : values.im.subarray(0, nz));
  }

  /**
   * r = b - A x for the values last factored; returns the normwise backward error
   * max|r_i| / (max|a_ij| max|x_j| + max|b_i|) (N. J. Higham, "Accuracy and Stability of Numerical
   * Algorithms", 2nd ed., 2002, section 7.1), NaN when x is not finite.
   */
  private residual(xRe: Float64Array, xIm: Float64Array, bRe: Float64Array, bIm: Float64Array, rRe: Float64Array, rIm: Float64Array): number {
    const n = this.sym.n;
    const { colPtr: Ap, rowIdx: Ai } = this.sym.pattern;
    const { aRe, aIm } = this;
    let bmax2 = 0;
    let xmax2 = 0;
    let amax2 = 0;
    for (let i = 0; i < n; i++) {
      const br = bRe[i];
      const bi = bIm[i];
      rRe[i] = br;
      rIm[i] = bi;
      const b2 = br * br + bi * bi;
      if (b2 > bmax2) bmax2 = b2;
    }
    for (let j = 0; j < n; j++) {
      const vr = xRe[j];
      const vi = xIm[j];
      const x2 = vr * vr + vi * vi;
      if (!(x2 <= xmax2)) xmax2 = x2; // NaN propagates
      for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) {
        const i = Ai[p];
        const ar = aRe[p];
        const ai = aIm[p];
        const a2 = ar * ar + ai * ai;
        if (a2 > amax2) amax2 = a2;
        rRe[i] -= ar * vr - ai * vi;
        rIm[i] -= ar * vi + ai * vr;
      }
    }
    let rmax2 = 0;
    for (let i = 0; i < n; i++) {
      const r2 = rRe[i] * rRe[i] + rIm[i] * rIm[i];
      if (r2 > rmax2) rmax2 = r2;
    }
    const den = Math.sqrt(amax2 * xmax2) + Math.sqrt(bmax2);
    return den > 0 ? Math.sqrt(rmax2) / den : 0;
  }

  /**
   * Solves A x = b in place: on return bRe/bIm hold x. Threshold pivoting lets the entries of the factors
   * grow (up to 1/pivotTol per step), which can cost digits even on a well-conditioned matrix. The
   * backward error is bounded by a small multiple of eps G, G = max_k max|L(:,k)| max|U(k,:)| / max|A|
   * (Higham, ibid., section 9.3); when G > GROWTH_UNCHECKED, solve() measures the backward error of x and,
   * while it is above refineTol, takes up to two steps of iterative refinement in working precision
   * (Higham, ibid., chapter 12; the approach of KLU's and SuperLU's refinement options).
   */
  solve(bRe: Float64Array, bIm: Float64Array): void {
    if (!this.factored) throw new Error('ComplexSparseLU.solve called before factor()');
    const n = this.sym.n;
    if (bRe.length < n || bIm.length < n) throw new RangeError(`right-hand side must hold ${n} entries`);
    if (!this.checksResidual()) {
      this.solveFactors(bRe, bIm);
      return;
    }
    const { kRe, kIm, rRe, rIm } = this;
    kRe.set(bRe.length === n ? bRe : bRe.subarray(0, n));
    kIm.set(bIm.length === n ? bIm : bIm.subarray(0, n));
    this.solveFactors(bRe, bIm);
    let err = this.residual(bRe, bIm, kRe, kIm, rRe, rIm);
    for (let step = 0; step < 2 && err > this.refineTol; step++) {
      this.solveFactors(rRe, rIm);
      for (let i = 0; i < n; i++) {
        bRe[i] += rRe[i];
        bIm[i] += rIm[i];
      }
      const next = this.residual(bRe, bIm, kRe, kIm, rRe, rIm);
      if (!(next < 0.5 * err)) break; // no longer converging
      err = next;
    }
  }

  /** x = Q U^-1 L^-1 P b, in place. */
  private solveFactors(bRe: Float64Array, bIm: Float64Array): void {
    const n = this.sym.n;
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
