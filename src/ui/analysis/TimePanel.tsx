/**
 * The time response view: stop time, resolution and start, run (in the
 * background, with progress and Cancel); the chosen voltages and currents on
 * one time axis (volts left, amperes right) with the phasor steady state
 * faint beside a sine-driven trace; zoom and pan; a cursor that reads every
 * trace and that the sheet follows with instantaneous arrows and tags; and
 * measurements over a chosen window. Hazard readouts, CSV, and the plot with
 * its table for the SVG sheet.
 */
import { useEffect, useMemo, useState } from 'react';
import type { GraphModel } from '../../model/graph';
import { formatSI, parseSimple } from '../../model/quantity';
import { csvComment } from '../../export/csvText';
import { analysisStore, type TimeQuantity, type TimeSettings } from '../../store/analysisStore';
import { useEditor, useEditorState } from '../editorContext';
import { download } from '../files';
import { provideAnalysisOutputs } from '../share/analysisHook';
import { plotsOnScreen } from '../share/analysisScreen';
import { csvOf } from './plotMath';
import { TRACE_COLOURS } from './sweepPlots';
import { TimePlot, type TimeSeries } from './TimePlot';
import { timeCautions } from './timeCautions';
import { lowerIndex, measure, nearestIndex, phasorAt, settlingTime, steadyGap, type Measures } from './timeMath';
import { measureTableSvg } from './timeExport';
import { cancelTime, runTime, setTime, steadyPhasor, timeKey, timeLabel, timeUnit, traceValues } from './timeRunner';
import { useAnalysis } from './useSolved';

const setSettings = (patch: Partial<TimeSettings>) => setTime({ settings: { ...analysisStore.getState().time.settings, ...patch } });

/** Every trace a model offers: node voltages, then each part's current and voltage (a two-port's per side). */
export function modelTimeOptions(model: GraphModel): TimeQuantity[] {
  const out: TimeQuantity[] = [];
  const nodes = [...new Set(model.elements.flatMap((e) => e.nodes))].filter((n) => n !== model.ground).sort();
  for (const n of nodes) out.push({ kind: 'node', node: n });
  for (const e of model.elements) {
    if (e.nodes.length === 2) out.push({ kind: 'current', element: e.id }, { kind: 'voltage', element: e.id });
    else for (const side of [0, 1] as const) out.push({ kind: 'current', element: e.id, side }, { kind: 'voltage', element: e.id, side });
  }
  return out;
}

/** A first choice of traces: the windings' currents (else the first part's), and the first source's voltage. */
function firstTraces(model: GraphModel): TimeQuantity[] {
  const windings = model.elements.filter((e) => e.kind === 'inductor').slice(0, 3);
  const src = model.elements.find((e) => e.kind === 'voltage-source' || e.kind === 'current-source');
  const out: TimeQuantity[] = windings.map((w) => ({ kind: 'current', element: w.id }));
  if (!out.length && model.elements[0]?.nodes.length === 2) out.push({ kind: 'current', element: model.elements[0].id });
  if (src) out.push({ kind: src.kind === 'voltage-source' ? 'voltage' : 'current', element: src.id });
  return out;
}

const inModel = (model: GraphModel, q: TimeQuantity) => modelTimeOptions(model).some((o) => timeKey(o) === timeKey(q));

const timeText = (t: number) => formatSI(t, 's', 4);

export interface MeasureRow { key: string; label: string; unit: string; m: Measures; settle: number | null; gap: number | null }

