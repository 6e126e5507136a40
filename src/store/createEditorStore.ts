/** The one editor store: zustand slices with undo (zundo) over the sheet only. */
import { createStore } from 'zustand/vanilla';
import { temporal } from 'zundo';
import { newId } from '../model/ids';
import { emptySheet, type Sheet } from '../model/sheet';
import type { EditorState, EditorStore, TrackedState } from './types';

export const HISTORY_LIMIT = 300;

export function initialViewSlice(): Omit<EditorState, 'sheet' | 'sheetId' | 'library' | 'solve' | 'derived' | 'tab' | 'stored' | 'unreadable'> {
  return {
    view: { x: 40, y: 20, zoom: 1.5 },
    selection: [],
    tool: 'select',
    preview: null,
    ghost: null,
    wireDraft: null,
    pinCursor: null,
    box: null,
    notice: null,
    clipboard: null,
    hoverNode: null,
    readout: 'polar',
    symbols: 'iec',
  };
}

export function createEditorStore(sheet: Sheet = emptySheet(), sheetId: string = newId('sheet')): EditorStore {
  return createStore<EditorState>()(
    temporal<EditorState, [], [], TrackedState>(
      (): EditorState => ({
        sheet,
        sheetId,
        ...initialViewSlice(),
        solve: { status: 'idle', result: null, circuit: null, refusal: null, stale: false, seq: 0, solveMs: 0 },
        derived: null,
        library: [],
        tab: { state: 'own' },
        stored: null,
        unreadable: null,
      }),
      {
        partialize: (s): TrackedState => ({ sheet: s.sheet }),
        equality: (a, b) => a.sheet === b.sheet,
        limit: HISTORY_LIMIT,
      },
    ),
  ) as EditorStore;
}
