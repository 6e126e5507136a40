import { describe, expect, it } from 'vitest';
import { envelope, lowerIndex, measure, nearestIndex, phasorAt, settlingTime, steadyGap } from '../../../src/ui/analysis/timeMath';

const grid = (stop: number, n: number) => Float64Array.from({ length: n + 1 }, (_, i) => (stop * i) / n);

describe('measurements of a trace over a window', () => {
  it('a sine over whole periods: peak A, peak-to-peak 2A, mean 0, RMS A/√2', () => {
    // RMS of a sinusoid = peak/√2; its mean over whole periods is 0 (standard results)
    const f = 50, A = 325;
    const t = grid(4 / f, 8000);
    const y = t.map((x) => A * Math.sin(2 * Math.PI * f * x));
    const m = measure(t, y, 0, t.length - 1)!;
    expect(Math.abs(m.peak)).toBeCloseTo(A, 6);
    expect(m.peakToPeak).toBeCloseTo(2 * A, 6);
    expect(Math.abs(m.mean)).toBeLessThan(1e-9 * A);
    expect(m.rms).toBeCloseTo(A / Math.SQRT2, 3);
    // the first positive peak of sin is at a quarter period (1/(4f) = 5 ms)
    expect(m.peak).toBeGreaterThan(0);
    expect(m.timeOfPeak).toBeCloseTo(1 / (4 * f), 9);
  });

  it('a sine with an offset: mean is the offset, RMS² = offset² + A²/2', () => {
    // RMS of a DC plus a sine: √(D² + A²/2) (Parseval, standard result)
    const f = 1000, A = 2, D = 1.5;
    const t = grid(10 / f, 20000);
    const y = t.map((x) => D + A * Math.cos(2 * Math.PI * f * x));
    const m = measure(t, y, 0, t.length - 1)!;
    expect(m.mean).toBeCloseTo(D, 6);
    expect(m.rms).toBeCloseTo(Math.sqrt(D * D + (A * A) / 2), 5);
    expect(m.max).toBeCloseTo(D + A, 9);
    expect(m.min).toBeCloseTo(D - A, 6);
  });

  it('the peak keeps its sign: a negative excursion larger than the positive one', () => {
    const t = grid(1, 4);
    const y = Float64Array.from([0, 2, -5, 1, 0]);
    const m = measure(t, y, 0, 4)!;
    expect(m.peak).toBe(-5);
    expect(m.timeOfPeak).toBe(0.5);
    expect(m.peakToPeak).toBe(7);
  });

  it('a window of part of the run, and of one sample', () => {
    const t = grid(1, 10);
    const y = t.map((x) => x);
    // the mean of y = t over [0.2, 0.6] is 0.4 (arithmetic)
    expect(measure(t, y, 2, 6)!.mean).toBeCloseTo(0.4, 12);
    const one = measure(t, y, 3, 3)!;
    expect(one.mean).toBeCloseTo(0.3, 12);
    expect(one.rms).toBeCloseTo(0.3, 12);
    expect(measure(new Float64Array(0), new Float64Array(0), 0, 0)).toBeNull();
  });
});

