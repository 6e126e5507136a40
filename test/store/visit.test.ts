import { describe, expect, it } from 'vitest';
import { seedIds } from '../../src/model/ids';
import { emptySheet } from '../../src/model/sheet';
import { isolationTransformerSheet } from '../../src/model/examples/isolation';
import { wirelessPairSheet } from '../../src/model/examples/wireless';
import { placePart } from '../../src/store/actions';
import { attachAutosave } from '../../src/store/autosave';
import { createEditorStore } from '../../src/store/createEditorStore';
import { readIndex, readSheet, restoreCurrent, type KeyValueStorage } from '../../src/store/library';
import { loadSheet, switchSheet } from '../../src/store/sheets';
import { dismissVisit, keepVisit, startVisit } from '../../src/store/visit';

class MemoryStorage implements KeyValueStorage {
  map = new Map<string, string>();
  writes = 0;
  getItem(k: string) { return this.map.get(k) ?? null; }
  setItem(k: string, v: string) { this.writes++; this.map.set(k, v); }
  removeItem(k: string) { this.map.delete(k); }
  snapshot() { return new Map(this.map); }
}

function setUp() {
  seedIds(31);
  const storage = new MemoryStorage();
  const store = createEditorStore(emptySheet('Mine'), 'sheet:mine');
  const autosave = attachAutosave(store, storage, 0);
  placePart(store, 'resistor', { x: 40, y: 40 });
  return { storage, store, autosave, mine: store.getState().sheet };
}

describe('a sheet opened from a link', () => {
  it('is shown, edited and flushed without a single write to storage', () => {
    const { storage, store, autosave } = setUp();
    const before = storage.snapshot();
    const writes = storage.writes;
    const shared = isolationTransformerSheet();
    startVisit(store, shared);
    expect(store.getState().sheet).toBe(shared);
    placePart(store, 'capacitor', { x: 400, y: 40 }); // an edit while looking
    autosave.flush();
    expect(storage.writes).toBe(writes); // storage untouched: the invariant of a visit
    expect(storage.snapshot()).toEqual(before);
  });

  it('dismissed, brings back the sheet from before and leaves storage as it was', () => {
    const { storage, store, mine } = setUp();
    const before = storage.snapshot();
    startVisit(store, isolationTransformerSheet());
    dismissVisit(store);
    expect(store.getState().sheetId).toBe('sheet:mine');
    expect(store.getState().sheet).toBe(mine);
    expect(store.getState().visit).toBeNull();
    expect(storage.snapshot()).toEqual(before); // nothing written on the way back
  });

  it('kept, is written with the edits made while looking, beside the sheet from before', () => {
    const { storage, store } = setUp();
    startVisit(store, isolationTransformerSheet());
    placePart(store, 'capacitor', { x: 400, y: 40 });
    const id = store.getState().sheetId;
    keepVisit(store);
    expect(readSheet(storage, id)).toEqual(store.getState().sheet); // identity through storage
    expect(restoreCurrent(storage)?.id).toBe(id);
    expect(readIndex(storage).map((e) => e.id).sort()).toEqual([id, 'sheet:mine'].sort());
  });

  it('a second link replaces the first and still returns to the sheet from before', () => {
    const { store, mine } = setUp();
    startVisit(store, isolationTransformerSheet());
    startVisit(store, wirelessPairSheet());
    dismissVisit(store);
    expect(store.getState().sheet).toBe(mine);
  });

  it('switching to a kept sheet lets the visited one go unwritten; opening another sheet ends the visit', () => {
    const { storage, store } = setUp();
    startVisit(store, isolationTransformerSheet());
    const visitId = store.getState().sheetId;
    expect(switchSheet(store, storage, 'sheet:mine')).toBe(true);
    expect(readSheet(storage, visitId)).toBeNull();
    expect(store.getState().visit).toBeNull();
    startVisit(store, isolationTransformerSheet());
    loadSheet(store, emptySheet('Next'), 'sheet:next');
    expect(store.getState().visit).toBeNull();
    expect(readSheet(storage, 'sheet:next')?.title).toBe('Next'); // an ordinary sheet again: autosaved
  });

  it('an edit still waiting when a link opens is written first', () => {
    seedIds(32);
    const storage = new MemoryStorage();
    const store = createEditorStore(emptySheet('Mine'), 'sheet:mine');
    attachAutosave(store, storage, 60_000); // a long delay: the edit waits
    placePart(store, 'resistor', { x: 40, y: 40 });
    const mine = store.getState().sheet;
    expect(readSheet(storage, 'sheet:mine')).toBeNull();
    startVisit(store, isolationTransformerSheet());
    expect(readSheet(storage, 'sheet:mine')).toEqual(mine); // nothing the user made is lost
  });
});
