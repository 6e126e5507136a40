/** Power balance: P, Q, |S| and power factor per part; totals; efficiency from a source to a load; the Tellegen check. */
import { isDissipative, sourceKindOf } from '../../model/elementFacts';
import { useEffect, useState } from 'react';
import type { PowerAnswer } from '../../worker/protocol';
import { formatSI } from '../../model/quantity';
import { analysisClient } from './client';
import { useSolved } from './useSolved';

/** P or Q below a billionth of |S| is rounding: shown as 0. */
function clean<T extends { watts: number; vars: number; va: number }>(r: T): T {
  const tiny = 1e-9 * r.va;
  return { ...r, watts: Math.abs(r.watts) < tiny ? 0 : r.watts, vars: Math.abs(r.vars) < tiny ? 0 : r.vars };
}

export function PowerPanel() {
  const solved = useSolved();
  const [answer, setAnswer] = useState<PowerAnswer | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [source, setSource] = useState('');
  const [load, setLoad] = useState('');
  useEffect(() => {
    if (!solved) return;
    let live = true;
    analysisClient().power(solved.model, solved.result).then((a) => live && (setAnswer(a), setError(null)), (e: Error) => live && setError(e.message));
    return () => { live = false; };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [solved?.result]);
  if (error) return <p className="field-error">{error}</p>;
  if (!answer) return <p className="muted">{solved ? 'Adding up…' : 'Waiting for the solve of the latest edit…'}</p>;
  const byId = new Map(solved?.model.elements.map((e) => [e.id, e]) ?? []);
  const sources = answer.rows.filter((r) => byId.has(r.id) && sourceKindOf(byId.get(r.id)!));
  const loads = answer.rows.filter((r) => byId.has(r.id) && isDissipative(byId.get(r.id)!));
  const src = sources.find((r) => r.id === source) ?? sources[0];
  const ld = loads.find((r) => r.id === load) ?? loads[loads.length - 1];
  const delivered = src ? -src.watts : 0;
  const eff = src && ld && delivered > 0 ? ld.watts / delivered : null;
  const conv = answer.amplitudes === 'rms' ? 'RMS phasors: S = V·I*' : 'peak phasors: S = ½·V·I*';
  return (
    <div className="power" data-testid="power-panel">
      <p className="muted">Absorbed power (a part that delivers shows negative P); {conv}. Power factor P/|S| in the direction the power flows: lagging when the current lags the voltage, as it does into an inductive load (Q &gt; 0 absorbed) and out of a source that sees one (Q &gt; 0 delivered).</p>
      <div className="side-by-side">
        <table className="data" data-testid="power-table">
          <thead><tr><th scope="col">Part</th><th scope="col">P</th><th scope="col">Q</th><th scope="col">|S|</th><th scope="col">pf</th></tr></thead>
          <tbody>
            {answer.rows.map((r) => clean(r)).map((r) => (
              <tr key={r.id} data-id={r.id} data-watts={r.watts}>
                <th scope="row">{r.id}</th>
                <td className="num">{formatSI(r.watts, 'W', 4)}</td>
                <td className="num">{formatSI(r.vars, 'var', 4)}</td>
                <td className="num">{formatSI(r.va, 'VA', 4)}</td>
                <td className="num" data-testid={`pf-${r.id}`}>{r.powerFactor === null ? '—' : `${r.powerFactor.toFixed(3)} ${r.vars === 0 ? '' : r.sense ?? ''}`.trim()}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <div>
          <table className="data" data-testid="power-totals">
            <tbody>
              <tr><th scope="row">Delivered by the sources</th><td>{formatSI(answer.delivered.watts, 'W', 4)}, {formatSI(answer.delivered.vars, 'var', 4)}</td></tr>
              <tr><th scope="row">Absorbed by the resistors</th><td data-testid="power-dissipated">{formatSI(answer.dissipated, 'W', 4)}</td></tr>
              <tr><th scope="row">Tellegen check (Σ S over all parts)</th><td data-testid="power-tellegen" data-relative={answer.tellegen.relative}>{formatSI(answer.tellegen.watts, 'W', 3)}, {formatSI(answer.tellegen.vars, 'var', 3)} — {answer.tellegen.relative < 1e-9 ? 'balanced' : `off by ${(answer.tellegen.relative * 100).toExponential(1)} %`}</td></tr>
            </tbody>
          </table>
          {src && ld && (
            <div className="row-controls">
              <label>Efficiency from <select aria-label="Source for efficiency" value={src.id} onChange={(e) => setSource(e.target.value)}>{sources.map((r) => <option key={r.id}>{r.id}</option>)}</select></label>
              <label>to <select aria-label="Load for efficiency" value={ld.id} onChange={(e) => setLoad(e.target.value)}>{loads.map((r) => <option key={r.id}>{r.id}</option>)}</select></label>
              <strong data-testid="power-efficiency">{eff === null ? `${src.id} delivers no real power` : `${(eff * 100).toFixed(2)} %`}</strong>
            </div>
          )}
        </div>
      </div>
    </div>
  );
}
