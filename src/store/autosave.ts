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
    pending = false;
    const s = store.getState();
    try {
      const library = writeSheet(storage, s.sheetId, s.sheet);
      store.setState({ library });
    } catch (e) {
      store.setState({ notice: { text: `Could not save in the browser: ${e instanceof Error ? e.message : String(e)}`, tone: 'error' } });
    }
  };
  const unsubscribe = store.subscribe((s, prev) => {
    if (s.sheet === prev.sheet && s.sheetId === prev.sheetId) return;
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
