import { describe, it, expect } from 'vitest';
import { DEFAULT_HARMONIC_COUNT, rebuildPeriod, rmsAndThd, waveformHarmonic, waveformMean } from '../../src/model/fourier';
import { waveformAt, type Waveform } from '../../src/model/waveform';

/** (1/T)·∫_0^T x(t)·e^(−j·n·ω·t) dt by the midpoint rule on the waveform itself (waveformAt), times 2: the peak phasor A_n. */
function numericHarmonic(w: Waveform, f: number, n: number, steps = 200_000): { re: number; im: number } {
  const T = 1 / f;
  // one period from the last start on: the square wave's delay, if any
  const t0 = w.shape === 'square' ? (w.delayS ?? 0) + 3 * T : 0;
  let re = 0;
  let im = 0;
  for (let k = 0; k < steps; k++) {
    const t = t0 + ((k + 0.5) * T) / steps;
    const x = waveformAt(w, t);
    const a = 2 * Math.PI * n * f * t;
    re += x * Math.cos(a);
    im -= x * Math.sin(a);
  }
  return { re: (2 * re) / steps, im: (2 * im) / steps };
}

describe('Fourier series of the source waveforms', () => {
  it('square wave ±A, duty 0.5: 4A/(πn) for odd n, 0 for even n (standard), the fundamental in phase with sin ωt', () => {
    const A = 3;
    const w: Waveform = { shape: 'square', low: -A, high: A, frequencyHz: 1000 };
    expect(waveformMean(w)).toBe(0);
    for (let n = 1; n <= 41; n++) {
      const h = waveformHarmonic(w, n);
      const mag = Math.hypot(h.re, h.im);
      if (n % 2 === 0) expect(mag).toBe(0);
      else expect(mag).toBeCloseTo((4 * A) / (Math.PI * n), 13);
    }
    // high over the first half period: (4A/π)·sin ωt = (4A/π)·cos(ωt − 90°) (standard)
    const h1 = waveformHarmonic(w, 1);
    expect((Math.atan2(h1.im, h1.re) * 180) / Math.PI).toBeCloseTo(-90, 10);
  });

  it('duty, edges and delay: each harmonic against numerical integration of the waveform itself (midpoint rule)', () => {
    const w: Waveform = { shape: 'square', low: -1, high: 4, frequencyHz: 2000, duty: 0.3, delayS: 1.7e-4, edgeS: 2e-5 };
    for (const n of [1, 2, 3, 7, 10]) {
      const a = waveformHarmonic(w, n);
      const b = numericHarmonic(w, 2000, n);
      expect(Math.abs(a.re - b.re)).toBeLessThan(1e-7);
      expect(Math.abs(a.im - b.im)).toBeLessThan(1e-7);
    }
    // the mean: low + (high − low)·duty, the trapezoid's area equals the pulse's (standard)
    expect(waveformMean(w)).toBeCloseTo(-1 + 5 * 0.3, 14);
  });

  it('the default count is the smallest order at which the rebuilt square wave keeps 99.9 % of its RMS (Parseval)', () => {
    const w: Waveform = { shape: 'square', low: -1, high: 1, frequencyHz: 50 };
    const keep = (N: number) => {
      const orders: number[] = [];
      const ph: { re: number; im: number }[] = [];
      for (let n = 1; n <= N; n++) {
        orders.push(n);
        ph.push(waveformHarmonic(w, n));
      }
      return rmsAndThd(orders, ph, Math.SQRT1_2).rms; // the true RMS of a ±1 square wave is 1
    };
    expect(keep(DEFAULT_HARMONIC_COUNT)).toBeGreaterThanOrEqual(0.999);
    expect(keep(DEFAULT_HARMONIC_COUNT - 2)).toBeLessThan(0.999);
  });

  it('Parseval: the RMS from the harmonics equals the waveform\'s RMS (trapezoid wave, closed form of its mean square)', () => {
    // mean square of low L, high H, duty D, edges e over T (sharp parts plus two ramps ∫ = e·(H² + HL + L²)/3, standard)
    const [L, H, D, f, e] = [-2, 5, 0.4, 1000, 5e-5];
    const w: Waveform = { shape: 'square', low: L, high: H, frequencyHz: f, duty: D, edgeS: e };
    const T = 1 / f;
    const ms = ((D * T - e) * H * H + ((1 - D) * T - e) * L * L + (2 * e * (H * H + H * L + L * L)) / 3) / T;
    const orders = [0];
    const ph = [{ re: waveformMean(w), im: 0 }];
    for (let n = 1; n <= 20000; n++) {
      orders.push(n);
      ph.push(waveformHarmonic(w, n));
    }
    const { rms } = rmsAndThd(orders, ph, Math.SQRT1_2);
    // the tail beyond 20000 falls as 1/n⁴ for a trapezoid: far below 1e-9 of the RMS
    expect(Math.abs(rms - Math.sqrt(ms)) / Math.sqrt(ms)).toBeLessThan(1e-9);
  });

  it('THD of a square wave tends to √(π²/8 − 1) ≈ 48.34 % (standard); the rebuilt period\'s own RMS matches Parseval (discrete Parseval)', () => {
    const w: Waveform = { shape: 'square', low: -1, high: 1, frequencyHz: 50 };
    const orders: number[] = [];
    const ph: { re: number; im: number }[] = [];
    for (let n = 1; n <= 20001; n++) {
      orders.push(n);
      ph.push(waveformHarmonic(w, n));
    }
    const fig = rmsAndThd(orders, ph, Math.SQRT1_2);
    expect(fig.thd!).toBeCloseTo(Math.sqrt((Math.PI * Math.PI) / 8 - 1), 4);
    // a period sampled at S > 2N points holds exactly the harmonics' mean square (discrete Parseval, standard)
    const few = orders.slice(0, 51);
    const { values } = rebuildPeriod(50, few, ph.slice(0, 51), 1, 256);
    let ms = 0;
    for (let k = 0; k < 256; k++) ms += values[k] * values[k];
    expect(Math.sqrt(ms / 256)).toBeCloseTo(rmsAndThd(few, ph.slice(0, 51), Math.SQRT1_2).rms, 12);
  });

  it('a sine contributes its amplitude∠phase at its own order and its offset as DC', () => {
    const w: Waveform = { shape: 'sine', amplitude: 2, frequencyHz: 60, phaseDeg: 30, offset: 0.5, startS: 1e-3 };
    const h = waveformHarmonic(w, 1);
    expect(h.re).toBeCloseTo(2 * Math.cos(Math.PI / 6), 14);
    expect(h.im).toBeCloseTo(2 * Math.sin(Math.PI / 6), 14);
    expect(waveformHarmonic(w, 2)).toEqual({ re: 0, im: 0 });
    expect(waveformMean(w)).toBe(0.5);
  });
});
