/** Boot: restore the last sheet (or open the demo), wire autosave and the solve worker, show the editor. */
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { isolationTransformerSheet } from './model/examples/isolation';
import { newId } from './model/ids';
import { createEditorStore } from './store/createEditorStore';
import { attachAutosave } from './store/autosave';
import { readIndex, restoreCurrent } from './store/library';
import { ToolController } from './tools/controller';
import { attachSolver } from './store/solveBridge';
import { App } from './ui/App';
import { worldToScreen } from './store/actions';
import { pinPositions } from './model/parts/registry';
import { overlayProbe, sheetProbe } from './store/probe';
import { drawnTags } from './canvas/drawOverlay';
import './ui/app.css';

const storage = window.localStorage;
const restored = restoreCurrent(storage);
const store = createEditorStore(restored?.sheet ?? isolationTransformerSheet(), restored?.id ?? newId('sheet'));
store.setState({ library: readIndex(storage) });
// view preferences kept between visits
const SYMBOLS_KEY = 'coilwright:symbols';
if (storage.getItem(SYMBOLS_KEY) === 'ieee') store.setState({ symbols: 'ieee' });
store.subscribe((s, p) => s.symbols !== p.symbols && storage.setItem(SYMBOLS_KEY, s.symbols));
const autosave = attachAutosave(store, storage);
if (!restored) autosave.flush();
window.addEventListener('pagehide', () => autosave.flush());
document.addEventListener('visibilitychange', () => document.visibilityState === 'hidden' && autosave.flush());
attachSolver(store, () => new Worker(new URL('./worker/solve.worker.ts', import.meta.url), { type: 'module' }));
const tools = new ToolController(store);

// read-only hook for tests and the benchmark: the state, where things are on screen, and when the overlay was drawn
(window as unknown as { __coilwright: unknown }).__coilwright = {
  state: () => store.getState(),
  overlay: overlayProbe,
  sheetDraws: sheetProbe,
  toScreen: (x: number, y: number) => worldToScreen(store.getState().view, x, y),
  /** the reading tags last drawn on the canvas, as boxes in sheet units */
  tags: () => drawnTags.boxes,
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
};

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <App store={store} tools={tools} storage={storage} readGraph={(json) => import('./solver').then((m) => m.parseGraphModel(json))} />
  </StrictMode>,
);
