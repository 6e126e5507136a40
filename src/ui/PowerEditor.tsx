/**
 * Details-panel editor of a practical transformer: its rating, the form its
 * data are entered in (equivalent circuit, tests, per-unit) and that form's
 * fields; the same transformer in the other two forms, its graph elements, and
 * its report at the solved operating point. Every entry is checked against the
 * whole data set; a refusal names the field and the sheet keeps the last good
 * values.
 */
import { useState } from 'react';
import { formatEditable, formatSI } from '../model/quantity';
import { ratioText } from '../model/parts/others';
import { expandPower, powerReport } from '../model/powerExpansion';
import {
  allForms, defaultPowerSpec, powerSpecProblem, switchForm, type PowerForm, type PowerSpec, type TestSide,
} from '../model/powerTransformer';
import * as E from '../model/edits';
import type { Part } from '../model/sheet';
import { commit } from '../store/actions';
import { useSolved } from './analysis/useSolved';
import { Field } from './Field';
import { useEditor } from './editorContext';
import { parseEntry } from './valueEntry';

interface FieldSpec { path: string; label: string; unit: string; optional?: boolean; hint?: string }

const RATING: FieldSpec[] = [
  { path: 'rating.va', label: 'Rated power', unit: 'VA', hint: 'e.g. 100k' },
  { path: 'rating.v1', label: 'Rated primary voltage', unit: 'V' },
  { path: 'rating.v2', label: 'Rated secondary voltage', unit: 'V' },
  { path: 'rating.hz', label: 'Rated frequency', unit: 'Hz' },
];
const CIRCUIT: FieldSpec[] = [
  { path: 'circuit.ratio', label: 'Turns ratio N1 : N2', unit: '', hint: 'e.g. 26.5:1' },
  { path: 'circuit.r1', label: 'Primary resistance R1', unit: 'Ω' },
  { path: 'circuit.r2', label: 'Secondary resistance R2', unit: 'Ω' },
  { path: 'circuit.l1', label: 'Primary leakage L1σ', unit: 'H', hint: 'or its reactance at the rated frequency, e.g. 12 Ω' },
  { path: 'circuit.l2', label: 'Secondary leakage L2σ', unit: 'H', hint: 'or its reactance at the rated frequency, e.g. 0.02 Ω' },
  { path: 'circuit.lm', label: 'Magnetising inductance Lm (primary)', unit: 'H', optional: true, hint: 'or its reactance; empty for none' },
  { path: 'circuit.rc', label: 'Core-loss resistance Rc (primary)', unit: 'Ω', optional: true, hint: 'empty for none' },
];
const reading = (at: 'noLoad' | 'shortCircuit', name: string): FieldSpec[] => [
  { path: `tests.${at}.volts`, label: `${name} voltage`, unit: 'V' },
  { path: `tests.${at}.amps`, label: `${name} current`, unit: 'A' },
  { path: `tests.${at}.watts`, label: `${name} power`, unit: 'W' },
];
const PER_UNIT: FieldSpec[] = [
  { path: 'perUnit.ukPct', label: 'Impedance voltage uk', unit: '%' },
  { path: 'perUnit.i0Pct', label: 'No-load current i0', unit: '%' },
  { path: 'perUnit.p0W', label: 'No-load loss P0', unit: 'W' },
];

function getPath(spec: PowerSpec, path: string): number | undefined {
  let o: unknown = spec;
  for (const k of path.split('.')) o = (o as Record<string, unknown> | undefined)?.[k];
  return typeof o === 'number' ? o : undefined;
}

function setPath(spec: PowerSpec, path: string, value: unknown): PowerSpec {
  const keys = path.split('.');
  const put = (o: Record<string, unknown>, i: number): Record<string, unknown> => {
    const copy = { ...o };
    if (i === keys.length - 1) {
      if (value === undefined) delete copy[keys[i]];
      else copy[keys[i]] = value;
    } else copy[keys[i]] = put((o[keys[i]] ?? {}) as Record<string, unknown>, i + 1);
    return copy;
  };
  return put(spec as unknown as Record<string, unknown>, 0) as unknown as PowerSpec;
}

const FORM_LABELS: Record<PowerForm, string> = { circuit: 'equivalent circuit', tests: 'rating and tests', perUnit: 'per-unit data' };

