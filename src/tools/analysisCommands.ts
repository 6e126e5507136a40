/** Commands of the analysis views: open a view, put a T-equivalent pair back. */
import { latestSubstitution, openView, putPairBack } from '../store/analysisActions';
import { analysisStore } from '../store/analysisStore';
import { isCouplable } from '../model/parts/registry';
import type { EditorState } from '../store/types';
import type { Command } from './commands';

const hasLink = (s: EditorState) => s.sheet.couplings.length > 0;

export const ANALYSIS_COMMANDS: Command[] = [
  {
    id: 'analysis-compare', label: 'Compare dots', keys: ['o'],
    hint: 'Show the circuit as drawn beside the same circuit with one polarity dot flipped; the sheet changes only if you accept',
    enabled: hasLink,
    run: (h) => {
      const s = h.store.getState();
      const w = s.sheet.parts.find((p) => isCouplable(p) && s.selection.includes(p.id) && s.sheet.couplings.some((c) => c.windings.includes(p.id)));
      if (w) analysisStore.setState({ compareWinding: w.id });
      openView('compare');
    },
  },
  { id: 'analysis-tequiv', label: 'T-equivalent', keys: ['t'], hint: 'Arms L1 − M, L2 − M and M of a linked pair, with a port check; draw it on the sheet in place of the pair', run: () => openView('tequiv') },
  {
    id: 'analysis-put-back', label: 'Put pair back', keys: ['b'], hint: 'Take the T-equivalent drawn last off the sheet and put the linked pair back as it was',
    enabled: (s) => analysisStore.getState().substitutions.some((x) => x.sheetId === s.sheetId),
    run: (h) => { if (latestSubstitution(h.store)) putPairBack(h.store); },
  },
  { id: 'analysis-sweep', label: 'Sweep', keys: ['s'], hint: 'Plot chosen quantities against frequency or against a part\'s value (magnitude and phase), with peak, −3 dB and resonance markers, a cursor, CSV and a slider on one value', run: () => openView('sweep') },
  { id: 'analysis-phasors', label: 'Phasors', keys: ['g'], hint: 'Phasor diagram of chosen voltages and currents to scale, and their waveforms over two periods', run: () => openView('phasor') },
  { id: 'analysis-sdomain', label: 'Poles and zeros', keys: ['z'], hint: 'The transfer function H(s) from a source to a node, a voltage or a current: its poles and zeros on the s-plane, and the natural frequencies of the whole circuit', run: () => openView('sdomain') },
  { id: 'analysis-time', label: 'Time response', keys: ['r'], hint: 'Voltages and currents over time from t = 0 (switching, waveforms, initial values): cursor, zoom, measurements over a window; the sheet follows the cursor', run: () => openView('time') },
  { id: 'analysis-harmonics', label: 'Harmonics', keys: ['n'], hint: 'The steady state of periodic sources (square waves, sines at multiples of one fundamental) as a sum of harmonics: one period rebuilt, each harmonic\'s magnitude, phase and power, true RMS and THD', run: () => openView('harmonic') },
  { id: 'analysis-power', label: 'Power balance', keys: ['e'], hint: 'P, Q, |S| and power factor of every part; totals, efficiency and the Tellegen check', run: () => openView('power') },
];
