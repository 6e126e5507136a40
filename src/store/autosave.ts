/** Autosave: after every edit of the sheet, write it to storage (soon, and at once when the page goes away). */
import type { KeyValueStorage } from './library';
import { writeSheet } from './library';
import type { EditorStore } from './types';

export interface Autosave {
  flush(): void;
  stop(): void;
}

export function attachAutosave(store: EditorStore, storage: KeyValueStorage, delayMs = 40): Autosave {
  let timer: ReturnType<typeof setTimeout> | null = null;
  let pending = false;
  const flush = () => {
    if (timer) clearTimeout(timer);
    timer = null;
    if (!pending) return;
    const s = store.getState();
    // a sheet opened from a link is not written until it is kept
    if (s.visit) return;
    pending = false;
    try {
      const library = writeSheet(storage, s.sheetId, s.sheet);
      store.setState({ library });
    } catch (e) {
      store.setState({ notice: { text: `Could not save in the browser: ${e instanceof Error ? e.message : String(e)}`, tone: 'error' } });
    }
  };
  const unsubscribe = store.subscribe((s, prev) => {
    if (s.visit) {
      // a visit begins: an edit of the sheet before it that is still waiting is written now
      if (!prev.visit && pending) {
        pending = false;
        try { store.setState({ library: writeSheet(storage, prev.sheetId, prev.sheet) }); } catch { /* reported on the next write */ }
      }
      return;
    }
    if (prev.visit) {
      // dismissed: the sheet from before is back as it was stored; kept: written now
      if (s.sheetId === prev.visit.previousId && s.sheet === prev.visit.previousSheet && !pending) return;
    } else if (s.sheet === prev.sheet && s.sheetId === prev.sheetId) return;
    pending = true;
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
