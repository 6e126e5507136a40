import { describe, expect, it } from 'vitest';
import { seedIds } from '../../src/model/ids';
import { emptySheet } from '../../src/model/sheet';
import { isolationTransformerSheet } from '../../src/model/examples/isolation';
import { placePart, undo, redo } from '../../src/store/actions';
import { attachAutosave } from '../../src/store/autosave';
import { createEditorStore } from '../../src/store/createEditorStore';
import { KEY_CURRENT, KEY_INDEX, readIndex, restoreCurrent, sheetKey, writeSheet, type KeyValueStorage } from '../../src/store/library';
import { loadSheet, switchSheet } from '../../src/store/sheets';

/** The restored sheet, when it could be read. */
function restoredSheet(storage: KeyValueStorage) {
  const r = restoreCurrent(storage);
  return r && 'sheet' in r ? r : null;
}

class MemoryStorage implements KeyValueStorage {
  map = new Map<string, string>();
  getItem(k: string) { return this.map.get(k) ?? null; }
  setItem(k: string, v: string) { this.map.set(k, v); }
  removeItem(k: string) { this.map.delete(k); }
}

describe('autosave', () => {
  it('writes the sheet after every edit and restores it exactly', () => {
    seedIds(11);
    const storage = new MemoryStorage();
    const store = createEditorStore(emptySheet('Bench'), 'sheet:one');
    attachAutosave(store, storage, 0);
    placePart(store, 'resistor', { x: 40, y: 40 });
    expect(storage.getItem(KEY_CURRENT)).toBe('sheet:one');
    placePart(store, 'winding', { x: 140, y: 40 });
    const back = restoredSheet(storage);
    expect(back?.id).toBe('sheet:one');
    expect(back?.sheet).toEqual(store.getState().sheet);
    undo(store);
    expect(restoredSheet(storage)?.sheet.parts).toHaveLength(1); // an undo is an edit too
    redo(store);
    expect(restoredSheet(storage)?.sheet.parts).toHaveLength(2);
  });

  it('keeps several sheets and switches between them with fresh history', () => {
    seedIds(12);
    const storage = new MemoryStorage();
    const store = createEditorStore(emptySheet('First'), 'sheet:one');
    const autosave = attachAutosave(store, storage, 0);
    placePart(store, 'resistor', { x: 0, y: 0 });
    loadSheet(store, isolationTransformerSheet(), 'sheet:two');
    autosave.flush();
    expect(readIndex(storage).map((e) => e.id).sort()).toEqual(['sheet:one', 'sheet:two']);
    expect(store.temporal.getState().pastStates).toHaveLength(0);
    expect(switchSheet(store, storage, 'sheet:one')).toBe(true);
    expect(store.getState().sheet.title).toBe('First');
    expect(store.getState().sheet.parts).toHaveLength(1);
  });

  it('a damaged stored sheet is not restored: its text and the reason come back instead', () => {
    const storage = new MemoryStorage();
    storage.setItem(KEY_CURRENT, 'sheet:x');
    const text = '{"schema":"coilwright.sheet/3","title":"Bench","parts":"oops"}';
    storage.setItem(sheetKey('sheet:x'), text);
    expect(restoreCurrent(storage)).toEqual({
      id: 'sheet:x',
      unreadable: { id: 'sheet:x', title: 'Bench', text, reason: expect.stringMatching(/^Sheet is damaged: frequencyHz/) },
    });
    storage.setItem(sheetKey('sheet:x'), '{"schema":');
    expect(restoreCurrent(storage)).toMatchObject({ unreadable: { title: 'Unreadable sheet', reason: 'its text is not valid JSON' } });
    expect(storage.getItem(sheetKey('sheet:x'))).toBe('{"schema":'); // the text stays stored
  });
});

describe('the index of kept sheets', () => {
  class ListingStorage extends MemoryStorage {
    get length() { return this.map.size; }
    key(i: number) { return [...this.map.keys()][i] ?? null; }
  }

  it('is rebuilt from the stored sheets when it is damaged, and lists a stored sheet it had lost', () => {
    const storage = new ListingStorage();
    writeSheet(storage, 'sheet:a', emptySheet('Alpha'), 1000);
    writeSheet(storage, 'sheet:b', emptySheet('Beta'), 2000);
    storage.setItem(sheetKey('sheet:c'), '{"schema": "coilwright.sheet/4", "title": "Gamma"'); // stored, not even valid JSON
    storage.setItem(KEY_INDEX, '[{"id": "sheet:b", "title": "Beta", "updated": 2000}, {"id": 7}');
    const index = readIndex(storage, 5000);
    expect(index.map((e) => [e.id, e.title]).sort()).toEqual([['sheet:a', 'Alpha'], ['sheet:b', 'Beta'], ['sheet:c', 'Unreadable sheet']]);
    expect(JSON.parse(storage.getItem(KEY_INDEX)!)).toEqual(index); // written back
    storage.setItem(KEY_INDEX, JSON.stringify([{ id: 'sheet:a', title: 'Alpha', updated: 1000 }, { id: 'sheet:gone', title: 'Gone', updated: 1 }]));
    expect(readIndex(storage, 6000).map((e) => e.id)).toEqual(['sheet:a', 'sheet:b', 'sheet:c']); // the one no longer stored is dropped
  });
});

describe('switching sheets', () => {
  it('writes nothing for a sheet only looked at, yet opens it again on the next start', () => {
    seedIds(13);
    const storage = new MemoryStorage();
    const store = createEditorStore(emptySheet('First'), 'sheet:one');
    const autosave = attachAutosave(store, storage, 0);
    placePart(store, 'resistor', { x: 0, y: 0 });
    loadSheet(store, emptySheet('Second'), 'sheet:two');
    autosave.flush();
    const second = storage.getItem(sheetKey('sheet:two'));
    expect(switchSheet(store, storage, 'sheet:one')).toBe(true);
    autosave.flush();
    expect(storage.getItem(sheetKey('sheet:two'))).toBe(second);
    expect(restoredSheet(storage)?.id).toBe('sheet:one');
  });
});
