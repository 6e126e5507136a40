/**
 * What the sweep view draws from a finished sweep, as plain data: the
 * magnitude and phase series of each trace (magnitudes in dB against each
 * quantity's own reference when asked), the marks on the magnitude plot
 * (peaks, −3 dB points, resonances where an impedance's phase crosses 0°) and
 * the readouts listed under it. Pure, so it is tested without a browser.
 */
import type { SweepAnswer, SweepQuantity } from '../../worker/protocol';
import { formatSI } from '../../model/quantity';
import type { SweepTrace } from '../../store/analysisStore';
import type { PlotMark, PlotSeries } from './Plot';
import { dbOf, dbScale, engLabel, findPeaks, halfPowerPoints, phaseZeros, type DbScale, type Marker } from './plotMath';

export const TRACE_COLOURS = ['#2563a8', '#b45309', '#0d7463', '#9d174d', '#5b21b6', '#4d7c0f'];

/** Whether a quantity is a power (its decibels are 10·log10, its half-power point at 1/2). */
export function isPower(q: SweepQuantity): boolean {
  return q.kind === 'power' || (q.kind === 'ratio' && isPower(q.num) && isPower(q.den));
}

export function traceDb(t: SweepTrace): DbScale {
  const power = isPower(t.quantity);
  return dbScale(power && t.quantity.kind === 'ratio' ? '' : t.unit, power);
}

/** One line of the readouts under the magnitude plot. */
export interface MarkerLine { kind: 'peak' | 'half-power' | 'bandwidth' | 'phase-zero'; x: number; text: string; trace: string }

export interface SweepPlots {
  x: number[];
  mag: PlotSeries[];
  ph: PlotSeries[];
  marks: PlotMark[];
  lines: MarkerLine[];
  /** the magnitude axis' unit */
  yUnit: string;
}

/** Degrees of a phasor, in (−180°, 180°]. */
export const phaseDeg = (re: number, im: number) => {
  const d = (Math.atan2(im, re) * 180) / Math.PI;
  return d === -180 ? 180 : d;
};

/**
 * The plots of a sweep. `x` is the swept frequency or value; `xUnit` its
 * unit; `db` shows magnitudes in decibels.
 */
export function sweepPlots(ans: SweepAnswer, shown: SweepTrace[], opts: { db: boolean; log: boolean; xUnit: string }): SweepPlots {
  const x = ans.values ?? ans.frequenciesHz;
  const byFrequency = !ans.values;
  const mag: PlotSeries[] = [];
  const ph: PlotSeries[] = [];
  const marks: PlotMark[] = [];
  const lines: MarkerLine[] = [];
  const at = (v: number) => engLabel(v, opts.xUnit, 5);
  const dbUnits = new Set<string>();
  ans.traces.forEach((tr, k) => {
    const t = shown[k];
    if (!t) return;
    const n = x.length;
    const lin = new Float64Array(n);
    const deg = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      lin[i] = Math.hypot(tr[2 * i], tr[2 * i + 1]);
      deg[i] = phaseDeg(tr[2 * i], tr[2 * i + 1]);
    }
    const scale = traceDb(t);
    dbUnits.add(scale.unit);
    const shownValue = (v: number) => (opts.db ? dbOf(v, scale) : v);
    const magText = (v: number) => `${formatSI(v, t.unit, 4)}${v > 0 ? ` (${dbOf(v, scale).toFixed(2)} ${scale.unit})` : ''}`;
    const colour = TRACE_COLOURS[k % TRACE_COLOURS.length];
    mag.push({ label: t.label, color: colour, y: opts.db ? lin.map((v) => dbOf(v, scale)) : lin });
    ph.push({ label: t.label, color: colour, y: deg });

    const peaks = findPeaks(x, lin, 0.05, opts.log);
    for (const p of peaks) {
      marks.push({ x: p.frequency, y: shownValue(p.value), label: `peak ${at(p.frequency)}`, color: colour, kind: 'peak', shape: 'dot' });
      lines.push({ kind: 'peak', x: p.frequency, trace: t.label, text: `${t.label}: peak ${magText(p.value)} at ${at(p.frequency)}` });
    }
    const power = isPower(t.quantity);
    for (const { peak, below, above } of halfPowerPoints(x, lin, peaks, opts.log, power)) {
      const from = peaks.includes(peak) ? `the peak at ${at(peak.frequency)}` : `the largest value (${magText(peak.value)} at ${at(peak.frequency)})`;
      for (const h of [below, above]) {
        if (!h) continue;
        marks.push({ x: h.frequency, y: shownValue(h.value), label: `−3 dB ${at(h.frequency)}`, color: colour, kind: 'half-power', shape: 'cross' });
        lines.push({ kind: 'half-power', x: h.frequency, trace: t.label, text: `${t.label}: −3 dB from ${from} at ${at(h.frequency)}` });
      }
      if (below && above && peaks.includes(peak)) {
        const bw = above.frequency - below.frequency;
        // Q = f0 / bandwidth between the half-power points (common practice)
        const q = byFrequency && bw > 0 ? `, Q = ${(peak.frequency / bw).toPrecision(4)}` : '';
        lines.push({ kind: 'bandwidth', x: peak.frequency, trace: t.label, text: `${t.label}: −3 dB width ${engLabel(bw, opts.xUnit, 4)} around ${at(peak.frequency)}${q}` });
      }
    }
    if (t.quantity.kind === 'zin') {
      for (const z of phaseZeros(x, deg, opts.log)) {
        const word = byFrequency ? 'resonance' : 'phase 0°';
        marks.push({ x: z.frequency, label: `${word} ${at(z.frequency)}`, color: colour, kind: 'phase-zero', shape: 'ring', rule: true });
        lines.push({ kind: 'phase-zero', x: z.frequency, trace: t.label, text: `${t.label}: ${byFrequency ? 'resonance (phase 0°)' : 'phase 0°'} at ${at(z.frequency)}` });
      }
    }
  });
  const units = [...new Set(shown.map((t) => t.unit))];
  const yUnit = opts.db ? (dbUnits.size === 1 ? [...dbUnits][0] : 'dB, see legend') : units.length === 1 ? units[0] : 'own units';
  return { x, mag, ph, marks, lines, yUnit };
}

export type { Marker };
