/**
 * Sweep: over the frequency or over one part's value (or a coupling's k) at
 * the sheet's frequency; quantities, range, points, spacing; magnitude (in dB
 * against each quantity's reference) and phase plots with peak, −3 dB and
 * resonance marks and their readouts, cursor, legend, CSV; a slider on one value.
 */
import { useEffect, useMemo, useState } from 'react';
import { formatSI, parseSimple } from '../../model/quantity';
import type { GraphModel } from '../../model/graph';
import { sourceKindOf, sweepableOf } from '../../model/elementFacts';
import type { SweepQuantity } from '../../worker/protocol';
import { analysisStore, type SliderTarget, type SweepSettings, type ValueSweep } from '../../store/analysisStore';
import { useEditorState } from '../editorContext';
import { Plot, type PlotMark } from './Plot';
import { csvComment } from '../../export/csvText';
import { csvOf } from './plotMath';
import { cancelSweep, decodeQ, encodeQ, labelOf, runSweep, traceOf } from './sweepRunner';
import { phaseDeg, sweepPlots, traceDb, TRACE_COLOURS } from './sweepPlots';
import { dbOf, engLabel } from './plotMath';
import { hasValueTarget } from '../../model/valueTarget';
import { useAnalysis } from './useSolved';
import { useStore } from 'zustand';
import { sPlaneStore } from '../../store/sPlaneStore';
import { poleMarks } from './splane';

export { TRACE_COLOURS };

const setSettings = (patch: Partial<SweepSettings>) => {
  const s = analysisStore.getState().sweep;
  analysisStore.setState({ sweep: { ...s, settings: { ...s.settings, ...patch } } });
};

/** Every plottable single quantity of a model, as select options. */
function options(model: GraphModel) {
  const nodes = [...new Set(model.elements.flatMap((e) => e.nodes))].filter((n) => n !== model.ground).sort();
  const out: { value: string; label: string }[] = [];
  for (const n of nodes) out.push({ value: encodeQ({ kind: 'node', node: n }), label: `V(${n}) node voltage` });
  for (const e of model.elements) {
    if (e.nodes.length > 2) continue; // a two-port (ideal transformer) reports its sides in pairs
    if (sourceKindOf(e)) out.push({ value: encodeQ({ kind: 'zin', source: e.id }), label: `Z seen by ${e.id}` });
    out.push({ value: encodeQ({ kind: 'current', element: e.id }), label: `I(${e.id}) current` });
    out.push({ value: encodeQ({ kind: 'voltage', element: e.id }), label: `V(${e.id}) across` });
    out.push({ value: encodeQ({ kind: 'power', element: e.id }), label: `S into ${e.id} (power)` });
  }
  return out;
}

/** Whether every name a quantity uses is in the model. */
function namesIn(model: GraphModel, q: SweepQuantity): boolean {
  switch (q.kind) {
    case 'node': return model.elements.some((e) => e.nodes.includes(q.node));
    case 'zin': return model.elements.some((e) => e.id === q.source && !!sourceKindOf(e));
    case 'ratio': return namesIn(model, q.num) && namesIn(model, q.den);
    default: return model.elements.some((e) => e.id === q.element);
  }
}

export function sliderTargets(model: GraphModel): (SliderTarget & { value: number })[] {
  const out: (SliderTarget & { value: number })[] = [];
  for (const c of model.couplings ?? []) {
    if (c.k !== undefined) out.push({ kind: 'coupling', id: c.id, label: `k of ${c.windings.join('–')}`, min: 0, max: 1, log: false, unit: '', value: c.k });
  }
  for (const e of model.elements) {
    const v = sweepableOf(e);
    if (v) out.push({ kind: 'part', id: e.id, label: `${e.id} ${v.what}`, min: v.value / v.span, max: v.value * v.span, log: true, unit: v.unit, value: v.value });
  }
  return out;
}

/** A value sweep over a slider target, from its low to its high end. */
export function valueSweepOf(t: SliderTarget): ValueSweep {
  return { target: { kind: t.kind, id: t.id }, label: t.label, unit: t.unit, from: t.kind === 'coupling' ? 0.01 : t.min, to: t.kind === 'coupling' ? 0.99 : t.max };
}

