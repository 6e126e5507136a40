/**
 * Pure helpers of the analysis plots: engineering ticks, peaks and phase
 * zero crossings, decibels and phase, steady-state waveforms, CSV.
 */
import { csvField } from '../../export/csvText';
import { formatSI } from '../../model/quantity';

/** Ticks of a log axis at 1, 2 and 5 times each power of ten (fewer when the range spans many decades). */
export function logTicks(lo: number, hi: number): number[] {
  if (!(lo > 0 && hi > lo)) return [];
  const d0 = Math.floor(Math.log10(lo));
  const d1 = Math.ceil(Math.log10(hi));
  const steps = d1 - d0 > 4 ? [1] : d1 - d0 > 2 ? [1, 2, 5] : [1, 2, 3, 5];
  const out: number[] = [];
  for (let d = d0; d <= d1; d++) {
    for (const s of steps) {
      const v = Number((s * 10 ** d).toPrecision(6));
      if (v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9)) out.push(v);
    }
  }
  return out;
}

/** "1 kHz", "20 kHz", "2.5 MHz": a tick label with an SI prefix. */
export function engLabel(v: number, unit: string): string {
  return formatSI(v, unit, 3);
}

/** 20·log10(|x|) (amplitude ratio in decibels, common practice); −Infinity at 0. */
export function toDb(mag: number): number {
  return 20 * Math.log10(mag);
}

export interface Marker { index: number; frequency: number; value: number; kind: 'peak' | 'phase-zero' }

/**
 * Local maxima of `y` that stand above their surroundings by at least
 * `prominence` (as a fraction of the larger of the two neighbouring
 * minima's gaps to the peak relative to the peak), refined by a parabola
 * through the three points around each in log-frequency (for log grids).
 */
export function findPeaks(f: ArrayLike<number>, y: ArrayLike<number>, prominence = 0.05, logF = true): Marker[] {
  const n = y.length;
  const out: Marker[] = [];
  for (let i = 1; i < n - 1; i++) {
    if (!(y[i] > y[i - 1] && y[i] >= y[i + 1])) continue;
    let left = y[i];
    for (let j = i - 1; j >= 0 && y[j] <= y[i]; j--) left = Math.min(left, y[j]);
    let right = y[i];
    for (let j = i + 1; j < n && y[j] <= y[i]; j++) right = Math.min(right, y[j]);
    const drop = y[i] - Math.max(left, right);
    if (!(drop >= prominence * Math.abs(y[i]))) continue;
    const x = (k: number) => (logF ? Math.log(f[k]) : f[k]);
    const [x0, x1, x2] = [x(i - 1), x(i), x(i + 1)];
    const [y0, y1, y2] = [y[i - 1], y[i], y[i + 1]];
    // vertex of the parabola through the three points
    const den = (x0 - x1) * (x0 - x2) * (x1 - x2);
    const a = (x2 * (y1 - y0) + x1 * (y0 - y2) + x0 * (y2 - y1)) / den;
    const b = (x2 * x2 * (y0 - y1) + x1 * x1 * (y2 - y0) + x0 * x0 * (y1 - y2)) / den;
    let xv = a < 0 ? -b / (2 * a) : x1;
    if (!(xv >= x0 && xv <= x2)) xv = x1;
    const c = y1 - a * x1 * x1 - b * x1;
    out.push({ index: i, frequency: logF ? Math.exp(xv) : xv, value: a < 0 ? a * xv * xv + b * xv + c : y1, kind: 'peak' });
  }
  return out;
}

/** Where the phase (degrees) passes through 0 between two points both within ±90°, by linear interpolation in log-frequency. */
export function phaseZeros(f: ArrayLike<number>, deg: ArrayLike<number>, logF = true): Marker[] {
  const out: Marker[] = [];
  for (let i = 0; i + 1 < deg.length; i++) {
    const a = deg[i];
    const b = deg[i + 1];
    if (Math.abs(a) > 90 || Math.abs(b) > 90) continue;
    if (a === 0 && i > 0) continue;
    if (!(a === 0 || (a < 0) !== (b < 0)) || b === 0) continue;
    const t = a === b ? 0 : a / (a - b);
    const x0 = logF ? Math.log(f[i]) : f[i];
    const x1 = logF ? Math.log(f[i + 1]) : f[i + 1];
    const x = x0 + t * (x1 - x0);
    out.push({ index: i, frequency: logF ? Math.exp(x) : x, value: 0, kind: 'phase-zero' });
  }
  return out;
}

/**
 * Samples of x(t) = A·cos(ωt + φ) over `periods` periods, with A = √2·|X|
 * for RMS phasors and A = |X| for peak phasors (field notes: the RMS/peak
 * convention).
 */
export function waveform(re: number, im: number, frequencyHz: number, amplitudes: 'rms' | 'peak', samples = 200, periods = 2): { t: Float64Array; y: Float64Array } {
  const amp = Math.hypot(re, im) * (amplitudes === 'rms' ? Math.SQRT2 : 1);
  const phi = Math.atan2(im, re);
  const T = frequencyHz > 0 ? 1 / frequencyHz : 1;
  const t = new Float64Array(samples);
  const y = new Float64Array(samples);
  for (let i = 0; i < samples; i++) {
    t[i] = (periods * T * i) / (samples - 1);
    y[i] = frequencyHz > 0 ? amp * Math.cos(2 * Math.PI * frequencyHz * t[i] + phi) : Math.hypot(re, im) * Math.sign(re || 1);
  }
  return { t, y };
}

/** Comma-separated rows with a header; numbers in full precision, text quoted and defused (export/csv). */
export function csvOf(header: string[], rows: (number | string)[][]): string {
  const cell = (v: number | string) => (typeof v === 'number' ? String(v) : csvField(v));
  return [header.map(cell).join(','), ...rows.map((r) => r.map(cell).join(','))].join('\n') + '\n';
}

/** A "nice" upper bound for a linear scale: 1, 2 or 5 times a power of ten at or above `v`. */
export function niceCeil(v: number): number {
  if (!(v > 0)) return 1;
  const p = 10 ** Math.floor(Math.log10(v));
  for (const s of [1, 2, 5, 10]) if (s * p >= v * (1 - 1e-12)) return s * p;
  return 10 * p;
}
