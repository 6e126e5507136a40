/**
 * Autosave: after every edit of the sheet, write it to storage (soon, and at
 * once when the page goes away). Nothing is written while the sheet is a
 * visit from a link, while the tab waits to learn whether another tab has the
 * sheet open, or while it shows the sheet read-only; a sheet just read from
 * storage is not written back.
 */
import type { KeyValueStorage } from './library';
import { saveSheet, unsaved } from './save';
import type { EditorState, EditorStore } from './types';

export interface Autosave {
  flush(): void;
  stop(): void;
}

const due = (s: EditorState) => !s.visit && s.tab.state === 'own' && unsaved(s.sheetId, s.sheet, s.stored);

export function attachAutosave(store: EditorStore, storage: KeyValueStorage, delayMs = 40): Autosave {
  let timer: ReturnType<typeof setTimeout> | null = null;
  const flush = () => {
    if (timer) clearTimeout(timer);
    timer = null;
    if (due(store.getState())) saveSheet(store, storage);
  };
  const unsubscribe = store.subscribe((s, prev) => {
    if (s.visit && !prev.visit) {
      // a visit begins: an edit of the sheet before it that is still waiting is written now
      if (prev.tab.state === 'own' && unsaved(prev.sheetId, prev.sheet, prev.stored)) saveSheet(store, storage, prev.sheetId, prev.sheet);
      return;
    }
    const moved = s.sheet !== prev.sheet || s.sheetId !== prev.sheetId || s.tab !== prev.tab || s.visit !== prev.visit || s.stored !== prev.stored;
    if (!moved || !due(s)) return;
    if (delayMs <= 0) return flush();
    if (!timer) timer = setTimeout(flush, delayMs);
  });
  return {
    flush,
    stop: () => {
      flush();
      unsubscribe();
    },
  };
}
