import { describe, expect, it } from 'vitest';
import { seedIds } from '../../src/model/ids';
import { emptySheet, type Sheet } from '../../src/model/sheet';
import { commit, undo } from '../../src/store/actions';
import { attachAutosave } from '../../src/store/autosave';
import { createEditorStore } from '../../src/store/createEditorStore';
import { readRev, readSheet, revKey, writeSheet, type KeyValueStorage } from '../../src/store/library';
import { attachTabGuard, noLocks, type HeldLock, type TabLocks } from '../../src/store/tabGuard';
import type { EditorStore } from '../../src/store/types';

/**
 * Two tabs on one sheet, as two stores over one storage and one lock
 * manager (with the Web Locks semantics: ifAvailable, a queue of waiters,
 * steal; W3C Web Locks API, from memory). The invariant: no tab ever writes
 * over what another tab saved, and what a user made is never lost.
 */

class MemoryStorage implements KeyValueStorage {
  map = new Map<string, string>();
  getItem(k: string) { return this.map.get(k) ?? null; }
  setItem(k: string, v: string) { this.map.set(k, v); }
  removeItem(k: string) { this.map.delete(k); }
}

/** One lock manager shared by every tab of a test. */
function lockManager(): TabLocks {
  const holders = new Map<string, { lose: () => void }>();
  const queues = new Map<string, { grant: () => void; signal: AbortSignal }[]>();
  const grant = (name: string): HeldLock => {
    let lose = () => {};
    const lost = new Promise<void>((r) => (lose = r));
    const entry = { lose };
    holders.set(name, entry);
    return {
      lost,
      release: () => {
        if (holders.get(name) !== entry) return;
        holders.delete(name);
        const next = (queues.get(name) ?? []).shift();
        next?.grant();
      },
    };
  };
  return {
    tryHold: async (name) => (holders.has(name) ? null : grant(name)),
    wait: (name, signal) =>
      new Promise((resolve) => {
        if (!holders.has(name)) return resolve(grant(name));
        const q = queues.get(name) ?? [];
        const waiter = { grant: () => resolve(grant(name)), signal };
        q.push(waiter);
        queues.set(name, q);
        signal.addEventListener('abort', () => {
          const i = q.indexOf(waiter);
          if (i >= 0) q.splice(i, 1);
          resolve(null);
        });
      }),
    steal: async (name) => {
      holders.get(name)?.lose();
      return grant(name);
    },
  };
}

const settle = () => new Promise((r) => setTimeout(r, 0));
const titled = (store: EditorStore, title: string) => commit(store, { ...store.getState().sheet, title });

function tab(storage: MemoryStorage, locks: TabLocks, sheet: Sheet, id: string) {
  const store = createEditorStore(sheet, id);
  store.setState({ stored: { id, sheet, rev: readRev(storage, id) } });
  let onStorage: (key: string | null) => void = () => {};
  const guard = attachTabGuard(store, storage, locks, { watchStorage: (f) => ((onStorage = f), () => {}) });
  const autosave = attachAutosave(store, storage, 0);
  return { store, guard, autosave, storageChanged: (key: string | null) => onStorage(key) };
}

/** A sheet "Bench" stored as sheet:s, and a way to open it in a tab (from storage, or as a tab showing `view`). */
function bench(seed: number, locks: TabLocks = lockManager()) {
  seedIds(seed);
  const storage = new MemoryStorage();
  writeSheet(storage, 'sheet:s', emptySheet('Bench'));
  const open = (view?: Sheet) => tab(storage, locks, view ?? readSheet(storage, 'sheet:s')!, 'sheet:s');
  return { storage, open };
}

