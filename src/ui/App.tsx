/** The editor's frame: top bar, shelf, sheet with its convention badge, details and readings. */
import { useEffect, useMemo, useRef, useState } from 'react';
import { SheetCanvas } from './SheetCanvas';
import { EXAMPLES } from '../model/examples';
import { emptySheet } from '../model/sheet';
import { formatSI } from '../model/quantity';
import { fitView, notify } from '../store/actions';
import { loadSheet, switchSheet, deleteStoredSheet } from '../store/sheets';
import { nextSheetTitle, type KeyValueStorage } from '../store/library';
import type { SolveBridge } from '../store/solveBridge';
import type { TabGuard } from '../store/tabGuard';
import { findCommand, type CommandHost } from '../tools/commands';
import type { ToolController } from '../tools/controller';
import type { EditorStore } from '../store/types';
import { CommandHostContext } from './commandHost';
import { CommandList } from './CommandList';
import { openView } from '../store/analysisActions';
import { analysisStore } from '../store/analysisStore';
import { Details } from './Details';
import { downloadSheet, readSheetFile, type GraphReader } from './files';
import { Notices } from './Notices';
import { PartsShelf } from './PartsShelf';
import { Readings } from './Readings';
import { rawRows, readingsCsv } from './readings';
import { EditorContext, useEditorState } from './editorContext';
import { TopBar } from './TopBar';
import { AnalysisDock, AnalysisTabs } from './analysis/AnalysisDock';
import { CouplingInspector } from './analysis/CouplingInspector';
import { fileProblem } from './share/importGuard';
import { runOutput } from './share/outputs';
import { ShareLayer } from './share/ShareLayer';
import { GuardLayer } from './guard/GuardLayer';
import { preloadExpr } from './valueEntry';

/** Put the keyboard into the main value of what is selected (or the sheet's frequency), its text selected for typing over. */
function focusMainValue(tries = 3): void {
  const el = document.querySelector<HTMLInputElement>('[data-testid="field-value"], [data-testid="field-coupling"], [data-testid="field-name"], [data-testid="sheet-frequency"]');
  if (!el) {
    if (tries > 0) requestAnimationFrame(() => focusMainValue(tries - 1));
    return;
  }
  el.focus();
  el.select();
}

function isTyping(t: EventTarget | null): boolean {
  const el = t as HTMLElement | null;
  return !!el && (el.tagName === 'INPUT' || el.tagName === 'TEXTAREA' || el.tagName === 'SELECT' || el.isContentEditable);
}

export function App({ store, tools, storage, guard, solver, readGraph }: { store: EditorStore; tools: ToolController; storage: KeyValueStorage; guard?: TabGuard; solver?: SolveBridge; readGraph: GraphReader }) {
  const fileInput = useRef<HTMLInputElement>(null);
  const canvasBox = useRef<HTMLDivElement>(null);
  const [listOpen, setListOpen] = useState(false);
  const host: CommandHost = useMemo(() => ({
    openCommandList: () => setListOpen(true),
    editValue: () => focusMainValue(),
    store,
    tools,
    viewport: () => ({ width: canvasBox.current?.clientWidth ?? 800, height: canvasBox.current?.clientHeight ?? 600 }),
    openFile: () => fileInput.current?.click(),
    saveFile: () => {
      downloadSheet(store.getState().sheet);
      notify(store, 'Sheet saved as a file');
    },
    savePicture: () => void runOutput(store, 'svg'),
    output: (what) => void runOutput(store, what),
    newSheet: () => {
      const s = store.getState();
      const title = nextSheetTitle([s.sheet.title, ...s.library.map((e) => e.title)]);
      loadSheet(store, emptySheet(title));
      notify(store, `New empty sheet “${title}” (the previous one is kept under Sheets, where a sheet can be renamed)`);
    },
    copyReadings: () => {
      const s = store.getState();
      if (!s.solve.result) return notify(store, 'Nothing solved to copy yet');
      const csv = readingsCsv(s.solve.result, rawRows(s.solve.raw ?? s.solve.result), s.sheet.title);
      navigator.clipboard?.writeText(csv).then(
        () => notify(store, 'Readings copied as CSV'),
        () => notify(store, 'The browser did not allow copying to the clipboard', 'error'),
      );
    },
  }), [store, tools]);

  useEffect(() => {
    tools.place.viewport = host.viewport;
    const v = host.viewport();
    fitView(store, v.width, v.height);
  }, [store, host, tools]);

  useEffect(() => {
    preloadExpr();
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape' && (e.target as HTMLElement)?.closest?.('.analysis-dock')) {
        // Escape inside an analysis view closes it and hands the keyboard back to the drawing
        openView(null);
        document.querySelector<HTMLElement>('.sheet-canvas')?.focus();
        return;
      }
      if (isTyping(e.target)) return;
      if (e.key === ' ') {
        tools.spaceHeld = true;
        if ((e.target as HTMLElement)?.classList?.contains('sheet-canvas')) e.preventDefault();
        return;
      }
      const k = { key: e.key, shift: e.shiftKey, mod: e.ctrlKey || e.metaKey, alt: e.altKey };
      if (tools.key(k)) {
        e.preventDefault();
        return;
      }
      if (e.key === 'Escape' && store.getState().tool === 'select' && analysisStore.getState().view) {
        // nothing left to let go of on the drawing: Escape closes the open analysis view
        openView(null);
        e.preventDefault();
        return;
      }
      const cmd = findCommand(k);
      if (!cmd) return;
      const targetIsButton = (e.target as HTMLElement)?.tagName === 'BUTTON';
      if (targetIsButton && (e.key === 'Enter' || e.key === ' ')) return;
      e.preventDefault();
      if (cmd.enabled && !cmd.enabled(store.getState())) return;
      cmd.run(host);
    };
    const onKeyUp = (e: KeyboardEvent) => {
      if (e.key === ' ') tools.spaceHeld = false;
    };
    window.addEventListener('keydown', onKey);
    window.addEventListener('keyup', onKeyUp);
    return () => {
      window.removeEventListener('keydown', onKey);
      window.removeEventListener('keyup', onKeyUp);
    };
  }, [store, tools, host]);

  const openChosen = async (file: File) => {
    const tooBig = fileProblem(file);
    if (tooBig) return notify(store, `Could not open ${file.name}: ${tooBig}. The current sheet is unchanged.`, 'error');
    try {
      const sheet = await readSheetFile({ text: await file.text(), name: file.name }, readGraph);
      loadSheet(store, sheet);
      const v = host.viewport();
      fitView(store, v.width, v.height);
      notify(store, `Opened ${file.name}`);
    } catch (e) {
      notify(store, `Could not open ${file.name}: ${e instanceof Error ? e.message : String(e)}. The current sheet is unchanged.`, 'error');
    }
  };

  return (
    <EditorContext.Provider value={{ store, tools }}>
      <CommandHostContext.Provider value={host}>
        <div className="app">
          <TopBar
            onExample={(key) => {
              const ex = EXAMPLES.find((x) => x.key === key)!;
              loadSheet(store, ex.make());
              const v = host.viewport();
              fitView(store, v.width, v.height);
            }}
            onSwitch={(id) => switchSheet(store, storage, id)}
            onForget={(id) => deleteStoredSheet(store, storage, id)}
            onRename={guard ? (id, title) => guard.rename(id, title) : undefined}
          />
          <PartsShelf />
          <main className="stage" aria-label="Sheet">
            <div className="canvas-box" ref={canvasBox}>
              <SheetCanvas />
              <ConventionBadge />
              <FirstSteps />
            </div>
            <GuardLayer guard={guard} solver={solver} />
            <Notices />
            <AnalysisTabs />
            <AnalysisDock />
          </main>
          <aside className="side" aria-label="Details and readings">
            <Details />
            <CouplingInspector />
            <Readings />
          </aside>
          <input
            ref={fileInput}
            type="file"
            accept=".json,.svg,application/json,image/svg+xml"
            hidden
            aria-label="Choose a sheet file to open"
            data-testid="file-input"
            onChange={(e) => {
              const f = e.target.files?.[0];
              e.target.value = '';
              if (f) void openChosen(f);
            }}
          />
          <ShareLayer />
          {listOpen && <CommandList onClose={() => setListOpen(false)} />}
        </div>
      </CommandHostContext.Provider>
    </EditorContext.Provider>
  );
}

