/**
 * The harmonic view: the steady state of periodic sources as a sum of
 * harmonics, worked out in the analysis worker (the solver's
 * harmonicSteadyState). The user sets how many harmonics and picks the
 * quantities; shown are one period of each rebuilt from its harmonics, a card
 * per quantity (true RMS, DC, fundamental, THD) with its table of harmonics
 * (order, frequency, magnitude, phase, power), and the power the sources
 * deliver and the resistors absorb at each harmonic.
 */
import { useEffect, useMemo, useState } from 'react';
import type { HarmonicSeries, PowerJson } from '../../model/graph';
import { DEFAULT_HARMONIC_COUNT, rebuildPeriod } from '../../model/fourier';
import { sourceKindOf } from '../../model/elementFacts';
import { formatAngle, formatSI } from '../../model/quantity';
import type { HarmonicAnswer } from '../../worker/protocol';
import { analysisClient } from './client';
import { cabs, cdeg } from './format';
import { niceCeil } from './plotMath';
import { VoltsAmpsPlot } from './VoltsAmpsPlot';
import { TRACE_COLOURS } from './sweepPlots';
import { useSolved } from './useSolved';

/** The most harmonics this view asks for (the worker's VIEW_MAX_HARMONICS). */
const MAX_COUNT = 5000;
/** Rows a table of harmonics shows until the user asks for all of them. */
const FIRST_ROWS = 40;

/** The rows to draw: the first FIRST_ROWS, or all once asked for, with the button that asks. */
function useRows(total: number): { shown: number; more: React.ReactNode } {
  const [all, setAll] = useState(false);
  const shown = all ? total : Math.min(total, FIRST_ROWS);
  const more = shown < total
    ? <button type="button" className="cmd" onClick={() => setAll(true)}>Show all {total} harmonics</button>
    : null;
  return { shown, more };
}

interface Pick { key: string; label: string; unit: 'V' | 'A'; series: HarmonicSeries; power?: PowerJson[] }

function candidates(a: HarmonicAnswer): Pick[] {
  const out: Pick[] = [];
  for (const [id, e] of Object.entries(a.elements)) {
    if (e.voltage && e.current) {
      out.push({ key: `v:${id}`, label: `V(${id})`, unit: 'V', series: e.voltage, power: e.power }, { key: `i:${id}`, label: `I(${id})`, unit: 'A', series: e.current, power: e.power });
    } else if (e.voltages && e.currents) {
      ['primary', 'secondary'].forEach((side, s) => out.push(
        { key: `v:${id}:${s}`, label: `V(${id} ${side})`, unit: 'V', series: e.voltages![s] },
        { key: `i:${id}:${s}`, label: `I(${id} ${side})`, unit: 'A', series: e.currents![s] },
      ));
    }
  }
  for (const [n, s] of Object.entries(a.nodes)) out.push({ key: `n:${n}`, label: `V(${n})`, unit: 'V', series: s });
  return out;
}

const pct = (v: number) => `${(v * 100).toFixed(v < 0.1 ? 2 : 1)} %`;