const short = (v: number, unit: string) => (unit === '' ? String(Number(v.toPrecision(4))) : unit === 'Hz' ? formatSI(v, '', 4).replace(' ', '') : formatSI(v, unit, 4));

const fromPos = (t: SliderTarget, p: number) => (t.log ? t.min * (t.max / t.min) ** (p / 1000) : t.min + ((t.max - t.min) * p) / 1000);
const toPos = (t: SliderTarget, v: number) => Math.round(1000 * (t.log ? Math.log(v / t.min) / Math.log(t.max / t.min) : (v - t.min) / (t.max - t.min)));

export function SweepPanel({ marks: extraMarks = [] }: { marks?: PlotMark[] } = {}) {
  const model = useEditorState((s) => s.derived?.model ?? null);
  const f0 = useEditorState((s) => s.sheet.frequencyHz);
  const sweep = useAnalysis((s) => s.sweep);
  const { settings } = sweep;
  const opts = useMemo(() => (model ? options(model) : []), [model]);
  const targets = useMemo(() => (model ? sliderTargets(model) : []), [model]);
  const [pick, setPick] = useState('');
  const [per, setPer] = useState('');
  const over = settings.over;
  const unit = over ? over.unit : 'Hz';
  const lo = over ? over.from : settings.from;
  const hi = over ? over.to : settings.to;
  const [fromText, setFromText] = useState(short(lo, unit));
  const [toText, setToText] = useState(short(hi, unit));
  const [rangeError, setRangeError] = useState<string | null>(null);
  const [cursor, setCursor] = useState<number | null>(null);
  // the range fields follow the settings (another sheet's, or another swept value)
  useEffect(() => {
    setFromText(short(lo, unit));
    setToText(short(hi, unit));
    setRangeError(null);
  }, [lo, hi, unit]);

  // first opening: a range around the sheet frequency and the impedance the first source sees
  useEffect(() => {
    if (!model) return;
    // another sheet: keep the traces, swept value and slider that still name something on it
    const kept = settings.traces.filter((t) => namesIn(model, t.quantity));
    const slider = analysisStore.getState().sweep.slider;
    if (slider && !sliderTargets(model).some((x) => x.kind === slider.target.kind && x.id === slider.target.id)) {
      analysisStore.setState({ sweep: { ...analysisStore.getState().sweep, slider: null } });
    }
    const patch: Partial<SweepSettings> = {};
    if (settings.over && !hasValueTarget(model, settings.over.target)) patch.over = null;
    if (kept.length !== settings.traces.length) patch.traces = kept;
    if (!kept.length) {
      const src = model.elements.find((e) => sourceKindOf(e));
      const base = f0 > 0 ? f0 : 1000;
      Object.assign(patch, { from: base / 10, to: base * 10, traces: src ? [traceOf({ kind: 'zin', source: src.id })] : [] });
    }
    if (Object.keys(patch).length) setSettings(patch);
    // settings kept from an earlier visit, whose sweep had run: run it again
    const now = analysisStore.getState().sweep;
    if (now.autoRun) {
      analysisStore.setState({ sweep: { ...now, autoRun: false } });
      if (now.settings.traces.length && now.status === 'idle') runSweep(model);
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [model]);

  const applyRange = () => {
    const a = parseSimple(fromText, unit === 'Hz' ? 'Hz' : unit);
    const b = parseSimple(toText, unit === 'Hz' ? 'Hz' : unit);
    if (!over) {
      if (a === null || b === null) return setRangeError('Write frequencies like 100, 20k or 1.5M');
      if (!(a > 0 && b > a)) return setRangeError('The range must run from above 0 Hz to a higher frequency');
      setRangeError(null);
      return setSettings({ from: a, to: b });
    }
    if (a === null || b === null) return setRangeError(`Write values of ${over.label} like 10, 4.7k or 2.2m`);
    if (!(b > a)) return setRangeError(`The values of ${over.label} must run from a lower to a higher one`);
    if (over.target.kind === 'coupling' && !(a >= 0 && b <= 1)) return setRangeError('A coupling coefficient k runs from 0 to 1');
    if (over.target.kind === 'part' && !(a > 0)) return setRangeError(`The values of ${over.label} must be above 0`);
    if (settings.log && !(a > 0)) return setRangeError('Log spacing needs values above 0: start above 0 or choose linear');
    setRangeError(null);
    setSettings({ over: { ...over, from: a, to: b } });
  };

  const run = () => model && runSweep(model);
  const slider = sweep.slider;
  const ans = sweep.answer;
  const shown = sweep.shown;
  const shownOver = sweep.shownOver ?? null;
  // a coupling's k is a pure number: its ticks read 0.25, not 250 m
  const xUnit = shownOver ? shownOver.unit || '1' : 'Hz';
  const plots = useMemo(() => (ans ? sweepPlots(ans, shown, { db: settings.db, log: settings.log, xUnit }) : null), [ans, shown, settings.db, settings.log, xUnit]);
  // the poles of the pair the s-domain view last showed for this sheet, on a frequency sweep
  const splane = useStore(sPlaneStore);
  const poles = useMemo(() => {
    if (!ans || shownOver || !splane.markOnSweep || !splane.answer || !splane.model || !model) return [];
    if (splane.model !== model && JSON.stringify(splane.model) !== JSON.stringify(model)) return [];
    const f = ans.frequenciesHz;
    return poleMarks(splane.answer, f[0], f[f.length - 1]);
  }, [ans, shownOver, splane, model]);
  const logShown = ans ? (() => {
    const x = ans.values ?? ans.frequenciesHz;
    const n = x.length;
    // the grid the answer was solved on: log when its steps grow in ratio
    return n > 2 && x[0] > 0 && Math.abs(x[1] / x[0] - x[n - 1] / x[n - 2]) < 1e-6 * (x[1] / x[0]);
  })() : settings.log;

  const exportCsv = () => {
    if (!ans) return;
    const header = ['frequency_Hz'];
    if (ans.values && shownOver) header.push(`${shownOver.label}${shownOver.unit ? ` (${shownOver.unit})` : ''}`);
    shown.forEach((t) => header.push(`${t.label} magnitude (${t.unit || 'ratio'})`, `${t.label} phase (deg)`, `${t.label} real`, `${t.label} imaginary`));
    const rows = ans.frequenciesHz.map((f, i) => {
      const r: number[] = [f];
      if (ans.values) r.push(ans.values[i]);
      ans.traces.forEach((tr) => r.push(Math.hypot(tr[2 * i], tr[2 * i + 1]), phaseDeg(tr[2 * i], tr[2 * i + 1]), tr[2 * i], tr[2 * i + 1]));
      return r;
    });
    const amp = model?.amplitudes === 'peak' ? 'peak' : 'RMS';
    const what = ans.values && shownOver ? `sweep of ${shownOver.label} at ${formatSI(ans.frequenciesHz[0], 'Hz', 6)}` : 'frequency sweep';
    const blob = new Blob([`${csvComment(`Coilwright ${what}; ${amp} phasors`)}\n${csvOf(header, rows)}`], { type: 'text/csv' });
    const a = document.createElement('a');
    a.href = URL.createObjectURL(blob);
    a.download = 'sweep.csv';
    a.click();
    setTimeout(() => URL.revokeObjectURL(a.href), 1000);
  };

  if (!model) return <p className="muted">Nothing to sweep yet — place a source and some parts.</p>;
  const unitShown = over ? over.unit : 'Hz';
  return (
    <div className="sweep" data-testid="sweep-panel">
      <div className="row-controls">
        <label>Sweep <select aria-label="What to sweep" data-testid="sweep-over" value={over ? `${over.target.kind}:${over.target.id}` : ''} onChange={(e) => {
          const t = targets.find((x) => `${x.kind}:${x.id}` === e.target.value);
          setCursor(null);
          setSettings({ over: t ? valueSweepOf(t) : null, ...(t && t.kind === 'coupling' ? { log: false } : {}) });
        }}>
          <option value="">the frequency</option>
          {targets.map((t) => <option key={`${t.kind}:${t.id}`} value={`${t.kind}:${t.id}`}>{t.label}</option>)}
        </select></label>
        {over && <span className="muted" data-testid="sweep-fixed">at {formatSI(f0, 'Hz', 4)}, the sheet's frequency</span>}
      </div>
      <div className="row-controls">
        <label>From <input type="text" aria-label={`Sweep from (${unitShown || 'value'})`} data-testid="sweep-from" value={fromText} onChange={(e) => setFromText(e.target.value)} onBlur={applyRange} onKeyDown={(e) => { e.stopPropagation(); if (e.key === 'Enter') applyRange(); }} /> {unitShown}</label>
        <label>to <input type="text" aria-label={`Sweep to (${unitShown || 'value'})`} data-testid="sweep-to" value={toText} onChange={(e) => setToText(e.target.value)} onBlur={applyRange} onKeyDown={(e) => { e.stopPropagation(); if (e.key === 'Enter') applyRange(); }} /> {unitShown}</label>
        <label>Points <input type="number" min={2} max={over ? 5000 : 100000} aria-label="Points" data-testid="sweep-points" value={settings.points} onChange={(e) => setSettings({ points: Math.max(2, Math.min(over ? 5000 : 100000, Math.round(Number(e.target.value) || 2))) })} onKeyDown={(e) => e.stopPropagation()} /></label>
        <label><input type="radio" name="spacing" checked={settings.log} onChange={() => setSettings({ log: true })} /> log spacing</label>
        <label><input type="radio" name="spacing" checked={!settings.log} onChange={() => setSettings({ log: false })} /> linear</label>
        <label><input type="checkbox" checked={settings.db} onChange={(e) => setSettings({ db: e.target.checked })} aria-label="Magnitude in dB" data-testid="sweep-db" /> magnitude in dB</label>
      </div>
      {rangeError && <p className="field-error" role="alert">{rangeError}</p>}
      <div className="row-controls">
        <label>Plot <select aria-label="Quantity to plot" data-testid="sweep-quantity" value={pick} onChange={(e) => setPick(e.target.value)}>
          <option value="">choose…</option>
          {opts.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
        </select></label>
        <label>divided by <select aria-label="Divide by (for a ratio)" data-testid="sweep-per" value={per} onChange={(e) => setPer(e.target.value)}>
          <option value="">nothing</option>
          {opts.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
        </select></label>
        <button type="button" className="cmd" data-testid="sweep-add" disabled={!pick} title="Add this quantity as a trace" onClick={() => {
          const q = per ? { kind: 'ratio' as const, num: decodeQ(pick), den: decodeQ(per) } : decodeQ(pick);
          if (!settings.traces.some((t) => encodeQ(t.quantity) === encodeQ(q))) setSettings({ traces: [...settings.traces, traceOf(q)] });
          setPick(''); setPer('');
        }}>Add trace</button>
      </div>
      <ul className="trace-list" aria-label="Traces">
        {settings.traces.map((t, k) => (
          <li key={encodeQ(t.quantity)} data-testid="sweep-trace">
            <span className="swatch" style={{ background: TRACE_COLOURS[k % TRACE_COLOURS.length] }} /> {labelOf(t.quantity)} {t.unit ? `(${t.unit})` : ''}
            <button type="button" className="cmd" aria-label={`Remove trace ${t.label}`} title="Remove this trace" onClick={() => setSettings({ traces: settings.traces.filter((x) => x !== t) })}>×</button>
          </li>
        ))}
      </ul>
      <div className="row-controls">
        <button type="button" className="cmd primary" data-testid="sweep-run" disabled={sweep.status === 'running' || !settings.traces.length} title={over ? `Solve at every value of ${over.label} (in the background)` : 'Solve at every frequency of the range (in the background)'} onClick={run}>Run sweep</button>
        <button type="button" className="cmd" data-testid="sweep-cancel" disabled={sweep.status !== 'running'} title="Stop the sweep" onClick={cancelSweep}>Cancel</button>
        <progress className="progress" data-testid="sweep-progress" max={1} value={sweep.progress} aria-label="Sweep progress" />
        <span className="muted" data-testid="sweep-status" data-status={sweep.status}>
          {sweep.status === 'running' ? `${Math.round(sweep.progress * 100)} %` : sweep.status === 'done' && ans ? `${ans.frequenciesHz.length} points in ${ans.ms.toFixed(0)} ms` : sweep.message}
        </span>
        <button type="button" className="cmd" data-testid="sweep-csv" disabled={!ans} title="Save the swept data as CSV" onClick={exportCsv}>Save CSV</button>
      </div>
      <div className="row-controls slider-row">
        <label>Slider on <select aria-label="Value the slider changes" data-testid="slider-target" value={slider ? `${slider.target.kind}:${slider.target.id}` : ''} onChange={(e) => {
          const t = targets.find((x) => `${x.kind}:${x.id}` === e.target.value);
          analysisStore.setState({ sweep: { ...analysisStore.getState().sweep, slider: t ? { target: t, value: t.value } : null } });
        }}>
          <option value="">nothing</option>
          {targets.map((t) => <option key={`${t.kind}:${t.id}`} value={`${t.kind}:${t.id}`}>{t.label}</option>)}
        </select></label>
        {slider && (
          <>
            <input type="range" min={0} max={1000} step={1} aria-label={`${slider.target.label}`} data-testid="slider" value={toPos(slider.target, slider.value)} onChange={(e) => {
              const value = fromPos(slider.target, Number(e.target.value));
              analysisStore.setState({ sweep: { ...analysisStore.getState().sweep, slider: { target: slider.target, value } } });
              if (model) runSweep(model);
            }} onKeyDown={(e) => e.stopPropagation()} />
            <span data-testid="slider-value">{slider.target.label} = {slider.target.unit ? formatSI(slider.value, slider.target.unit, 4) : slider.value.toFixed(3)}</span>
            <span className="muted">(the plot only; the sheet keeps its value)</span>
          </>
        )}
      </div>
      {plots && ans && (
        <div className="plots">
          <div className="legend" aria-label="Legend">
            {plots.mag.map((s, k) => <span key={s.label}><span className="swatch" style={{ background: s.color }} />{s.label}{settings.db && shown[k] ? ` (${traceDb(shown[k]).unit})` : ''}</span>)}
            {shownOver && <span className="muted">against {shownOver.label}, at {formatSI(ans.frequenciesHz[0], 'Hz', 4)}</span>}
          </div>
          <Plot testId="plot-magnitude" x={plots.x} xUnit={xUnit} xLabel={shownOver ? shownOver.label : 'frequency'} series={plots.mag} log={logShown} height={200} yLabel="magnitude" yUnit={plots.yUnit} cursor={cursor} onCursor={setCursor} marks={[...plots.marks, ...poles, ...extraMarks]} />
          <Plot testId="plot-phase" x={plots.x} xUnit={xUnit} xLabel={shownOver ? shownOver.label : 'frequency'} series={plots.ph} log={logShown} height={140} yLabel="phase" yUnit="°" yDomain={[-180, 180]} cursor={cursor} onCursor={setCursor} />
          <div className="readout" data-testid="sweep-readout">
            {cursor !== null && cursor < plots.x.length ? <>
              <strong>{shownOver ? `${shownOver.label} = ` : ''}{engLabel(plots.x[cursor], xUnit, 5)}</strong>
              {shown.map((t, k) => {
                const tr = ans.traces[k];
                if (!tr) return null;
                const m = Math.hypot(tr[2 * cursor], tr[2 * cursor + 1]);
                const d = phaseDeg(tr[2 * cursor], tr[2 * cursor + 1]);
                const db = traceDb(t);
                return <span key={t.label}> · {t.label}: {formatSI(m, t.unit, 4)}{settings.db && m > 0 ? ` (${dbOf(m, db).toFixed(2)} ${db.unit})` : ''} ∠{d.toFixed(1)}°</span>;
              })}
            </> : <span className="muted">Point at a plot to read the values.</span>}
          </div>
          <ul className="markers" data-testid="sweep-markers" aria-label="Markers">
            {plots.lines.map((l, j) => (
              <li key={j} data-kind={l.kind} data-frequency={l.x} data-trace={l.trace}>{l.text}</li>
            ))}
            {poles.map((m) => (
              <li key={`pole-${m.x}`} data-kind="pole" data-frequency={m.x}>{m.label}, from the s-domain view ({splane.answer!.input} to {splane.answer!.output})</li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
