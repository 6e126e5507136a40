/** T-equivalent of a linked pair: arms, notes, a port check; draw it on the sheet in place, and put the pair back. */
import { useEffect, useState } from 'react';
import type { TAnswer } from '../../worker/protocol';
import { formatSI } from '../../model/quantity';
import { portAgreement } from '../../model/resultCompare';
import { drawTEquivalent, latestSubstitution } from '../../store/analysisActions';
import { analysisStore } from '../../store/analysisStore';
import { couplingTitle } from '../../model/couplingName';
import { useEditor, useEditorState } from '../editorContext';
import { CommandButton } from '../CommandButton';
import { analysisClient } from './client';
import { graphCouplingId, selectedCoupling, useAnalysis, useSolved } from './useSolved';

const ARM_NAMES: Record<string, string> = { arm1: 'series arm 1 (L1 − M)', arm2: 'series arm 2 (L2 − M)', shunt: 'shunt arm (M)' };

export function TEquivalentPanel() {
  const { store } = useEditor();
  const sheet = useEditorState((s) => s.sheet);
  const sheetId = useEditorState((s) => s.sheetId);
  const picked = useEditorState(selectedCoupling);
  const solved = useSolved();
  const pairs = sheet.couplings.filter((c) => c.windings.length === 2);
  const [choice, setChoice] = useState<string | null>(null);
  const coupling = pairs.find((c) => c.id === (choice ?? picked)) ?? pairs[0];
  const [answer, setAnswer] = useState<TAnswer | null>(null);
  const [error, setError] = useState<string | null>(null);
  const gid = solved && coupling ? graphCouplingId(solved.circuit.couplingOfId, coupling.id) : null;
  useEffect(() => {
    setAnswer(null);
    if (!solved || !gid) return;
    let live = true;
    analysisClient().tCheck(solved.model, gid).then((a) => live && (setAnswer(a), setError(null)), (e: Error) => live && setError(e.message));
    return () => { live = false; };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [solved?.result, gid]);

  // the check on the sheet itself: once the T is solved, compare with the solve before it
  const subs = useAnalysis((s) => s.substitutions);
  const latest = subs.filter((x) => x.sheetId === sheetId).at(-1) ?? null;
  useEffect(() => {
    if (!latest || latest.check || !latest.before || !solved) return;
    if (!latest.record.added.every((id) => sheet.parts.some((p) => p.id === id))) return;
    const check = portAgreement(latest.before, solved.result, new Set(latest.record.windings.map((w) => w.part.ref)), new Set(latest.record.reversed), latest.record.arms);
    analysisStore.setState({ substitutions: analysisStore.getState().substitutions.map((x) => (x === latest ? { ...x, check } : x)) });
  }, [latest, solved, sheet]);
  const drawn = latest && latestSubstitution(store) === latest ? latest : null;

  return (
    <div className="tequiv" data-testid="t-panel">
      {drawn && (
        <div className="t-drawn" data-testid="t-drawn">
          <p>The pair of <strong>{drawn.record.name}</strong> is drawn as its T-equivalent: arms {Object.values(drawn.record.arms).join(' and ')} in series, one shunt arm, joined by wires.{' '}
            {drawn.check ? (
              <span data-testid="t-sheet-check" data-maxrel={drawn.check.maxRel}>Port voltages and currents against the pair: largest difference {(drawn.check.maxRel * 100).toExponential(1)} % over {drawn.check.compared} values — {drawn.check.maxRel < 1e-6 ? 'they agree to rounding' : 'they differ'}.</span>
            ) : <span className="muted">checking the ports…</span>}
          </p>
          <CommandButton id="analysis-put-back">Put the pair back</CommandButton>
        </div>
      )}
      {!pairs.length ? (!drawn && <p className="muted">No linked pair on this sheet: link two windings (select both, press K) to see their T-equivalent.</p>) : (
        <>
          <div className="row-controls">
            <label>Pair{' '}
              <select aria-label="Linked pair for the T-equivalent" value={coupling.id} onChange={(e) => setChoice(e.target.value)}>
                {pairs.map((c) => <option key={c.id} value={c.id}>{couplingTitle(sheet, c)}</option>)}
              </select>
            </label>
            <button type="button" className="cmd primary" data-testid="t-draw" disabled={!answer} title="Replace the pair on the sheet with its T-equivalent drawn in place (one undo step)"
              onClick={() => answer && drawTEquivalent(store, coupling.id, { arm1: answer.arm1, arm2: answer.arm2, shunt: answer.shunt, shared: answer.shared, outerPins: answer.outerPins }, solved?.result ?? null)}>
              Draw T-equivalent on the sheet
            </button>
          </div>
          {error && <p className="field-error">{error}</p>}
          {answer && (
            <>
              <table className="data" data-testid="t-arms">
                <caption>Arms ({answer.windings[0]} and {answer.windings[1]}; M = {formatSI(answer.m, 'H', 4)} with its sign from the dots)</caption>
                <tbody>
                  <tr data-arm="arm1"><th scope="row">{ARM_NAMES.arm1}</th><td>{formatSI(answer.arm1, 'H', 4)}</td></tr>
                  <tr data-arm="arm2"><th scope="row">{ARM_NAMES.arm2}</th><td>{formatSI(answer.arm2, 'H', 4)}</td></tr>
                  <tr data-arm="shunt"><th scope="row">{ARM_NAMES.shunt}</th><td>{formatSI(answer.shunt, 'H', 4)}</td></tr>
                </tbody>
              </table>
              <ul className="notes" data-testid="t-notes">
                {answer.negativeArms.length > 0 && <li className="caution">Negative: {answer.negativeArms.map((a) => ARM_NAMES[a]).join(', ')}. A negative arm is valid for analysis but is not a part you can buy.</li>}
                {!answer.shared && <li className="caution">The windings share no terminal: the T-equivalent joins the two sides and removes the isolation, so it holds only for the port voltages and currents.</li>}
                <li data-testid="t-check" data-maxrel={answer.check.maxRel}>Check: solved with the pair and with the T, the port voltages and currents differ by at most {(answer.check.maxRel * 100).toExponential(1)} % ({answer.check.compared} values).</li>
              </ul>
            </>
          )}
        </>
      )}
    </div>
  );
}