export function HarmonicPanel() {
  const solved = useSolved();
  const model = solved?.model;
  const [count, setCount] = useState(DEFAULT_HARMONIC_COUNT);
  const [countText, setCountText] = useState(String(DEFAULT_HARMONIC_COUNT));
  const [countError, setCountError] = useState<string | null>(null);
  const [run, setRun] = useState<{ model: unknown; count: number; answer: HarmonicAnswer | null; error: string | null } | null>(null);
  const [chosen, setChosen] = useState<string[] | null>(null);
  useEffect(() => {
    if (!model) return;
    let live = true;
    analysisClient().harmonics(model, count).then(
      (answer) => live && setRun({ model, count, answer, error: null }),
      (e: Error) => live && setRun({ model, count, answer: null, error: e.message }),
    );
    return () => { live = false; };
  }, [model, count]);
  const current = run && run.model === model && run.count === count ? run : null;
  const all = useMemo(() => (current?.answer ? candidates(current.answer) : []), [current?.answer]);
  const takeCount = () => {
    const v = Number(countText.trim());
    if (!/^\d+$/.test(countText.trim()) || !(v >= 1 && v <= MAX_COUNT)) {
      setCountError(`Harmonics: "${countText}" is not a whole number from 1 to ${MAX_COUNT}`);
      return;
    }
    setCountError(null);
    setCount(v);
  };
  if (!solved) return <p className="muted">Waiting for the solve of the latest edit…</p>;
  const firstSource = solved.model.elements.find((e) => sourceKindOf(e))?.id;
  const keys = chosen ?? (firstSource ? [`v:${firstSource}`, `i:${firstSource}`] : []);
  const picks = keys.map((k) => all.find((p) => p.key === k)).filter((p): p is Pick => !!p);
  const toggle = (k: string) => setChosen(keys.includes(k) ? keys.filter((x) => x !== k) : [...keys, k]);
  const a = current?.answer ?? null;
  return (
    <div className="harmonics" data-testid="harmonic-panel">
      <div className="row-controls">
        <label>Harmonics up to <input type="text" inputMode="numeric" data-testid="harmonic-count" aria-label="Highest harmonic solved" value={countText}
          onChange={(e) => setCountText(e.target.value)} onBlur={takeCount} onKeyDown={(e) => { if (e.key === 'Enter') takeCount(); }} /></label>
        <label>Add <select aria-label="Quantity to rebuild" value="" onChange={(e) => e.target.value && toggle(e.target.value)}>
          <option value="">choose…</option>
          {all.filter((p) => !keys.includes(p.key)).map((p) => <option key={p.key} value={p.key}>{p.label}</option>)}
        </select></label>
        {a && <span className="muted" data-testid="harmonic-summary">fundamental {formatSI(a.fundamentalHz, 'Hz', 4)}; {a.orders.length} harmonics solved up to order {a.count} (those at which a source is non-zero); {a.amplitudes === 'rms' ? 'RMS' : 'peak'} phasors</span>}
      </div>
      {countError && <p className="field-error" role="alert">{countError}</p>}
      <p className="muted">The steady state once the start-up has died away: each harmonic of the sources solved as a phasor circuit and the results added. {DEFAULT_HARMONIC_COUNT} harmonics keep a square wave&apos;s RMS to 0.1 %. THD = √(X₂² + X₃² + …)/X₁, the harmonics against the fundamental.</p>
      {current?.error && <p className="field-error" role="alert" data-testid="harmonic-refused">{current.error}</p>}
      {!current && <p className="muted">Solving the harmonics…</p>}
      {a && (
        <>
          <Period answer={a} picks={picks} />
          <div className="side-by-side">
            {picks.map((p, i) => <QuantityCard key={p.key} answer={a} pick={p} colour={TRACE_COLOURS[i % TRACE_COLOURS.length]} onRemove={() => toggle(p.key)} />)}
            <PowerTable answer={a} />
          </div>
        </>
      )}
    </div>
  );
}

function Period({ answer, picks }: { answer: HarmonicAnswer; picks: Pick[] }) {
  const scale = answer.amplitudes === 'rms' ? Math.SQRT2 : 1;
  // 8 points a cycle of the highest harmonic, up to about two a pixel of the plot: each point is the sum's
  // exact value at its time, so past that only the straight lines between them would change
  const samples = Math.min(2048, Math.max(512, 8 * answer.count));
  const keys = picks.map((p) => p.key).join('|');
  const waves = useMemo(
    () => picks.map((p) => rebuildPeriod(answer.fundamentalHz, answer.orders, p.series.phasors, scale, samples)),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [answer, keys],
  );
  const top = (unit: 'V' | 'A') => niceCeil(Math.max(0, ...waves.flatMap((w, i) => (picks[i].unit === unit ? [Math.max(...w.values.map(Math.abs))] : []))));
  const traces = picks.map((p, i) => ({ key: p.key, label: p.label, unit: p.unit, colour: TRACE_COLOURS[i % TRACE_COLOURS.length], t: waves[i].timesS, y: waves[i].values }));
  const T = 1 / answer.fundamentalHz;
  return (
    <VoltsAmpsPlot traces={traces} spanS={T} vMax={top('V')} iMax={top('A')} label="One period rebuilt from the harmonics" testId="harmonic-period">
      <p className="muted">One period, {formatSI(T, 's', 4)}, rebuilt from the harmonics. Voltages on the left scale (solid), currents on the right (dashed). The ripple beside a jump is the Gibbs overshoot of a truncated series (about 9 % of the jump, standard), not the circuit&apos;s.</p>
    </VoltsAmpsPlot>
  );
}