/**
 * Entries not yet applied, by part: data typed in one field at a time pass
 * through states that do not hold together (a new test voltage before its
 * current), so the panel keeps them here, names the field at fault, and applies
 * the whole set to the sheet as soon as it holds together again.
 */
const drafts = new Map<string, PowerSpec>();

export function PowerEditor({ part }: { part: Part }) {
  const { store } = useEditor();
  const [, redraw] = useState(0);
  const spec = drafts.get(part.id) ?? part.power ?? defaultPowerSpec();
  const solved = useSolved();
  const set = (next: PowerSpec) => commit(store, E.updatePart(store.getState().sheet, part.id, { power: next }));
  /**
   * Take a new data set: applied when it holds together; kept as a draft otherwise.
   * Returns the reason when the field `path` itself is the one at fault.
   */
  const update = (next: PowerSpec, path?: string): string | null => {
    const problem = powerSpecProblem(next);
    if (!problem) {
      drafts.delete(part.id);
      set(next);
      redraw((n) => n + 1);
      return null;
    }
    if (path && problem.field === path) return problem.message;
    drafts.set(part.id, next);
    redraw((n) => n + 1);
    return null;
  };
  const field = (f: FieldSpec) => {
    const v = getPath(spec, f.path);
    const shown = v === undefined ? '' : f.path === 'circuit.ratio' ? ratioText(v, ':') : formatEditable(v, f.unit);
    return (
      <Field key={`${part.id}-${spec.form}-${f.path}`} live label={f.label} unit={f.unit} value={shown} hint={f.hint} testId={`power-${f.path}`}
        apply={async (t) => {
          const now = drafts.get(part.id) ?? store.getState().sheet.parts.find((p) => p.id === part.id)?.power ?? spec;
          if (f.optional && t.trim() === '') return update(setPath(now, f.path, undefined), f.path);
          let text = t.trim();
          let unit = f.unit;
          let scale = 1;
          if (f.path === 'circuit.ratio') {
            const m = /^\s*([^:]+):([^:]+)$/.exec(text);
            if (m) {
              const [a, b] = [await parseEntry(m[1], ''), await parseEntry(m[2], '')];
              if (!a.ok || !b.ok || !(b.value > 0)) return `${f.label}: write it as N1:N2 or a number`;
              return update(setPath(now, f.path, a.value / b.value), f.path);
            }
          }
          // a reactance typed into an inductance field is read at the rated frequency
          if (f.unit === 'H' && /(Ω|ohms?)$/i.test(text)) {
            unit = 'Ω';
            scale = 1 / (2 * Math.PI * now.rating.hz);
            text = text.replace(/ohms?$/i, 'Ω');
          }
          const r = await parseEntry(text, unit);
          if (!r.ok) return `${f.label}: ${r.reason}`;
          if (!Number.isFinite(r.value)) return `${f.label} must be a finite number`;
          return update(setPath(now, f.path, r.value * scale), f.path);
        }} />
    );
  };
  const sideChoice = (at: 'noLoad' | 'shortCircuit') => (
    <label className="field">
      <span className="label">taken on</span>
      <select data-testid={`power-tests.${at}.side`} value={spec.tests?.[at].side ?? 'primary'}
        onChange={(e) => update(setPath(spec, `tests.${at}.side`, e.target.value as TestSide))}>
        <option value="primary">the primary (other side open / shorted)</option>
        <option value="secondary">the secondary (other side open / shorted)</option>
      </select>
    </label>
  );
  const problem = powerSpecProblem(spec);
  const pending = drafts.has(part.id);
  const forms = problem ? null : allForms(spec);
  const x = solved?.circuit.expansions.get(part.id);
  const report = x && solved && !problem ? powerReport(spec, x, solved.result) : null;
  return (
    <div className="power-editor" data-testid="power-editor">
      {RATING.map(field)}
      <fieldset className="radio">
        <legend>Entered as</legend>
        {(['circuit', 'tests', 'perUnit'] as const).map((f) => (
          <label key={f}><input type="radio" name={`power-form-${part.id}`} data-testid={`power-form-${f}`} checked={spec.form === f}
            onChange={() => { if (!problem) set(switchForm(spec, f)); }} /> {FORM_LABELS[f]}</label>
        ))}
      </fieldset>
      {spec.form === 'circuit' && CIRCUIT.map(field)}
      {spec.form === 'tests' && (
        <>
          <p className="muted">No-load (open-circuit) test: the other side open.</p>
          {reading('noLoad', 'No-load test').map(field)}
          {sideChoice('noLoad')}
          <p className="muted">Short-circuit test: the other side shorted.</p>
          {reading('shortCircuit', 'Short-circuit test').map(field)}
          {sideChoice('shortCircuit')}
        </>
      )}
      {spec.form === 'perUnit' && (
        <>
          {PER_UNIT.slice(0, 1).map(field)}
          <fieldset className="radio">
            <legend>Series resistance from</legend>
            <label><input type="radio" name={`power-r-${part.id}`} checked={!spec.perUnit?.byXr} onChange={() => update(setPath(spec, 'perUnit.byXr', false))} /> the load loss</label>
            <label><input type="radio" name={`power-r-${part.id}`} checked={!!spec.perUnit?.byXr} onChange={() => update(setPath(spec, 'perUnit.byXr', true))} /> X/R</label>
          </fieldset>
          {spec.perUnit?.byXr ? field({ path: 'perUnit.xr', label: 'X/R', unit: '' }) : field({ path: 'perUnit.loadLossW', label: 'Load loss at rated current', unit: 'W' })}
          {PER_UNIT.slice(1).map(field)}
        </>
      )}
      <fieldset className="radio">
        <legend>In the circuit as</legend>
        <label><input type="radio" name={`power-x-${part.id}`} checked={spec.expansion === 'ratio'} onChange={() => update({ ...spec, expansion: 'ratio' })} /> exact equivalent circuit with an ideal ratio</label>
        <label><input type="radio" name={`power-x-${part.id}`} data-testid="power-expansion-coupled" checked={spec.expansion === 'coupled'}
          onChange={() => update({ ...spec, expansion: 'coupled' })} /> coupled windings with k, and resistors (core loss across the primary winding)</label>
      </fieldset>
      {problem && (
        <div className="field-error" role="alert" data-testid="power-problem" data-field={problem.field}>
          {problem.message}{pending ? ' — not applied yet: the sheet keeps the last values that held together.' : ''}
          {pending && <button type="button" className="cmd" onClick={() => { drafts.delete(part.id); redraw((n) => n + 1); }}>Put back the applied values</button>}
        </div>
      )}
      {forms && <DerivedForms spec={spec} forms={forms} />}
      {!problem && <ExpansionList part={part} spec={spec} />}
      {report && <ReportTable report={report} />}
    </div>
  );
}

