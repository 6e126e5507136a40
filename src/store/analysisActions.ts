/** Sheet edits of the analysis views: accept a dot flip, draw a T-equivalent, put a pair back. Each is one undo step. */
import * as E from '../model/edits';
import type { SolveResult } from '../model/graph';
import { restorePair, substituteT, type TArms } from '../model/tEquivalentSheet';
import { commit, notify } from './actions';
import { analysisStore, type AnalysisView } from './analysisStore';
import type { EditorStore } from './types';

export function openView(view: AnalysisView | null): void {
  analysisStore.setState({ view: analysisStore.getState().view === view ? null : view });
}

export function acceptDotFlip(store: EditorStore, partId: string): void {
  commit(store, E.flipDots(store.getState().sheet, new Set([partId])));
  notify(store, 'Dot moved to the other end of the winding (undo takes it back)');
}

export function drawTEquivalent(store: EditorStore, couplingId: string, arms: TArms, before: SolveResult | null): void {
  const s = store.getState();
  try {
    const r = substituteT(s.sheet, couplingId, arms);
    analysisStore.setState({ substitutions: [...analysisStore.getState().substitutions, { sheetId: s.sheetId, record: r.record, check: null, before }] });
    commit(store, r.sheet, []);
    notify(store, `The pair of ${r.record.name} drawn as its T-equivalent (Put pair back restores it)`);
  } catch (e) {
    notify(store, `Could not draw the T-equivalent: ${e instanceof Error ? e.message : String(e)}`, 'error');
  }
}

/** The newest T-equivalent drawn on this sheet whose parts are still there. */
export function latestSubstitution(store: EditorStore) {
  const s = store.getState();
  const ids = new Set(s.sheet.parts.map((p) => p.id));
  const list = analysisStore.getState().substitutions;
  for (let i = list.length - 1; i >= 0; i--) {
    const x = list[i];
    if (x.sheetId === s.sheetId && x.record.added.every((id) => ids.has(id))) return x;
  }
  return null;
}

export function putPairBack(store: EditorStore): void {
  const x = latestSubstitution(store);
  if (!x) return notify(store, 'No T-equivalent drawn on this sheet to put back');
  try {
    const restored = restorePair(store.getState().sheet, x.record);
    analysisStore.setState({ substitutions: analysisStore.getState().substitutions.filter((y) => y !== x) });
    commit(store, restored, x.record.windings.map((w) => w.part.id));
    notify(store, `${x.record.name} and its windings are back`);
  } catch (e) {
    notify(store, `Could not put the pair back: ${e instanceof Error ? e.message : String(e)}`, 'error');
  }
}
