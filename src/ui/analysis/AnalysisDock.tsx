/** The analysis dock under the sheet: one view at a time, chosen from its tab row (each tab is a command with a key). */
import { CommandButton } from '../CommandButton';
import { ComparePanel } from './ComparePanel';
import { PhasorPanel } from './PhasorPanel';
import { PowerPanel } from './PowerPanel';
import { SweepPanel } from './SweepPanel';
import { TEquivalentPanel } from './TEquivalentPanel';
import { useAnalysis } from './useSolved';
import { openView } from '../../store/analysisActions';
import './analysis.css';

const TITLES = { compare: 'Dot comparison', tequiv: 'T-equivalent', sweep: 'Frequency sweep', phasor: 'Phasors and waveforms', power: 'Power balance' } as const;

export function AnalysisTabs() {
  const view = useAnalysis((s) => s.view);
  return (
    <div className="analysis-tabs" role="toolbar" aria-label="Analysis views">
      <CommandButton id="analysis-compare" pressed={view === 'compare'} />
      <CommandButton id="analysis-tequiv" pressed={view === 'tequiv'} />
      <CommandButton id="analysis-sweep" pressed={view === 'sweep'} />
      <CommandButton id="analysis-phasors" pressed={view === 'phasor'} />
      <CommandButton id="analysis-power" pressed={view === 'power'} />
    </div>
  );
}

export function AnalysisDock() {
  const view = useAnalysis((s) => s.view);
  if (!view) return null;
  return (
    <section className="analysis-dock" aria-label={TITLES[view]} data-testid="analysis-dock" data-view={view}>
      <div className="dock-head">
        <h2 className="panel-title">{TITLES[view]}</h2>
        <button type="button" className="cmd dock-close" aria-label="Close the analysis view" title="Close the analysis view" onClick={() => openView(null)}>×</button>
      </div>
      <div className="dock-body">
        {view === 'compare' && <ComparePanel />}
        {view === 'tequiv' && <TEquivalentPanel />}
        {view === 'sweep' && <SweepPanel />}
        {view === 'phasor' && <PhasorPanel />}
        {view === 'power' && <PowerPanel />}
      </div>
    </section>
  );
}
