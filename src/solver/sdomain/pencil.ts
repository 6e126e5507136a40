/**
 * Finite eigenvalues of a sparse real pencil (A, E), the s with
 * det(A + s·E) = 0, by shift and invert (standard linear algebra): with a shift
 * σ where A + σE is regular, (A + σE)⁻¹·E·x = x/(σ − s), so s = σ − 1/λ for the
 * non-zero eigenvalues λ of K = (A + σE)⁻¹·E. Only the columns J where E has
 * entries matter: the non-zero eigenvalues of K are those of the r×r matrix
 * K[J, J] (r = |J|, for a circuit the capacitor nodes and winding branches),
 * which goes to a dense eigensolver.
 */
import type { CscPattern } from '../sparse/types';
import { SingularMatrixError } from '../sparse/types';
import { analyze, ComplexSparseLU } from '../lu-backend';
import { denseEigenvalues } from './dense-eigen';

export interface SparsePencil {
  pattern: CscPattern;
  a: Float64Array;
  e: Float64Array;
}

export interface Roots {
  re: number[];
  im: number[];
  /** per root: polished to working precision (a simple or semisimple root); absent means not */
  polished?: boolean[];
}

/** Finite eigenvalues and the shift they were found with (a rate typical of the circuit, rad/s). */
export interface PencilRoots {
  roots: Roots;
  shift: number;
}

/** Largest dense eigenproblem solved (r, the number of state columns). */
export const DENSE_EIGEN_LIMIT = 2000;

export class PencilTooLarge extends Error {
  constructor(readonly size: number) {
    super(`the circuit has ${size} state variables (capacitor voltages and winding currents); poles are found by a dense eigensolve up to ${DENSE_EIGEN_LIMIT}`);
  }
}

/** A real sparse matrix A + σE, factored once and solved many times. */
class ShiftedSolver {
  private readonly lu: ComplexSparseLU;
  private readonly zero: Float64Array;
  constructor(p: SparsePencil, sigma: number) {
    const nnz = p.pattern.rowIdx.length;
    const re = new Float64Array(nnz);
    for (let s = 0; s < nnz; s++) re[s] = p.a[s] + sigma * p.e[s];
    this.lu = new ComplexSparseLU(analyze(p.pattern));
    this.lu.factor({ re, im: new Float64Array(nnz) });
    this.zero = new Float64Array(p.pattern.n);
  }
  solve(b: Float64Array): void {
    this.zero.fill(0);
    this.lu.solve(b, this.zero);
  }
}

/** Columns where E has a non-zero entry. */
function stateColumns(p: SparsePencil): number[] {
  const { colPtr } = p.pattern;
  const cols: number[] = [];
  for (let j = 0; j < p.pattern.n; j++) {
    for (let s = colPtr[j]; s < colPtr[j + 1]; s++) {
      if (p.e[s] !== 0) {
        cols.push(j);
        break;
      }
    }
  }
  return cols;
}

/**
 * A first shift: the geometric mean over the state columns of ‖A(:,j)‖/‖E(:,j)‖,
 * a rate (1/s) typical of each state variable.
 */
function firstShift(p: SparsePencil, cols: number[]): number {
  const { colPtr } = p.pattern;
  let logSum = 0;
  let count = 0;
  for (const j of cols) {
    let an = 0;
    let en = 0;
    for (let s = colPtr[j]; s < colPtr[j + 1]; s++) {
      an += p.a[s] * p.a[s];
      en += p.e[s] * p.e[s];
    }
    if (an > 0 && en > 0) {
      logSum += 0.5 * Math.log(an / en);
      count++;
    }
  }
  return count ? Math.exp(logSum / count) : 1;
}

