/** State of the analysis views (outside the undoable sheet): which view is open, T-equivalents drawn, the last sweep. */
import { createStore } from 'zustand/vanilla';
import type { SweepAnswer, SweepQuantity } from '../worker/protocol';
import type { SolveResult } from '../model/graph';
import type { TRecord } from '../model/tEquivalentSheet';

export type AnalysisView = 'compare' | 'tequiv' | 'sweep' | 'phasor' | 'power' | 'sdomain';

export interface SweepTrace { label: string; quantity: SweepQuantity; unit: string }

export interface SweepSettings {
  from: number;
  to: number;
  points: number;
  log: boolean;
  db: boolean;
  traces: SweepTrace[];
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
    message: string;
    slider: { target: SliderTarget; value: number } | null;
  };
  /** the winding whose dot the comparison flips */
  compareWinding: string | null;
}

export const DEFAULT_SWEEP: SweepSettings = { from: 10, to: 100e3, points: 400, log: true, db: true, traces: [] };

export function createAnalysisStore() {
  return createStore<AnalysisState>()(() => ({
    view: null,
    substitutions: [],
    sweep: { settings: DEFAULT_SWEEP, status: 'idle', progress: 0, answer: null, shown: [], message: '', slider: null },
    compareWinding: null,
  }));
}

export const analysisStore = createAnalysisStore();
export type AnalysisStore = typeof analysisStore;
