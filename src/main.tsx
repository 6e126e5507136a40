/** Boot: restore the last sheet (or open the demo), wire autosave, the tab guard and the solve worker, show the editor. */
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { isolationTransformerSheet } from './model/examples/isolation';
import { newId } from './model/ids';
import { createEditorStore } from './store/createEditorStore';
import { attachAutosave } from './store/autosave';
import { attachSweepKeep } from './store/sweepKeep';
import { attachHistoryKeep } from './store/historyKeep';
import { readIndex, readRev, restoreCurrent } from './store/library';
import { attachPrefs } from './store/prefs';
import { attachTabGuard, noLocks, webLocks } from './store/tabGuard';
import { ToolController } from './tools/controller';
import { attachSolver, DEFAULT_WATCHDOG, type WorkerLike } from './store/solveBridge';
import { App } from './ui/App';
import { worldToScreen } from './store/actions';
import { pinPositions } from './model/parts/registry';
import { overlayProbe, sheetProbe } from './store/probe';
import { sweepTestHold } from './ui/analysis/sweepRunner';
import { drawnArrows, drawnTags } from './canvas/drawOverlay';
import { drawnText } from './canvas/drawPrims';
import { timeTestHold } from './ui/analysis/timeRunner';
import './ui/app.css';

const storage = window.localStorage;
const restored = restoreCurrent(storage);
// a last sheet that cannot be read is kept as it is stored (the editor offers its text for download); the demo opens beside it
const start = restored && 'sheet' in restored ? restored : null;
const store = createEditorStore(start?.sheet ?? isolationTransformerSheet(), start?.id ?? newId('sheet'));
if (start) store.setState({ stored: { id: start.id, sheet: start.sheet, rev: readRev(storage, start.id) } });
if (restored && 'unreadable' in restored) store.setState({ unreadable: restored.unreadable });
store.setState({ library: readIndex(storage) });
attachPrefs(store, storage);
const guard = attachTabGuard(store, storage, navigator.locks ? webLocks(navigator.locks) : noLocks, {
  watchStorage: (onChange) => {
    const listen = (e: StorageEvent) => (e.storageArea === storage || e.storageArea === null) && onChange(e.key);
    window.addEventListener('storage', listen);
    return () => window.removeEventListener('storage', listen);
  },
});
const autosave = attachAutosave(store, storage);
attachSweepKeep(store, storage);
// undo history in the tab's session storage (kept across reloads of this tab only); without it, history lasts the visit
let history: { flush(): void } | null = null;
try {
  history = attachHistoryKeep(store, window.sessionStorage);
} catch {
  /* session storage refused */
}
const flushAll = () => {
  autosave.flush();
  history?.flush();
};
window.addEventListener('pagehide', flushAll);
document.addEventListener('visibilitychange', () => document.visibilityState === 'hidden' && flushAll());

// the solve worker, with faults a browser test can put in: a worker stopped without a word, or new workers that never answer
const faults = { hang: false };
let solveWorker: WorkerLike | null = null;
const silentWorker = (): WorkerLike => ({ postMessage: () => {}, onmessage: null, onerror: null, terminate: () => {} });
const watchdog = { ...DEFAULT_WATCHDOG };
const solver = attachSolver(store, () => {
  solveWorker = faults.hang ? silentWorker() : new Worker(new URL('./worker/solve.worker.ts', import.meta.url), { type: 'module' });
  return solveWorker;
}, watchdog);
const tools = new ToolController(store);

// hook for tests and the benchmark: the state, where things are on screen, when the overlay was drawn; and test-only faults
(window as unknown as { __coilwright: unknown }).__coilwright = {
  state: () => store.getState(),
  overlay: overlayProbe,
  sheetDraws: sheetProbe,
  toScreen: (x: number, y: number) => worldToScreen(store.getState().view, x, y),
  /** the reading tags last drawn on the canvas, as boxes in sheet units */
  tags: () => drawnTags.boxes,
  /** the current arrows last drawn (sheet units), and the instant of the time response they show (null: the phasors) */
  arrows: () => ({ instantS: drawnArrows.instantS, arrows: drawnArrows.arrows }),
  /** the font sizes of the drawing's text last drawn, in sheet units (screen px at 100 % zoom) */
  textSizes: () => [...drawnText.sizes].sort((a, b) => a - b),
  /** a part's pin in sheet units */
  pin: (ref: string, pin: number) => {
    const p = store.getState().sheet.parts.find((q) => q.ref === ref);
    return p ? pinPositions(p)[pin] : null;
  },
  pinOnScreen: (ref: string, pin: number) => {
    const p = store.getState().sheet.parts.find((q) => q.ref === ref);
    if (!p) return null;
    const w = pinPositions(p)[pin];
    return worldToScreen(store.getState().view, w.x, w.y);
  },
  test: {
    /** terminates the solve worker as a crash would, but without an error event */
    stopSolver: () => solveWorker?.terminate(),
    /** while on, every new solve worker ignores what it is sent */
    hangSolvers: (on: boolean) => void (faults.hang = on),
    watchdog,
    /** while on, sweeps wait after their first chunk until cancelled */
    holdSweeps: (on: boolean) => void (sweepTestHold.on = on),
    /** while on, time responses wait before their first step until cancelled */
    holdTimeRuns: (on: boolean) => void (timeTestHold.on = on),
  },
};

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <App store={store} tools={tools} storage={storage} guard={guard} solver={solver} readGraph={(json) => import('./solver').then((m) => m.parseGraphModel(json))} />
  </StrictMode>,
);