export function TimePanel() {
  const model = useEditorState((s) => s.derived?.model ?? null);
  const { store } = useEditor();
  const derived = useEditorState((s) => s.derived);
  const time = useAnalysis((s) => s.time);
  const { settings, answer } = time;
  const [stopText, setStopText] = useState(timeText(settings.stopS));
  const [stopError, setStopError] = useState<string | null>(null);
  const [pick, setPick] = useState('');
  const opts = useMemo(() => (model ? modelTimeOptions(model) : []), [model]);

  useEffect(() => setStopText(timeText(settings.stopS)), [settings.stopS]);
  // first opening (or another sheet): a stop time of a few periods and a first choice of traces
  useEffect(() => {
    if (!model) return;
    const kept = settings.traces.filter((q) => inModel(model, q));
    const patch: Partial<TimeSettings> = {};
    if (kept.length !== settings.traces.length) patch.traces = kept;
    if (!kept.length) {
      patch.traces = firstTraces(model);
      if (model.frequencyHz > 0 && settings.stopS === 0.1) patch.stopS = Number((10 / model.frequencyHz).toPrecision(6));
    }
    if (Object.keys(patch).length) setSettings(patch);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [model]);

  const applyStop = () => {
    const v = parseSimple(stopText, 's');
    if (v === null) return setStopError('Stop time: write a time like 20m, 100u or 0.5');
    if (!(v > 0)) return setStopError('Stop time: must be above 0 s');
    setStopError(null);
    setSettings({ stopS: v });
  };

  const t = answer?.timesS ?? new Float64Array(0);
  const stopS = t.length ? t[t.length - 1] : settings.stopS;
  const span: [number, number] = time.span ?? [0, stopS || 1];
  const freq = answer?.steady?.frequencyHz ?? 0;
  const amplitudes = answer?.steady?.amplitudes ?? 'rms';
  const series: TimeSeries[] = useMemo(() => {
    if (!answer) return [];
    const out: TimeSeries[] = [];
    settings.traces.forEach((q, k) => {
      const y = traceValues(answer, q);
      if (!y) return;
      const z = steadyPhasor(answer.steady, q);
      out.push({
        key: timeKey(q), label: timeLabel(q), unit: timeUnit(q), color: TRACE_COLOURS[k % TRACE_COLOURS.length], y,
        steady: z && freq > 0 ? (tt: number) => phasorAt(z, freq, amplitudes, tt) : undefined,
      });
    });
    return out;
  }, [answer, settings.traces, freq, amplitudes]);

  const win: [number, number] = time.window ?? [0, stopS];
  const rows: MeasureRow[] = useMemo(() => {
    if (!answer || !t.length) return [];
    const i0 = lowerIndex(t, win[0] - 1e-12 * stopS);
    // the last sample at or before the window's end
    const i1 = Math.max(i0, lowerIndex(t, win[1] + 1e-12 * stopS) - 1);
    return series.flatMap((s) => {
      const m = measure(t, s.y, i0, i1);
      if (!m) return [];
      const ref = s.steady ? (i: number) => s.steady!(t[i]) : undefined;
      const settle = settlingTime(t, s.y, i0, i1, 0.02, ref);
      // the last period of the run against the phasor steady state
      const gap = ref && freq > 0 ? steadyGap(s.y, ref, lowerIndex(t, stopS - 1 / freq)) : null;
      return [{ key: s.key, label: s.label, unit: s.unit, m, settle, gap }];
    });
  }, [answer, series, t, win, stopS, freq]);

  const cursorIndex = time.cursorS !== null && t.length ? nearestIndex(t, time.cursorS) : -1;
  const cautions = useMemo(() => (answer && time.sheetOf ? timeCautions(time.sheetOf, answer, answer.steady) : []), [answer, time.sheetOf]);

  // the plot and the measurements go onto the SVG sheet
  useEffect(() => provideAnalysisOutputs({
    plots: () => {
      const shown = plotsOnScreen();
      return rows.length ? [...shown, measureTableSvg(rows, win)] : shown;
    },
  }), [rows, win]);

  const exportCsv = () => {
    if (!answer || !series.length) return;
    const header = ['time_s', ...series.map((s) => `${s.label} (${s.unit})`)];
    const out: number[][] = [];
    for (let i = 0; i < t.length; i++) out.push([t[i], ...series.map((s) => s.y[i])]);
    download('time-response.csv', `${csvComment('Coilwright time response; instantaneous values')}\n${csvOf(header, out)}`, 'text/csv');
  };

  // the part a refusal names, to select on the sheet
  const named = time.culprits.find((c) => c.kind === 'element' && c.id);
  const culpritPart = named?.id && derived ? derived.partOfElement.get(named.id) : undefined;

  if (!model) return <p className="muted">Nothing to run yet — place a source and some parts.</p>;
  const running = time.status === 'running';
  const stale = answer && time.sheetOf !== model;
  return (
    <div className="time-view" data-testid="time-panel">
      <div className="row-controls">
        <label>Stop at <input type="text" aria-label="Stop time (s)" data-testid="time-stop" value={stopText} onChange={(e) => setStopText(e.target.value)} onBlur={applyStop} onKeyDown={(e) => { e.stopPropagation(); if (e.key === 'Enter') applyStop(); }} /> s</label>
        <label>Resolution <input type="number" min={10} max={200000} aria-label="Resolution (samples)" data-testid="time-samples" value={settings.samples}
          onChange={(e) => setSettings({ samples: Math.max(10, Math.min(200000, Math.round(Number(e.target.value) || 10))) })} onKeyDown={(e) => e.stopPropagation()} /> samples</label>
        <label>Start from <select aria-label="Start from" data-testid="time-start" value={settings.start} onChange={(e) => setSettings({ start: e.target.value as 'given' | 'dc' })}>
          <option value="given">the initial values given</option>
          <option value="dc">the DC operating point at t = 0</option>
        </select></label>
        <span className="muted">sample every {timeText(settings.stopS / settings.samples)}</span>
      </div>
      {stopError && <p className="field-error" role="alert">{stopError}</p>}
      <div className="row-controls">
        <label>Plot <select aria-label="Trace to add" data-testid="time-quantity" value={pick} onChange={(e) => setPick(e.target.value)}>
          <option value="">choose…</option>
          {opts.map((q) => <option key={timeKey(q)} value={timeKey(q)}>{timeLabel(q)} {q.kind === 'current' ? 'current' : q.kind === 'node' ? 'node voltage' : 'voltage across'}</option>)}
        </select></label>
        <button type="button" className="cmd" data-testid="time-add" disabled={!pick} onClick={() => {
          const q = opts.find((o) => timeKey(o) === pick);
          if (q && !settings.traces.some((x) => timeKey(x) === pick)) setSettings({ traces: [...settings.traces, q] });
          setPick('');
        }}>Add trace</button>
        <ul className="trace-list inline" aria-label="Traces">
          {settings.traces.map((q, k) => (
            <li key={timeKey(q)} data-testid="time-trace-item">
              <span className="swatch" style={{ background: TRACE_COLOURS[k % TRACE_COLOURS.length] }} /> {timeLabel(q)} ({timeUnit(q)})
              <button type="button" className="cmd" aria-label={`Remove trace ${timeLabel(q)}`} onClick={() => setSettings({ traces: settings.traces.filter((x) => x !== q) })}>×</button>
            </li>
          ))}
        </ul>
      </div>
      <div className="row-controls">
        <button type="button" className="cmd primary" data-testid="time-run" disabled={running} title="Solve the time response from 0 to the stop time (in the background)" onClick={() => runTime(model)}>Run</button>
        <button type="button" className="cmd" data-testid="time-cancel" disabled={!running} title="Stop the run" onClick={cancelTime}>Cancel</button>
        <progress className="progress" data-testid="time-progress" max={1} value={time.progress} aria-label="Run progress" />
        <span className="muted" data-testid="time-status" data-status={time.status}>
          {running ? `${Math.round(time.progress * 100)} %` : time.status === 'done' && answer ? `${t.length.toLocaleString('en')} samples in ${answer.ms.toFixed(0)} ms` : time.status === 'failed' ? '' : time.message}
        </span>
        <button type="button" className="cmd" data-testid="time-csv" disabled={!answer || !series.length} title="The chosen traces at every sample, as CSV" onClick={exportCsv}>CSV</button>
      </div>
      {time.status === 'failed' && (
        <p className="field-error" role="alert" data-testid="time-error">Not run: {time.message}
          {culpritPart && <> <button type="button" className="cmd" data-testid="time-error-show" title="Select the part this is about" onClick={() => store.setState({ selection: [culpritPart] })}>Show</button></>}
        </p>
      )}
      {stale && <p className="muted" data-testid="time-stale">The sheet has changed since this run: run again to see it (the sheet shows its phasors meanwhile).</p>}
      {answer && answer.warnings.length > 0 && (
        <ul className="time-warnings" data-testid="time-warnings">{answer.warnings.map((w, i) => <li key={i} className="caution">{w}</li>)}</ul>
      )}
      {cautions.map((c, i) => (c.hazard
        ? (
          <div key={i} className="notice notice-hazard full" role="alert" data-testid={`time-caution-${c.kind}`} data-peak={c.peak} data-at={c.atS}>
            <span className="hazard-mark" aria-hidden="true">⚠</span> <strong>{c.head}:</strong> <span className="notice-text">{c.text}</span>
          </div>
        )
        : <p key={i} className="muted" data-testid={`time-reading-${c.kind}`} data-peak={c.peak} data-at={c.atS}><strong>{c.head}:</strong> {c.text}</p>))}
      {answer && series.length > 0 && (
        <>
          <div className="row-controls">
            <button type="button" className="cmd" data-testid="time-zoom-in" title="Zoom in on the middle of the shown span (or the cursor)" onClick={() => {
              const c = time.cursorS ?? (span[0] + span[1]) / 2;
              const w = (span[1] - span[0]) / 4;
              setTime({ span: [Math.max(0, c - w), Math.min(stopS, c + w)] });
            }}>Zoom in</button>
            <button type="button" className="cmd" data-testid="time-zoom-out" onClick={() => {
              const c = (span[0] + span[1]) / 2;
              const w = span[1] - span[0];
              const lo = Math.max(0, c - w), hi = Math.min(stopS, c + w);
              setTime({ span: hi - lo >= stopS * (1 - 1e-9) ? null : [lo, hi] });
            }}>Zoom out</button>
            <button type="button" className="cmd" aria-label="Pan to earlier times" title="Earlier" onClick={() => {
              const w = span[1] - span[0];
              const a = Math.max(0, span[0] - w / 4);
              if (time.span) setTime({ span: [a, a + w] });
            }}>◀</button>
            <button type="button" className="cmd" aria-label="Pan to later times" title="Later" onClick={() => {
              const w = span[1] - span[0];
              const a = Math.min(stopS - w, span[0] + w / 4);
              if (time.span) setTime({ span: [a, a + w] });
            }}>▶</button>
            <button type="button" className="cmd" data-testid="time-whole" onClick={() => setTime({ span: null })}>Whole run</button>
            <span className="muted">shown {timeText(span[0])} to {timeText(span[1])}; drag on the plot to choose the measuring window</span>
          </div>
          <TimePlot t={t} series={series} span={span} stopS={stopS} cursorS={time.cursorS} window={time.window} height={240}
            onCursor={(c) => { if (c !== null) setTime({ cursorS: c }); }}
            onWindow={(w) => setTime({ window: w })}
            onSpan={(s) => setTime({ span: s })} />
          <table className="readings time-cursor" data-testid="time-readings" data-cursor={cursorIndex >= 0 ? t[cursorIndex] : ''}>
            <caption>At the cursor{cursorIndex >= 0 ? `, t = ${timeText(t[cursorIndex])}` : ' (move over the plot, or focus it and use the arrow keys)'}</caption>
            <tbody>
              {series.map((s) => (
                <tr key={s.key} data-name={s.label}>
                  <th scope="row"><span className="swatch" style={{ background: s.color }} /> {s.label}</th>
                  <td data-testid="time-reading" data-value={cursorIndex >= 0 ? s.y[cursorIndex] : ''}>{cursorIndex >= 0 ? formatSI(s.y[cursorIndex], s.unit, 4) : '—'}</td>
                  {s.steady && <td className="muted">steady state {cursorIndex >= 0 ? formatSI(s.steady(t[cursorIndex]), s.unit, 4) : '—'}</td>}
                </tr>
              ))}
            </tbody>
          </table>
          <div className="row-controls">
            <span data-testid="time-window-text" data-from={win[0]} data-to={win[1]}>Measured over {timeText(win[0])} to {timeText(win[1])}</span>
            <button type="button" className="cmd" data-testid="time-window-shown" onClick={() => setTime({ window: [span[0], span[1]] })}>Measure the shown span</button>
            <button type="button" className="cmd" data-testid="time-window-all" onClick={() => setTime({ window: null })}>Measure the whole run</button>
          </div>
          <table className="readings time-measures" data-testid="time-measures">
            <thead>
              <tr><th scope="col">trace</th><th scope="col">peak</th><th scope="col">time of peak</th><th scope="col">peak-to-peak</th><th scope="col">mean</th><th scope="col">RMS</th><th scope="col" title="after the window's start, until it stays within 2 % (of its swing to the final value, or of the steady state's peak about the steady state)">settling time (2 %)</th>{rows.some((r) => r.gap !== null) && <th scope="col" title="the largest departure from the phasor steady state over the run's last period, as a share of the steady state's peak">last period off steady state</th>}</tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.key} data-name={r.label}>
                  <th scope="row">{r.label}</th>
                  <td data-testid="measure-peak" data-value={r.m.peak}>{formatSI(r.m.peak, r.unit, 4)}</td>
                  <td data-testid="measure-peak-time" data-value={r.m.timeOfPeak}>{timeText(r.m.timeOfPeak)}</td>
                  <td data-testid="measure-pp" data-value={r.m.peakToPeak}>{formatSI(r.m.peakToPeak, r.unit, 4)}</td>
                  <td data-testid="measure-mean" data-value={r.m.mean}>{formatSI(r.m.mean, r.unit, 4)}</td>
                  <td data-testid="measure-rms" data-value={r.m.rms}>{formatSI(r.m.rms, r.unit, 4)}</td>
                  <td data-testid="measure-settle" data-value={r.settle ?? ''}>{r.settle === null ? 'not settled' : timeText(r.settle)}</td>
                  {rows.some((x) => x.gap !== null) && <td data-testid="measure-gap" data-value={r.gap ?? ''}>{r.gap === null ? '—' : `${(100 * r.gap).toPrecision(3)} %`}</td>}
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </div>
  );
}
