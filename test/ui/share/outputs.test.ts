import { describe, expect, it } from 'vitest';
import * as exportModule from '../../../src/export';
import { EXAMPLES, deriveCircuit, seedIds } from '../../../src/model';
import { solveGraph } from '../../../src/solver';
import { createEditorStore } from '../../../src/store/createEditorStore';
import { provideAnalysisOutputs } from '../../../src/ui/share/analysisHook';
import { svgNow } from '../../../src/ui/share/outputs';
import { shareSettings } from '../../../src/ui/share/settings';

function solvedStore() {
  seedIds(51);
  const sheet = EXAMPLES[0].make();
  const circuit = deriveCircuit(sheet);
  const store = createEditorStore(sheet, 'sheet:s');
  store.setState({ solve: { status: 'solved', result: solveGraph(circuit.model), circuit, refusal: null, stale: false, seq: 1, solveMs: 0 } });
  return store;
}

const PLOT = '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 200 100"><path d="M0 50 L200 10" stroke="black"/></svg>';

describe('the SVG sheet as the Share panel sets it up', () => {
  it('carries the paper, the notes and the analysis plots when asked', () => {
    const store = solvedStore();
    shareSettings.setState({ paper: 'Letter', notes: 'Bench <unit> & "A"', includePlots: true });
    const stop = provideAnalysisOutputs({ plots: () => [PLOT] });
    const { svg, plotsDropped } = svgNow(store, exportModule);
    stop();
    expect(plotsDropped).toBeNull();
    // Letter landscape 279.4 mm × 215.9 mm (ANSI) less 2 × 10.5 mm print margins
    expect(svg).toMatch(/<svg [^>]*width="258.4mm" height="194.9mm"/);
    expect(svg).toContain('Bench &lt;unit&gt; &amp; "A"'); // escaped as character data (XML 1.0 §2.4)
    expect(svg).toContain('id="plot-1"');
    expect(svg).toMatch(/class="row" data-kind="part" data-name="Rp"/); // solved: the results table is there
  });

  it('leaves the plots out when not wanted, and says why when a plot is refused', () => {
    const store = solvedStore();
    shareSettings.setState({ paper: 'A4', notes: '', includePlots: false });
    const stop = provideAnalysisOutputs({ plots: () => ['<svg viewBox="0 0 10 10"><script>alert(1)</script></svg>'] });
    expect(svgNow(store, exportModule).svg).not.toContain('id="plot-1"');
    shareSettings.setState({ includePlots: true });
    const r = svgNow(store, exportModule);
    stop();
    expect(r.plotsDropped).toContain('holds a script');
    expect(r.svg).not.toContain('<script');
    expect(r.svg).toMatch(/width="276mm" height="189mm"/); // A4 297 × 210 mm (ISO 216) less the margins
  });

  it('an unsolved sheet says why instead of showing values', () => {
    seedIds(52);
    const store = createEditorStore(EXAMPLES[0].make(), 'sheet:u');
    shareSettings.setState({ includePlots: false });
    const { svg } = svgNow(store, exportModule);
    expect(svg).toContain('Not solved. The solve had not finished when the picture was made.');
    expect(svg).not.toContain('class="row"');
  });
});
