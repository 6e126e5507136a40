/**
 * Row and column equilibration of a sparse matrix by powers of two: S = R A C with R, C diagonal, so that
 * rows and columns of S have comparable size. Two stages after D. Ruiz ("A scaling algorithm to equilibrate
 * both rows and columns norms in matrices", RAL-TR-2001-034, 2001), who recommends a few steps of the
 * infinity-norm iteration followed by a few of the 1-norm one:
 *   1. max-norm: divide every row and every column at once by the square root of its largest entry, and
 *      repeat; the spread of the row and column maxima halves each time. Run on the binary exponents of the
 *      entries (integers), so a spread of 1e-300 .. 1e300 costs integer passes only.
 *   2. 1-norm, on the result: the same with row and column sums. Its limit (a doubly stochastic |S|, the
 *      scaling of R. Sinkhorn and P. Knopp, Pacific J. Math. 21(2), 1967) is unique for a fully
 *      indecomposable pattern, so D1 A D2 and A scale to nearly the same S; the max-norm limit is not unique
 *      and can leave S much worse conditioned than A.
 * The factors are rounded to powers of two at the end, so that applying them rounds nothing (short of
 * overflow or underflow).
 */

const ABSENT = -0x40000000; // exponent of a zero (or non-finite) entry: ignored
const MAX_SWEEPS = 40;
const SUM_SWEEPS = 60; // 1-norm sweeps; each brings the row and column sums closer to 1

// binary exponent of a double from its bit pattern (little- or big-endian hosts alike)
const F64 = new Float64Array(1);
const U32 = new Uint32Array(F64.buffer);
F64[0] = 1;
const HI = U32[1] === 0x3ff00000 ? 1 : 0;

// 2^e for -1000 <= e <= 1000, exact (Math.pow is a slow library call)
const POW2 = new Float64Array(2001);
POW2[1000] = 1;
for (let e = 1; e <= 1000; e++) {
  POW2[1000 + e] = POW2[999 + e] * 2;
  POW2[1000 - e] = POW2[1001 - e] / 2;
}

/** 2^e, e clamped to [-1000, 1000] so that a factor and its reciprocal stay normal doubles. */
function pow2(e: number): number {
  return POW2[1000 + (e > 1000 ? 1000 : e < -1000 ? -1000 : e)];
}

/** floor(log2 |v|) for normal |v| > 0; ABSENT for zero, subnormal, infinite or NaN. */
function exponentOf(v: number): number {
  F64[0] = v;
  const e = (U32[HI] >>> 20) & 0x7ff;
  return e === 0 || e === 0x7ff ? ABSENT : e - 1023;
}

/**
 * Scale factors for the matrix with pattern (Ap, Ai) and entries of magnitude max(|re|, |im|) (im may be
 * null for a real matrix), into rs (rows) and cs (columns): S = diag(rs) A diag(cs). A row or column
 * without nonzero entries keeps the factor 1.
 */
export function equilibrate(n: number, Ap: Int32Array, Ai: Int32Array, re: Float64Array, im: Float64Array | null, rs: Float64Array, cs: Float64Array): void {
  const nz = Ap[n];
  const ea = new Int32Array(nz);
  if (im) exponentsComplex(re, im, ea, nz);
  else exponentsReal(re, ea, nz);
  const er = new Int32Array(n);
  const ec = new Int32Array(n);
  const rmax = new Int32Array(n);
  const cmax = new Int32Array(n);
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    maxExponents(n, Ap, Ai, ea, er, ec, rmax, cmax);
    const movedRows = halve(er, rmax, n);
    const movedCols = halve(ec, cmax, n);
    if (!movedRows && !movedCols) break;
  }
  // stage 2 on the magnitudes after stage 1 (all near 1 now): r, c in floating point
  const mag = new Float64Array(nz);
  magnitudes(n, Ap, Ai, re, im, ea, er, ec, mag);
  const r = new Float64Array(n).fill(1);
  const c = new Float64Array(n).fill(1);
  const rsum = new Float64Array(n);
  const csum = new Float64Array(n);
  for (let sweep = 0; sweep < SUM_SWEEPS; sweep++) {
    sums(n, Ap, Ai, mag, r, c, rsum, csum);
    const movedRows = rescale(r, rsum, n);
    const movedCols = rescale(c, csum, n);
    if (!movedRows && !movedCols) break;
  }
  powersOfTwo(er, r, rs, n);
  powersOfTwo(ec, c, cs, n);
}

