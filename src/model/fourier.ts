/**
 * Fourier series of the periodic source waveforms (contract:
 * time-and-s-domain.md, "waveform shapes") and the figures read from a sum of
 * harmonics: one period rebuilt, true RMS, THD. Pure arithmetic, shared by the
 * harmonic engine (src/solver/phasor/harmonics.ts) and the editor's harmonic
 * view.
 *
 * A real periodic x(t) with fundamental ω = 2π/T is
 *
 *     x(t) = c0 + Σ_{n≥1} 2·|c_n|·cos(n·ω·t + arg c_n),   c_n = (1/T)·∫_0^T x(t)·e^(−j·n·ω·t) dt
 *
 * (standard). Here a harmonic is given as its peak phasor A_n = 2·c_n, so that
 * x(t) = c0 + Σ Re(A_n·e^(j·n·ω·t)): the cosine convention the tool reads every
 * phasor by.
 */
import type { Waveform } from './waveform';

export interface Complex { re: number; im: number }

/**
 * The rebuilt square wave's RMS is within 0.1 % of the true RMS from this
 * order on: for a symmetric square wave (duty 0.5, sharp edges) the odd
 * harmonics 4/(πn) hold Σ_{odd n ≤ N} 8/(π²n²) of the mean square (Parseval,
 * Σ_{odd} 1/n² = π²/8, standard); N = 201 leaves 0.99899 of the RMS, N = 203 gives
 * 0.99901 (test/model/fourier.test.ts checks that 203 is the smallest such N).
 */
export const DEFAULT_HARMONIC_COUNT = 203;

/** The waveforms that repeat: their period is 1/frequencyHz (constant has no period of its own). */
export function periodicFrequency(w: Waveform): number | null {
  return w.shape === 'sine' || w.shape === 'square' ? w.frequencyHz : null;
}

/** Why a waveform has no Fourier series (not periodic), or null. */
export function notPeriodic(w: Waveform): string | null {
  if (w.shape === 'step') return 'a step is not periodic (for its final value use a constant waveform)';
  if (w.shape === 'points') return 'a waveform of points is not periodic';
  return null;
}

/** The mean (the DC term c0) of a periodic waveform, from the time its last start is past. */
export function waveformMean(w: Waveform): number {
  switch (w.shape) {
    case 'constant': return w.value;
    case 'sine': return w.offset ?? 0;
    case 'square': return w.low + (w.high - w.low) * (w.duty ?? 0.5);
    default: throw new Error(`waveform "${w.shape}" is not periodic`);
  }
}

/**
 * The peak phasor A_n = 2·c_n of harmonic n ≥ 1 (n counts in multiples of the
 * waveform's own frequency), once every start time (a sine's `startS`, a
 * square wave's `delayS`) is past.
 *
 * Square wave: x = low + (high − low)·p, p the trapezoid pulse of one period,
 * which is a pulse of width D·T convolved with a box of width e and area 1
 * (rise over e from τ = 0, fall over e from D·T; e ≤ D·T and e ≤ (1−D)·T by the
 * contract), so c_n = (high − low)·R_n·B_n with (standard transform pairs)
 *
 *     R_n = e^(−jπnD)·sin(πnD)/(πn),   B_n = e^(−jπn·e/T)·sin(πn·e/T)/(πn·e/T)
 *
 * and a delay d multiplies by e^(−j·n·ω·d). For D = 1/2, e = 0, low = −A,
 * high = A: |A_n| = 4A/(πn) for odd n, 0 for even n.
 */
export function waveformHarmonic(w: Waveform, n: number): Complex {
  switch (w.shape) {
    case 'constant':
      return { re: 0, im: 0 };
    case 'sine': {
      if (n !== 1) return { re: 0, im: 0 };
      const ph = ((w.phaseDeg ?? 0) * Math.PI) / 180;
      return { re: w.amplitude * Math.cos(ph), im: w.amplitude * Math.sin(ph) };
    }
    case 'square': {
      const duty = w.duty ?? 0.5;
      const edgeFraction = (w.edgeS ?? 0) * w.frequencyHz;
      const rect = sinPi(n * duty) / (Math.PI * n);
      const x = n * edgeFraction;
      const box = x === 0 ? 1 : sinPi(x) / (Math.PI * x);
      const mag = 2 * (w.high - w.low) * rect * box;
      // phase: −πnD (the pulse's centre), −πn·e/T (the edges' centre), −n·ω·d (the delay), taken modulo 2π first
      const turns = (n * duty) / 2 + (n * edgeFraction) / 2 + frac(n * (w.delayS ?? 0) * w.frequencyHz);
      const ph = -2 * Math.PI * frac(turns);
      return { re: mag * Math.cos(ph), im: mag * Math.sin(ph) };
    }
    default:
      throw new Error(`waveform "${w.shape}" is not periodic`);
  }
}

