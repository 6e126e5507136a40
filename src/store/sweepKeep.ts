/**
 * The sweep view's settings kept per sheet in browser storage, beside the
 * sheet and outside it (the sheet file does not change): range, points,
 * spacing, dB, traces, the swept value, the slider, and whether a sweep had
 * run (it runs again when the view next shows the sheet). Bounded: at most
 * SWEEP_KEEP_SHEETS sheets' settings (the least recently used go first) of at
 * most SWEEP_KEEP_CHARS each. What is read back is checked field by field;
 * anything unreadable is ignored and the defaults stand.
 */
import type { SweepQuantity } from '../worker/protocol';
import { touchBoundedList, type KeyValueStorage } from './library';
import { analysisStore, DEFAULT_SWEEP, type AnalysisStore, type SliderTarget, type SweepSettings, type SweepTrace, type ValueSweep } from './analysisStore';
import type { EditorStore } from './types';

export const SWEEP_KEEP_SHEETS = 40;
export const SWEEP_KEEP_CHARS = 16_000;
const MAX_TRACES = 16;
const INDEX = 'coilwright:sweeps';
export const sweepKey = (sheetId: string) => `coilwright:sweep:${sheetId}`;

export interface KeptSweep { settings: SweepSettings; slider: { target: SliderTarget; value: number } | null; ran: boolean }

const num = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const str = (v: unknown, max = 300): v is string => typeof v === 'string' && v.length <= max;
const obj = (v: unknown): v is Record<string, unknown> => !!v && typeof v === 'object' && !Array.isArray(v);

function quantity(v: unknown, depth = 0): SweepQuantity | null {
  if (!obj(v) || depth > 2) return null;
  switch (v.kind) {
    case 'node': return str(v.node) ? { kind: 'node', node: v.node } : null;
    case 'zin': return str(v.source) ? { kind: 'zin', source: v.source } : null;
    case 'current': case 'voltage': case 'power': return str(v.element) ? { kind: v.kind, element: v.element } : null;
    case 'ratio': {
      const a = quantity(v.num, depth + 1);
      const b = quantity(v.den, depth + 1);
      return a && b ? { kind: 'ratio', num: a, den: b } : null;
    }
    default: return null;
  }
}

function trace(v: unknown): SweepTrace | null {
  if (!obj(v) || !str(v.label) || !str(v.unit, 20)) return null;
  const q = quantity(v.quantity);
  return q ? { label: v.label, unit: v.unit, quantity: q } : null;
}

function target(v: unknown): { kind: 'part' | 'coupling'; id: string } | null {
  return obj(v) && (v.kind === 'part' || v.kind === 'coupling') && str(v.id) ? { kind: v.kind, id: v.id } : null;
}

function valueSweep(v: unknown): ValueSweep | null {
  if (!obj(v) || !str(v.label) || !str(v.unit, 20) || !num(v.from) || !num(v.to) || !(v.to > v.from)) return null;
  const t = target(v.target);
  return t ? { target: t, label: v.label, unit: v.unit, from: v.from, to: v.to } : null;
}

function slider(v: unknown): KeptSweep['slider'] {
  if (!obj(v) || !num(v.value) || !obj(v.target)) return null;
  const t = v.target;
  const base = target(t);
  if (!base || !str(t.label) || !str(t.unit, 20) || !num(t.min) || !num(t.max) || !(t.max > t.min) || typeof t.log !== 'boolean') return null;
  return { target: { ...base, label: t.label, unit: t.unit, min: t.min, max: t.max, log: t.log }, value: v.value };
}

/** Settings read back from their stored text; null when it does not hold them. */
export function parseKeptSweep(text: string | null): KeptSweep | null {
  if (!text || text.length > SWEEP_KEEP_CHARS) return null;
  let v: unknown;
  try {
    v = JSON.parse(text);
  } catch {
    return null;
  }
  if (!obj(v) || !obj(v.settings)) return null;
  const s = v.settings;
  if (!num(s.from) || !num(s.to) || !(s.from > 0 && s.to > s.from) || !num(s.points) || typeof s.log !== 'boolean' || typeof s.db !== 'boolean' || !Array.isArray(s.traces)) return null;
  const traces = s.traces.slice(0, MAX_TRACES).map(trace).filter((t): t is SweepTrace => !!t);
  const settings: SweepSettings = {
    from: s.from, to: s.to, points: Math.max(2, Math.min(100000, Math.round(s.points))), log: s.log, db: s.db, traces,
    over: s.over === null || s.over === undefined ? null : valueSweep(s.over),
  };
  return { settings, slider: slider(v.slider), ran: v.ran === true };
}

export function readKeptSweep(storage: KeyValueStorage, sheetId: string): KeptSweep | null {
  try {
    return parseKeptSweep(storage.getItem(sweepKey(sheetId)));
  } catch {
    return null;
  }
}

/** Writes one sheet's settings and moves it to the front of the kept list, dropping the least recently used beyond the bound. Best effort. */
export function writeKeptSweep(storage: KeyValueStorage, sheetId: string, kept: KeptSweep): void {
  const text = JSON.stringify({ settings: { ...kept.settings, traces: kept.settings.traces.slice(0, MAX_TRACES) }, slider: kept.slider, ran: kept.ran });
  try {
    if (text.length > SWEEP_KEEP_CHARS) return;
    touchBoundedList(storage, INDEX, sheetId, SWEEP_KEEP_SHEETS, sweepKey);
    storage.setItem(sweepKey(sheetId), text);
  } catch {
    /* storage full or refused: the settings still hold for this visit */
  }
}

export function forgetKeptSweep(storage: KeyValueStorage, sheetId: string): void {
  try {
    storage.removeItem(sweepKey(sheetId));
  } catch {
    /* nothing to do */
  }
}

/**
 * Follows the open sheet: when another sheet opens, its kept settings (or the
 * defaults) replace the view's, and its last plot is let go; when the
 * settings change, they are written under the open sheet (not while it is a
 * visit from a link, which keeps nothing).
 */
export function attachSweepKeep(store: EditorStore, storage: KeyValueStorage, analysis: AnalysisStore = analysisStore): () => void {
  let shownFor: string | null = null;
  let written = '';
  const load = () => {
    const s = store.getState();
    const id = s.visit ? null : s.sheetId;
    if (id === shownFor) return;
    shownFor = id;
    const kept = id ? readKeptSweep(storage, id) : null;
    written = '';
    analysis.setState({
      sweep: {
        settings: kept?.settings ?? DEFAULT_SWEEP, slider: kept?.slider ?? null, autoRun: !!kept?.ran,
        status: 'idle', progress: 0, answer: null, shown: [], shownOver: null, message: '',
      },
    });
  };
  load();
  const offSheet = store.subscribe((s, p) => {
    if (s.sheetId !== p.sheetId || !s.visit !== !p.visit) load();
  });
  const offView = analysis.subscribe((a, p) => {
    if (a.sweep === p.sweep || !shownFor) return;
    const { settings, slider, status } = a.sweep;
    const ran = status === 'done' || (status !== 'idle' && status !== 'failed' && !!a.sweep.answer) || !!a.sweep.autoRun;
    const kept: KeptSweep = { settings, slider: slider ? { target: slider.target, value: slider.value } : null, ran };
    const text = JSON.stringify(kept);
    if (text === written) return;
    written = text;
    writeKeptSweep(storage, shownFor, kept);
  });
  return () => {
    offSheet();
    offView();
  };
}
