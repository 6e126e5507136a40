/**
 * The waveform shapes as the editor shows them: each shape's fields with
 * their labels and units, a starting waveform for each shape taken from the
 * source's phasor, a short description for the drawing, the check of an entry
 * (the waveform schema of waveform.ts, so the editor refuses exactly what the
 * solver would), and samples for the preview drawn from waveformAt.
 */
import { formatSI } from './quantity';
import { WAVEFORM_SHAPES, waveformAt, waveformCorners, waveformSchema, type Waveform, type WaveformShape } from './waveform';

/** What a field's number is: the source's own unit (V or A), seconds, hertz, degrees, or a plain fraction. */
export type WaveUnit = 'value' | 's' | 'Hz' | '°' | '';

export interface WaveFieldDef {
  key: string;
  label: string;
  unit: WaveUnit;
  /** the value an absent optional field stands for (contract defaults) */
  fallback?: number;
  hint?: string;
}

export const SHAPE_LABELS: Record<WaveformShape, string> = {
  constant: 'Constant',
  sine: 'Sine, switched in at a time',
  step: 'Step',
  square: 'Square, with edges',
  points: 'Points joined by straight lines',
};

export const WAVEFORM_FIELDS: Record<Exclude<WaveformShape, 'points'>, WaveFieldDef[]> = {
  constant: [{ key: 'value', label: 'Value', unit: 'value' }],
  sine: [
    { key: 'amplitude', label: 'Amplitude (peak)', unit: 'value' },
    { key: 'frequencyHz', label: 'Frequency', unit: 'Hz' },
    { key: 'phaseDeg', label: 'Phase at t = 0', unit: '°', fallback: 0, hint: 'offset + amplitude·cos(2π·f·t + phase)' },
    { key: 'offset', label: 'Offset', unit: 'value', fallback: 0 },
    { key: 'startS', label: 'Switched in at', unit: 's', fallback: 0, hint: 'before it, the offset alone; the phase still counts from t = 0' },
  ],
  step: [
    { key: 'before', label: 'Before', unit: 'value' },
    { key: 'after', label: 'After', unit: 'value' },
    { key: 'atS', label: 'At', unit: 's' },
  ],
  square: [
    { key: 'low', label: 'Low', unit: 'value' },
    { key: 'high', label: 'High', unit: 'value' },
    { key: 'frequencyHz', label: 'Frequency', unit: 'Hz' },
    { key: 'duty', label: 'Duty (high share of the period)', unit: '', fallback: 0.5, hint: 'between 0 and 1, e.g. 0.5' },
    { key: 'delayS', label: 'Starts at', unit: 's', fallback: 0, hint: 'low before it' },
    { key: 'edgeS', label: 'Rise and fall time', unit: 's', fallback: 0, hint: '0 for a sharp edge' },
  ],
};

/** The labels of every field, for messages (points included). */
const LABELS: Record<string, string> = {
  ...Object.fromEntries(Object.values(WAVEFORM_FIELDS).flat().map((f) => [f.key, f.label])),
  timesS: 'Times',
  values: 'Values',
};

/** What a new waveform of a shape starts as, from the source's phasor: its peak, the sheet's frequency and the phase. */
export function startingWaveform(shape: WaveformShape, from: { peak: number; frequencyHz: number; phaseDeg: number }): Waveform {
  const f = from.frequencyHz > 0 ? from.frequencyHz : 50;
  const a = from.peak;
  switch (shape) {
    case 'constant': return { shape, value: a };
    case 'sine': return { shape, amplitude: Math.abs(a), frequencyHz: f, phaseDeg: from.phaseDeg };
    case 'step': return { shape, before: 0, after: a, atS: 0 };
    case 'square': return { shape, low: 0, high: a, frequencyHz: f, duty: 0.5 };
    case 'points': return { shape, timesS: [0, 1 / f], values: [0, a] };
  }
}

/** The reason a waveform is refused, naming its field ("Rise and fall time is longer than …"), or null. */
export function waveformProblem(w: unknown): { field: string; message: string } | null {
  const r = waveformSchema.safeParse(w);
  if (r.success) return null;
  const issue = r.error.issues[0];
  const field = String(issue.path[0] ?? 'shape');
  const at = typeof issue.path[1] === 'number' ? ` (entry ${issue.path[1] + 1})` : '';
  return { field, message: `${LABELS[field] ?? field}${at} ${issue.message}` };
}

const n3 = (v: number, unit: string) => formatSI(v, unit, 3);

/** A few words for the drawing: "square 0…12 V, 85 kHz". */
export function waveformText(w: Waveform, unit: string): string {
  switch (w.shape) {
    case 'constant': return `constant ${n3(w.value, unit)}`;
    case 'sine': return `sine ${n3(w.amplitude, unit)} peak, ${n3(w.frequencyHz, 'Hz')}${w.startS ? ` from ${n3(w.startS, 's')}` : ''}`;
    case 'step': return `step ${n3(w.before, unit)} → ${n3(w.after, unit)} at ${n3(w.atS, 's')}`;
    case 'square': return `square ${n3(w.low, unit)}…${n3(w.high, unit)}, ${n3(w.frequencyHz, 'Hz')}`;
    case 'points': return `${w.timesS.length} points to ${n3(w.timesS[w.timesS.length - 1], 's')}`;
  }
}

/** The span of time the preview shows: two periods of a periodic shape (from where it starts), the step and as long again, the points and a tenth more. */
export function previewWindow(w: Waveform, fallbackHz: number): [number, number] {
  const T = 1 / (fallbackHz > 0 ? fallbackHz : 50);
  switch (w.shape) {
    case 'constant': return [0, 2 * T];
    case 'sine':
    case 'square': {
      const period = 1 / w.frequencyHz;
      const start = w.shape === 'sine' ? (w.startS ?? 0) : (w.delayS ?? 0);
      // a late start: half a period before it, two after
      return start > 2 * period ? [start - period / 2, start + 2 * period] : [0, start + 2 * period];
    }
    case 'step': return [0, w.atS > 0 ? 2 * w.atS : 2 * T];
    case 'points': {
      const last = w.timesS[w.timesS.length - 1];
      return [0, last > 0 ? last * 1.1 : 2 * T];
    }
  }
}

/**
 * Samples of the waveform over [t0, t1] for drawing: evenly spaced points and
 * every corner in the window, a jump drawn upright (the value just before it,
 * then the value from it on).
 */
export function waveformSamples(w: Waveform, t0: number, t1: number, count = 240): { t: number[]; y: number[] } {
  const span = t1 - t0;
  const times = new Set<number>();
  for (let i = 0; i < count; i++) times.add(t0 + (span * i) / (count - 1));
  const corners = waveformCorners(w, t1, 2000).filter((c) => c >= t0);
  const before = new Set<number>();
  for (const c of corners) {
    times.add(c);
    before.add(c);
  }
  const t: number[] = [];
  const y: number[] = [];
  for (const x of [...times].sort((a, b) => a - b)) {
    if (before.has(x) && x > t0) {
      t.push(x);
      y.push(waveformAt(w, x - 1e-9 * span));
    }
    t.push(x);
    y.push(waveformAt(w, x));
  }
  return { t, y };
}

export { WAVEFORM_SHAPES };