/** Eigenvalues λ of K[J,J] for one shift; null when A + σE is singular at σ. */
function shiftedEigenvalues(p: SparsePencil, cols: number[], sigma: number): Shifted | null {
  let solver: ShiftedSolver;
  try {
    solver = new ShiftedSolver(p, sigma);
  } catch (e) {
    if (e instanceof SingularMatrixError) return null;
    throw e;
  }
  const n = p.pattern.n;
  const r = cols.length;
  const { colPtr, rowIdx } = p.pattern;
  const k = new Float64Array(r * r);
  const b = new Float64Array(n);
  for (let c = 0; c < r; c++) {
    b.fill(0);
    const j = cols[c];
    for (let s = colPtr[j]; s < colPtr[j + 1]; s++) b[rowIdx[s]] = p.e[s];
    solver.solve(b);
    for (let i = 0; i < r; i++) k[i * r + c] = b[cols[i]];
  }
  let norm2 = 0;
  for (let i = 0; i < k.length; i++) {
    if (!Number.isFinite(k[i])) return null;
    norm2 += k[i] * k[i];
  }
  return { ...denseEigenvalues(k, r), norm: Math.sqrt(norm2) };
}

/** Eigenvalues λ of K[J,J] and the Frobenius norm of K[J,J] (the scale of the eigensolver's rounding). */
interface Shifted {
  re: Float64Array;
  im: Float64Array;
  norm: number;
}

/**
 * Infinite eigenvalues (λ = 0) come out of the eigensolver as small λ: alone
 * at rounding level, or, where the equations have a chain of them (a
 * capacitor across a voltage source, a strictly proper transfer function in
 * the system matrix), as m values on a circle of radius about eps^(1/m) around
 * 0 whose mean stays at rounding level (the mean of a cluster is well
 * conditioned). Finite eigenvalues λ = 1/(σ − s) of a circuit lie off such
 * circles: for every s left of σ their real parts are positive. The largest
 * prefix (by |λ|, among |λ| below 1e-3 of the scale) whose mean is at the
 * eigensolver's rounding level (1e-10 of ‖K‖) is taken as infinite.
 */
function toRoots(lam: Shifted, sigma: number): Roots {
  const count = lam.re.length;
  let scale = 1 / sigma;
  for (let i = 0; i < count; i++) scale = Math.max(scale, Math.hypot(lam.re[i], lam.im[i]));
  const rounding = 1e-10 * Math.max(lam.norm, scale);
  const order = Array.from({ length: count }, (_, i) => i).sort((i, j) => Math.hypot(lam.re[i], lam.im[i]) - Math.hypot(lam.re[j], lam.im[j]));
  let infinite = 0;
  let sr = 0;
  let si = 0;
  for (let m = 1; m <= count; m++) {
    const i = order[m - 1];
    if (Math.hypot(lam.re[i], lam.im[i]) > 1e-3 * scale) break;
    sr += lam.re[i];
    si += lam.im[i];
    if (Math.hypot(sr, si) / m <= rounding) infinite = m;
  }
  const out: Roots = { re: [], im: [] };
  for (let t = infinite; t < count; t++) {
    const i = order[t];
    const lr = lam.re[i];
    const li = lam.im[i];
    const m2 = lr * lr + li * li;
    // s = σ − 1/λ
    out.re.push(sigma - lr / m2);
    out.im.push(li / m2);
  }
  return out;
}

/**
 * Polishes each root by inverse iteration at the root itself (standard
 * linear algebra): with M = A + s0·E factored at the computed root s0,
 * w = M⁻¹·E·v is v/(s0 − s) along the eigenvector, so after two steps
 * s = s0 − 1/μ with μ = vᴴw/vᴴv. A simple (or semisimple) root converges at
 * once from an eigensolver's answer: the first step moves it by less than 1e-6
 * and a second by far less than the first. Only then is the root marked
 * polished; a defective multiple root, which creeps, stays as it was.
 * Conjugates are set from their partner.
 */