// Each loop below sits alone in its function (see structure.ts on loops and on-stack replacement).

function exponentsReal(re: Float64Array, ea: Int32Array, nz: number): void {
  for (let p = 0; p < nz; p++) ea[p] = exponentOf(re[p]);
}

function exponentsComplex(re: Float64Array, im: Float64Array, ea: Int32Array, nz: number): void {
  for (let p = 0; p < nz; p++) ea[p] = exponentOf(Math.max(Math.abs(re[p]), Math.abs(im[p])));
}

/** Largest exponent of every row and column of the matrix scaled by 2^er, 2^ec (ABSENT for an empty one). */
function maxExponents(n: number, Ap: Int32Array, Ai: Int32Array, ea: Int32Array, er: Int32Array, ec: Int32Array, rmax: Int32Array, cmax: Int32Array): void {
  rmax.fill(ABSENT);
  for (let j = 0; j < n; j++) {
    let cm = ABSENT;
    const cj = ec[j];
    for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) {
      const e = ea[p];
      if (e === ABSENT) continue;
      const i = Ai[p];
      const v = e + er[i] + cj;
      if (v > rmax[i]) rmax[i] = v;
      if (v > cm) cm = v;
    }
    cmax[j] = cm;
  }
}

/** e -= half the largest exponent (an entry 2^v lies in [2^v, 2^(v+1)): aims v at {-1, 0}); true if any moved. */
function halve(e: Int32Array, max: Int32Array, n: number): boolean {
  let moved = false;
  for (let i = 0; i < n; i++) {
    if (max[i] === ABSENT) continue;
    const s = (max[i] + 1) >> 1;
    if (s !== 0) {
      e[i] -= s;
      moved = true;
    }
  }
  return moved;
}

/** mag[p] = |a_p| 2^(er_i + ec_j) for the entries stage 1 saw (|a| = max(|re|, |im|)), zero for the others. */
function magnitudes(n: number, Ap: Int32Array, Ai: Int32Array, re: Float64Array, im: Float64Array | null, ea: Int32Array, er: Int32Array, ec: Int32Array, mag: Float64Array): void {
  const pr = new Float64Array(n);
  powersOfTwo(er, null, pr, n);
  for (let j = 0; j < n; j++) {
    const cj = pow2(ec[j]);
    for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) {
      const a = im ? Math.max(Math.abs(re[p]), Math.abs(im[p])) : Math.abs(re[p]);
      mag[p] = ea[p] === ABSENT ? 0 : a * (pr[Ai[p]] * cj);
    }
  }
}

/** Row and column sums of r_i mag_ij c_j. */
function sums(n: number, Ap: Int32Array, Ai: Int32Array, mag: Float64Array, r: Float64Array, c: Float64Array, rsum: Float64Array, csum: Float64Array): void {
  rsum.fill(0);
  for (let j = 0; j < n; j++) {
    let s = 0;
    const cj = c[j];
    for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) {
      const i = Ai[p];
      const v = r[i] * mag[p] * cj;
      rsum[i] += v;
      s += v;
    }
    csum[j] = s;
  }
}

/** f_i /= sqrt(sum_i) where the sum is off 1 by more than 1/4; true if any was. */
function rescale(f: Float64Array, sum: Float64Array, n: number): boolean {
  let moved = false;
  for (let i = 0; i < n; i++) {
    const s = sum[i];
    if (s > 0 && (s > 1.25 || s < 0.8)) {
      f[i] /= Math.sqrt(s);
      moved = true;
    }
  }
  return moved;
}

/** out_i = 2^(e_i + round(log2 f_i)) (f_i = 1 when f is null). */
function powersOfTwo(e: Int32Array, f: Float64Array | null, out: Float64Array, n: number): void {
  // round(log2 f) as the binary exponent of f sqrt(2)
  for (let i = 0; i < n; i++) out[i] = pow2(e[i] + (f ? exponentOf(f[i] * Math.SQRT2) : 0));
}

/** s = diag(rs) a diag(cs) for the pattern (Ap, Ai): exact for powers of two short of overflow or underflow. */
export function applyScaling(n: number, Ap: Int32Array, Ai: Int32Array, a: Float64Array, rs: Float64Array, cs: Float64Array, s: Float64Array): void {
  for (let j = 0; j < n; j++) {
    const c = cs[j];
    for (let p = Ap[j], pe = Ap[j + 1]; p < pe; p++) s[p] = a[p] * rs[Ai[p]] * c;
  }
}
