/**
 * Autosave: after every edit of the sheet, write it to storage (soon, and at
 * once when the page goes away). Nothing is written while the sheet is a
 * visit from a link, while the tab waits to learn whether another tab has the
 * sheet open, or while it shows the sheet read-only; a sheet just read from
 * storage is not written back. Where the browser offers idle callbacks, the
 * write waits (after the delay, at most IDLE_TIMEOUT_MS more) for a moment
 * when no frame is due, so that it never delays the frame that shows an edit
 * and its values.
 */
import type { KeyValueStorage } from './library';
import { saveSheet, unsaved } from './save';
import type { EditorState, EditorStore } from './types';

export interface Autosave {
  flush(): void;
  stop(): void;
}

/** The longest an idle write waits for the browser to be idle. */
const IDLE_TIMEOUT_MS = 500;

type IdleScheduler = { requestIdleCallback?: (cb: () => void, o: { timeout: number }) => number; cancelIdleCallback?: (h: number) => void };

const due = (s: EditorState) => !s.visit && s.tab.state === 'own' && unsaved(s.sheetId, s.sheet, s.stored);

export function attachAutosave(store: EditorStore, storage: KeyValueStorage, delayMs = 40): Autosave {
  let timer: ReturnType<typeof setTimeout> | null = null;
  let idle: number | null = null;
  const host = globalThis as IdleScheduler;
  const flush = () => {
    if (timer) clearTimeout(timer);
    timer = null;
    if (idle !== null) host.cancelIdleCallback?.(idle);
    idle = null;
    if (due(store.getState())) saveSheet(store, storage);
  };
  const later = () => {
    timer = null;
    if (!host.requestIdleCallback) return flush();
    idle = host.requestIdleCallback(() => {
      idle = null;
      flush();
    }, { timeout: IDLE_TIMEOUT_MS });
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
    // a write already waiting (on its timer or for an idle moment) writes the latest sheet
    if (!timer && idle === null) timer = setTimeout(later, delayMs);
  });
  return {
    flush,
    stop: () => {
      flush();
      unsubscribe();
    },
  };
}
