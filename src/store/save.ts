/**
 * Writing the open sheet to browser storage, never over newer work: the
 * write happens only when the stored revision is still the one this tab read
 * or wrote last. When another tab has written the sheet meanwhile, nothing is
 * written; this tab turns read-only and says so, keeping what it shows (its
 * user can keep it as a copy).
 */
import type { Sheet } from '../model/sheet';
import { readRev, writeSheet, type KeyValueStorage } from './library';
import type { EditorStore, StoredCopy } from './types';

/** This tab's mark in the revisions it writes. */
const TAB = Math.random().toString(36).slice(2, 10);
let written = 0;

/** A revision mark no other write has used (this tab's mark and a count). */
export function nextRev(): string {
  return `${TAB}.${++written}`;
}

/** Whether the sheet differs from the copy this tab knows to be stored. */
export function unsaved(id: string, sheet: Sheet, stored: StoredCopy | null): boolean {
  return !(stored && stored.id === id && stored.sheet === sheet);
}

/** Writes `sheet` under `id` (by default the open sheet) unless another tab wrote it since; true when written. */
export function saveSheet(store: EditorStore, storage: KeyValueStorage, id = store.getState().sheetId, sheet = store.getState().sheet): boolean {
  const { stored } = store.getState();
  const known = stored && stored.id === id ? stored.rev : null;
  if (readRev(storage, id) !== known) {
    if (id === store.getState().sheetId) {
      store.setState({
        tab: { state: 'read-only', why: 'changed' },
        notice: { text: 'This sheet was changed in another tab, so this tab did not save over it. Keep a copy to save what this tab shows, or take over to load the newer version.', tone: 'error' },
      });
    }
    return false;
  }
  const rev = nextRev();
  try {
    const library = writeSheet(storage, id, sheet, Date.now(), rev);
    store.setState({ library, stored: { id, sheet, rev } });
    return true;
  } catch (e) {
    store.setState({ notice: { text: `Could not save in the browser: ${e instanceof Error ? e.message : String(e)}`, tone: 'error' } });
    return false;
  }
}
