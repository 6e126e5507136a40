/**
 * View preferences kept between visits (the symbol standard). Keeping one is
 * best effort: when storage refuses the write (full, or forbidden) the choice
 * still applies on screen for this visit and the user is told, so the store
 * and the screen never disagree.
 */
import type { KeyValueStorage } from './library';
import type { EditorStore } from './types';

export const SYMBOLS_KEY = 'coilwright:symbols';

export function attachPrefs(store: EditorStore, storage: KeyValueStorage): () => void {
  try {
    if (storage.getItem(SYMBOLS_KEY) === 'ieee') store.setState({ symbols: 'ieee' });
  } catch {
    /* unreadable storage: the default stands */
  }
  return store.subscribe((s, p) => {
    if (s.symbols === p.symbols) return;
    try {
      storage.setItem(SYMBOLS_KEY, s.symbols);
    } catch (e) {
      const why = e instanceof DOMException && e.name === 'QuotaExceededError' ? 'its storage is full' : 'it refused to store it';
      // after this listener returns, so that every other listener sees the change first
      queueMicrotask(() => store.setState({ notice: { text: `Symbols are now drawn to ${s.symbols === 'iec' ? 'IEC 60617' : 'IEEE 315'}, for this visit only: the browser could not keep the choice (${why}).`, tone: 'error' } }));
    }
  });
}
