/**
 * Complex sparse LU for the MNA solver at a frequency (KLU-style left-looking LU: see structure.ts for the
 * graph work and lu-base.ts for pivoting, refactor and refinement). Input values are split re/im; the
 * factors keep re and im interleaved.
 */
import { complexKernels } from './complex-kernels';
import { residual, solveFactors, solveFactorsT } from './complex-solve';
import { inverseNorm1Complex } from './condition';
import { copy, SparseLuBase } from './lu-base';
import { resolveOptions, type LuOptions } from './options';
import { applyScaling, equilibrate } from './scaling';
import type { LuSymbolic } from './symbolic';
import type { ComplexValues } from './types';

const EMPTY: Float64Array = new Float64Array(0);

export class ComplexSparseLU extends SparseLuBase<ComplexValues> {
  // the values being factored (va, vb of SparseLuBase): the caller's, or their scaled copy in own*
  private ownRe: Float64Array = EMPTY;
  private ownIm: Float64Array = EMPTY;
  // the values last factored, for the residual and the norm: own* (scaled, or a copy when solve() checks its
  // residual), else the caller's arrays themselves
  private ar: Float64Array = EMPTY;
  private ai: Float64Array = EMPTY;
  // right-hand side of the solve in progress, and work vectors of its refinement
  private bRe: Float64Array = EMPTY;
  private bIm: Float64Array = EMPTY;
  private readonly kRe: Float64Array;
  private readonly kIm: Float64Array;
  private readonly rRe: Float64Array;
  private readonly rIm: Float64Array;
  private readonly wRe: Float64Array; // |A| |x| + |b| of the componentwise error (scaling on)

  constructor(sym: LuSymbolic, options: LuOptions = {}) {
    super(sym, resolveOptions(options), 2, complexKernels);
    const n = sym.n;
    this.kRe = new Float64Array(n);
    this.kIm = new Float64Array(n);
    this.rRe = new Float64Array(n);
    this.rIm = new Float64Array(n);
    this.wRe = this.scaled ? new Float64Array(n) : EMPTY;
  }

  /** Solves A x = b in place: on return bRe/bIm hold x (see SparseLuBase.solveInPlace for refinement). */
  solve(bRe: Float64Array, bIm: Float64Array): void {
    this.run(bRe, bIm, false, false, 'solve');
  }

  /** Solves A^T x = b in place, or A^H x = b (conjugate transpose) when `conjugate`. */
  solveTransposed(bRe: Float64Array, bIm: Float64Array, conjugate = false): void {
    this.run(bRe, bIm, true, conjugate, 'solveTransposed');
  }

  /**
   * Estimate of the 1-norm condition number kappa_1(A) = ||A||_1 ||A^-1||_1 of the matrix last factored
   * (unscaled), with `column` the column j of A^-1 the estimate of ||A^-1||_1 came from: the right-hand
   * side e_j the solution is most sensitive to (in MNA, the equation of unknown j). A lower bound, usually
   * within a factor 3 (condition.ts); costs a few solves. Without scaling, ||A||_1 is read from the arrays
   * given to the last factor() or refactor() (the LU keeps no copy of them unless refinement needs one):
   * call it before changing them.
   */
  conditionEstimate(): { kappa: number; column: number } {
    this.requireFactors('conditionEstimate');
    const n = this.sym.n;
    const inv = inverseNorm1Complex(
      n,
      (vr, vi) => this.solve(vr, vi),
      (vr, vi) => this.solveTransposed(vr, vi, true),
      new Float64Array(n),
      new Float64Array(n),
    );
    return { kappa: this.norm1() * inv.est, column: inv.column };
  }

  /** ||A||_1 of the values last factored, unscaled. */
  private norm1(): number {
    const { colPtr: Ap, rowIdx: Ai, n } = this.sym.pattern;
    const { ar: vr, ai: vi, rs, cs } = this;
    let norm = 0;
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) {
        const a = Math.hypot(vr[p], vi[p]);
        s += this.scaled ? a / (rs[Ai[p]] * cs[j]) : a;
      }
      if (s > norm) norm = s;
    }
    return norm;
  }

  protected load(values: ComplexValues, fresh: boolean): void {
    const { n, colPtr: Ap, rowIdx: Ai } = this.sym.pattern;
    const nz = Ap[n];
    if (values.re.length < nz || values.im.length < nz) throw new RangeError(`values must hold ${nz} entries`);
    if (!this.scaled) {
      this.va = values.re;
      this.vb = values.im;
      return;
    }
    if (this.ownRe.length !== nz) this.own(nz);
    if (fresh) equilibrate(n, Ap, Ai, values.re, values.im, this.rs, this.cs);
    applyScaling(n, Ap, Ai, values.re, this.rs, this.cs, (this.va = this.ownRe));
    applyScaling(n, Ap, Ai, values.im, this.rs, this.cs, (this.vb = this.ownIm));
  }

  private own(nz: number): void {
    this.ownRe = new Float64Array(nz);
    this.ownIm = new Float64Array(nz);
  }

  /** After a factorisation: what the residual and the norm read (see ar, ai). */
  protected keep(values: ComplexValues): void {
    const nz = this.sym.pattern.colPtr[this.sym.n];
    if (!this.scaled && this.checksResidual()) {
      if (this.ownRe.length !== nz) this.own(nz);
      copy(values.re, this.ownRe, nz);
      copy(values.im, this.ownIm, nz);
      this.va = this.ownRe;
      this.vb = this.ownIm;
    }
    this.ar = this.va;
    this.ai = this.vb;
    if (!this.scaled) this.va = this.vb = EMPTY; // hold no reference beyond ar, ai
  }

  private run(bRe: Float64Array, bIm: Float64Array, transposed: boolean, conj: boolean, what: string): void {
    this.requireFactors(what);
    const n = this.sym.n;
    if (bRe.length < n || bIm.length < n) throw new RangeError(`right-hand side must hold ${n} entries`);
    this.bRe = bRe;
    this.bIm = bIm;
    try {
      this.solveInPlace(transposed, conj);
    } finally {
      this.bRe = this.bIm = EMPTY;
    }
  }

  // ---- hooks of SparseLuBase for solve ----
  protected applyFactors(correction: boolean, transposed: boolean, conj: boolean): void {
    const re = correction ? this.rRe : this.bRe;
    const im = correction ? this.rIm : this.bIm;
    if (transposed) solveFactorsT(this.core, re, im, conj);
    else solveFactors(this.core, re, im);
  }
  protected keepRhs(): void {
    copy(this.bRe, this.kRe, this.sym.n);
    copy(this.bIm, this.kIm, this.sym.n);
  }
  protected residual(transposed: boolean, conj: boolean): number {
    const { n, colPtr, rowIdx } = this.sym.pattern;
    // with scaling, the normwise error of the scaled system says little about x = C y: the componentwise one
    return residual(n, colPtr, rowIdx, this.ar, this.ai, this.bRe, this.bIm, this.kRe, this.kIm, this.rRe, this.rIm, transposed, conj, this.scaled ? this.wRe : null);
  }
  protected correct(): void {
    const { bRe, bIm, rRe, rIm } = this;
    for (let i = 0, n = this.sym.n; i < n; i++) {
      bRe[i] += rRe[i];
      bIm[i] += rIm[i];
    }
  }
  protected scaleVector(by: Float64Array): void {
    const { bRe, bIm } = this;
    for (let i = 0, n = this.sym.n; i < n; i++) {
      bRe[i] *= by[i];
      bIm[i] *= by[i];
    }
  }
}