const si = (v: number, unit: string, d = 4) => formatSI(v, unit, d);
const pct = (v: number, d = 3) => `${Number((100 * v).toPrecision(d))} %`;

function DerivedForms({ spec, forms }: { spec: PowerSpec; forms: ReturnType<typeof allForms> }) {
  const c = forms.circuit, t = forms.tests, p = forms.perUnit;
  const w = 2 * Math.PI * spec.rating.hz;
  const a2 = c.ratio * c.ratio;
  const ur = p.ukPct / Math.sqrt(1 + p.xr * p.xr);
  return (
    <details className="tb-fields" open data-testid="power-derived">
      <summary>The same transformer in all three forms</summary>
      <table className="kv">
        <tbody>
          <tr><th colSpan={2}>Equivalent circuit (X at {si(spec.rating.hz, 'Hz')})</th></tr>
          <tr><td>N1 : N2</td><td>{ratioText(c.ratio, ' : ')}</td></tr>
          <tr><td>R1, R2</td><td data-testid="power-derived-r">{si(c.r1, 'Ω')}, {si(c.r2, 'Ω')} (R2′ = {si(a2 * c.r2, 'Ω')})</td></tr>
          <tr><td>X1, X2</td><td>{si(w * c.l1, 'Ω')}, {si(w * c.l2, 'Ω')} (L1σ {si(c.l1, 'H')}, L2σ {si(c.l2, 'H')})</td></tr>
          <tr><td>Xm, Rc</td><td data-testid="power-derived-shunt">{c.lm ? `${si(w * c.lm, 'Ω')} (Lm ${si(c.lm, 'H')})` : 'none'}, {c.rc ? si(c.rc, 'Ω') : 'none'}</td></tr>
          <tr><th colSpan={2}>Tests{spec.form === 'tests' ? ' (as entered)' : ' (repeated on the circuit at rated voltage and current, primary)'}</th></tr>
          <tr><td>No load</td><td>{si(t.noLoad.volts, 'V')}, {si(t.noLoad.amps, 'A')}, {si(t.noLoad.watts, 'W')} on the {t.noLoad.side}</td></tr>
          <tr><td>Short circuit</td><td>{si(t.shortCircuit.volts, 'V')}, {si(t.shortCircuit.amps, 'A')}, {si(t.shortCircuit.watts, 'W')} on the {t.shortCircuit.side}</td></tr>
          <tr><th colSpan={2}>Per unit{spec.form === 'perUnit' ? ' (as entered)' : ''}</th></tr>
          <tr><td>uk, ur, ux</td><td data-testid="power-derived-uk">{Number(p.ukPct.toPrecision(4))} %, {Number(ur.toPrecision(4))} %, {Number(Math.sqrt(Math.max(0, p.ukPct ** 2 - ur ** 2)).toPrecision(4))} %</td></tr>
          <tr><td>X/R, load loss</td><td>{Number(p.xr.toPrecision(4))}, {si(p.loadLossW, 'W')}</td></tr>
          <tr><td>i0, P0</td><td>{Number(p.i0Pct.toPrecision(4))} %, {si(p.p0W, 'W')}</td></tr>
        </tbody>
      </table>
    </details>
  );
}

