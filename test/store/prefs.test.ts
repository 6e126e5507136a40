import { describe, expect, it } from 'vitest';
import { attachPrefs, SYMBOLS_KEY } from '../../src/store/prefs';
import { createEditorStore } from '../../src/store/createEditorStore';
import type { KeyValueStorage } from '../../src/store/library';

/** A storage that is full: every write fails as localStorage's does (a QuotaExceededError DOMException, HTML standard, from memory). */
class FullStorage implements KeyValueStorage {
  map = new Map<string, string>();
  getItem(k: string) { return this.map.get(k) ?? null; }
  setItem() { throw new DOMException('The quota has been exceeded.', 'QuotaExceededError'); }
  removeItem(k: string) { this.map.delete(k); }
}

describe('the symbol standard preference', () => {
  it('is read on start and kept when it changes', () => {
    const storage = new FullStorage();
    storage.map.set(SYMBOLS_KEY, 'ieee');
    const store = createEditorStore();
    attachPrefs(store, storage);
    expect(store.getState().symbols).toBe('ieee');
  });

  it('with storage full, still changes for every listener and says it is not kept', async () => {
    const store = createEditorStore();
    let seenByLater: string | null = null;
    attachPrefs(store, new FullStorage());
    store.subscribe((s) => (seenByLater = s.symbols)); // e.g. the canvas redraw, subscribed after
    expect(() => store.setState({ symbols: 'ieee' })).not.toThrow();
    expect(store.getState().symbols).toBe('ieee');
    expect(seenByLater).toBe('ieee');
    await Promise.resolve();
    expect(store.getState().notice?.text).toMatch(/IEEE 315, for this visit only: the browser could not keep the choice \(its storage is full\)/);
  });
});