function QuantityCard({ answer, pick, colour, onRemove }: { answer: HarmonicAnswer; pick: Pick; colour: string; onRemove: () => void }) {
  const { series, unit } = pick;
  const dcAt = answer.orders.indexOf(0);
  const oneAt = answer.orders.indexOf(1);
  const toRms = answer.amplitudes === 'rms' ? 1 : Math.SQRT1_2;
  const magLabel = answer.amplitudes === 'rms' ? 'RMS' : 'peak';
  const { shown, more } = useRows(answer.orders.length);
  return (
    <section className="harmonic-card" data-testid="harmonic-card" data-key={pick.key}>
      <h3 className="sub"><span className="swatch" style={{ background: colour }} />{pick.label}
        <button type="button" className="cmd" aria-label={`Remove ${pick.label}`} title="Remove from the view" onClick={onRemove}>×</button></h3>
      <dl className="kv">
        <dt>true RMS</dt><dd data-testid="harmonic-rms">{formatSI(series.rms, unit, 4)}</dd>
        <dt>DC</dt><dd>{formatSI(dcAt >= 0 ? series.phasors[dcAt].re : 0, unit, 4)}</dd>
        <dt>fundamental (RMS)</dt><dd>{formatSI(oneAt >= 0 ? cabs(series.phasors[oneAt]) * toRms : 0, unit, 4)}</dd>
        <dt>THD</dt><dd data-testid="harmonic-thd" data-thd={series.thd ?? ''}>{series.thd === undefined ? '— (no fundamental)' : pct(series.thd)}</dd>
      </dl>
      <div className="harmonic-rows">
        <table className="data" data-testid="harmonic-table">
          <thead><tr><th scope="col">n</th><th scope="col">f</th><th scope="col">magnitude ({magLabel})</th><th scope="col" title="of the cosine, from the start of the period (t = 0)">phase</th>{pick.power && <th scope="col">P absorbed</th>}</tr></thead>
          <tbody>
            {answer.orders.slice(0, shown).map((n, k) => {
              const z = series.phasors[k];
              return (
                <tr key={n} data-order={n}>
                  <th scope="row">{n === 0 ? 'DC' : n}</th>
                  <td className="num">{formatSI(answer.frequenciesHz[k], 'Hz', 4)}</td>
                  <td className="num">{formatSI(n === 0 ? z.re : cabs(z), unit, 4)}</td>
                  <td className="num">{n === 0 || cabs(z) === 0 ? '—' : `${formatAngle(cdeg(z))}`}</td>
                  {pick.power && <td className="num">{formatSI(pick.power[k].watts, 'W', 4)}</td>}
                </tr>
              );
            })}
          </tbody>
        </table>
        {more}
      </div>
    </section>
  );
}

function PowerTable({ answer }: { answer: HarmonicAnswer }) {
  const { balance } = answer;
  const total = balance.totalDelivered;
  const { shown, more } = useRows(answer.orders.length);
  return (
    <section className="harmonic-card" data-testid="harmonic-power">
      <h3 className="sub">Power and loss per harmonic</h3>
      <p className="muted small">Real power the sources deliver and the resistors and switches absorb at each harmonic; their sums are the average powers (harmonics of different order carry no average power between them).</p>
      <div className="harmonic-rows">
        <table className="data">
          <thead><tr><th scope="col">n</th><th scope="col">delivered</th><th scope="col">loss</th><th scope="col">share</th></tr></thead>
          <tbody>
            {answer.orders.slice(0, shown).map((n, k) => (
              <tr key={n} data-order={n}>
                <th scope="row">{n === 0 ? 'DC' : n}</th>
                <td className="num">{formatSI(balance.delivered[k], 'W', 4)}</td>
                <td className="num">{formatSI(balance.dissipated[k], 'W', 4)}</td>
                <td className="num">{total > 0 ? pct(balance.delivered[k] / total) : '—'}</td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr><th scope="row">all</th><td className="num" data-testid="harmonic-delivered">{formatSI(total, 'W', 4)}</td><td className="num">{formatSI(balance.totalDissipated, 'W', 4)}</td><td /></tr>
          </tfoot>
        </table>
        {more}
      </div>
    </section>
  );
}
