/**
 * Real sparse LU, the twin of ComplexSparseLU for real matrices (the time-domain system G + C/h): the same
 * symbolic analysis, structure, pivoting rules and options, with real kernels. solve() allocates nothing.
 */
import { inverseNorm1Real } from './condition';
import { copy, SparseLuBase } from './lu-base';
import { resolveOptions, type LuOptions } from './options';
import { realKernels } from './real-kernels';
import { residual, solveFactors, solveFactorsT } from './real-solve';
import { applyScaling, equilibrate } from './scaling';
import type { LuSymbolic } from './symbolic';

const EMPTY: Float64Array = new Float64Array(0);

export class RealSparseLU extends SparseLuBase<Float64Array> {
  /** the values being factored (va of SparseLuBase): the caller's, or their scaled copy in own */
  private own: Float64Array = EMPTY;
  /** the values last factored, for the residual and the norm (see ComplexSparseLU) */
  private a: Float64Array = EMPTY;
  private b: Float64Array = EMPTY;
  private readonly kb: Float64Array;
  private readonly r: Float64Array;
  private readonly w: Float64Array; // |A| |x| + |b| of the componentwise error (scaling on)

  constructor(sym: LuSymbolic, options: LuOptions = {}) {
    super(sym, resolveOptions(options), 1, realKernels);
    this.kb = new Float64Array(sym.n);
    this.r = new Float64Array(sym.n);
    this.w = this.scaled ? new Float64Array(sym.n) : EMPTY;
  }

  /** Solves A x = b in place; allocates nothing. */
  solve(b: Float64Array): void {
    this.run(b, false, 'solve');
  }

  /** Solves A^T x = b in place. */
  solveTransposed(b: Float64Array): void {
    this.run(b, true, 'solveTransposed');
  }

  /**
   * Estimate of kappa_1(A) of the matrix last factored, and the column of A^-1 it came from (see
   * ComplexSparseLU, also on the values it reads).
   */
  conditionEstimate(): { kappa: number; column: number } {
    this.requireFactors('conditionEstimate');
    const n = this.sym.n;
    const inv = inverseNorm1Real(
      n,
      (x) => this.solve(x),
      (x) => this.solveTransposed(x),
      new Float64Array(n),
      new Float64Array(n),
    );
    return { kappa: this.norm1() * inv.est, column: inv.column };
  }

  /** ||A||_1 of the values last factored, unscaled. */
  private norm1(): number {
    const { colPtr: Ap, rowIdx: Ai, n } = this.sym.pattern;
    const { a: v, rs, cs } = this;
    let norm = 0;
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) s += this.scaled ? Math.abs(v[p]) / (rs[Ai[p]] * cs[j]) : Math.abs(v[p]);
      if (s > norm) norm = s;
    }
    return norm;
  }

  protected load(values: Float64Array, fresh: boolean): void {
    const { n, colPtr: Ap, rowIdx: Ai } = this.sym.pattern;
    const nz = Ap[n];
    if (values.length < nz) throw new RangeError(`values must hold ${nz} entries`);
    if (!this.scaled) {
      this.va = values;
      return;
    }
    if (this.own.length !== nz) this.own = new Float64Array(nz);
    if (fresh) equilibrate(n, Ap, Ai, values, null, this.rs, this.cs);
    applyScaling(n, Ap, Ai, values, this.rs, this.cs, (this.va = this.own));
  }

  /** After a factorisation: what the residual and the norm read. */
  protected keep(values: Float64Array): void {
    const nz = this.sym.pattern.colPtr[this.sym.n];
    if (!this.scaled && this.checksResidual()) {
      if (this.own.length !== nz) this.own = new Float64Array(nz);
      copy(values, this.own, nz);
      this.va = this.own;
    }
    this.a = this.va;
    if (!this.scaled) this.va = EMPTY;
  }

  private run(b: Float64Array, transposed: boolean, what: string): void {
    this.requireFactors(what);
    if (b.length < this.sym.n) throw new RangeError(`right-hand side must hold ${this.sym.n} entries`);
    this.b = b;
    try {
      this.solveInPlace(transposed, false);
    } finally {
      this.b = EMPTY;
    }
  }

  // ---- hooks of SparseLuBase for solve ----
  protected applyFactors(correction: boolean, transposed: boolean): void {
    const b = correction ? this.r : this.b;
    if (transposed) solveFactorsT(this.core, b);
    else solveFactors(this.core, b);
  }
  protected keepRhs(): void {
    copy(this.b, this.kb, this.sym.n);
  }
  protected residual(transposed: boolean): number {
    const { n, colPtr, rowIdx } = this.sym.pattern;
    return residual(n, colPtr, rowIdx, this.a, this.b, this.kb, this.r, transposed, this.scaled ? this.w : null); // see ComplexSparseLU
  }
  protected correct(): void {
    const { b, r } = this;
    for (let i = 0, n = this.sym.n; i < n; i++) b[i] += r[i];
  }
  protected scaleVector(by: Float64Array): void {
    const b = this.b;
    for (let i = 0, n = this.sym.n; i < n; i++) b[i] *= by[i];
  }
}
