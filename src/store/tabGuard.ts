/**
 * One sheet, one editing tab. A tab holds a lock named after its sheet (Web
 * Locks, which the browser releases when the tab closes or navigates away).
 * A tab that opens a sheet another tab holds shows it read-only and offers to
 * take over (the lock is taken from the other tab, which turns read-only, and
 * the newest stored version is loaded) or to keep a copy (the sheet as shown,
 * under an id of its own). A read-only tab follows what the other tab saves,
 * and becomes the editing tab by itself when the other one lets go. The
 * stored revision (save.ts) guards the writes as well, so a browser without
 * Web Locks still never saves over newer work.
 */
import { newId } from '../model/ids';
import { loadStoredSheet, readIndex, readRev, writeSheet, type KeyValueStorage } from './library';
import { nextRev } from './save';
import { commit } from './actions';
import { titleProblem } from '../model/names';
import { loadSheet } from './sheets';
import type { EditorStore } from './types';

export interface HeldLock {
  /** settles when another tab took the lock */
  lost: Promise<void>;
  release(): void;
}

export interface TabLocks {
  /** The lock if it is free now, else null. */
  tryHold(name: string): Promise<HeldLock | null>;
  /** Waits until the lock is free and holds it; null when `signal` gave up waiting. */
  wait(name: string, signal: AbortSignal): Promise<HeldLock | null>;
  /** Takes the lock from whoever holds it. */
  steal(name: string): Promise<HeldLock>;
}

/** The browser's Web Locks (navigator.locks). */
export function webLocks(manager: LockManager): TabLocks {
  const request = (name: string, options: LockOptions): Promise<HeldLock | null> =>
    new Promise((resolve) => {
      let release = () => {};
      const released = new Promise<void>((r) => (release = r));
      let lose = () => {};
      const lost = new Promise<void>((r) => (lose = r));
      let granted = false;
      manager
        .request(name, options, async (lock) => {
          if (!lock) return resolve(null);
          granted = true;
          resolve({ lost, release });
          await released;
        })
        // rejected: stolen while held (AbortError), or given up while waiting
        .catch(() => (granted ? lose() : resolve(null)));
    });
  return {
    tryHold: (name) => request(name, { ifAvailable: true }),
    wait: (name, signal) => request(name, { signal }),
    steal: (name) => request(name, { steal: true }) as Promise<HeldLock>,
  };
}

/** No locks at all (a browser without Web Locks): every sheet is this tab's; the stored revision still guards writes. */
export const noLocks: TabLocks = {
  tryHold: async () => ({ lost: new Promise(() => {}), release: () => {} }),
  wait: async () => null,
  steal: async () => ({ lost: new Promise(() => {}), release: () => {} }),
};

export const lockName = (sheetId: string) => `coilwright:sheet:${sheetId}`;

export interface TabGuard {
  /** Take the sheet over from the other tab: load its newest stored version here and edit it here. */
  takeOver(): Promise<void>;
  /** Keep what this tab shows as a sheet of its own, and edit that. */
  keepCopy(): void;
  /**
   * Renames a kept sheet: the open one as an edit (undoable), another one in
   * storage, only while no tab has it open; a message saying why not, or null.
   */
  rename(id: string, title: string): Promise<string | null>;
  stop(): void;
}

export interface GuardOptions {
  /** subscribes to changes other tabs make to storage (the window's `storage` event); returns an unsubscribe */
  watchStorage?: (onChange: (key: string | null) => void) => () => void;
}

