/**
 * What the complex and the real sparse LU share beyond the structure (structure.ts): the column loops of
 * factor and refactor, the singular test, the growth of the factors, scaling and the refinement loop
 * of solve. The arithmetic is the variant's kernels (complex-kernels.ts, real-kernels.ts), passed in as
 * functions, so that every hot loop runs on one kind of typed array and each kernel, a small function of
 * its own, is compiled early.
 *
 * factor(): threshold partial pivoting that prefers the diagonal (pivotTol), KLU style; a column whose
 * largest candidate is at most singularTol of its largest |a_ij| or |u_ij| is singular. refactor(): the
 * pivot sequence and the patterns of the last factor(), no graph search; a reused pivot below refactorTol
 * of its column (or zero, or singular) sends it back to factor(). solve() refines x when the growth of the
 * factors says threshold pivoting may have cost digits.
 */
import type { ResolvedLuOptions } from './options';
import { LuCore } from './structure';
import type { LuSymbolic } from './symbolic';
import { SingularMatrixError } from './types';

/**
 * Growth G of the factors (see solve) up to which solve() does not check its residual. Measured on 4,000
 * random matrices with growth from threshold pivoting (test/solver/sparse/lu.test.ts family): backward
 * error at most 4.1e-15 for G <= 16 (1.0e-14 for G <= 32); MNA matrices of the benchmark circuits have
 * G of 1 to 15.
 */
const GROWTH_UNCHECKED = 16;

const NO_SCALE = new Float64Array(0);

/**
 * The numeric kernels of one arithmetic (complex-kernels.ts, real-kernels.ts). Values come as two arrays,
 * re and im (the real variant leaves the second empty), so that the column loops below take either.
 */
export interface Kernels {
  /** factor(), column q[k] = col before its pivot; returns the largest candidate's row (see complex-kernels.ts). */
  factorColumn(c: LuCore, a: Float64Array, b: Float64Array, col: number, top: number, u0: number, u1: number, drow: number, out: Float64Array): number;
  /** factor(), column k after its pivot and the rows of L(:,k) are chosen. */
  finishColumn(c: LuCore, k: number, ipiv: number, cmax2: number, out: Float64Array): void;
  /** refactor(), column k: the largest candidate |x|^2, or -1 when the reused pivot is not acceptable. */
  refactorColumn(c: LuCore, a: Float64Array, b: Float64Array, k: number, tol2: number, sing2: number, out: Float64Array): number;
}

export abstract class SparseLuBase<V> {
  readonly sym: LuSymbolic;
  protected readonly core: LuCore;
  protected readonly opt: ResolvedLuOptions;
  protected factored = false;
  /** scale factors S = diag(rs) A diag(cs), powers of two, when opt.scale is on */
  protected readonly rs: Float64Array;
  protected readonly cs: Float64Array;
  // growth of the factors: growth2 = G^2 with G = max_k max|L(:,k)| max|U(k,:)| / max|A|, the size of
  // |L||U| that bounds the backward error
  private growth2 = Infinity;
  private g2 = 0; // running max of |l|^2 |u|^2 and of |a|^2 during refactor()
  private a2 = 0;
  /** kernel results (complex-kernels.ts): growth, largest and diagonal candidate, column scale, largest |a_ij| */
  protected readonly out = new Float64Array(5);
  private readonly kernels: Kernels;
  /** the values being factored (re, im; im empty for the real variant), set by the variant before factoring */
  protected va: Float64Array = NO_SCALE;
  protected vb: Float64Array = NO_SCALE;

  constructor(sym: LuSymbolic, opt: ResolvedLuOptions, w: number, kernels: Kernels) {
    this.sym = sym;
    this.opt = opt;
    this.kernels = kernels;
    this.core = new LuCore(sym, w);
    const scaled = opt.scale === 'rows-cols';
    this.rs = scaled ? new Float64Array(sym.n).fill(1) : NO_SCALE;
    this.cs = scaled ? new Float64Array(sym.n).fill(1) : NO_SCALE;
  }

  /** Entries of L including its unit diagonal. */
  get nnzL(): number {
    return this.factored ? this.core.Lp[this.sym.n] + this.sym.n : 0;
  }
  /** Entries of U including its diagonal. */
  get nnzU(): number {
    return this.factored ? this.core.Up[this.sym.n] + this.sym.n : 0;
  }

  /** Full factorisation with threshold partial pivoting. Throws SingularMatrixError(original column). */
  factor(values: V): void {
    this.load(values, true);
    this.factorColumns();
    this.keep(values);
  }

  /**
   * Numeric factorisation reusing the pivot sequence and the L/U patterns of the last factor(), without
   * any graph search. Falls back to factor() (and returns false) when a pivot is zero, below refactorTol
   * of its column or fails the singular test; also returns false when there was no factorisation to reuse.
   */
  refactor(values: V): boolean {
    if (!this.factored) {
      this.factor(values);
      return false;
    }
    this.load(values, false);
    if (this.refactorColumns()) {
      this.keep(values);
      return true;
    }
    this.factor(values);
    return false;
  }

  /** Checks the values and sets va, vb to what the column loops read (scaled when scaling is on; fresh: new scale factors). */
  protected abstract load(values: V, fresh: boolean): void;
  /** After a factorisation: keeps what the residual and the norm of conditionEstimate read. */
  protected abstract keep(values: V): void;

  protected get scaled(): boolean {
    return this.rs.length > 0;
  }

