import { describe, expect, it } from 'vitest';
import { seedIds } from '../../src/model/ids';
import { emptySheet } from '../../src/model/sheet';
import { isolationTransformerSheet } from '../../src/model/examples/isolation';
import { placePart, undo, redo } from '../../src/store/actions';
import { attachAutosave } from '../../src/store/autosave';
import { createEditorStore } from '../../src/store/createEditorStore';
import { KEY_CURRENT, readIndex, restoreCurrent, sheetKey, type KeyValueStorage } from '../../src/store/library';
import { loadSheet, switchSheet } from '../../src/store/sheets';

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
    const back = restoreCurrent(storage);
    expect(back?.id).toBe('sheet:one');
    expect(back?.sheet).toEqual(store.getState().sheet);
    undo(store);
    expect(restoreCurrent(storage)?.sheet.parts).toHaveLength(1); // an undo is an edit too
    redo(store);
    expect(restoreCurrent(storage)?.sheet.parts).toHaveLength(2);
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

  it('a damaged stored sheet is not restored', () => {
    const storage = new MemoryStorage();
    storage.setItem(KEY_CURRENT, 'sheet:x');
    storage.setItem(sheetKey('sheet:x'), '{"schema":"coilwright.sheet/3","parts":"oops"}');
    expect(restoreCurrent(storage)).toBeNull();
  });
});