export function attachTabGuard(store: EditorStore, storage: KeyValueStorage, locks: TabLocks, options: GuardOptions = {}): TabGuard {
  interface Hold { id: string; lock: HeldLock | null; waiting: AbortController | null }
  let current: Hold | null = null;
  let stopped = false;
  const say = (text: string, tone: 'info' | 'error' = 'info') => store.setState({ notice: { text, tone } });

  /** Shows the sheet as it is stored now, without an undo step and without writing it back. */
  const loadNewest = (id: string) => {
    const r = loadStoredSheet(storage, id);
    if (!r) return;
    if ('unreadable' in r) {
      store.setState({ unreadable: r.unreadable });
      return;
    }
    const s = store.getState();
    if (s.sheetId !== id || s.visit) return;
    loadSheet(store, r.sheet, id, { id, sheet: r.sheet, rev: readRev(storage, id) });
  };

  const holding = (h: Hold, lock: HeldLock, reload: boolean) => {
    h.lock = lock;
    void lock.lost.then(() => {
      if (current !== h || h.lock !== lock) return;
      h.lock = null;
      store.setState({ tab: { state: 'read-only', why: 'taken' }, preview: null });
      store.temporal.getState().clear();
      say('This sheet was taken over in another tab; here it is now read-only. Take it back, or keep a copy of what this tab shows.', 'error');
      waitFor(h);
    });
    if (reload) loadNewest(h.id);
    store.setState({ tab: { state: 'own' } });
  };

  const waitFor = (h: Hold) => {
    const waiting = new AbortController();
    h.waiting = waiting;
    void locks.wait(lockName(h.id), waiting.signal).then((lock) => {
      if (!lock) return;
      if (current !== h || h.waiting !== waiting) return lock.release();
      h.waiting = null;
      holding(h, lock, true);
      say('The other tab let go of this sheet: it is editable here now, as it was last saved.');
    });
  };

  const follow = () => {
    if (stopped) return;
    const s = store.getState();
    const id = s.visit ? null : s.sheetId;
    if (current && current.id === id) return;
    if (current) {
      current.waiting?.abort();
      current.lock?.release();
      current = null;
    }
    if (id === null) {
      // a visit from a link writes nothing: there is nothing to guard
      if (s.tab.state !== 'own') store.setState({ tab: { state: 'own' } });
      return;
    }
    const h: Hold = { id, lock: null, waiting: null };
    current = h;
    store.setState({ tab: { state: 'checking' } });
    void locks.tryHold(lockName(id)).then((lock) => {
      if (current !== h) return lock?.release();
      if (lock) return holding(h, lock, false);
      store.setState({ tab: { state: 'read-only', why: 'elsewhere' }, preview: null });
      store.temporal.getState().clear();
      waitFor(h);
    });
  };

  const unsubscribe = store.subscribe((s, p) => {
    if (s.sheetId !== p.sheetId || !s.visit !== !p.visit) follow();
  });
  const unwatch = options.watchStorage?.((key) => {
    const s = store.getState();
    if (key === null || key === 'coilwright:library') store.setState({ library: readIndex(storage) });
    // a read-only tab follows what the editing tab saves
    if (current && !current.lock && s.tab.state === 'read-only' && s.tab.why !== 'changed' && (key === null || key === `coilwright:rev:${current.id}`)) loadNewest(current.id);
  });
  follow();

  return {
    async takeOver() {
      const h = current;
      if (!h) return;
      if (h.lock) {
        // changed in another tab while held here (a browser without locks): the newer version wins
        loadNewest(h.id);
        store.setState({ tab: { state: 'own' } });
        return;
      }
      h.waiting?.abort();
      h.waiting = null;
      const lock = await locks.steal(lockName(h.id));
      if (current !== h) return lock.release();
      holding(h, lock, true);
      say('Taken over: this tab edits the sheet now, as it was last saved; the other tab shows it read-only.');
    },
    keepCopy() {
      const s = store.getState();
      const title = `${s.sheet.title.slice(0, 190)} (copy)`;
      loadSheet(store, { ...s.sheet, title }, newId('sheet'));
      say(`Kept as a copy: “${title}” is a sheet of its own in this browser, edited here.`);
    },
    async rename(id, raw) {
      const title = raw.trim();
      if (!title) return 'A title cannot be empty';
      const problem = titleProblem(title);
      if (problem) return `The title ${problem}`;
      const s = store.getState();
      if (id === s.sheetId && !s.visit) {
        if (s.tab.state === 'read-only') return 'This sheet is read-only in this tab (another tab edits it): rename it there';
        commit(store, { ...s.sheet, title });
        return null;
      }
      const lock = await locks.tryHold(lockName(id));
      if (!lock) return 'That sheet is open in another tab: rename it there';
      try {
        const r = loadStoredSheet(storage, id);
        if (!r) return 'That sheet is no longer kept in this browser';
        if ('unreadable' in r) return `That sheet cannot be read (${r.unreadable.reason}), so it was not renamed`;
        try {
          store.setState({ library: writeSheet(storage, id, { ...r.sheet, title }, Date.now(), nextRev(), false) });
        } catch (e) {
          return `Could not rename it in the browser: ${e instanceof Error ? e.message : String(e)}`;
        }
        return null;
      } finally {
        lock.release();
      }
    },
    stop() {
      stopped = true;
      unsubscribe();
      unwatch?.();
      current?.waiting?.abort();
      current?.lock?.release();
      current = null;
    },
  };
}