  /** The numeric work of factor() on the values the variant holds. Throws SingularMatrixError(original column). */
  private factorColumns(): void {
    this.factored = false;
    const core = this.core;
    core.beginFactor();
    let aAll2 = 0; // max |a_ij|^2
    try {
      aAll2 = this.factorLoop();
      core.endFactor();
    } finally {
      core.endWork();
    }
    this.growth2 = aAll2 > 0 ? this.out[0] / aAll2 : Infinity;
    this.factored = true;
  }

  /**
   * Columns 0..n-1 of factor(); returns max |a_ij|^2, with max_k max|L(:,k)|^2 max|U(k,:)|^2 in out[0].
   * The loop is alone in its function (see structure.ts on loops and on-stack replacement).
   */
  private factorLoop(): number {
    const { core, out, va, vb } = this;
    const { factorColumn, finishColumn } = this.kernels;
    const n = core.n;
    const q = core.q;
    const tol2 = this.opt.pivotTol * this.opt.pivotTol;
    const sing2 = this.opt.singularTol * this.opt.singularTol;
    let aAll2 = 0;
    out[0] = 0;
    for (let k = 0; k < n; k++) {
      const col = q[k];
      const top = core.columnPattern(k, col);
      const imax = factorColumn(core, va, vb, col, top, core.Up[k], core.unz, core.diagOf[col], out);
      const cmax2 = out[1];
      if (out[4] > aAll2) aAll2 = out[4];
      if (imax < 0 || cmax2 === 0 || cmax2 <= sing2 * out[3]) {
        core.clearReach(top);
        throw new SingularMatrixError(col);
      }
      const ipiv = core.pivotColumn(k, col, imax, cmax2, out[2], tol2, top);
      finishColumn(core, k, ipiv, cmax2, out);
    }
    return aAll2;
  }

  /** The numeric work of refactor(); false (nothing usable) when a reused pivot is no longer acceptable. */
  private refactorColumns(): boolean {
    this.g2 = 0;
    this.a2 = 0;
    if (!this.refactorLoop()) return false;
    this.growth2 = this.a2 > 0 ? this.g2 / this.a2 : Infinity;
    return true;
  }

  /** Columns 0..n-1 of refactor(), alone in its function (see factorLoop). */
  private refactorLoop(): boolean {
    const { core, out, va, vb } = this;
    const refactorColumn = this.kernels.refactorColumn;
    const n = core.n;
    const tol2 = this.opt.refactorTol * this.opt.refactorTol;
    const sing2 = this.opt.singularTol * this.opt.singularTol;
    for (let k = 0; k < n; k++) {
      const cmax2 = refactorColumn(core, va, vb, k, tol2, sing2, out);
      if (out[4] > this.a2) this.a2 = out[4];
      if (cmax2 < 0) return false;
      if (cmax2 > this.g2) this.g2 = cmax2;
      if (out[0] > this.g2) this.g2 = out[0];
    }
    return true;
  }

  /** solve() checks its residual when the growth of the factors is above GROWTH_UNCHECKED (or unknown). */
  protected checksResidual(): boolean {
    return !(this.growth2 <= GROWTH_UNCHECKED * GROWTH_UNCHECKED);
  }

  /** x = op(A)^-1 b in place, for the scaled matrix held by the factors (kernels solveFactors/solveFactorsT). */
  protected abstract applyFactors(correction: boolean, transposed: boolean, conj: boolean): void;
  /** Keeps b for the residual. */
  protected abstract keepRhs(): void;
  /** r = b - op(A) x for the values factored; returns the backward error. */
  protected abstract residual(transposed: boolean, conj: boolean): number;
  /** x += r. */
  protected abstract correct(): void;
  /** b = R b (or C b, transposed) on the way in; x = C x (or R x) on the way out. */
  protected abstract scaleVector(by: Float64Array): void;

  /**
   * Solves op(A) x = b in place on the variant's right-hand side. The factors hold S = R A C (R = C = I
   * without scaling): S y = R b, x = C y; transposed, S^T y = C b, x = R y. Threshold pivoting lets the
   * entries of the factors grow (up to 1/pivotTol per step), which can cost digits even on a well-conditioned
   * matrix. The backward error is bounded by a small multiple of eps G, G = max_k max|L(:,k)| max|U(k,:)| /
   * max|A| (N. J. Higham, "Accuracy and Stability of Numerical Algorithms", 2nd ed., 2002, section 9.3);
   * when G > GROWTH_UNCHECKED, the backward error of x is measured and, while it is above refineTol, up to
   * two steps of iterative refinement in working precision are taken (Higham, ibid., chapter 12; the
   * approach of KLU's and SuperLU's refinement options).
   */
  protected solveInPlace(transposed: boolean, conj: boolean): void {
    if (this.scaled) this.scaleVector(transposed ? this.cs : this.rs);
    if (!this.checksResidual()) {
      this.applyFactors(false, transposed, conj);
    } else {
      this.keepRhs();
      this.applyFactors(false, transposed, conj);
      let err = this.residual(transposed, conj);
      for (let step = 0; step < 2 && err > this.opt.refineTol; step++) {
        this.applyFactors(true, transposed, conj);
        this.correct();
        const next = this.residual(transposed, conj);
        if (!(next < 0.5 * err)) break; // no longer converging
        err = next;
      }
    }
    if (this.scaled) this.scaleVector(transposed ? this.rs : this.cs);
  }

  protected requireFactors(what: string): void {
    if (!this.factored) throw new Error(`${this.constructor.name}.${what} called before factor()`);
  }
}

/** to[0..len) = from[0..len), without making a view. */
export function copy(from: Float64Array, to: Float64Array, len: number): void {
  if (from.length === len) to.set(from);
  else for (let i = 0; i < len; i++) to[i] = from[i];
}
