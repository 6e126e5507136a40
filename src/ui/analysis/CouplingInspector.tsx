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
