import { describe, expect, it } from 'vitest';
import { seedIds } from '../../src/model/ids';
import { emptySheet } from '../../src/model/sheet';
import { placePart, undo } from '../../src/store/actions';
import { createAnalysisStore, DEFAULT_SWEEP } from '../../src/store/analysisStore';
import { createEditorStore } from '../../src/store/createEditorStore';
import { attachHistoryKeep, historyKey, historyText, HISTORY_KEEP_CHARS, parseHistory } from '../../src/store/historyKeep';
import { nextSheetTitle, writeSheet, type KeyValueStorage } from '../../src/store/library';
import { loadSheet, switchSheet } from '../../src/store/sheets';
import { attachSweepKeep, parseKeptSweep, readKeptSweep, sweepKey, SWEEP_KEEP_SHEETS, writeKeptSweep } from '../../src/store/sweepKeep';

class MemoryStorage implements KeyValueStorage {
  map = new Map<string, string>();
  getItem(k: string) { return this.map.get(k) ?? null; }
  setItem(k: string, v: string) { this.map.set(k, v); }
  removeItem(k: string) { this.map.delete(k); }
}

const microtasks = () => new Promise<void>((r) => queueMicrotask(r));

describe('new sheet titles', () => {
  it('count on from the highest "Sheet N" in use', () => {
    expect(nextSheetTitle([])).toBe('Sheet 1');
    expect(nextSheetTitle(['Sheet 1', 'Bench', 'Sheet 7', 'Sheet 3'])).toBe('Sheet 8');
    expect(nextSheetTitle(['Untitled sheet', 'Sheet x'])).toBe('Sheet 1');
  });
});

describe('sweep settings kept per sheet', () => {
  const settings = { ...DEFAULT_SWEEP, from: 5, to: 500, points: 123, traces: [{ label: 'I(R1)', unit: 'A', quantity: { kind: 'current' as const, element: 'R1' } }] };
  it('come back for their sheet, and the defaults for another', () => {
    const storage = new MemoryStorage();
    const store = createEditorStore(emptySheet('A'), 'sheet:a');
    const analysis = createAnalysisStore();
    attachSweepKeep(store, storage, analysis);
    analysis.setState({ sweep: { ...analysis.getState().sweep, settings, status: 'done', answer: { frequenciesHz: [1, 2], traces: [[0, 0, 0, 0]], ms: 1 } } });
    expect(readKeptSweep(storage, 'sheet:a')).toEqual({ settings, slider: null, ran: true });
    loadSheet(store, emptySheet('B'), 'sheet:b');
    expect(analysis.getState().sweep.settings).toEqual(DEFAULT_SWEEP);
    expect(analysis.getState().sweep.answer).toBeNull(); // the other sheet's plot is let go
    loadSheet(store, emptySheet('A'), 'sheet:a');
    expect(analysis.getState().sweep.settings).toEqual(settings);
    expect(analysis.getState().sweep.autoRun).toBe(true); // it had run: it runs again when shown
  });
  it('are bounded in the number of sheets kept, and refuse damaged text', () => {
    const storage = new MemoryStorage();
    for (let i = 0; i < SWEEP_KEEP_SHEETS + 5; i++) writeKeptSweep(storage, `s${i}`, { settings, slider: null, ran: false });
    expect([...storage.map.keys()].filter((k) => k.startsWith('coilwright:sweep:'))).toHaveLength(SWEEP_KEEP_SHEETS);
    expect(storage.getItem(sweepKey('s0'))).toBeNull(); // the least recently used went first
    expect(parseKeptSweep('{"settings":{"from":-1}}')).toBeNull();
    expect(parseKeptSweep('not json')).toBeNull();
    const hostile = JSON.stringify({ settings: { ...settings, traces: [{ label: 'x', unit: 'A', quantity: { kind: 'eval', element: 'R1' } }] } });
    expect(parseKeptSweep(hostile)!.settings.traces).toEqual([]); // an unknown quantity is dropped, not trusted
  });
});

describe('undo history kept across a reload', () => {
  it('comes back onto the same sheet and undoes as before', async () => {
    seedIds(21);
    const session = new MemoryStorage();
    const store = createEditorStore(emptySheet('Bench'), 'sheet:one');
    const keep = attachHistoryKeep(store, session, 0);
    placePart(store, 'resistor', { x: 40, y: 40 });
    placePart(store, 'winding', { x: 140, y: 40 });
    keep.stop();
    // a reload: a new store with the sheet as stored
    const again = createEditorStore(store.getState().sheet, 'sheet:one');
    attachHistoryKeep(again, session, 0);
    expect(again.temporal.getState().pastStates).toHaveLength(2);
    undo(again);
    expect(again.getState().sheet.parts).toHaveLength(1);
    undo(again);
    expect(again.getState().sheet.parts).toHaveLength(0);
    await microtasks();
  });
  it('is not put onto another version of the sheet', () => {
    seedIds(22);
    const session = new MemoryStorage();
    const store = createEditorStore(emptySheet('Bench'), 'sheet:one');
    attachHistoryKeep(store, session, 0);
    placePart(store, 'resistor', { x: 40, y: 40 });
    const other = createEditorStore(emptySheet('Bench, changed elsewhere'), 'sheet:one');
    attachHistoryKeep(other, session, 0);
    expect(other.temporal.getState().pastStates).toHaveLength(0);
  });
  it('follows a switch of sheets: each sheet gets its own steps back', async () => {
    seedIds(23);
    const storage = new MemoryStorage();
    const session = new MemoryStorage();
    writeSheet(storage, 'sheet:b', emptySheet('B'));
    const store = createEditorStore(emptySheet('A'), 'sheet:a');
    attachHistoryKeep(store, session, 50);
    placePart(store, 'resistor', { x: 40, y: 40 });
    switchSheet(store, storage, 'sheet:b');
    await microtasks();
    expect(store.temporal.getState().pastStates).toHaveLength(0);
    expect(session.getItem(historyKey('sheet:a'))).not.toBeNull(); // written on leaving, though its delay had not run out
    switchSheet(store, storage, 'sheet:a');
    await microtasks();
    expect(store.temporal.getState().pastStates).toHaveLength(1);
  });
  it('stays within its size, dropping the oldest steps first', () => {
    seedIds(24);
    const store = createEditorStore(emptySheet('Big'), 'sheet:big');
    for (let i = 0; i < 300; i++) placePart(store, 'resistor', { x: 40 * (i % 30), y: 80 * Math.floor(i / 30) });
    const sheet = store.getState().sheet;
    const past = Array.from({ length: 100 }, (_, i) => ({ sheet: { ...sheet, title: `Step ${i}` } }));
    const text = historyText(sheet, past, []);
    expect(text.length).toBeLessThanOrEqual(HISTORY_KEEP_CHARS);
    const back = parseHistory(text, sheet)!;
    expect(back.past.length).toBeGreaterThan(0);
    expect(back.past.length).toBeLessThan(100);
    expect(back.past[back.past.length - 1].sheet.title).toBe('Step 99'); // the newest steps are the ones kept
  });
});
