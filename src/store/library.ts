/** Several named sheets kept in browser storage (localStorage or any Storage-like object). */
import { newId } from '../model/ids';
import { parseSheetJson } from '../model/parseSheet';
import type { Sheet } from '../model/sheet';
import type { SheetEntry } from './types';

export interface KeyValueStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
  /** with these two (as localStorage has them) the index can be rebuilt from what is stored */
  readonly length?: number;
  key?(index: number): string | null;
}

export const KEY_INDEX = 'coilwright:library';
export const KEY_CURRENT = 'coilwright:current';
const SHEET_PREFIX = 'coilwright:sheet:';
export const sheetKey = (id: string) => `${SHEET_PREFIX}${id}`;
/** The revision of a stored sheet: written with every save, so a tab can tell that another wrote the sheet since it read it. */
export const revKey = (id: string) => `coilwright:rev:${id}`;

export function readRev(storage: KeyValueStorage, id: string): string | null {
  return storage.getItem(revKey(id));
}

const isEntry = (e: unknown): e is SheetEntry =>
  !!e && typeof e === 'object' && typeof (e as SheetEntry).id === 'string' && typeof (e as SheetEntry).title === 'string' && Number.isFinite((e as SheetEntry).updated);

/** The ids of every sheet kept in storage, or null when the storage cannot list its keys. */
function storedIds(storage: KeyValueStorage): string[] | null {
  if (typeof storage.key !== 'function' || typeof storage.length !== 'number') return null;
  const ids: string[] = [];
  for (let i = 0; i < storage.length; i++) {
    const k = storage.key(i);
    if (k?.startsWith(SHEET_PREFIX)) ids.push(k.slice(SHEET_PREFIX.length));
  }
  return ids;
}

/** The title a stored sheet's text carries, read without validating the rest. */
function storedTitle(storage: KeyValueStorage, id: string): string {
  try {
    const t = (JSON.parse(storage.getItem(sheetKey(id)) ?? '') as { title?: unknown }).title;
    if (typeof t === 'string' && t.trim()) return t.slice(0, 200);
  } catch {
    /* unreadable: named as such */
  }
  return 'Unreadable sheet';
}

/**
 * The list of kept sheets. A damaged index does not hide sheets that are
 * still stored: it is rebuilt from the stored sheets themselves (their
 * titles, newest known first), and sheets stored but missing from it are
 * added; the repaired index is written back when storage allows.
 */
export function readIndex(storage: KeyValueStorage, now = Date.now()): SheetEntry[] {
  let list: SheetEntry[] = [];
  let damaged = false;
  try {
    const raw = storage.getItem(KEY_INDEX);
    const parsed: unknown = raw ? JSON.parse(raw) : [];
    if (!Array.isArray(parsed)) damaged = true;
    else {
      list = parsed.filter(isEntry);
      damaged = list.length !== parsed.length;
    }
  } catch {
    damaged = true;
  }
  const ids = storedIds(storage);
  if (!ids) return list;
  const stored = new Set(ids);
  const listed = new Set(list.map((e) => e.id));
  const repaired = list.filter((e) => stored.has(e.id));
  for (const id of ids) if (!listed.has(id)) repaired.push({ id, title: storedTitle(storage, id), updated: now });
  if (damaged || repaired.length !== list.length) {
    try {
      storage.setItem(KEY_INDEX, JSON.stringify(repaired));
    } catch {
      /* storage full: the list is still right for this visit */
    }
  }
  return repaired;
}

/** Writes a sheet, lists it first, and (unless `current` is false) marks it as the one to open next time. */
export function writeSheet(storage: KeyValueStorage, id: string, sheet: Sheet, now = Date.now(), rev?: string, current = true): SheetEntry[] {
  storage.setItem(sheetKey(id), JSON.stringify(sheet));
  if (rev !== undefined) storage.setItem(revKey(id), rev);
  const index = readIndex(storage).filter((e) => e.id !== id);
  index.unshift({ id, title: sheet.title, updated: now });
  storage.setItem(KEY_INDEX, JSON.stringify(index));
  if (current) storage.setItem(KEY_CURRENT, id);
  return index;
}

/** A title for a new sheet that no kept sheet has: "Sheet 1", "Sheet 2", … one above the highest in use. */
export function nextSheetTitle(titles: string[]): string {
  let high = 0;
  for (const t of titles) {
    const m = /^Sheet (\d{1,9})$/.exec(t.trim());
    if (m) high = Math.max(high, Number(m[1]));
  }
  return `Sheet ${high + 1}`;
}

/** Marks the sheet to open on the next start (best effort: a full storage keeps the mark it had). */
export function rememberCurrent(storage: KeyValueStorage, id: string): void {
  try {
    if (storage.getItem(KEY_CURRENT) !== id) storage.setItem(KEY_CURRENT, id);
  } catch {
    /* storage full */
  }
}

/** A stored sheet that cannot be read: its text (kept, for download) and why. */
export interface UnreadableSheet { id: string; title: string; text: string; reason: string }

/** Read a stored sheet: the sheet, what is wrong with its text, or null when nothing is stored under the id. */
export function loadStoredSheet(storage: KeyValueStorage, id: string): { sheet: Sheet } | { unreadable: UnreadableSheet } | null {
  const raw = storage.getItem(sheetKey(id));
  if (raw === null) return null;
  try {
    return { sheet: parseSheetJson(JSON.parse(raw)) };
  } catch (e) {
    const reason = e instanceof SyntaxError ? 'its text is not valid JSON' : e instanceof Error ? e.message : String(e);
    return { unreadable: { id, title: storedTitle(storage, id), text: raw, reason } };
  }
}

/** Read a stored sheet; null when missing or unreadable. */
export function readSheet(storage: KeyValueStorage, id: string): Sheet | null {
  const r = loadStoredSheet(storage, id);
  return r && 'sheet' in r ? r.sheet : null;
}

export function removeSheet(storage: KeyValueStorage, id: string): SheetEntry[] {
  storage.removeItem(sheetKey(id));
  storage.removeItem(revKey(id));
  const index = readIndex(storage).filter((e) => e.id !== id);
  storage.setItem(KEY_INDEX, JSON.stringify(index));
  return index;
}

/** The sheet to open on start: the last one worked on; or, when it cannot be read, what is wrong with it; null when there is none. */
export function restoreCurrent(storage: KeyValueStorage): { id: string; sheet: Sheet } | { id: string; unreadable: UnreadableSheet } | null {
  const id = storage.getItem(KEY_CURRENT);
  if (!id) return null;
  const r = loadStoredSheet(storage, id);
  if (!r) return null;
  return 'sheet' in r ? { id, sheet: r.sheet } : { id, unreadable: r.unreadable };
}

export function freshSheetId(): string {
  return newId('sheet');
}

/**
 * A bounded list of ids kept under `indexKey`, most recent first: `id` moves
 * to the front, and the entries (`keyOf(id)`) of ids beyond `max` are removed.
 * Throws what the storage throws (a full storage).
 */
export function touchBoundedList(storage: KeyValueStorage, indexKey: string, id: string, max: number, keyOf: (id: string) => string): void {
  let ids: string[] = [];
  try {
    const parsed: unknown = JSON.parse(storage.getItem(indexKey) ?? '[]');
    if (Array.isArray(parsed)) ids = parsed.filter((x): x is string => typeof x === 'string');
  } catch {
    /* a damaged list starts again */
  }
  ids = [id, ...ids.filter((x) => x !== id)];
  for (const gone of ids.slice(max)) storage.removeItem(keyOf(gone));
  storage.setItem(indexKey, JSON.stringify(ids.slice(0, max)));
}
