/** Frequency sweep: quantities, range, points, spacing; magnitude and phase plots with markers, cursor, legend, CSV; a slider on one value. */
import { useEffect, useMemo, useState } from 'react';
import { formatSI, parseSimple } from '../../model/quantity';
import type { GraphModel } from '../../model/graph';
import { sourceKindOf, sweepableOf } from '../../model/elementFacts';
import type { SweepQuantity } from '../../worker/protocol';
import { analysisStore, type SliderTarget, type SweepSettings } from '../../store/analysisStore';
import { useEditorState } from '../editorContext';
import { Plot, type PlotSeries } from './Plot';
import { csvComment } from '../../export/csvText';
import { csvOf, findPeaks, phaseZeros, toDb, type Marker } from './plotMath';
import { cancelSweep, decodeQ, encodeQ, labelOf, runSweep, traceOf } from './sweepRunner';
import { useAnalysis } from './useSolved';

export const TRACE_COLOURS = ['#2563a8', '#b45309', '#0d7463', '#9d174d', '#5b21b6', '#4d7c0f'];

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

function sliderTargets(model: GraphModel): (SliderTarget & { value: number })[] {
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

const fromPos = (t: SliderTarget, p: number) => (t.log ? t.min * (t.max / t.min) ** (p / 1000) : t.min + ((t.max - t.min) * p) / 1000);
const toPos = (t: SliderTarget, v: number) => Math.round(1000 * (t.log ? Math.log(v / t.min) / Math.log(t.max / t.min) : (v - t.min) / (t.max - t.min)));

export function SweepPanel() {
  const model = useEditorState((s) => s.derived?.model ?? null);
  const f0 = useEditorState((s) => s.sheet.frequencyHz);
  const sweep = useAnalysis((s) => s.sweep);
  const { settings } = sweep;
  const opts = useMemo(() => (model ? options(model) : []), [model]);
  const targets = useMemo(() => (model ? sliderTargets(model) : []), [model]);
  const [pick, setPick] = useState('');
  const [per, setPer] = useState('');
  const [fromText, setFromText] = useState(formatSI(settings.from, '', 4).replace(' ', ''));
  const [toText, setToText] = useState(formatSI(settings.to, '', 4).replace(' ', ''));
  const [rangeError, setRangeError] = useState<string | null>(null);
  const [cursor, setCursor] = useState<number | null>(null);

  // first opening: a range around the sheet frequency and the impedance the first source sees
  useEffect(() => {
    if (!model) return;
    // another sheet: keep the traces and slider that still name something on it
    const kept = settings.traces.filter((t) => namesIn(model, t.quantity));
    const slider = analysisStore.getState().sweep.slider;
    if (slider && !sliderTargets(model).some((x) => x.kind === slider.target.kind && x.id === slider.target.id)) {
      analysisStore.setState({ sweep: { ...analysisStore.getState().sweep, slider: null } });
    }
    if (kept.length !== settings.traces.length) setSettings({ traces: kept });
    if (kept.length) return;
    const src = model.elements.find((e) => sourceKindOf(e));
    const base = f0 > 0 ? f0 : 1000;
    const from = base / 10;
    const to = base * 10;
    setFromText(formatSI(from, '', 4).replace(' ', ''));
    setToText(formatSI(to, '', 4).replace(' ', ''));
    setSettings({ from, to, traces: src ? [traceOf({ kind: 'zin', source: src.id })] : [] });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [model]);

  const applyRange = () => {
    const a = parseSimple(fromText, 'Hz');
    const b = parseSimple(toText, 'Hz');
    if (a === null || b === null) return setRangeError('Write frequencies like 100, 20k or 1.5M');
    if (!(a > 0 && b > a)) return setRangeError('The range must run from above 0 Hz to a higher frequency');
    setRangeError(null);
    setSettings({ from: a, to: b });
  };

  const run = () => model && runSweep(model);
  const slider = sweep.slider;
  const ans = sweep.answer;
  const shown = sweep.shown;
  const plots = useMemo(() => {
    if (!ans) return null;
    const f = ans.frequenciesHz;
    const mag: PlotSeries[] = [];
    const ph: PlotSeries[] = [];
    const markers: { label: string; m: Marker }[] = [];
    ans.traces.forEach((tr, k) => {
      const t = shown[k];
      if (!t) return;
      const n = f.length;
      const lin = new Float64Array(n);
      const deg = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        lin[i] = Math.hypot(tr[2 * i], tr[2 * i + 1]);
        deg[i] = (Math.atan2(tr[2 * i + 1], tr[2 * i]) * 180) / Math.PI;
      }
      const shownMag = settings.db ? lin.map(toDb) : lin;
      const peaks = findPeaks(f, lin, 0.05, settings.log).map((m) => ({ ...m, value: settings.db ? toDb(m.value) : m.value }));
      const zeros = t.quantity.kind === 'zin' ? phaseZeros(f, deg, settings.log) : [];
      const colour = TRACE_COLOURS[k % TRACE_COLOURS.length];
      mag.push({ label: t.label, color: colour, y: shownMag, markers: [...peaks, ...zeros] });
      ph.push({ label: t.label, color: colour, y: deg });
      for (const m of [...peaks, ...zeros]) markers.push({ label: t.label, m });
    });
    return { f, mag, ph, markers };
  }, [ans, shown, settings.db, settings.log]);

  const exportCsv = () => {
    if (!ans) return;
    const header = ['frequency_Hz'];
    shown.forEach((t) => header.push(`${t.label} magnitude (${t.unit || 'ratio'})`, `${t.label} phase (deg)`, `${t.label} real`, `${t.label} imaginary`));
    const rows = ans.frequenciesHz.map((f, i) => {
      const r: number[] = [f];
      ans.traces.forEach((tr) => r.push(Math.hypot(tr[2 * i], tr[2 * i + 1]), (Math.atan2(tr[2 * i + 1], tr[2 * i]) * 180) / Math.PI, tr[2 * i], tr[2 * i + 1]));
      return r;
    });
    const amp = model?.amplitudes === 'peak' ? 'peak' : 'RMS';
    const blob = new Blob([`${csvComment(`Coilwright frequency sweep; ${amp} phasors`)}\n${csvOf(header, rows)}`], { type: 'text/csv' });
    const a = document.createElement('a');
    a.href = URL.createObjectURL(blob);
    a.download = 'sweep.csv';
    a.click();
    setTimeout(() => URL.revokeObjectURL(a.href), 1000);
  };

  if (!model) return <p className="muted">Nothing to sweep yet — place a source and some parts.</p>;
  return (
    <div className="sweep" data-testid="sweep-panel">
      <div className="row-controls">
        <label>From <input type="text" aria-label="Sweep from (Hz)" data-testid="sweep-from" value={fromText} onChange={(e) => setFromText(e.target.value)} onBlur={applyRange} onKeyDown={(e) => { e.stopPropagation(); if (e.key === 'Enter') applyRange(); }} /> Hz</label>
        <label>to <input type="text" aria-label="Sweep to (Hz)" data-testid="sweep-to" value={toText} onChange={(e) => setToText(e.target.value)} onBlur={applyRange} onKeyDown={(e) => { e.stopPropagation(); if (e.key === 'Enter') applyRange(); }} /> Hz</label>
        <label>Points <input type="number" min={2} max={100000} aria-label="Points" data-testid="sweep-points" value={settings.points} onChange={(e) => setSettings({ points: Math.max(2, Math.min(100000, Math.round(Number(e.target.value) || 2))) })} onKeyDown={(e) => e.stopPropagation()} /></label>
        <label><input type="radio" name="spacing" checked={settings.log} onChange={() => setSettings({ log: true })} /> log spacing</label>
        <label><input type="radio" name="spacing" checked={!settings.log} onChange={() => setSettings({ log: false })} /> linear</label>
        <label><input type="checkbox" checked={settings.db} onChange={(e) => setSettings({ db: e.target.checked })} aria-label="Magnitude in dB" /> magnitude in dB</label>
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
        <button type="button" className="cmd primary" data-testid="sweep-run" disabled={sweep.status === 'running' || !settings.traces.length} title="Solve at every frequency of the range (in the background)" onClick={run}>Run sweep</button>
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
      {plots && (
        <div className="plots">
          <div className="legend" aria-label="Legend">
            {plots.mag.map((s) => <span key={s.label}><span className="swatch" style={{ background: s.color }} />{s.label}</span>)}
          </div>
          <Plot testId="plot-magnitude" f={plots.f} series={plots.mag} log={settings.log} height={200} yLabel={settings.db ? 'magnitude' : 'magnitude'} yUnit={settings.db ? 'dB' : shown.length === 1 ? shown[0].unit : 'own units'} cursor={cursor} onCursor={setCursor} />
          <Plot testId="plot-phase" f={plots.f} series={plots.ph} log={settings.log} height={140} yLabel="phase" yUnit="°" yDomain={[-180, 180]} cursor={cursor} onCursor={setCursor} />
          <div className="readout" data-testid="sweep-readout">
            {cursor !== null && ans ? <>
              <strong>{formatSI(plots.f[cursor], 'Hz', 5)}</strong>
              {shown.map((t, k) => {
                const tr = ans.traces[k];
                if (!tr) return null;
                const m = Math.hypot(tr[2 * cursor], tr[2 * cursor + 1]);
                const d = (Math.atan2(tr[2 * cursor + 1], tr[2 * cursor]) * 180) / Math.PI;
                return <span key={t.label}> · {t.label}: {formatSI(m, t.unit, 4)}{settings.db ? ` (${toDb(m).toFixed(2)} dB)` : ''} ∠{d.toFixed(1)}°</span>;
              })}
            </> : <span className="muted">Point at a plot to read the values.</span>}
          </div>
          <ul className="markers" data-testid="sweep-markers" aria-label="Markers">
            {plots.markers.map(({ label, m }, j) => (
              <li key={j} data-kind={m.kind} data-frequency={m.frequency}>{label}: {m.kind === 'peak' ? 'peak' : 'resonance (phase 0°)'} at {formatSI(m.frequency, 'Hz', 5)}</li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
