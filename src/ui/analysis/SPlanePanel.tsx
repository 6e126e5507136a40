/**
 * The s-domain view: pick the input source and the output (a node's voltage,
 * or a part's voltage or current); the worker computes H(s) with the solver's
 * transfer function. Shown: H written out (factored and as polynomials), the
 * poles (×) and zeros (○) on the s-plane with the jω axis, each root's ω0, f,
 * ζ and Q on hover and in a table, and the natural frequencies of the whole
 * circuit, those this pair does not see marked.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import { useStore } from 'zustand';
import type { ComplexJson } from '../../model/graph';
import { formatSI } from '../../model/quantity';
import { sourceKindOf } from '../../model/elementFacts';
import type { TransferAnswer } from '../../worker/protocol';
import { analysisClient } from './client';
import { factoredText, polynomialText, rootFacts, rootText, sPlaneCsv } from './splane';
import { useSolved } from './useSolved';
import { useEditorState } from '../editorContext';
import { sPlaneStore, type SPlaneState } from '../../store/sPlaneStore';

const W = 420;
const H = 300;
const PAD = 28;

function factsText(p: ComplexJson): string {
  const f = rootFacts(p);
  if (f.omega0 === 0) return 's = 0 (an integrator or a free constant)';
  const zeta = f.zeta === null ? '' : `, ζ = ${f.zeta.toFixed(4)}`;
  const q = f.q === null ? (f.zeta !== null && f.zeta <= 0 ? ', undamped or growing' : '') : `, Q = ${formatSI(f.q, '', 4).trim()}`;
  return `s = ${rootText(p)} rad/s: ω0 = ${formatSI(f.omega0, 'rad/s', 4)}, f = ${formatSI(f.hz, 'Hz', 4)}${zeta}${q}`;
}

function SPlane({ answer, pair }: { answer: TransferAnswer; pair: string }) {
  const all = [...answer.poles, ...answer.zeros, ...answer.naturalFrequencies];
  const span = Math.max(1e-12, ...all.map((p) => Math.max(Math.abs(p.re), Math.abs(p.im)))) * 1.15;
  const x = (re: number) => W / 2 + (re / span) * (W / 2 - PAD);
  const y = (im: number) => H / 2 - (im / span) * (H / 2 - PAD);
  const [hover, setHover] = useState<string | null>(null);
  return (
    <figure className="splane">
      <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`Poles and zeros of H(s), ${pair}`} data-testid="splane-plot">
        <rect x={0} y={0} width={W / 2} height={H} fill="currentColor" opacity={0.04} />
        <line x1={PAD / 2} y1={H / 2} x2={W - PAD / 2} y2={H / 2} stroke="currentColor" opacity={0.5} />
        <line x1={W / 2} y1={PAD / 2} x2={W / 2} y2={H - PAD / 2} stroke="currentColor" strokeWidth={1.6} />
        <text x={W / 2 + 4} y={PAD / 2 + 8} fontSize={11}>jω</text>
        <text x={W - PAD} y={H / 2 - 4} fontSize={11}>σ</text>
        <text x={4} y={H - 6} fontSize={10} opacity={0.7}>{`±${formatSI(span, 'rad/s', 3)} across`}</text>
        {answer.naturalFrequencies.map((p, i) => !answer.seen[i] && (
          <circle key={`n${i}`} cx={x(p.re)} cy={y(p.im)} r={3} fill="none" stroke="currentColor" strokeDasharray="2 2" opacity={0.6}
            data-testid="splane-unseen" onMouseEnter={() => setHover(`not seen by this pair: ${factsText(p)}`)} onMouseLeave={() => setHover(null)}>
            <title>{`natural frequency not seen by this input and output: ${factsText(p)}`}</title>
          </circle>
        ))}
        {answer.zeros.map((z, i) => (
          <circle key={`z${i}`} cx={x(z.re)} cy={y(z.im)} r={5} fill="none" stroke="#1b6fa8" strokeWidth={2} data-testid="splane-zero"
            onMouseEnter={() => setHover(`zero ${factsText(z)}`)} onMouseLeave={() => setHover(null)}>
            <title>{`zero ${factsText(z)}`}</title>
          </circle>
        ))}
        {answer.poles.map((p, i) => (
          <g key={`p${i}`} data-testid="splane-pole" data-re={p.re} data-im={p.im}
            onMouseEnter={() => setHover(`pole ${factsText(p)}`)} onMouseLeave={() => setHover(null)}>
            <title>{`pole ${factsText(p)}`}</title>
            <rect x={x(p.re) - 7} y={y(p.im) - 7} width={14} height={14} fill="transparent" />
            <path d={`M${x(p.re) - 5},${y(p.im) - 5}L${x(p.re) + 5},${y(p.im) + 5}M${x(p.re) + 5},${y(p.im) - 5}L${x(p.re) - 5},${y(p.im) + 5}`} stroke="#b8431d" strokeWidth={2.2} />
          </g>
        ))}
      </svg>
      <figcaption className="muted" data-testid="splane-hover">{hover ?? '× pole, ○ zero, dashed: a natural frequency this pair does not see. Hover one for ω0, f, ζ and Q.'}</figcaption>
    </figure>
  );
}

export function SPlanePanel() {
  const solved = useSolved();
  const model = solved?.model;
  const sources = useMemo(() => model?.elements.filter((e) => sourceKindOf(e)) ?? [], [model]);
  const outputs = useMemo(() => {
    if (!solved) return [];
    const nodes = Object.keys(solved.result.nodes).map((n) => ({ value: `node:${n}`, label: `node ${n} (voltage)` }));
    const parts = solved.model.elements.filter((e) => !sourceKindOf(e)).flatMap((e) => [
      { value: `voltage:${e.id}`, label: `voltage across ${e.id}` },
      { value: `current:${e.id}`, label: `current through ${e.id}` },
    ]);
    return [...nodes, ...parts];
  }, [solved]);
  const { input, output, picking, pickNote, answer, markOnSweep } = useStore(sPlaneStore);
  const setInput = (v: string) => sPlaneStore.setState({ input: v, picking: null, pickNote: '' });
  const setOutput = (v: string) => sPlaneStore.setState({ output: v, picking: null, pickNote: '' });
  const inp = sources.find((s) => s.id === input)?.id ?? sources[0]?.id ?? '';
  const out = outputs.find((o) => o.value === output)?.value ?? outputs[outputs.length - 1]?.value ?? '';
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    if (!model || !inp || !out) return;
    let live = true;
    setError(null);
    analysisClient().transfer(model, inp, out).then(
      (a) => { if (live) { sPlaneStore.setState({ answer: a, model }); setError(null); } },
      (e: Error) => { if (live) { sPlaneStore.setState({ answer: null, model: null }); setError(e.message); } },
    );
    return () => { live = false; };
  }, [model, inp, out]);
  const sourceIds = useMemo(() => sources.map((s) => s.id), [sources]);
  usePickOnSheet(sourceIds, out);
  if (!solved) return <p className="muted">Waiting for the solve of the latest edit…</p>;
  if (!sources.length) return <p className="muted">The s-domain view needs a voltage or current source as the input; the sheet has none.</p>;
  const current = answer && answer.input === inp && answer.output === out ? answer : null;
  const outLabel = outputs.find((o) => o.value === out)?.label ?? out;
  return (
    <div className="sdomain" data-testid="sdomain-panel">
      <div className="row-buttons">
        <label>Input <select data-testid="tf-input" value={inp} onChange={(e) => setInput(e.target.value)}>
          {sources.map((s) => <option key={s.id} value={s.id}>{s.id}</option>)}
        </select></label>
        <PickButton which="input" picking={picking} />
        <label>Output <select data-testid="tf-output" value={out} onChange={(e) => setOutput(e.target.value)}>
          {outputs.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
        </select></label>
        <PickButton which="output" picking={picking} />
        <button type="button" className="cmd" data-testid="tf-csv" disabled={!current} onClick={() => current && download(sPlaneCsv(current))}>CSV</button>
        <label className="muted"><input type="checkbox" data-testid="tf-mark-sweep" checked={markOnSweep} onChange={(e) => sPlaneStore.setState({ markOnSweep: e.target.checked })} /> mark the poles on the sweep</label>
      </div>
      {picking && <p className="muted" role="status" data-testid="tf-pick-hint">{picking === 'input' ? 'Click a voltage or current source on the drawing to make it the input.' : 'Click a part on the drawing for its voltage (or current, if the output is a current now), or a wire for its node’s voltage.'}</p>}
      {pickNote && <p className="field-error" role="alert" data-testid="tf-pick-note">{pickNote}</p>}
      <p className="muted">H(s) = Y(s)/U(s) with every other source set to zero and every initial value zero; roots in rad/s. On the jω axis H(j2πf) is the phasor ratio the solve gives at f.</p>
      {error && <p className="field-error" role="alert">{error}</p>}
      {!error && !current && <p className="muted">Working out H(s)…</p>}
      {current && (
        <div className="side-by-side">
          <SPlane answer={current} pair={`from ${inp} to ${outLabel}`} />
          <div>
            <p data-testid="tf-factored"><code>{factoredText(current.gain, current.zeros, current.poles)}</code></p>
            {current.gain !== 0 && (
              <p data-testid="tf-polynomials">
                numerator <code>{polynomialText(current.numerator)}</code><br />
                denominator <code>{polynomialText(current.denominator)}</code>
              </p>
            )}
            {current.warnings.map((w) => <p key={w} className="muted" role="note">{w}</p>)}
            <table className="data" data-testid="tf-natural">
              <caption>Natural frequencies of the whole circuit</caption>
              <thead><tr><th scope="col">s (rad/s)</th><th scope="col">f</th><th scope="col">ζ</th><th scope="col">Q</th><th scope="col">in this H</th></tr></thead>
              <tbody>
                {current.naturalFrequencies.map((p, i) => {
                  const f = rootFacts(p);
                  return (
                    <tr key={i} data-seen={current.seen[i]} data-re={p.re} data-im={p.im}>
                      <td className="num">{rootText(p)}</td>
                      <td className="num">{formatSI(f.hz, 'Hz', 4)}</td>
                      <td className="num">{f.zeta === null ? '—' : f.zeta.toFixed(4)}</td>
                      <td className="num">{f.q === null ? '—' : formatSI(f.q, '', 4)}</td>
                      <td>{current.seen[i] ? 'a pole' : 'not seen'}</td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        </div>
      )}
    </div>
  );
}

function download(text: string) {
  const a = document.createElement('a');
  a.href = URL.createObjectURL(new Blob([text], { type: 'text/csv' }));
  a.download = 'transfer-function.csv';
  a.click();
  setTimeout(() => URL.revokeObjectURL(a.href), 1000);
}

function PickButton({ which, picking }: { which: 'input' | 'output'; picking: SPlaneState['picking'] }) {
  const on = picking === which;
  return (
    <button type="button" className="cmd" aria-pressed={on} data-testid={`tf-pick-${which}`}
      title={on ? 'Stop picking' : `Pick the ${which} on the drawing`}
      onClick={() => sPlaneStore.setState({ picking: on ? null : which, pickNote: '' })}>
      {on ? 'Picking…' : 'Pick on sheet'}
    </button>
  );
}

/**
 * While a pick is on, the next part or wire selected on the drawing becomes the input (a source) or the
 * output (a part's voltage, or its current when the output was a current; a wire's node voltage).
 */
