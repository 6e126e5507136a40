/**
 * The seam between the analysis views and the outputs. The analysis views
 * (src/ui/analysis) may register what they show; the SVG export then offers to
 * include their plots, and the sweep CSV writes their sweep. Nothing depends
 * on a provider being there: without one, the export has no plots and the
 * sweep CSV says there is no sweep yet.
 *
 *     import { provideAnalysisOutputs } from '../share/analysisHook';
 *     useEffect(() => provideAnalysisOutputs({ plots: () => [...], sweep: () => table }), [...]);
 */
import type { SweepTable } from '../../export/csv';
import type { PlotFragment } from '../../export/options';

export interface AnalysisOutputs {
  /** the plots now shown, each a whole `<svg>` element (sized by width and height or its viewBox) or a fragment with its size; titles are printed above */
  plots?: () => (PlotFragment | string)[];
  /** the latest sweep: frequencies and one complex series per trace (re and im interleaved), or null when none has run */
  sweep?: () => SweepTable | null;
}

let current: AnalysisOutputs | null = null;
const listeners = new Set<() => void>();

/** Register the analysis views' outputs; returns the function that withdraws them (fit for a React effect's clean-up). */
export function provideAnalysisOutputs(outputs: AnalysisOutputs): () => void {
  current = outputs;
  listeners.forEach((f) => f());
  return () => {
    if (current === outputs) {
      current = null;
      listeners.forEach((f) => f());
    }
  };
}

const NONE: AnalysisOutputs = Object.freeze({});

export function analysisOutputs(): AnalysisOutputs {
  return current ?? NONE;
}

/** Be told when a provider comes or goes (the export panel shows or hides its plot option). */
export function onAnalysisOutputs(f: () => void): () => void {
  listeners.add(f);
  return () => listeners.delete(f);
}
