/**
 * Looking at a sheet from a shared link: it is loaded, drawn and solved like
 * any sheet, but autosave writes nothing of it (nor touches the user's kept
 * sheets) until the user keeps it; dismissing brings back the sheet from before.
 */
import { newId } from '../model/ids';
import type { Sheet } from '../model/sheet';
import { loadSheet } from './sheets';
import type { EditorStore } from './types';

export function startVisit(store: EditorStore, sheet: Sheet): void {
  const s = store.getState();
  // a second link opened during a visit replaces the first; the sheet from before stays the same
  const before = s.visit ? { previousId: s.visit.previousId, previousSheet: s.visit.previousSheet } : { previousId: s.sheetId, previousSheet: s.sheet };
  store.setState({
    sheet, sheetId: newId('sheet'), selection: [], preview: null, ghost: null, wireDraft: null, box: null,
    visit: { from: 'link', ...before },
  });
  store.temporal.getState().clear();
}

/** Keep the visited sheet (with any edits made since) among the sheets of this browser. */
export function keepVisit(store: EditorStore): void {
  if (!store.getState().visit) return;
  store.setState({ visit: null });
}

/** Let the visited sheet go and bring back the sheet from before. */
export function dismissVisit(store: EditorStore): void {
  const v = store.getState().visit;
  if (!v) return;
  loadSheet(store, v.previousSheet, v.previousId);
}
