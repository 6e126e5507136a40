/**
 * Undo history that survives a reload: the undo and redo steps of the sheets
 * edited in this tab are kept in the tab's session storage (which the
 * browser keeps across reloads of the tab, apart from the sheets' own
 * storage, and gives no other tab: one editing tab per sheet holds here too).
 * Bounded: at most HISTORY_KEEP_STEPS steps each way and HISTORY_KEEP_CHARS
 * of text per sheet (the oldest undo steps and the furthest redo steps go
 * first), for at most HISTORY_KEEP_SHEETS sheets. A kept history is put back
 * only onto the very sheet it was written with; every step read back goes
 * through the sheet reader, and anything unreadable is dropped.
 */
import { parseSheetJson } from '../model/parseSheet';
import type { Sheet } from '../model/sheet';
import { touchBoundedList, type KeyValueStorage } from './library';
import type { EditorStore, TrackedState } from './types';

export const HISTORY_KEEP_STEPS = 100;
export const HISTORY_KEEP_CHARS = 2_000_000;
export const HISTORY_KEEP_SHEETS = 4;
const INDEX = 'coilwright:histories';
export const historyKey = (sheetId: string) => `coilwright:history:${sheetId}`;

const texts = new WeakMap<Sheet, string>();
/** A sheet's JSON, worked out once per sheet object (history steps are shared between writes). */
function jsonOf(sheet: Sheet): string {
  let t = texts.get(sheet);
  if (t === undefined) {
    t = JSON.stringify(sheet);
    texts.set(sheet, t);
  }
  return t;
}

/** The text kept for a history: the present sheet and the steps either side, within the bounds. */
export function historyText(present: Sheet, past: Partial<TrackedState>[], future: Partial<TrackedState>[]): string {
  const p = jsonOf(present);
  const texts = (xs: Partial<TrackedState>[]) => xs.slice(-HISTORY_KEEP_STEPS).flatMap((s) => (s.sheet ? [jsonOf(s.sheet)] : []));
  let back = texts(past);
  let ahead = texts(future);
  let size = p.length + back.reduce((n, t) => n + t.length + 1, 0) + ahead.reduce((n, t) => n + t.length + 1, 0);
  // the oldest undo steps go first, then the furthest redo steps
  let i = 0;
  while (size > HISTORY_KEEP_CHARS && i < back.length) size -= back[i++].length + 1;
  back = back.slice(i);
  let j = 0;
  while (size > HISTORY_KEEP_CHARS && j < ahead.length) size -= ahead[j++].length + 1;
  ahead = ahead.slice(j);
  return `{"present":${p},"past":[${back.join(',')}],"future":[${ahead.join(',')}]}`;
}

/** The steps kept for `present`, or null when what is kept belongs to another version of the sheet or cannot be read. */
export function parseHistory(text: string | null, present: Sheet): { past: TrackedState[]; future: TrackedState[] } | null {
  if (!text || text.length > HISTORY_KEEP_CHARS * 1.1) return null;
  try {
    const v = JSON.parse(text) as { present?: unknown; past?: unknown; future?: unknown };
    if (!Array.isArray(v.past) || !Array.isArray(v.future)) return null;
    // both through the same reader, so their texts compare field for field
    if (JSON.stringify(parseSheetJson(v.present)) !== JSON.stringify(parseSheetJson(JSON.parse(jsonOf(present))))) return null;
    const read = (xs: unknown[]) => xs.slice(-HISTORY_KEEP_STEPS).flatMap((x) => {
      try {
        return [{ sheet: parseSheetJson(x) }];
      } catch {
        return [];
      }
    });
    return { past: read(v.past), future: read(v.future) };
  } catch {
    return null;
  }
}

export interface HistoryKeep { flush(): void; stop(): void }

/**
 * Keeps the open sheet's history in `storage` (the tab's session storage)
 * once edits pause, and at once on `flush`; puts it back when the
 * sheet opens (at start, or on switching to it). Nothing is kept while the
 * sheet is read-only in this tab or a visit from a link.
 */
export function attachHistoryKeep(store: EditorStore, storage: KeyValueStorage, delayMs = 800): HistoryKeep {
  let timer: ReturnType<typeof setTimeout> | null = null;
  let lastText = '';
  const canKeep = () => {
    const s = store.getState();
    return !s.visit && s.tab.state !== 'read-only';
  };
  const write = () => {
    const s = store.getState();
    writeFor(s.sheetId, s.sheet);
  };
  const writeFor = (sheetId: string, sheet: Sheet) => {
    if (timer) clearTimeout(timer);
    timer = null;
    if (!canKeep()) return;
    const s = { sheetId, sheet };
    const t = store.temporal.getState();
    const key = historyKey(s.sheetId);
    try {
      if (!t.pastStates.length && !t.futureStates.length) {
        if (lastText !== '') storage.removeItem(key);
        lastText = '';
        return;
      }
      const text = historyText(s.sheet, t.pastStates, t.futureStates);
      if (text === lastText) return;
      touchBoundedList(storage, INDEX, s.sheetId, HISTORY_KEEP_SHEETS, historyKey);
      storage.setItem(key, text);
      lastText = text;
    } catch {
      /* session storage full or refused: the history still holds until the tab reloads */
    }
  };
  // written once edits pause (and at once when the page goes away), so a run of edits is not slowed by it
  const schedule = () => {
    if (delayMs <= 0) return write();
    if (timer) clearTimeout(timer);
    timer = setTimeout(write, delayMs);
  };
  const restore = () => {
    const s = store.getState();
    if (!canKeep()) return;
    let text: string | null = null;
    try {
      text = storage.getItem(historyKey(s.sheetId));
    } catch {
      return;
    }
    const kept = parseHistory(text, s.sheet);
    if (!kept || (!kept.past.length && !kept.future.length)) return;
    lastText = text ?? '';
    store.temporal.setState({ pastStates: kept.past, futureStates: kept.future });
  };
  restore();
  const offSheet = store.subscribe((s, p) => {
    if (s.sheetId !== p.sheetId) {
      // the history of the sheet being left is written now (its steps are still there); the new sheet's comes back once its load has cleared them
      if (timer && !p.visit && p.tab.state !== 'read-only') writeFor(p.sheetId, p.sheet);
      if (timer) clearTimeout(timer);
      timer = null;
      lastText = '';
      queueMicrotask(restore);
      return;
    }
    if (s.sheet !== p.sheet) schedule();
  });
  const offHistory = store.temporal.subscribe((t, p) => {
    if (t.pastStates !== p.pastStates || t.futureStates !== p.futureStates) schedule();
  });
  return {
    flush: write,
    stop: () => {
      write();
      offSheet();
      offHistory();
    },
  };
}