describe('settling time', () => {
  it('a first-order step 1 − e^(−t/τ) settles into 2 % at τ·ln 50 = 3.912τ', () => {
    // |y − 1| = e^(−t/τ) = 0.02 ⇒ t = τ·ln(50) (first-order step response, standard result)
    const tau = 1e-3;
    const t = grid(30 * tau, 30000);
    const y = t.map((x) => 1 - Math.exp(-x / tau));
    const ts = settlingTime(t, y, 0, t.length - 1)!;
    expect(Math.abs(ts - tau * Math.log(50)) / (tau * Math.log(50))).toBeLessThan(1e-4);
    // and into 5 % at τ·ln 20 (the same law)
    expect(settlingTime(t, y, 0, t.length - 1, 0.05)!).toBeCloseTo(tau * Math.log(20), 7);
  });

  it('a decaying offset settles onto its steady-state sine: e^(−t/τ) below 2 % of the sine peak at τ·ln 50', () => {
    // y = A·cos(ωt) + A·e^(−t/τ): the departure from the steady state is A·e^(−t/τ) (switching transient, standard form)
    const A = 10, f = 50, tau = 0.02;
    const t = grid(0.3, 60000);
    const ss = (x: number) => A * Math.cos(2 * Math.PI * f * x);
    const y = t.map((x) => ss(x) + A * Math.exp(-x / tau));
    const ts = settlingTime(t, y, 0, t.length - 1, 0.02, (i) => ss(t[i]))!;
    expect(ts).toBeCloseTo(tau * Math.log(50), 5);
  });

  it('the gap to the steady state over the last period: A·e^(−t/τ) against a sine of peak A is e^(−t/τ) there', () => {
    const A = 2, f = 50, tau = 0.01;
    const t = grid(0.1, 10000);
    const ss = (x: number) => A * Math.sin(2 * Math.PI * f * x);
    const y = t.map((x) => ss(x) + A * Math.exp(-x / tau));
    const from = lowerIndex(t, 0.1 - 1 / f);
    // the largest departure is at the period's start, e^(−0.08/0.01) = e^(−8) of the peak (arithmetic)
    expect(steadyGap(y, (i) => ss(t[i]), from)!).toBeCloseTo(Math.exp(-8), 9);
    expect(steadyGap(y, () => 0, from)).toBeNull();
  });

  it('measured from the window start; 0 when already settled; null when still outside at the end', () => {
    const tau = 1;
    const t = grid(20, 20000);
    const y = t.map((x) => 1 - Math.exp(-x / tau));
    const from = lowerIndex(t, 1);
    // from t = 1 the remaining swing is e^(−1) and 2 % of it is reached at t = 1 + ln 50 (same law, shifted)
    expect(settlingTime(t, y, from, t.length - 1)!).toBeCloseTo(Math.log(50), 3);
    const flat = new Float64Array(t.length).fill(3);
    expect(settlingTime(t, flat, 0, t.length - 1)).toBe(0);
    const ramp = t.map((x) => x);
    expect(settlingTime(t, ramp, 0, t.length - 1, 0.02, () => 0.5)).toBeNull();
  });
});

describe('the time axis and the envelope', () => {
  it('finds indices by time', () => {
    const t = grid(1, 10);
    expect(lowerIndex(t, 0.35)).toBe(4);
    expect(lowerIndex(t, 2)).toBe(11);
    expect(nearestIndex(t, 0.34)).toBe(3);
    expect(nearestIndex(t, 0.36)).toBe(4);
    expect(nearestIndex(t, -5)).toBe(0);
    expect(nearestIndex(new Float64Array(0), 1)).toBe(-1);
  });

  it('a million samples become at most four per column and keep every extreme', () => {
    const n = 1_000_000;
    const t = grid(1, n);
    const y = t.map((x) => Math.sin(2 * Math.PI * 37 * x) + (Math.abs(x - 0.123456) < 1e-7 ? 5 : 0));
    const e = envelope(t, y, 0, 1, 500);
    expect(e.x.length).toBeLessThanOrEqual(4 * 502);
    let max = -Infinity, min = Infinity, rawMax = -Infinity, rawMin = Infinity;
    for (const v of e.y) { max = Math.max(max, v); min = Math.min(min, v); }
    for (const v of y) { rawMax = Math.max(rawMax, v); rawMin = Math.min(rawMin, v); }
    // the one-sample spike survives (its sample is the run's largest), and so does the trough of the sine (−1)
    expect(rawMax).toBeGreaterThan(4);
    expect(max).toBe(rawMax);
    expect(min).toBe(rawMin);
    expect(min).toBeCloseTo(-1, 6);
    for (let i = 1; i < e.x.length; i++) expect(e.x[i]).toBeGreaterThanOrEqual(e.x[i - 1]);
  });

  it('few samples are kept as they are, with the neighbours just outside the window', () => {
    const t = grid(1, 10);
    const e = envelope(t, t, 0.25, 0.55, 500);
    expect(Array.from(e.x)).toEqual([0.2, 0.3, 0.4, 0.5, 0.6].map((v) => t[Math.round(v * 10)]));
  });
});

describe('a phasor read as a waveform', () => {
  it('follows A·cos(2πft + φ) with A = √2·|X| for RMS phasors (contract: the cosine convention)', () => {
    const z = { re: 0, im: 10 }; // 10 ∠90°
    expect(phasorAt(z, 50, 'rms', 0)).toBeCloseTo(0, 12);
    // a quarter period later cos(π/2 + π/2) = −1
    expect(phasorAt(z, 50, 'rms', 0.005)).toBeCloseTo(-10 * Math.SQRT2, 9);
    expect(phasorAt({ re: 3, im: 0 }, 50, 'peak', 0)).toBe(3);
  });
});
