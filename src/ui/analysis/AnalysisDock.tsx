/**
 * The analysis dock under the sheet: one view at a time, chosen from its tab
 * row (each tab is a command with a key). The dock's top edge is a splitter
 * (drag it, or focus it and use the arrow keys); however it is set, the
 * drawing above keeps at least its minimum height (the stage's CSS holds it),
 * and the dock's body starts at the top for each view.
 */
import { useRef, useState } from 'react';
import { CommandButton } from '../CommandButton';
import { ComparePanel } from './ComparePanel';
import { HarmonicPanel } from './HarmonicPanel';
import { PhasorPanel } from './PhasorPanel';
import { PowerPanel } from './PowerPanel';
import { SPlanePanel } from './SPlanePanel';
import { SweepPanel } from './SweepPanel';
import { TEquivalentPanel } from './TEquivalentPanel';
import { TimePanel } from './TimePanel';
import { useAnalysis } from './useSolved';
import { openView } from '../../store/analysisActions';
import './analysis.css';

const TITLES = { compare: 'Dot comparison', tequiv: 'T-equivalent', sweep: 'Sweep', phasor: 'Phasors and waveforms', power: 'Power balance', sdomain: 'Poles and zeros (s-domain)', harmonic: 'Harmonics (periodic steady state)', time: 'Time response' } as const;

const DOCK_KEY = 'coilwright:dock-height';
const readHeight = () => {
  try {
    const v = Number(globalThis.localStorage?.getItem(DOCK_KEY));
    return v >= 120 && v <= 2000 ? v : 340;
  } catch {
    return 340;
  }
};

export function AnalysisTabs() {
  const view = useAnalysis((s) => s.view);
  return (
    <div className="analysis-tabs" role="toolbar" aria-label="Analysis views">
      <CommandButton id="analysis-compare" pressed={view === 'compare'} />
      <CommandButton id="analysis-tequiv" pressed={view === 'tequiv'} />
      <CommandButton id="analysis-sweep" pressed={view === 'sweep'} />
      <CommandButton id="analysis-phasors" pressed={view === 'phasor'} />
      <CommandButton id="analysis-power" pressed={view === 'power'} />
      <CommandButton id="analysis-sdomain" pressed={view === 'sdomain'} />
      <CommandButton id="analysis-time" pressed={view === 'time'} />
      <CommandButton id="analysis-harmonics" pressed={view === 'harmonic'} />
    </div>
  );
}

export function AnalysisDock() {
  const view = useAnalysis((s) => s.view);
  const [height, setHeight] = useState(readHeight);
  const drag = useRef<{ y: number; h: number } | null>(null);
  const dock = useRef<HTMLElement>(null);
  if (!view) return null;
  const set = (h: number) => {
    const v = Math.round(Math.max(120, Math.min(2000, h)));
    setHeight(v);
    try { localStorage.setItem(DOCK_KEY, String(v)); } catch { /* a view preference only */ }
  };
  // the height the dock has on screen (the stage may hold it lower to keep the drawing's minimum)
  const shown = () => dock.current?.getBoundingClientRect().height ?? height;
  return (
    <section ref={dock} className="analysis-dock" aria-label={TITLES[view]} data-testid="analysis-dock" data-view={view} style={{ height }}>
      <div
        className="dock-splitter" role="separator" aria-orientation="horizontal" aria-label="Height of the analysis view" tabIndex={0}
        aria-valuenow={height} aria-valuemin={120} data-testid="dock-splitter"
        onPointerDown={(e) => { e.currentTarget.setPointerCapture(e.pointerId); drag.current = { y: e.clientY, h: shown() }; }}
        onPointerMove={(e) => drag.current && set(drag.current.h + drag.current.y - e.clientY)}
        onPointerUp={() => { drag.current = null; }}
        onKeyDown={(e) => {
          // the arrows size the dock (and do not move the view); Escape still closes it
          if (e.key === 'ArrowUp') { e.preventDefault(); e.stopPropagation(); set(shown() + 24); }
          if (e.key === 'ArrowDown') { e.preventDefault(); e.stopPropagation(); set(shown() - 24); }
        }}
      />
      <div className="dock-head">
        <h2 className="panel-title">{TITLES[view]}</h2>
        <button type="button" className="cmd dock-close" aria-label="Close the analysis view (Escape)" title="Close the analysis view (Escape)" onClick={() => openView(null)}>×</button>
      </div>
      {/* a fresh body per view: it starts scrolled to the top */}
      <div className="dock-body" key={view}>
        {view === 'compare' && <ComparePanel />}
        {view === 'tequiv' && <TEquivalentPanel />}
        {view === 'sweep' && <SweepPanel />}
        {view === 'phasor' && <PhasorPanel />}
        {view === 'power' && <PowerPanel />}
        {view === 'sdomain' && <SPlanePanel />}
        {view === 'time' && <TimePanel />}
        {view === 'harmonic' && <HarmonicPanel />}
      </div>
    </section>
  );
}
