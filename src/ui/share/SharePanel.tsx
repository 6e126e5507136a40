/** The Share panel: the SVG sheet's paper, notes and plots; CSV, PNG and print; a link that carries the sheet. */
import { useEffect, useRef, useSyncExternalStore } from 'react';
import { useStore } from 'zustand';
import { useEditor, useEditorState } from '../editorContext';
import { MAX_LINK_CHARS } from '../../model/link';
import { notify } from '../../store/actions';
import { analysisOutputs, onAnalysisOutputs } from './analysisHook';
import { plotsShown } from './analysisScreen';
import { analysisStore } from '../../store/analysisStore';
import { makeLink, runOutput, type OutputKind } from './outputs';
import { shareSettings } from './settings';
import './share.css';

function useAnalysisOutputs() {
  return useSyncExternalStore(onAnalysisOutputs, analysisOutputs);
}

export function SharePanel() {
  const { store } = useEditor();
  const open = useStore(shareSettings, (s) => s.open);
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!open) return;
    const away = (e: PointerEvent) => { if (!ref.current?.contains(e.target as Node)) shareSettings.setState({ open: false }); };
    const esc = (e: KeyboardEvent) => { if (e.key === 'Escape') shareSettings.setState({ open: false }); };
    window.addEventListener('pointerdown', away);
    window.addEventListener('keydown', esc);
    return () => {
      window.removeEventListener('pointerdown', away);
      window.removeEventListener('keydown', esc);
    };
  }, [open]);
  return (
    <div className="menu" ref={ref}>
      <button
        type="button" className="cmd" aria-haspopup="dialog" aria-expanded={open} data-testid="share-open"
        title="Export the sheet (SVG, CSV, PNG, print) or share it as a link (Alt+E)"
        onClick={() => shareSettings.setState({ open: !open })}
      >
        Share ▾
      </button>
      {open && <SharePop run={(what) => void runOutput(store, what)} />}
    </div>
  );
}

function SharePop({ run }: { run: (what: OutputKind) => void }) {
  const { store } = useEditor();
  const paper = useStore(shareSettings, (s) => s.paper);
  const notes = useStore(shareSettings, (s) => s.notes);
  const includePlots = useStore(shareSettings, (s) => s.includePlots);
  const link = useStore(shareSettings, (s) => s.link);
  const sheet = useEditorState((s) => s.sheet);
  const solved = useEditorState((s) => s.solve.status === 'solved');
  const outputs = useAnalysisOutputs();
  const sweepDone = useStore(analysisStore, (s) => s.sweep.status === 'done' && !!s.sweep.answer);
  const hasPlots = !!outputs.plots || plotsShown();
  const hasSweep = !!outputs.sweep || sweepDone;

  // the link always carries the sheet as it is now
  useEffect(() => {
    void makeLink(store);
  }, [store, sheet]);

  const copy = async (url: string) => {
    try {
      await navigator.clipboard.writeText(url);
      notify(store, 'Link copied: whoever opens it sees this sheet solved');
    } catch {
      notify(store, 'The browser did not allow copying; select the link and copy it by hand', 'error');
    }
  };

  return (
    <div className="menu-pop share-pop" role="dialog" aria-label="Share and export" data-testid="share-panel">
      <div className="menu-group" aria-label="Sheet picture">
        <div className="menu-head">Sheet picture (SVG) and print</div>
        <fieldset className="radio">
          <legend>Paper, landscape</legend>
          {(['A4', 'Letter'] as const).map((p) => (
            <label key={p}>
              <input type="radio" name="share-paper" value={p} checked={paper === p} onChange={() => shareSettings.setState({ paper: p })} /> {p}
            </label>
          ))}
        </fieldset>
        <label className="field">
          <span className="label">Notes for the title block</span>
          <textarea data-testid="share-notes" maxLength={600} value={notes} onChange={(e) => shareSettings.setState({ notes: e.target.value })} placeholder="e.g. bench unit, measured 12 Nov" />
        </label>
        <label title={hasPlots ? 'Put the sweep and phasor plots now shown in the analysis views on the sheet' : 'No plots to include: open a sweep or phasor view first'}>
          <input type="checkbox" checked={includePlots && hasPlots} disabled={!hasPlots} onChange={(e) => shareSettings.setState({ includePlots: e.target.checked })} data-testid="share-plots" /> Include the analysis plots
        </label>
        <div className="row-buttons">
          <button type="button" className="cmd" data-testid="share-svg" onClick={() => run('svg')}>Save SVG</button>
          <button type="button" className="cmd" data-testid="share-print" onClick={() => run('print')} title="Print the SVG sheet (Ctrl+P)">Print…</button>
        </div>
        <div className="hint">{solved ? 'The sheet carries its solved values, the title block and the cautions; it opens again in Coilwright.' : 'Not solved: the picture will say why instead of showing values.'}</div>
      </div>
      <div className="menu-group" aria-label="Data and pictures">
        <div className="menu-head">Data and pictures</div>
        <div className="row-buttons">
          <button type="button" className="cmd" data-testid="share-csv" disabled={!solved} onClick={() => run('csv')} title="Every node voltage, part voltage and current, P and Q, unrounded (Alt+C)">Results CSV</button>
          <button type="button" className="cmd" data-testid="share-sweep-csv" disabled={!hasSweep} onClick={() => run('sweep-csv')} title={hasSweep ? 'The latest sweep of the sweep view' : 'Run a sweep in the sweep view first'}>Sweep CSV</button>
          <button type="button" className="cmd" data-testid="share-png" onClick={() => run('png')}>Save PNG</button>
          <button type="button" className="cmd" data-testid="share-copy-png" onClick={() => run('copy-png')} title="Copy the canvas as a picture to paste elsewhere (Alt+I)">Copy PNG</button>
        </div>
      </div>
      <div className="menu-group" aria-label="Link">
        <div className="menu-head">Link</div>
        {link && 'url' in link && (
          <>
            <input className="link-field" readOnly value={link.url} aria-label="Link to this sheet" data-testid="share-link" onFocus={(e) => e.currentTarget.select()} />
            <div className="row-buttons">
              <button type="button" className="cmd" data-testid="share-copy-link" onClick={() => void copy(link.url)}>Copy link</button>
              <span className="hint">{(link.chars / 1024).toFixed(1)} KB of {MAX_LINK_CHARS / 1024} KB. The sheet travels in the link itself; nothing is uploaded.</span>
            </div>
          </>
        )}
        {link && 'problem' in link && (
          <>
            <div className="share-problem" role="alert" data-testid="share-link-problem">{link.problem}</div>
            <div className="row-buttons">
              <button type="button" className="cmd" data-testid="share-save-file" onClick={() => run('file')}>Save file instead</button>
            </div>
          </>
        )}
        {!link && <div className="hint">Making the link…</div>}
      </div>
    </div>
  );
}
