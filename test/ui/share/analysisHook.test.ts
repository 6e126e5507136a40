import { describe, expect, it } from 'vitest';
import { sweepCsv, parseCsv } from '../../../src/export/csv';
import { analysisOutputs, onAnalysisOutputs, provideAnalysisOutputs } from '../../../src/ui/share/analysisHook';

describe('the analysis views\' outputs hook', () => {
  it('is empty until provided, tells listeners, and withdraws only its own provider', () => {
    expect(analysisOutputs()).toEqual({});
    expect(analysisOutputs()).toBe(analysisOutputs()); // one stable snapshot (React's useSyncExternalStore needs it)
    let told = 0;
    const stop = onAnalysisOutputs(() => told++);
    const table = { frequenciesHz: [50], traces: [{ label: 'I(R1)', unit: 'A', values: [1, 0] }] };
    const first = provideAnalysisOutputs({ sweep: () => table });
    const second = provideAnalysisOutputs({ plots: () => ['<svg viewBox="0 0 10 5"></svg>'] });
    first(); // an old provider's clean-up does not remove the newer one
    expect(analysisOutputs().plots?.()).toHaveLength(1);
    second();
    expect(analysisOutputs()).toEqual({});
    expect(told).toBe(3); // provided twice, withdrawn once (the stale withdrawal is silent)
    stop();
    // what a provider hands over writes as CSV: 1 A at 0°, magnitude 1 (|1 + 0j| = 1)
    expect(parseCsv(sweepCsv(table))[1].map(Number)).toEqual([50, 1, 0, 1, 0]);
  });
});
