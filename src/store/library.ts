/** Several named sheets kept in browser storage (localStorage or any Storage-like object). */
import { newId } from '../model/ids';
import { parseSheetJson } from '../model/parseSheet';
import type { Sheet } from '../model/sheet';
import type { SheetEntry } from './types';

export interface KeyValueStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

export const KEY_INDEX = 'coilwright:library';
export const KEY_CURRENT = 'coilwright:current';
export const sheetKey = (id: string) => `coilwright:sheet:${id}`;

export function readIndex(storage: KeyValueStorage): SheetEntry[] {
  try {
    const raw = storage.getItem(KEY_INDEX);
    const list = raw ? JSON.parse(raw) : [];
    return Array.isArray(list) ? list.filter((e) => e && typeof e.id === 'string') : [];
  } catch {
    return [];
  }
}

export function writeSheet(storage: KeyValueStorage, id: string, sheet: Sheet, now = Date.now()): SheetEntry[] {
  storage.setItem(sheetKey(id), JSON.stringify(sheet));
  const index = readIndex(storage).filter((e) => e.id !== id);
  index.unshift({ id, title: sheet.title, updated: now });
  storage.setItem(KEY_INDEX, JSON.stringify(index));
  storage.setItem(KEY_CURRENT, id);
  return index;
}

/** Read a stored sheet; null when missing or unreadable. */
export function readSheet(storage: KeyValueStorage, id: string): Sheet | null {
  const raw = storage.getItem(sheetKey(id));
  if (!raw) return null;
  try {
    return parseSheetJson(JSON.parse(raw));
  } catch {
    return null;
  }
}

export function removeSheet(storage: KeyValueStorage, id: string): SheetEntry[] {
  storage.removeItem(sheetKey(id));
  const index = readIndex(storage).filter((e) => e.id !== id);
  storage.setItem(KEY_INDEX, JSON.stringify(index));
  return index;
}

/** The sheet to open on start: the last one worked on, if it can be read. */
export function restoreCurrent(storage: KeyValueStorage): { id: string; sheet: Sheet } | null {
  const id = storage.getItem(KEY_CURRENT);
  if (!id) return null;
  const sheet = readSheet(storage, id);
  return sheet ? { id, sheet } : null;
}

export function freshSheetId(): string {
  return newId('sheet');
}
