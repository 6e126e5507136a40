/** State of the analysis views (outside the undoable sheet): which view is open, T-equivalents drawn, the last sweep. */
import { createStore } from 'zustand/vanilla';
import type { SweepAnswer, SweepQuantity, TransientAnswer } from '../worker/protocol';
import type { GraphModel, RefusalCulprit, SolveResult } from '../model/graph';
import type { TRecord } from '../model/tEquivalentSheet';
import type { ValueTarget } from '../model/valueTarget';

export type AnalysisView = 'compare' | 'tequiv' | 'sweep' | 'phasor' | 'power' | 'sdomain' | 'harmonic' | 'time';

/** What a time-view trace plots: a node's voltage, or an element's voltage or current (a two-port's side 0 or 1). */
export type TimeQuantity = { kind: 'node'; node: string } | { kind: 'voltage' | 'current'; element: string; side?: 0 | 1 };

export interface TimeSettings {
  stopS: number;
  /** output samples after t = 0 */
  samples: number;
  start: 'given' | 'dc';
  traces: TimeQuantity[];
}

export interface TimeState {
  settings: TimeSettings;
  status: 'idle' | 'running' | 'done' | 'cancelled' | 'failed';
  progress: number;
  answer: TransientAnswer | null;
  /** the sheet the answer was run on (its derived circuit), so that the sheet overlay matches it */
  sheetOf: GraphModel | null;
  message: string;
  /** what a refusal of the run names */
  culprits: RefusalCulprit[];
  /** the cursor's time (s), or null */
  cursorS: number | null;
  /** the measuring window (s) */
  window: [number, number] | null;
  /** the shown span of the time axis (s); null: the whole run */
  span: [number, number] | null;
}

export const DEFAULT_TIME: TimeSettings = { stopS: 0.1, samples: 2000, start: 'given', traces: [] };

export interface SweepTrace { label: string; quantity: SweepQuantity; unit: string }

/** A value sweep: one part's value (or a coupling's k) from `from` to `to`, at the sheet's frequency. */
export interface ValueSweep { target: ValueTarget; label: string; unit: string; from: number; to: number }

export interface SweepSettings {
  /** the frequency range (Hz) */
  from: number;
  to: number;
  points: number;
  log: boolean;
  db: boolean;
  traces: SweepTrace[];
  /** sweep this value instead of the frequency */
  over: ValueSweep | null;
}

/** A value the slider varies: a part's value or a link's k, between `min` and `max`. */
export interface SliderTarget { kind: 'part' | 'coupling'; id: string; label: string; min: number; max: number; log: boolean; unit: string }

export interface AnalysisState {
  view: AnalysisView | null;
  /** T-equivalents drawn on the sheet, newest last, by sheet id */
  substitutions: { sheetId: string; record: TRecord; check: { maxRel: number; compared: number } | null; before: SolveResult | null }[];
  sweep: {
    settings: SweepSettings;
    status: 'idle' | 'running' | 'done' | 'cancelled' | 'failed';
    progress: number;
    answer: SweepAnswer | null;
    /** the traces of `answer`, as they were when it was started */
    shown: SweepTrace[];
    /** what `answer` swept when it was started: a value, or the frequency (null) */
    shownOver?: ValueSweep | null;
    message: string;
    slider: { target: SliderTarget; value: number } | null;
    /** settings kept from an earlier visit whose sweep had run: it runs again when the view shows */
    autoRun?: boolean;
  };
  /** the winding whose dot the comparison flips */
  compareWinding: string | null;
  time: TimeState;
}

export const DEFAULT_SWEEP: SweepSettings = { from: 10, to: 100e3, points: 400, log: true, db: true, traces: [], over: null };

export function createAnalysisStore() {
  return createStore<AnalysisState>()(() => ({
    view: null,
    substitutions: [],
    sweep: { settings: DEFAULT_SWEEP, status: 'idle', progress: 0, answer: null, shown: [], message: '', slider: null },
    compareWinding: null,
    time: { settings: DEFAULT_TIME, status: 'idle', progress: 0, answer: null, sheetOf: null, message: '', culprits: [], cursorS: null, window: null, span: null },
  }));
}

export const analysisStore = createAnalysisStore();
export type AnalysisStore = typeof analysisStore;
