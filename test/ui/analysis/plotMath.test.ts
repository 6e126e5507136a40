import { describe, expect, it } from 'vitest';
import { csvOf, findPeaks, logTicks, niceCeil, phaseZeros, toDb, waveform } from '../../../src/ui/analysis/plotMath';
import { frequencyGrid } from '../../../src/solver';

describe('log axis ticks', () => {
  it('puts ticks at 1, 2 and 5 per decade over a few decades', () => {
    // 1-2-5 series per decade (common practice for log axes)
    expect(logTicks(10, 100e3)).toEqual([10, 20, 50, 100, 200, 500, 1000, 2000, 5000, 10000, 20000, 50000, 100000]);
  });
  it('keeps only the powers of ten over many decades, and adds 3 over a narrow range', () => {
    expect(logTicks(1, 1e7)).toEqual([1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7]); // common practice
    expect(logTicks(8.5e3, 85e3).slice(0, 3)).toEqual([1e4, 2e4, 3e4]); // 1-2-3-5 inside the range only (common practice)
  });
  it('rounds a scale limit up to 1, 2 or 5 times a power of ten', () => {
    expect(niceCeil(3.2)).toBe(5); // 1-2-5 series (common practice)
    expect(niceCeil(0.011)).toBeCloseTo(0.02, 15);
    expect(toDb(10)).toBeCloseTo(20, 12); // 20·log10(10) = 20 dB (definition of the decibel for amplitudes)
  });
});

describe('resonance markers on a series RLC', () => {
  // series R–L–C driven by 1 V: |I| peaks and the impedance phase passes 0° at f0 = 1/(2π√(LC)) (field notes, series resonance)
  const R = 2, L = 1e-3, C = 1e-6;
  const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
  const f = frequencyGrid(1e3, 20e3, 301, true);
  const x = f.map((v) => 2 * Math.PI * v * L - 1 / (2 * Math.PI * v * C));
  const iMag = x.map((xx) => 1 / Math.hypot(R, xx));
  const phase = x.map((xx) => (Math.atan2(xx, R) * 180) / Math.PI);

  it('finds one peak of |I| within 0.1 % of f0', () => {
    const peaks = findPeaks(f, iMag);
    expect(peaks).toHaveLength(1);
    expect(Math.abs(peaks[0].frequency - f0) / f0).toBeLessThan(1e-3); // closed form f0 = 1/(2π√(LC))
    expect(peaks[0].value).toBeCloseTo(1 / R, 2); // |I| = V/R at resonance (closed form)
  });
  it('finds the phase zero of Z within 0.1 % of f0', () => {
    const zeros = phaseZeros(f, phase);
    expect(zeros).toHaveLength(1);
    expect(Math.abs(zeros[0].frequency - f0) / f0).toBeLessThan(1e-3); // closed form f0 = 1/(2π√(LC))
  });
  it('finds two peaks for two separated humps and ignores ripples smaller than the prominence', () => {
    const y = f.map((v) => Math.exp(-((Math.log(v / 3e3)) ** 2) * 20) + Math.exp(-((Math.log(v / 9e3)) ** 2) * 20));
    const peaks = findPeaks(f, y);
    expect(peaks.map((p) => Math.round(p.frequency / 100) * 100)).toEqual([3000, 9000]); // the humps' centres (by construction)
  });
});

describe('steady-state waveforms', () => {
  it('honours RMS and peak phasors', () => {
    // x(t) = √2·|X|·cos(ωt + φ) for RMS phasors, |X|·cos(ωt + φ) for peak (field notes, phasors)
    const rms = waveform(1, 0, 50, 'rms', 401);
    expect(rms.y[0]).toBeCloseTo(Math.SQRT2, 12);
    expect(rms.t[400]).toBeCloseTo(2 / 50, 12); // two periods
    const peak = waveform(0, 1, 50, 'peak', 401); // 1∠90°: −sin(ωt)
    expect(peak.y[0]).toBeCloseTo(0, 12);
    expect(peak.y[50]).toBeCloseTo(-1, 12); // a quarter period later: cos(π/2 + π/2) = −1
    // the RMS of the samples over whole periods is |X| for an RMS phasor (definition of RMS)
    let s = 0;
    for (let i = 0; i < 400; i++) s += rms.y[i] ** 2;
    expect(Math.sqrt(s / 400)).toBeCloseTo(1, 10);
  });
});

describe('CSV', () => {
  it('quotes text that holds commas or quotes', () => {
    expect(csvOf(['f', 'a,b'], [[1, 'x"y'], [-2, '=1+1']])).toBe(`"f","a,b"\n1,"x""y"\n-2,"'=1+1"\n`); // RFC 4180 quoting; a formula defused (OWASP, CSV Injection)
  });
});