describe('two tabs on one sheet', () => {
  it('the second opens read-only, takes no edit, saves nothing and follows the first', async () => {
    const { storage, open } = bench(5);
    const a = open();
    await settle();
    expect(a.store.getState().tab).toEqual({ state: 'own' });
    const b = open();
    await settle();
    expect(b.store.getState().tab).toEqual({ state: 'read-only', why: 'elsewhere' });

    titled(a.store, 'Bench, edited in A');
    expect(readSheet(storage, 'sheet:s')?.title).toBe('Bench, edited in A');
    const stored = storage.getItem('coilwright:sheet:sheet:s');
    titled(b.store, 'Bench, edited in B');
    expect(b.store.getState().sheet.title).toBe('Bench'); // refused
    expect(b.store.getState().notice?.text).toMatch(/read-only in this tab/);
    undo(b.store);
    b.autosave.flush();
    expect(storage.getItem('coilwright:sheet:sheet:s')).toBe(stored); // nothing written by B
    b.storageChanged(revKey('sheet:s')); // the browser's storage event
    expect(b.store.getState().sheet.title).toBe('Bench, edited in A');
  });

  it('take over: the second edits the newest version; the first turns read-only and saves nothing', async () => {
    const { storage, open } = bench(6);
    const a = open();
    await settle();
    titled(a.store, 'A1');
    const b = open(emptySheet('stale view'));
    await settle();
    await b.guard.takeOver();
    await settle();
    expect(b.store.getState().tab).toEqual({ state: 'own' });
    expect(b.store.getState().sheet.title).toBe('A1'); // the newest stored version
    expect(a.store.getState().tab).toEqual({ state: 'read-only', why: 'taken' });
    titled(b.store, 'B1');
    titled(a.store, 'A2');
    a.autosave.flush();
    expect(readSheet(storage, 'sheet:s')?.title).toBe('B1');
    expect(a.store.getState().sheet.title).toBe('A1');
  });

  it('keep a copy: what the tab shows becomes a sheet of its own, the other sheet untouched', async () => {
    const { storage, open } = bench(7);
    const a = open();
    const b = open();
    await settle();
    const before = storage.getItem('coilwright:sheet:sheet:s');
    b.guard.keepCopy();
    await settle();
    const copyId = b.store.getState().sheetId;
    expect(copyId).not.toBe('sheet:s');
    expect(b.store.getState().tab).toEqual({ state: 'own' });
    expect(readSheet(storage, copyId)?.title).toBe('Bench (copy)');
    titled(b.store, 'My variant');
    expect(readSheet(storage, copyId)?.title).toBe('My variant');
    expect(storage.getItem('coilwright:sheet:sheet:s')).toBe(before);
    expect(a.store.getState().tab).toEqual({ state: 'own' });
  });

  it('a read-only tab becomes the editing tab when the other lets go', async () => {
    const { storage, open } = bench(8);
    const a = open();
    const b = open();
    await settle();
    titled(a.store, 'A1');
    a.guard.stop(); // the tab closes
    await settle();
    expect(b.store.getState().tab).toEqual({ state: 'own' });
    expect(b.store.getState().sheet.title).toBe('A1');
    expect(b.store.getState().notice?.text).toMatch(/let go of this sheet/);
  });

  it('without locks, a tab never saves over what another saved: it turns read-only and can keep a copy', async () => {
    const { storage, open } = bench(9, noLocks);
    const a = open();
    const b = open();
    await settle();
    titled(a.store, 'A1');
    titled(b.store, 'B1'); // B read the sheet before A saved
    expect(readSheet(storage, 'sheet:s')?.title).toBe('A1');
    expect(b.store.getState().tab).toEqual({ state: 'read-only', why: 'changed' });
    expect(b.store.getState().notice?.text).toMatch(/changed in another tab/);
    expect(b.store.getState().sheet.title).toBe('B1'); // what B made is still there
    b.guard.keepCopy();
    await settle();
    expect(readSheet(storage, b.store.getState().sheetId)?.title).toBe('B1 (copy)');
    expect(readSheet(storage, 'sheet:s')?.title).toBe('A1');
  });
});
