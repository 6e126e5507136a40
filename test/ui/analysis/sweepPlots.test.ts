import { describe, expect, it } from 'vitest';
import { dbOf, dbScale, findPeaks, halfPowerPoints } from '../../../src/ui/analysis/plotMath';
import { sweepPlots } from '../../../src/ui/analysis/sweepPlots';
import { traceOf } from '../../../src/ui/analysis/sweepRunner';
import { frequencyGrid } from '../../../src/solver';

describe('decibels against a reference', () => {
  it('names the reference of each quantity', () => {
    // dBV re 1 V, dBA re 1 A, dBΩ re 1 Ω; a ratio of like quantities in plain dB (common practice)
    expect(dbScale('V')).toEqual({ unit: 'dBV', factor: 20 });
    expect(dbScale('A')).toEqual({ unit: 'dBA', factor: 20 });
    expect(dbScale('Ω')).toEqual({ unit: 'dBΩ', factor: 20 });
    expect(dbScale('V/A').unit).toBe('dBΩ'); // volts per ampere are ohms (SI)
    expect(dbScale('')).toEqual({ unit: 'dB', factor: 20 });
    expect(dbScale('VA', true).factor).toBe(10); // a power in decibels is 10·log10 (definition of the decibel)
  });
  it('gives 20 dBV for 10 V and 10 dB for a power ratio of 10', () => {
    expect(dbOf(10, dbScale('V'))).toBeCloseTo(20, 12); // 20·log10(10) (definition)
    expect(dbOf(10, dbScale('', true))).toBeCloseTo(10, 12); // 10·log10(10) (definition)
  });
});

describe('half-power points of a series RLC current', () => {
  // |I| = V / |R + jωL + 1/(jωC)|; half-power bandwidth R/(2πL), Q = √(L/C)/R (common practice, series resonance)
  const R = 10, L = 10e-3, C = 1e-6;
  const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
  const f = frequencyGrid(f0 / 4, f0 * 4, 4001, true);
  const mag = f.map((x) => { const w = 2 * Math.PI * x; return 1 / Math.hypot(R, w * L - 1 / (w * C)); });
  it('are R/(2πL) apart around the peak, within 0.1 %', () => {
    const peaks = findPeaks(f, mag);
    expect(peaks).toHaveLength(1);
    const [{ below, above }] = halfPowerPoints(f, mag, peaks);
    const bw = above!.frequency - below!.frequency;
    expect(Math.abs(bw / (R / (2 * Math.PI * L)) - 1)).toBeLessThan(1e-3);
    // each crossing: ω = ±R/2L + √((R/2L)² + ω0²) (the quadratic of |Z| = √2·R, common practice)
    const a = R / (2 * L), w0 = 2 * Math.PI * f0;
    expect(Math.abs(below!.frequency / ((-a + Math.hypot(a, w0)) / (2 * Math.PI)) - 1)).toBeLessThan(1e-4);
    expect(Math.abs(above!.frequency / ((a + Math.hypot(a, w0)) / (2 * Math.PI)) - 1)).toBeLessThan(1e-4);
  });
  it('show in the readouts with Q, on a plot in dBA', () => {
    const traces = [f.flatMap((x) => { const w = 2 * Math.PI * x; const zr = R, zi = w * L - 1 / (w * C); const d = zr * zr + zi * zi; return [zr / d, -zi / d]; })];
    const p = sweepPlots({ frequenciesHz: f, traces, ms: 0 }, [traceOf({ kind: 'current', element: 'R1' })], { db: true, log: true, xUnit: 'Hz' });
    expect(p.yUnit).toBe('dBA');
    expect(p.lines.map((l) => l.kind).sort()).toEqual(['bandwidth', 'half-power', 'half-power', 'peak']);
    const q = Number(/Q = ([\d.]+)/.exec(p.lines.find((l) => l.kind === 'bandwidth')!.text)![1]);
    expect(Math.abs(q / (Math.sqrt(L / C) / R) - 1)).toBeLessThan(1e-3);
    // the −3 dB marks sit 3.01 dB under the peak mark: 20·log10(1/√2) (definition)
    const peak = p.marks.find((m) => m.kind === 'peak')!;
    for (const h of p.marks.filter((m) => m.kind === 'half-power')) expect(peak.y! - h.y!).toBeCloseTo(-20 * Math.log10(Math.SQRT1_2), 9);
    for (const m of p.marks) expect(Number.isFinite(m.x)).toBe(true);
  });
  it('of a curve without a peak are taken from its largest value (a low-pass)', () => {
    // |H| = 1/√(1 + (f/fc)²) is 1/√2 at fc (first-order low-pass, common practice)
    const fc = 1000;
    const g = frequencyGrid(10, 1e5, 801, true);
    const h = g.map((x) => 1 / Math.hypot(1, x / fc));
    const [{ below, above }] = halfPowerPoints(g, h, []);
    expect(below).toBeNull();
    expect(Math.abs(above!.frequency / fc - 1)).toBeLessThan(1e-3);
  });
});
