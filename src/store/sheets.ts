/** Switching, creating and opening sheets: history starts afresh for each sheet. */
import { newId } from '../model/ids';
import type { Sheet } from '../model/sheet';
import { loadStoredSheet, readRev, rememberCurrent, removeSheet, type KeyValueStorage } from './library';
import { saveSheet, unsaved } from './save';
import { forgetKeptSweep } from './sweepKeep';
import type { EditorStore, StoredCopy } from './types';

/** Shows `sheet` under `id`; `stored` when it was just read from storage (so it is not written back). */
export function loadSheet(store: EditorStore, sheet: Sheet, id: string = newId('sheet'), stored?: StoredCopy): void {
  store.setState({ sheet, sheetId: id, selection: [], preview: null, ghost: null, wireDraft: null, pinCursor: null, box: null, visit: null, notice: null, ...(stored ? { stored } : {}) });
  store.temporal.getState().clear();
}

/** Opens a kept sheet: its stored copy, or, when that cannot be read, the reason and its text for download. */
export function loadStored(store: EditorStore, storage: KeyValueStorage, id: string): boolean {
  const r = loadStoredSheet(storage, id);
  if (!r) {
    store.setState({ notice: { text: 'That sheet is no longer kept in this browser', tone: 'error' } });
    return false;
  }
  if ('unreadable' in r) {
    store.setState({ unreadable: r.unreadable });
    return false;
  }
  loadSheet(store, r.sheet, id, { id, sheet: r.sheet, rev: readRev(storage, id) });
  // not written back (it is as stored), but it is the sheet to open next time
  rememberCurrent(storage, id);
  return true;
}

export function switchSheet(store: EditorStore, storage: KeyValueStorage, id: string): boolean {
  const s = store.getState();
  // a sheet opened from a link and not kept is let go, not written; nor is one shown read-only
  if (!s.visit && s.tab.state !== 'read-only' && unsaved(s.sheetId, s.sheet, s.stored)) saveSheet(store, storage);
  return loadStored(store, storage, id);
}

export function deleteStoredSheet(store: EditorStore, storage: KeyValueStorage, id: string): void {
  store.setState({ library: removeSheet(storage, id) });
  forgetKeptSweep(storage, id);
}
