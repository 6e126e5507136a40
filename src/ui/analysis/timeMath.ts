/**
 * Pure helpers of the time view: measurements of a trace over a window (peak,
 * peak-to-peak, mean, RMS, time of peak, settling time), the min/max envelope
 * per pixel column that keeps a long run smooth, the phasor read as a
 * waveform, and index searches on the time axis.
 */
import type { ComplexJson } from '../../model/graph';

/** The first index whose time is at or after `t` (times ascending); `times.length` when none is. */
export function lowerIndex(times: ArrayLike<number>, t: number): number {
  let lo = 0;
  let hi = times.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (times[mid] < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The index of the sample nearest to `t` (-1 for an empty run). */
export function nearestIndex(times: ArrayLike<number>, t: number): number {
  const n = times.length;
  if (!n) return -1;
  const i = lowerIndex(times, t);
  if (i <= 0) return 0;
  if (i >= n) return n - 1;
  return t - times[i - 1] <= times[i] - t ? i - 1 : i;
}

export interface Measures {
  /** the value of largest magnitude, with its sign, and when it is reached (the first time) */
  peak: number;
  timeOfPeak: number;
  max: number;
  min: number;
  peakToPeak: number;
  /** time averages over the window (trapezoidal rule on the samples) */
  mean: number;
  rms: number;
}

/**
 * Measurements of y(t) over the samples i0…i1 (inclusive). Mean and RMS are
 * (1/T)∫y dt and √((1/T)∫y² dt) by the trapezoidal rule (RMS definition,
 * common practice); a window of one sample gives that sample.
 */
export function measure(t: ArrayLike<number>, y: ArrayLike<number>, i0: number, i1: number): Measures | null {
  const a = Math.max(0, Math.min(i0, i1));
  const b = Math.min(y.length - 1, Math.max(i0, i1));
  if (!(b >= a) || !y.length) return null;
  let max = -Infinity;
  let min = Infinity;
  let peak = 0;
  let timeOfPeak = t[a];
  let sum = 0;
  let sum2 = 0;
  for (let i = a; i <= b; i++) {
    const v = y[i];
    if (v > max) max = v;
    if (v < min) min = v;
    if (Math.abs(v) > Math.abs(peak)) { peak = v; timeOfPeak = t[i]; }
    if (i > a) {
      const dt = t[i] - t[i - 1];
      const u = y[i - 1];
      sum += 0.5 * dt * (u + v);
      sum2 += 0.5 * dt * (u * u + v * v);
    }
  }
  const span = t[b] - t[a];
  const mean = span > 0 ? sum / span : y[a];
  const rms = span > 0 ? Math.sqrt(Math.max(0, sum2 / span)) : Math.abs(y[a]);
  // a mean within rounding of the window's largest value (a sine over whole periods) reads as 0, not as femtovolts
  const tiny = 1e-12 * Math.max(Math.abs(max), Math.abs(min));
  return { peak: peak + 0, timeOfPeak, max, min, peakToPeak: max - min, mean: Math.abs(mean) <= tiny ? 0 : mean + 0, rms };
}

/**
 * Settling time: how long after the window's start y stays for good within
 * a band around where it settles. Without a reference it settles to its
 * value at the window's end, in a band of `fraction` (2 %, common practice)
 * of its largest departure from that value over the window (for a step
 * response: of the step). With a reference waveform (the phasor steady state)
 * it settles onto that waveform, in a band of `fraction` of the reference's
 * largest magnitude. The crossing into the band is interpolated between the
 * samples. 0 when y never leaves the band (settled from the start); null
 * when it is still outside it at the window's end.
 */
export function settlingTime(t: ArrayLike<number>, y: ArrayLike<number>, i0: number, i1: number, fraction = 0.02, reference?: (i: number) => number): number | null {
  const a = Math.max(0, Math.min(i0, i1));
  const b = Math.min(y.length - 1, Math.max(i0, i1));
  if (!(b > a)) return null;
  const final = y[b];
  const ref = reference ?? (() => final);
  let scale = 0;
  for (let i = a; i <= b; i++) scale = Math.max(scale, Math.abs(reference ? reference(i) : y[i] - final));
  if (!(scale > 0)) return 0;
  const band = fraction * scale;
  const dev = (i: number) => Math.abs(y[i] - ref(i));
  if (dev(b) > band) return null;
  let last = -1;
  for (let i = b; i >= a; i--) if (dev(i) > band) { last = i; break; }
  if (last < 0) return 0;
  // between the last sample outside and the next (inside): where the departure meets the band
  const d0 = dev(last);
  const d1 = dev(last + 1);
  const f = d0 > d1 ? (d0 - band) / (d0 - d1) : 1;
  return t[last] + f * (t[last + 1] - t[last]) - t[a];
}

/** A phasor as its waveform at time t: A·cos(2πft + φ), A = √2·|X| for RMS phasors (contract: the cosine convention). */
export function phasorAt(z: ComplexJson, frequencyHz: number, amplitudes: 'rms' | 'peak', t: number): number {
  const k = amplitudes === 'rms' ? Math.SQRT2 : 1;
  const w = 2 * Math.PI * frequencyHz * t;
  return k * (z.re * Math.cos(w) - z.im * Math.sin(w));
}

/**
 * The trace between t0 and t1 for a plot `columns` pixels wide: the samples
 * themselves when there are few, else per column its first, lowest, highest
 * and last value (in time order), so that the drawn line keeps every peak of
 * a million samples at a cost of four points per column. The samples just
 * outside the window are kept so that the line runs to the edges.
 */
export function envelope(t: ArrayLike<number>, y: ArrayLike<number>, t0: number, t1: number, columns: number): { x: Float64Array; y: Float64Array } {
  const n = t.length;
  const a = Math.max(0, lowerIndex(t, t0) - 1);
  const b = Math.min(n - 1, lowerIndex(t, t1));
  const count = b - a + 1;
  if (count <= 0) return { x: new Float64Array(0), y: new Float64Array(0) };
  const cols = Math.max(1, Math.floor(columns));
  if (count <= 4 * cols) return { x: Float64Array.from({ length: count }, (_, k) => t[a + k]), y: Float64Array.from({ length: count }, (_, k) => y[a + k]) };
  const xs: number[] = [];
  const ys: number[] = [];
  const span = t1 - t0 || 1;
  let i = a;
  while (i <= b) {
    const col = Math.floor(((t[i] - t0) / span) * cols);
    let lo = i, hi = i, j = i;
    while (j + 1 <= b && Math.floor(((t[j + 1] - t0) / span) * cols) === col) {
      j++;
      if (y[j] < y[lo]) lo = j;
      if (y[j] > y[hi]) hi = j;
    }
    const picks = [...new Set([i, Math.min(lo, hi), Math.max(lo, hi), j])];
    for (const k of picks) { xs.push(t[k]); ys.push(y[k]); }
    i = j + 1;
  }
  return { x: Float64Array.from(xs), y: Float64Array.from(ys) };
}

/**
 * How far y is from a reference waveform (the phasor steady state) over the
 * samples from i0 to the end: the largest |y − ref| as a fraction of the
 * reference's largest magnitude there (null when the reference is 0 there).
 */
export function steadyGap(y: ArrayLike<number>, ref: (i: number) => number, i0: number): number | null {
  let gap = 0, scale = 0;
  for (let i = Math.max(0, i0); i < y.length; i++) {
    const r = ref(i);
    gap = Math.max(gap, Math.abs(y[i] - r));
    scale = Math.max(scale, Math.abs(r));
  }
  return scale > 0 ? gap / scale : null;
}
