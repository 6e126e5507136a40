/** Coupling inspector: L1, L2, M and k (M from k or k from M), and the pair's state at the solved currents. */
import { Fragment, useEffect, useState } from 'react';
import type { InspectAnswer } from '../../worker/protocol';
import * as E from '../../model/edits';
import { formatEditable, formatSI } from '../../model/quantity';
import { commit } from '../../store/actions';
import { couplingTitle } from '../../model/couplingName';
import { useEditor, useEditorState } from '../editorContext';
import { Field, quantity } from '../Field';
import { analysisClient } from './client';
import { polarText, rectangularText } from './format';
import { graphCouplingId, selectedCoupling, useSolved } from './useSolved';
import { kRangeProblem, mRangeProblem } from './couplingRange';
import { pairEquations } from '../../model/pairEquations';
import { couplingFromBench, FIELDS, type BenchMethod } from '../../model/couplingMeasure';
import './analysis.css';
import { mutualLimit } from '../../model/mutual';

/** "L2 and L3", "L2, L3 and L4". */
const listed = (names: string[]) => (names.length < 2 ? names.join('') : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`);

export function CouplingInspector() {
  const couplingId = useEditorState(selectedCoupling);
  if (!couplingId) return null;
  return <Inspector couplingId={couplingId} />;
}

function Inspector({ couplingId }: { couplingId: string }) {
  const { store } = useEditor();
  const sheet = useEditorState((s) => s.sheet);
  const solved = useSolved();
  const [answer, setAnswer] = useState<InspectAnswer | null>(null);
  const [error, setError] = useState<string | null>(null);
  const c = sheet.couplings.find((x) => x.id === couplingId)!;
  const windings = c.windings.map((w) => sheet.parts.find((p) => p.id === w)!);
  const two = windings.length === 2;
  const [l1, l2] = [windings[0]?.value ?? 0, windings[1]?.value ?? 0];
  const mMax = mutualLimit(l1, l2);
  const k = c.by === 'k' ? c.value : mMax > 0 ? c.value / mMax : 0;
  const m = c.by === 'M' ? c.value : c.value * mMax;
  const gid = solved ? graphCouplingId(solved.circuit.couplingOfId, couplingId) : null;

  useEffect(() => {
    if (!solved || !gid || !two) return;
    let live = true;
    analysisClient()
      .inspect(solved.model, solved.result, gid, [windings[0].ref, windings[1].ref])
      .then((a) => live && (setAnswer(a), setError(null)), (e: Error) => live && setError(e.message));
    return () => { live = false; };
    // the answer belongs to the solved circuit
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [solved?.result, gid]);

  const patch = (by: 'k' | 'M', value: number) => commit(store, E.updateCoupling(store.getState().sheet, couplingId, { by, value }));
  if (!two) return <section className="panel inspector" aria-label="Coupling inspector"><p className="muted">{couplingTitle(sheet, c)} couples {windings.length} windings; the inspector reads pairs.</p></section>;
  const unit = answer?.amplitudes === 'peak' ? 'peak' : 'RMS';
  return (
    <section className="panel inspector" aria-label="Coupling inspector" data-testid="coupling-inspector">
      <h2 className="panel-title">Coupling inspector · {couplingTitle(sheet, c)}</h2>
      <dl className="kv">
        <dt>L1 ({windings[0].ref})</dt><dd>{formatSI(l1, 'H', 4)}</dd>
        <dt>L2 ({windings[1].ref})</dt><dd>{formatSI(l2, 'H', 4)}</dd>
      </dl>
      <div className="pair-fields">
        <Field
          live label="k (coupling coefficient)" value={formatEditable(k, '')} testId="inspector-k"
          hint={`0 to 1; sets M = k·√(L1·L2) = ${formatSI(m, 'H', 4)}`}
          apply={async (t) => {
            const r = await quantity(t, '', kRangeProblem);
            if ('reason' in r) return r.reason;
            patch('k', r.value);
            return null;
          }}
        />
        <Field
          live label="M (mutual inductance)" unit="H" value={formatEditable(m, 'H')} testId="inspector-m"
          hint={`0 to √(L1·L2) = ${formatSI(mMax, 'H', 4)}; sets k = M/√(L1·L2)`}
          apply={async (t) => {
            const r = await quantity(t, 'H', (v) => mRangeProblem(v, l1, l2));
            if ('reason' in r) return r.reason;
            patch('M', r.value);
            return null;
          }}
        />
      </div>
      <BenchCalculator names={[windings[0].ref, windings[1].ref]} l1={l1} l2={l2} apply={(kv) => patch('k', kv)} />
      <ThreeDomains
        names={[windings[0].ref, windings[1].ref]} henries={[l1, l2]} mutual={m}
        dots={[windings[0].dot ?? 'first', windings[1].dot ?? 'first']} frequencyHz={sheet.frequencyHz}
        initialAmps={[windings[0].initialAmps ?? 0, windings[1].initialAmps ?? 0]} />
      {!solved ? <p className="muted">Waiting for the solve of the latest edit…</p> : error ? <p className="field-error">{error}</p> : answer && (
        <div data-testid="inspector-state">
          <h3 className="sub">At the solved currents ({formatSI(answer.frequencyHz, 'Hz', 4)}, {unit})</h3>
          <dl className="kv">
            <dt>Flux linkage λ of {answer.windings[0]}</dt><dd>{polarText(answer.flux[0], 'Wb')}</dd>
            <dt>Flux linkage λ of {answer.windings[1]}</dt><dd>{polarText(answer.flux[1], 'Wb')}</dd>
            <dt>Stored energy (time average)</dt><dd data-testid="inspector-energy">{formatSI(answer.energyJ, 'J', 4)}</dd>
            <dt>The two currents</dt><dd data-testid="inspector-interaction">{answer.interaction === 'aiding' ? 'aid each other’s flux' : answer.interaction === 'opposing' ? 'oppose each other’s flux' : 'neither aid nor oppose on average (they are 90° apart, or one is zero)'}</dd>
            {[0, 1].map((t) => (
              <Fragment key={t}>
                <dt>Reflected into {answer.windings[t]}{answer.reflectedFrom[t].length > 1 ? ` by ${listed(answer.reflectedFrom[t])} together` : '’s loop'}</dt>
                <dd data-testid={`inspector-reflected-${t}`}>{polarText(answer.reflected[t], 'Ω')}<br /><small>{rectangularText(answer.reflected[t], 'Ω')}</small></dd>
              </Fragment>
            ))}
            {answer.connection && (
              <>
                <dt>Connected in {answer.connection.kind}, {answer.connection.sense}</dt>
                <dd data-testid="inspector-connection">
                  L = {formatSI(answer.connection.inductance, 'H', 4)} ({answer.connection.kind === 'series' ? `L1 + L2 ${answer.connection.sense === 'aiding' ? '+' : '−'} 2M` : `(L1·L2 − M²)/(L1 + L2 ${answer.connection.sense === 'aiding' ? '−' : '+'} 2M)`});
                  {' '}{answer.connection.sense === 'aiding' ? 'opposing' : 'aiding'} would give {formatSI(answer.connection.otherSense, 'H', 4)}
                </dd>
              </>
            )}
            {answer.sources.map((s) => (
              <SourceRow key={s.id} id={s.id} z={s.z} />
            ))}
          </dl>
          <p className="muted small">{answer.reflectedFrom.some((p) => p.length > 1)
            ? 'Reflected impedance Z_in − jωL from the full loop: the winding taken out of its circuit and driven, every partner loaded by its own circuit and coupled to the others (not a sum of pairwise (ωM)²/Z₂₂, which would ignore the partners’ coupling to each other).'
            : 'Reflected impedance (ωM)²/Z₂₂ with Z₂₂ the partner loop’s own impedance; it does not depend on the dots.'}</p>
        </div>
      )}
    </section>
  );
}

function SourceRow({ id, z }: { id: string; z: InspectAnswer['sources'][number]['z'] }) {
  return (
    <>
      <dt>{id} sees</dt>
      <dd data-testid={`inspector-zin-${id}`}>{polarText(z, 'Ω')}<br /><small>{rectangularText(z, 'Ω')}</small></dd>
    </>
  );
}

/** The pair's law in the time, phasor and s domains, with the present values and the sign the dots give. */
function ThreeDomains(props: Parameters<typeof pairEquations>[0]) {
  const eq = pairEquations(props);
  const rows = [['Time', eq.time], ['Phasor', eq.phasor], ['s-domain', eq.s]] as const;
  return (
    <details className="three-domains" data-testid="inspector-equations" open>
      <summary>The pair in three domains (dots give {eq.sign > 0 ? '+M' : '−M'})</summary>
      {rows.map(([title, pair]) => (
        <div key={title} data-testid={`equations-${title === 'Time' ? 'time' : title === 'Phasor' ? 'phasor' : 's'}`}>
          <h3 className="sub">{title}</h3>
          {pair.map((e) => (
            <p key={e.symbols} className="equation"><code>{e.symbols}</code><br /><code>{e.values}</code></p>
          ))}
        </div>
      ))}
      <p className="muted small">The sign of the M terms is d1·d2, with d = +1 for a dot on a winding’s first terminal and −1 on its second; i(0) are the windings’ initial currents (details panel).</p>
    </details>
  );
}

const METHOD_LABELS: Record<BenchMethod, string> = {
  series: 'series aiding and opposing (M = (L_aid − L_opp)/4)',
  'open-short': 'one winding with the other open and shorted (k = √(1 − L_sc/L_oc))',
  'voltage-ratio': 'voltage ratio with the other winding open (M = L_driven·V_open/V_driven)',
};

/** Bench readings → k and M, applied to the link as one undoable edit. */
function BenchCalculator({ names, l1, l2, apply }: { names: [string, string]; l1: number; l2: number; apply: (k: number) => void }) {
  const [method, setMethod] = useState<BenchMethod>('series');
  const [vals, setVals] = useState<{ a: number | null; b: number | null }>({ a: null, b: null });
  const [driven, setDriven] = useState<0 | 1>(0);
  const [labels, unit] = [FIELDS[method].slice(0, 2), FIELDS[method][2]];
  const answer = vals.a !== null && vals.b !== null ? couplingFromBench({ method, a: vals.a, b: vals.b, driven }, l1, l2) : null;
  const entry = (key: 'a' | 'b', label: string) => (
    <Field key={`${method}-${key}`} label={label} unit={unit} testId={`bench-${key}`} value={vals[key] === null ? '' : formatEditable(vals[key]!, unit)}
      apply={async (t) => {
        const r = await quantity(t, unit, (v) => (Number.isFinite(v) && v >= 0 ? null : `${label} must be zero or more`));
        if ('reason' in r) return r.reason;
        setVals((v) => ({ ...v, [key]: r.value }));
        return null;
      }} />
  );
  return (
    <details className="bench" data-testid="bench-calculator">
      <summary>k and M from bench readings</summary>
      <fieldset className="radio">
        <legend>Measured</legend>
        {(Object.keys(METHOD_LABELS) as BenchMethod[]).map((m) => (
          <label key={m}><input type="radio" name="bench-method" data-testid={`bench-method-${m}`} checked={method === m} onChange={() => { setMethod(m); setVals({ a: null, b: null }); }} /> {METHOD_LABELS[m]}</label>
        ))}
      </fieldset>
      {method === 'voltage-ratio' && (
        <label className="field"><span className="label">driven winding</span>
          <select data-testid="bench-driven" value={driven} onChange={(e) => setDriven(Number(e.target.value) as 0 | 1)}>
            <option value={0}>{names[0]}</option><option value={1}>{names[1]}</option>
          </select>
        </label>
      )}
      {entry('a', labels[0])}
      {entry('b', labels[1])}
      {answer && !answer.ok && <p className="field-error" role="alert" data-testid="bench-problem">{answer.reason}</p>}
      {answer && answer.ok && (
        <div data-testid="bench-answer">
          <p>k = {Number(answer.k.toPrecision(5))}, M = {formatSI(answer.m, 'H', 5)} (with {names[0]} = {formatSI(l1, 'H', 4)}, {names[1]} = {formatSI(l2, 'H', 4)})</p>
          {answer.note && <p className="muted small">{answer.note}</p>}
          <button type="button" className="cmd" data-testid="bench-apply" onClick={() => apply(answer.k)}>Apply k = {Number(answer.k.toPrecision(5))} to the link</button>
        </div>
      )}
    </details>
  );
}