/** sin(π·x), exactly 0 at whole x (so that a duty of one half leaves the even harmonics at exactly 0), with x reduced first. */
function sinPi(x: number): number {
  const k = Math.round(x);
  const r = x - k;
  if (Math.abs(r) <= 1e-12 * Math.max(1, Math.abs(x))) return 0;
  return (k % 2 === 0 ? 1 : -1) * Math.sin(Math.PI * r);
}

/** The fractional part, in [0, 1). */
function frac(v: number): number {
  return v - Math.floor(v);
}

/**
 * One period of Σ harmonics: x(t_k) = dc + Σ_i Re(P_i·e^(j·orders_i·ω·t_k)) at
 * `samples` times t_k = k·T/samples (k = 0 … samples, both ends), with the
 * phasors P_i read as peak values (`scale` = √2 for RMS phasors, 1 for peak).
 */
export function rebuildPeriod(fundamentalHz: number, orders: ArrayLike<number>, phasors: ArrayLike<Complex>, scale: number, samples: number): { timesS: Float64Array; values: Float64Array } {
  const timesS = new Float64Array(samples + 1);
  const values = new Float64Array(samples + 1);
  const period = 1 / fundamentalHz;
  for (let k = 0; k <= samples; k++) timesS[k] = (k * period) / samples;
  // every angle n·2π·k/samples is one of the samples' own: one table of cosines and sines serves all orders
  const cos = new Float64Array(samples);
  const sin = new Float64Array(samples);
  for (let j = 0; j < samples; j++) {
    cos[j] = Math.cos((2 * Math.PI * j) / samples);
    sin[j] = Math.sin((2 * Math.PI * j) / samples);
  }
  for (let i = 0; i < orders.length; i++) {
    const n = orders[i];
    const p = phasors[i];
    if (n === 0) {
      for (let k = 0; k <= samples; k++) values[k] += p.re;
      continue;
    }
    const re = scale * p.re;
    const im = scale * p.im;
    if (re === 0 && im === 0) continue;
    const step = n % samples;
    // the angle n·2π·k/samples reduced to one turn (so high orders keep their digits), stepped through the table
    for (let k = 0, j = 0; k <= samples; k++) {
      values[k] += re * cos[j] - im * sin[j];
      j += step;
      if (j >= samples) j -= samples;
    }
  }
  return { timesS, values };
}

/**
 * True RMS and THD of a quantity given by its harmonics (order 0 is DC, a real
 * value): RMS² = dc² + Σ |X_n|²_rms (Parseval, standard); THD = √(Σ_{n≥2} |X_n|²)/|X_1|
 * (relative to the fundamental, as IEC 61000-2-2 defines it), null when the
 * fundamental is zero. `scale` turns the phasors into RMS values (1 for RMS
 * phasors, 1/√2 for peak ones).
 */
export function rmsAndThd(orders: ArrayLike<number>, phasors: ArrayLike<Complex>, scale: number): { rms: number; thd: number | null; dc: number; fundamental: number } {
  let dc = 0;
  let fundamental = 0;
  let higher = 0;
  for (let i = 0; i < orders.length; i++) {
    const p = phasors[i];
    if (orders[i] === 0) {
      dc = p.re;
      continue;
    }
    const m2 = scale * scale * (p.re * p.re + p.im * p.im);
    if (orders[i] === 1) fundamental = Math.sqrt(m2);
    else higher += m2;
  }
  const rms = Math.sqrt(dc * dc + fundamental * fundamental + higher);
  // a fundamental below a billionth of the RMS is rounding: no THD to speak of
  const thd = fundamental > 1e-9 * rms && fundamental > 0 ? Math.sqrt(higher) / fundamental : null;
  return { rms, thd, dc, fundamental };
}