function usePickOnSheet(sourceIds: string[], out: string) {
  const picking = useStore(sPlaneStore, (s) => s.picking);
  const selection = useEditorState((s) => s.selection);
  const sheet = useEditorState((s) => s.sheet);
  const solved = useSolved();
  const atStart = useRef<string[] | null>(null);
  useEffect(() => {
    atStart.current = picking ? selection : null;
  }, [picking]); // the selection when the pick starts, not as it changes
  useEffect(() => {
    if (!picking || !solved || selection === atStart.current || selection.length !== 1) return;
    const id = selection[0];
    atStart.current = selection; // answered once
    let element: string | undefined;
    for (const [e, part] of solved.circuit.partOfElement) if (part === id) element = e;
    const wire = sheet.wires.findIndex((w) => w.id === id);
    const part = sheet.parts.find((p) => p.id === id);
    const name = part ? `“${part.ref}”` : 'that';
    if (picking === 'input') {
      if (element && sourceIds.includes(element)) sPlaneStore.setState({ input: element, picking: null, pickNote: '' });
      else sPlaneStore.setState({ pickNote: `${name} is not a voltage or current source: click a source to make it the input` });
      return;
    }
    if (element && !sourceIds.includes(element)) {
      sPlaneStore.setState({ output: `${out.startsWith('current:') ? 'current' : 'voltage'}:${element}`, picking: null, pickNote: '' });
    } else if (wire >= 0) {
      sPlaneStore.setState({ output: `node:${solved.circuit.topology.wireNodes[wire]}`, picking: null, pickNote: '' });
    } else {
      sPlaneStore.setState({ pickNote: `${name} cannot be the output: click a part that is not a source, or a wire` });
    }
  }, [picking, selection, solved, sheet, sourceIds, out]);
}
