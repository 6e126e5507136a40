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

/** "1 kHz", "20 kHz", "2.5 MHz": a tick label with an SI prefix; a pure number (unit "1", a coupling's k) as it is, "0.25". */
export function engLabel(v: number, unit: string, digits = 3): string {
  if (unit === '1') return String(Number(v.toPrecision(digits)));
  return formatSI(v, unit, digits);
}

/** 20·log10(|x|) (amplitude ratio in decibels, common practice); −Infinity at 0. */
export function toDb(mag: number): number {
  return 20 * Math.log10(mag);
}

export interface Marker { index: number; frequency: number; value: number; kind: 'peak' | 'phase-zero' | 'half-power' }

/**
 * The decibel scale of a quantity: the reference it is measured against and
 * whether it is a power (10·log10) or an amplitude (20·log10) quantity
 * (common practice: dBV re 1 V, dBA re 1 A, dBΩ re 1 Ω, dBS re 1 S; a ratio
 * of like quantities in plain dB).
 */
export interface DbScale { unit: string; factor: 10 | 20 }

export function dbScale(unit: string, power = false): DbScale {
  if (power) return { unit: unit === '' ? 'dB' : unit === 'VA' ? 'dB(VA)' : `dB(${unit})`, factor: 10 };
  switch (unit) {
    case '': return { unit: 'dB', factor: 20 };
    case 'V': return { unit: 'dBV', factor: 20 };
    case 'A': return { unit: 'dBA', factor: 20 };
    case 'Ω': case 'V/A': return { unit: 'dBΩ', factor: 20 };
    case 'S': case 'A/V': return { unit: 'dBS', factor: 20 };
    default: return { unit: `dB(${unit})`, factor: 20 };
  }
}

/** A magnitude in decibels on a scale; −Infinity at 0. */
export function dbOf(mag: number, scale: DbScale): number {
  return scale.factor * Math.log10(mag);
}

/**
 * The half-power points of a magnitude curve (−3 dB: where an amplitude
 * falls to 1/√2 of its peak, a power to 1/2; common practice): for each peak
 * given, the nearest crossing on each side, by linear interpolation in
 * log-x (for log grids) on the magnitude. With no peak given, the curve's
 * largest value serves as the reference (a low-pass or high-pass shape).
 * Returns the crossings found, each with the peak it belongs to.
 */
export function halfPowerPoints(f: ArrayLike<number>, mag: ArrayLike<number>, peaks: Marker[], logF = true, power = false): { peak: Marker; below: Marker | null; above: Marker | null }[] {
  const n = mag.length;
  if (n < 2) return [];
  const refs: Marker[] = peaks.length ? peaks : [];
  if (!refs.length) {
    let best = -1;
    for (let i = 0; i < n; i++) if (Number.isFinite(mag[i]) && (best < 0 || mag[i] > mag[best])) best = i;
    if (best < 0 || !(mag[best] > 0)) return [];
    refs.push({ index: best, frequency: f[best], value: mag[best], kind: 'peak' });
  }
  const x = (k: number) => (logF ? Math.log(f[k]) : f[k]);
  const at = (i: number, j: number, level: number): Marker => {
    const t = (level - mag[i]) / (mag[j] - mag[i]);
    const xv = x(i) + (Number.isFinite(t) ? t : 0) * (x(j) - x(i));
    return { index: i, frequency: logF ? Math.exp(xv) : xv, value: level, kind: 'half-power' };
  };
  return refs.map((peak) => {
    const level = peak.value * (power ? 0.5 : Math.SQRT1_2);
    let below: Marker | null = null;
    for (let i = Math.min(peak.index, n - 1); i > 0; i--) {
      if (mag[i - 1] > peak.value) break;
      if (mag[i - 1] <= level && mag[i] > level) { below = at(i, i - 1, level); break; }
    }
    let above: Marker | null = null;
    for (let i = Math.max(peak.index, 0); i < n - 1; i++) {
      if (mag[i + 1] > peak.value) break;
      if (mag[i + 1] <= level && mag[i] > level) { above = at(i, i + 1, level); break; }
    }
    return { peak, below, above };
  });
}

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
    // a phase that stays within rounding of 0° (a resistive load throughout) crosses nothing
    if (Math.max(Math.abs(a), Math.abs(b)) < 0.05) continue;
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