export function refineRoots(p: SparsePencil, roots: Roots): Roots {
  const n = p.pattern.n;
  const nnz = p.pattern.rowIdx.length;
  const { colPtr, rowIdx } = p.pattern;
  const lu = new ComplexSparseLU(analyze(p.pattern));
  let factored = false;
  const re = new Float64Array(nnz);
  const im = new Float64Array(nnz);
  const vr = new Float64Array(n);
  const vi = new Float64Array(n);
  const wr = new Float64Array(n);
  const wi = new Float64Array(n);
  const out: Roots = { re: [...roots.re], im: [...roots.im], polished: roots.re.map(() => false) };
  /** E·v into w */
  const applyE = () => {
    wr.fill(0);
    wi.fill(0);
    for (let j = 0; j < n; j++) {
      for (let t = colPtr[j]; t < colPtr[j + 1]; t++) {
        const e = p.e[t];
        if (e === 0) continue;
        wr[rowIdx[t]] += e * vr[j];
        wi[rowIdx[t]] += e * vi[j];
      }
    }
  };
  /** One inverse-iteration estimate of the root nearest s; 'singular' when A + sE is singular at s. */
  const step = (sr0: number, si0: number): { re: number; im: number } | 'singular' | null => {
    for (let t = 0; t < nnz; t++) {
      re[t] = p.a[t] + sr0 * p.e[t];
      im[t] = si0 * p.e[t];
    }
    try {
      if (factored) lu.refactor({ re, im });
      else lu.factor({ re, im });
      factored = true;
    } catch (e) {
      if (e instanceof SingularMatrixError) {
        factored = false;
        return 'singular';
      }
      throw e;
    }
    for (let i = 0; i < n; i++) {
      vr[i] = Math.cos(1.3 * i + 0.7);
      vi[i] = Math.sin(0.7 * i + 0.2);
    }
    let mur = 0;
    let mui = 0;
    for (let it = 0; it < 2; it++) {
      applyE();
      lu.solve(wr, wi);
      // μ = vᴴw / vᴴv, then v = w/‖w‖
      let nr = 0;
      let ni = 0;
      let vv = 0;
      let ww = 0;
      for (let i = 0; i < n; i++) {
        nr += vr[i] * wr[i] + vi[i] * wi[i];
        ni += vr[i] * wi[i] - vi[i] * wr[i];
        vv += vr[i] * vr[i] + vi[i] * vi[i];
        ww += wr[i] * wr[i] + wi[i] * wi[i];
      }
      mur = nr / vv;
      mui = ni / vv;
      const scale = 1 / Math.sqrt(ww);
      if (!(Number.isFinite(scale) && scale > 0)) return null;
      for (let i = 0; i < n; i++) {
        vr[i] = wr[i] * scale;
        vi[i] = wi[i] * scale;
      }
    }
    const m2 = mur * mur + mui * mui;
    if (!(m2 > 0) || !Number.isFinite(m2)) return null;
    return { re: sr0 - mur / m2, im: si0 + mui / m2 };
  };
  for (let k = 0; k < roots.re.length; k++) {
    const s0r = roots.re[k];
    const s0i = roots.im[k];
    if (s0i < 0) continue; // set from its conjugate below
    let mate = -1;
    if (s0i > 0) {
      for (let j = 0; j < roots.re.length; j++) {
        if (roots.re[j] === s0r && roots.im[j] === -s0i) {
          mate = j;
          break;
        }
      }
    }
    const settle = (sr: number, si: number) => {
      out.re[k] = sr;
      out.im[k] = s0i === 0 ? 0 : si;
      out.polished![k] = true;
      if (mate >= 0) {
        out.re[mate] = sr;
        out.im[mate] = -si;
        out.polished![mate] = true;
      }
    };
    const mag = Math.hypot(s0r, s0i);
    if (mag === 0) {
      settle(0, 0);
      continue;
    }
    const s1 = step(s0r, s0i);
    if (s1 === 'singular') {
      settle(s0r, s0i); // singular at s0 to working precision: s0 is as good as it gets
      continue;
    }
    if (!s1) continue;
    const d1 = Math.hypot(s1.re - s0r, s1.im - s0i);
    if (!(d1 <= 1e-6 * mag)) continue;
    // a simple root converges at once: the second step moves it by far less than the first
    const s2 = step(s1.re, s1.im);
    if (s2 === 'singular') {
      settle(s1.re, s1.im);
      continue;
    }
    if (!s2) continue;
    if (Math.hypot(s2.re - s1.re, s2.im - s1.im) <= Math.max(0.01 * d1, 1e-13 * mag)) settle(s2.re, s2.im);
  }
  return out;
}