function ExpansionList({ part, spec }: { part: Part; spec: PowerSpec }) {
  const x = expandPower(part.ref, spec, ['P1', 'P2', 'S1', 'S2']);
  const value = (e: (typeof x.elements)[number]) =>
    e.kind === 'resistor' ? si(e.ohms, 'Ω') : e.kind === 'inductor' ? si(e.henries, 'H') : e.kind === 'ideal-transformer' ? `ratio ${ratioText(e.ratio, ' : ')}` : '';
  return (
    <details className="tb-fields" data-testid="power-expansion">
      <summary>In the graph model: {x.elements.length} elements{x.couplings.length ? ' and a coupling' : ''}</summary>
      <ul className="plain">
        {x.elements.map((e) => <li key={e.id}><code>{e.id}</code> {e.kind} {e.nodes.join('–')} {value(e)}</li>)}
        {x.couplings.map((c) => <li key={c.id}><code>{c.id}</code> coupling {c.windings.join(', ')} k = {Number((c.k ?? 0).toPrecision(6))}</li>)}
      </ul>
      <p className="muted">P1, P2, S1, S2 stand for the nodes at the primary and secondary pins (dotted first).</p>
    </details>
  );
}

function ReportTable({ report: r }: { report: ReturnType<typeof powerReport> }) {
  return (
    <table className="kv" data-testid="power-report">
      <caption>At the solved operating point</caption>
      <tbody>
        <tr><td>Load (secondary current / rated)</td><td data-testid="power-load">{pct(r.load)}</td></tr>
        <tr><td>Copper loss</td><td data-testid="power-copper">{si(r.copperW, 'W')}</td></tr>
        <tr><td>Core loss</td><td data-testid="power-core">{si(r.coreW, 'W')}</td></tr>
        <tr><td>Input, output power</td><td>{si(r.inputW, 'W')}, {si(r.outputW, 'W')}</td></tr>
        <tr><td>Efficiency</td><td data-testid="power-efficiency">{r.efficiency === null ? 'no power delivered to the secondary' : pct(r.efficiency, 5)}</td></tr>
        <tr><td>Voltage regulation</td><td data-testid="power-regulation">{r.regulation === null ? 'needs a secondary voltage and a frequency above 0 Hz' : pct(r.regulation, 4)}</td></tr>
        <tr><td>Series impedance (per unit)</td><td data-testid="power-zpu">{r.zpu ? `${Number(r.zpu.re.toPrecision(4))} + j${Number(r.zpu.im.toPrecision(4))}` : '—'}</td></tr>
      </tbody>
    </table>
  );
}
