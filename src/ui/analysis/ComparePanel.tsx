/** Dot comparison: the circuit as drawn beside the same circuit with one dot flipped; the sheet changes only on Accept. */
import { useEffect, useState } from 'react';
import type { CompareAnswer } from '../../worker/protocol';
import { formatSI } from '../../model/quantity';
import { acceptDotFlip } from '../../store/analysisActions';
import { analysisStore } from '../../store/analysisStore';
import { isCouplable } from '../../model/parts/registry';
import { useEditor, useEditorState } from '../editorContext';
import { analysisClient } from './client';
import { cabs, polarText, rectangularText } from './format';
import { useAnalysis, useSolved } from './useSolved';

const UNIT = { voltage: 'V', current: 'A', power: 'VA' } as const;

export function ComparePanel() {
  const { store } = useEditor();
  const sheet = useEditorState((s) => s.sheet);
  const solved = useSolved();
  const coupled = sheet.parts.filter((p) => isCouplable(p) && sheet.couplings.some((c) => c.windings.includes(p.id)));
  const chosen = useAnalysis((s) => s.compareWinding);
  const winding = coupled.find((p) => p.id === chosen) ?? coupled[0];
  const [answer, setAnswer] = useState<CompareAnswer | null>(null);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    setAnswer(null);
    if (!solved || !winding) return;
    let live = true;
    analysisClient().compare(solved.model, winding.ref).then((a) => live && (setAnswer(a), setError(null)), (e: Error) => live && setError(e.message));
    return () => { live = false; };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [solved?.result, winding?.id]);
  if (!coupled.length) return <p className="muted">No linked windings on this sheet: link two windings (select both, press K) to compare their dots.</p>;
  const unitOf = solved?.result.amplitudes === 'peak' ? 'peak' : 'RMS';
  return (
    <div className="compare" data-testid="compare-panel">
      <div className="row-controls">
        <label>Flip the dot of{' '}
          <select aria-label="Winding whose dot is flipped" data-testid="compare-winding" value={winding?.id} onChange={(e) => analysisStore.setState({ compareWinding: e.target.value })}>
            {coupled.map((p) => <option key={p.id} value={p.id}>{p.ref}</option>)}
          </select>
        </label>
        <span className="muted">{winding ? `dot now at the ${winding.dot === 'second' ? 'second' : 'first'} terminal` : ''} · {unitOf} phasors</span>
        <button type="button" className="cmd primary" data-testid="compare-accept" disabled={!answer} title="Move the dot on the sheet (one undo step)" onClick={() => winding && acceptDotFlip(store, winding.id)}>Accept the flip</button>
      </div>
      {error && <p className="field-error">{error}</p>}
      {!answer ? <p className="muted">{solved ? 'Comparing…' : 'Waiting for the solve of the latest edit…'}</p> : (
        <>
          <div className="side-by-side">
            <table className="data" data-testid="compare-zin">
              <caption>Impedance each source sees</caption>
              <thead><tr><th scope="col">Source</th><th scope="col">As drawn</th><th scope="col">{answer.winding} flipped</th></tr></thead>
              <tbody>
                {answer.inputImpedance.map((z) => (
                  <tr key={z.source}><th scope="row">{z.source}</th><td>{polarText(z.before, 'Ω')}<br /><small>{rectangularText(z.before, 'Ω')}</small></td><td>{polarText(z.after, 'Ω')}<br /><small>{rectangularText(z.after, 'Ω')}</small></td></tr>
                ))}
              </tbody>
            </table>
            {answer.connection && (
              <table className="data" data-testid="compare-connection">
                <caption>The pair is connected in {answer.connection.kind}, {answer.connection.sense} as drawn</caption>
                <tbody>
                  <tr><th scope="row">Aiding {answer.connection.kind === 'series' ? 'L1 + L2 + 2M' : '(L1·L2 − M²)/(L1 + L2 − 2M)'}</th><td>{formatSI(answer.connection.aiding, 'H', 4)}</td></tr>
                  <tr><th scope="row">Opposing {answer.connection.kind === 'series' ? 'L1 + L2 − 2M' : '(L1·L2 − M²)/(L1 + L2 + 2M)'}</th><td>{formatSI(answer.connection.opposing, 'H', 4)}</td></tr>
                  <tr><th scope="row">Measured from the solve, as drawn</th><td data-testid="measured-before">{answer.connection.measuredBefore === null ? '—' : formatSI(answer.connection.measuredBefore, 'H', 4)}</td></tr>
                  <tr><th scope="row">Measured, {answer.winding} flipped</th><td data-testid="measured-after">{answer.connection.measuredAfter === null ? '—' : formatSI(answer.connection.measuredAfter, 'H', 4)}</td></tr>
                </tbody>
              </table>
            )}
          </div>
          <table className="data" data-testid="compare-changes">
            <caption>{answer.changes.length ? `${answer.changes.length} quantities change (largest change first)` : 'Nothing changes: the flip does not matter here'}</caption>
            <thead><tr><th scope="col">Quantity</th><th scope="col">As drawn</th><th scope="col">{answer.winding} flipped</th><th scope="col">Difference</th><th scope="col">|after| − |before|</th></tr></thead>
            <tbody>
              {answer.changes.map((c) => {
                const u = UNIT[c.quantity];
                return (
                  <tr key={c.label} data-label={c.label} data-before={cabs(c.before)} data-after={cabs(c.after)}>
                    <th scope="row">{c.quantity === 'power' ? `${c.label} (P + jQ)` : c.label}</th>
                    <td>{c.quantity === 'power' ? rectangularText(c.before, u) : polarText(c.before, u)}</td>
                    <td>{c.quantity === 'power' ? rectangularText(c.after, u) : polarText(c.after, u)}</td>
                    <td>{c.quantity === 'power' ? rectangularText(c.delta, u) : polarText(c.delta, u)}</td>
                    <td>{formatSI(cabs(c.after) - cabs(c.before), u, 4)}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </>
      )}
    </div>
  );
}