/**
 * Finite eigenvalues of the pencil. The shift starts at a rate typical of
 * the state variables and moves to the geometric middle of the spectrum found
 * (where the relative accuracy of both ends is best) while that is more than
 * a decade away, unless inverse iteration polishes every root found already
 * (each dense eigensolve is the cost that matters on a large circuit); a
 * shift that hits a pole is moved. `start`, when given,
 * replaces the first shift (a caller that knows where A + σE is best
 * conditioned); a later shift that fails keeps the roots found before it.
 */
export function pencilEigenvalues(p: SparsePencil, start?: number): PencilRoots {
  const cols = stateColumns(p);
  if (cols.length === 0) return { roots: { re: [], im: [] }, shift: 1 };
  if (cols.length > DENSE_EIGEN_LIMIT) throw new PencilTooLarge(cols.length);
  let sigma = start ?? firstShift(p, cols);
  let roots: Roots | null = null;
  let found = sigma; // the shift `roots` were found with
  for (let pass = 0; pass < 3; pass++) {
    let lam = shiftedEigenvalues(p, cols, sigma);
    for (let retry = 0; !lam && retry < 6; retry++) {
      sigma *= 1.618;
      lam = shiftedEigenvalues(p, cols, sigma);
    }
    if (!lam && roots) {
      sigma = found;
      break;
    }
    if (!lam) throw new SingularMatrixError(-1);
    roots = toRoots(lam, sigma);
    found = sigma;
    // roots at or near 0 (an integrator, a series capacitor's zero, and the small circle a multiple
    // root at 0 spreads into) say nothing of the scale
    const all = roots.re.map((re, i) => Math.hypot(re, roots!.im[i]));
    const floor = 1e-6 * Math.max(sigma, ...all);
    const mags = all.filter((m) => m > floor);
    if (!mags.length) break;
    const hi = Math.max(...mags);
    const lo = Math.min(...mags);
    const middle = Math.sqrt(lo * hi);
    if (middle / sigma < 10 && sigma / middle < 10) break;
    // a shift far from the middle costs accuracy at one end, which polishing at each root restores
    // where every root is simple or semisimple; another dense eigensolve only where one is not
    const polished = refineRoots(p, roots);
    if (polished.polished!.every(Boolean)) return { roots: dropUnconfirmed(polished), shift: sigma };
    sigma = middle * 1.0317; // a little off the middle, so it does not sit on a pole
  }
  return { roots: dropUnconfirmed(refineRoots(p, roots!)), shift: sigma };
}

/**
 * Leaves out roots that inverse iteration could not confirm and that lie more
 * than a hundred times beyond every confirmed one: what is left of a chain of
 * infinite eigenvalues (a system matrix's output row makes one as long as the
 * transfer function's relative degree) that the cluster test in toRoots did
 * not recognise. A genuine simple or semisimple root always confirms.
 */
function dropUnconfirmed(r: Roots): Roots {
  let trusted = 0;
  r.re.forEach((re, i) => {
    if (r.polished![i]) trusted = Math.max(trusted, Math.hypot(re, r.im[i]));
  });
  if (!(trusted > 0)) return r;
  const keep = r.re.map((re, i) => r.polished![i] || Math.hypot(re, r.im[i]) <= 100 * trusted);
  return { re: r.re.filter((_, i) => keep[i]), im: r.im.filter((_, i) => keep[i]), polished: r.polished!.filter((_, i) => keep[i]) };
}