/** On an empty sheet: how to start, in four lines. */
function FirstSteps() {
  const empty = useEditorState((s) => s.sheet.parts.length === 0 && s.sheet.wires.length === 0);
  if (!empty) return null;
  return (
    <div className="first-steps" role="note" aria-label="How to start">
      <strong>An empty sheet.</strong>
      <ol>
        <li>Pick a part on the left (or press <kbd>1</kbd>–<kbd>9</kbd>) and click on the sheet to drop it (<kbd>Enter</kbd> drops it at a free spot); <kbd>.</kbd> turns it.</li>
        <li>Press <kbd>J</kbd> and click from pin to pin to join them with a wire (or pick pins with the arrow keys and <kbd>Enter</kbd>); add a ground (<kbd>7</kbd>).</li>
        <li>Select a part and press <kbd>V</kbd> to type its value: <code>4.7m</code>, <code>4.7 mH</code>, <code>1/(2*pi*50)</code>, a ratio <code>1:200</code>.</li>
        <li>Shift-click two windings and press <kbd>C</kbd> to couple them. Currents and voltages appear on the drawing as you go; <kbd>/</kbd> finds any command.</li>
      </ol>
    </div>
  );
}

function ConventionBadge() {
  const f = useEditorState((s) => s.sheet.frequencyHz);
  const a = useEditorState((s) => s.sheet.amplitudes);
  const status = useEditorState((s) => s.solve.status);
  // an edit whose answer has not come back yet: the readings shown belong to the sheet before it
  const pending = useEditorState((s) => s.solve.status === 'solved' && !!s.derived && s.solve.circuit?.source !== s.derived.source);
  const title = useEditorState((s) => s.sheet.title);
  const readout = useEditorState((s) => s.readout);
  const said = status === 'solved' ? 'Solved; the readings are up to date.' : status === 'refused' ? 'Not solved; see the message under the sheet.' : '';
  return (
    <div className="badge" data-testid="convention" aria-label={`Frequency ${formatSI(f, 'Hz', 4)}, amplitudes ${a === 'rms' ? 'RMS' : 'peak'}`}>
      <span>
        <strong>{formatSI(f, 'Hz', 4)}</strong> · {a === 'rms' ? 'RMS' : 'peak'} phasors · {readout === 'polar' ? 'angles in degrees' : 'real + j imaginary'}
        <small className="badge-sub">{title} · {new Date().toLocaleDateString(undefined, { year: 'numeric', month: 'short', day: 'numeric' })} · linear model</small>
      </span>
      <span className={`dot-status dot-${pending ? 'pending' : status}`} title={pending ? 'solving the latest edit' : status === 'solved' ? 'solved' : status === 'refused' ? 'not solved' : 'nothing to solve'} />
      <span className="visually-hidden" role="status">{said}</span>
    </div>
  );
}
