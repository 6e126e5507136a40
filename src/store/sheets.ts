/** Switching, creating and opening sheets: history starts afresh for each sheet. */
import { newId } from '../model/ids';
import type { Sheet } from '../model/sheet';
import { readSheet, removeSheet, writeSheet, type KeyValueStorage } from './library';
import type { EditorStore } from './types';

export function loadSheet(store: EditorStore, sheet: Sheet, id: string = newId('sheet')): void {
  store.setState({ sheet, sheetId: id, selection: [], preview: null, ghost: null, wireDraft: null, pinCursor: null, box: null, visit: null, notice: null });
  store.temporal.getState().clear();
}

export function switchSheet(store: EditorStore, storage: KeyValueStorage, id: string): boolean {
  const s = store.getState();
  // a sheet opened from a link and not kept is let go, not written
  if (!s.visit) writeSheet(storage, s.sheetId, s.sheet);
  const sheet = readSheet(storage, id);
  if (!sheet) {
    store.setState({ notice: { text: 'That sheet could not be read from browser storage', tone: 'error' } });
    return false;
  }
  loadSheet(store, sheet, id);
  return true;
}

export function deleteStoredSheet(store: EditorStore, storage: KeyValueStorage, id: string): void {
  store.setState({ library: removeSheet(storage, id) });
}
