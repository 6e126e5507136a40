/**
 * Details-panel editors for what the time response uses: a source's waveform
 * (its shape and that shape's fields) and a switch's state and toggle times.
 * Every entry is read with units and checked by the graph model's own rules;
 * a refusal names the field, and the sheet keeps its last good value.
 */
import { formatEditable } from '../model/quantity';
import * as E from '../model/edits';
import type { Part } from '../model/sheet';
import type { Waveform, WaveformShape } from '../model/waveform';
import { SHAPE_LABELS, WAVEFORM_FIELDS, WAVEFORM_SHAPES, previewWindow, startingWaveform, waveformProblem, waveformSamples, type WaveUnit } from '../model/waveformFields';
import { formatSI } from '../model/quantity';
import { commit } from '../store/actions';
import { Field, quantity } from './Field';
import { parseEntry } from './valueEntry';
import { useEditor, useEditorState } from './editorContext';

const unitText = (u: WaveUnit, source: string) => (u === 'value' ? source : u);

/** Read a list of quantities ("0, 1m, 2.5m"); the reason names the entry that cannot be read. */
async function quantityList(text: string, unit: string, what: string): Promise<{ values: number[] } | { reason: string }> {
  const parts = text.split(/[,;]/).map((s) => s.trim()).filter(Boolean);
  const values: number[] = [];
  for (let i = 0; i < parts.length; i++) {
    const r = await parseEntry(parts[i], unit);
    if (!r.ok) return { reason: `${what} (entry ${i + 1}): ${r.reason}` };
    values.push(r.value);
  }
  return { values };
}

export function WaveformEditor({ part }: { part: Part }) {
  const { store } = useEditor();
  const sheet = useEditorState((s) => s.sheet);
  const unit = part.kind === 'isource' ? 'A' : 'V';
  const w = part.waveform;
  const set = (waveform: Waveform | undefined) => {
    const s = store.getState().sheet;
    commit(store, { ...s, parts: s.parts.map((p) => {
      if (p.id !== part.id) return p;
      const { waveform: _old, ...rest } = p;
      return waveform ? { ...rest, waveform } : rest;
    }) });
  };
  /** apply a changed waveform, or the reason (naming the field) it is refused */
  const tryApply = (next: Record<string, unknown>): string | null => {
    const problem = waveformProblem(next);
    if (problem) return problem.message;
    set(next as unknown as Waveform);
    return null;
  };
  const peak = (part.value ?? 0) * (sheet.amplitudes === 'rms' ? Math.SQRT2 : 1);
  return (
    <fieldset className="radio" data-testid="waveform-editor">
      <legend>Over time (time response)</legend>
      <label className="field">
        <span className="label">Shape</span>
        <select data-testid="waveform-shape" value={w?.shape ?? ''}
          onChange={(e) => set(e.target.value ? startingWaveform(e.target.value as WaveformShape, { peak, frequencyHz: sheet.frequencyHz, phaseDeg: part.phaseDeg ?? 0 }) : undefined)}>
          <option value="">Follows its phasor (cosine)</option>
          {WAVEFORM_SHAPES.map((s) => <option key={s} value={s}>{SHAPE_LABELS[s]}</option>)}
        </select>
      </label>
      {w && w.shape !== 'points' && WAVEFORM_FIELDS[w.shape].map((f) => {
        const u = unitText(f.unit, unit);
        const cur = (w as unknown as Record<string, number | undefined>)[f.key] ?? f.fallback ?? 0;
        return (
          <Field key={`${part.id}-${w.shape}-${f.key}`} live label={f.label} unit={u} testId={`wave-${f.key}`} hint={f.hint}
            value={formatEditable(cur, u)}
            apply={async (t) => {
              const r = await quantity(t, u);
              if ('reason' in r) return `${f.label}: ${r.reason}`;
              return tryApply({ ...(store.getState().sheet.parts.find((p) => p.id === part.id)?.waveform ?? w), [f.key]: r.value });
            }} />
        );
      })}
      {w?.shape === 'points' && (['timesS', 'values'] as const).map((key) => {
        const u = key === 'timesS' ? 's' : unit;
        const label = key === 'timesS' ? 'Times' : 'Values';
        return (
          <Field key={`${part.id}-points-${key}`} label={label} unit={u} testId={`wave-${key}`} hint="separated by commas, e.g. 0, 1m, 2m"
            value={w[key].map((v) => formatEditable(v, u)).join(', ')}
            apply={async (t) => {
              const r = await quantityList(t, u, label);
              if ('reason' in r) return r.reason;
              const now = store.getState().sheet.parts.find((p) => p.id === part.id)?.waveform ?? w;
              return tryApply({ ...now, [key]: r.values });
            }} />
        );
      })}
      {w && <WaveformPreview w={w} unit={unit} fallbackHz={sheet.frequencyHz} />}
    </fieldset>
  );
}

/** A small drawing of the waveform over the window previewWindow picks, its value range and time span written beside it. */
function WaveformPreview({ w, unit, fallbackHz }: { w: Waveform; unit: string; fallbackHz: number }) {
  const [t0, t1] = previewWindow(w, fallbackHz);
  const { t, y } = waveformSamples(w, t0, t1);
  const lo = Math.min(...y);
  const hi = Math.max(...y);
  const pad = hi > lo ? (hi - lo) * 0.1 : Math.max(Math.abs(hi), 1) * 0.1;
  const [W, H] = [220, 60];
  const px = (x: number) => ((x - t0) / (t1 - t0)) * W;
  const py = (v: number) => H - ((v - (lo - pad)) / (hi - lo + 2 * pad)) * H;
  const pts = t.map((x, i) => `${px(x).toFixed(1)},${py(y[i]).toFixed(1)}`).join(' ');
  return (
    <figure className="wave-preview" data-testid="waveform-preview">
      <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} role="img" aria-label="The source's waveform over time">
        <polyline points={pts} fill="none" stroke="currentColor" strokeWidth={1.5} />
      </svg>
      <figcaption className="field-hint">{formatSI(lo, unit, 3)} to {formatSI(hi, unit, 3)}, {formatSI(t0, 's', 3)} to {formatSI(t1, 's', 3)}</figcaption>
    </figure>
  );
}

export function SwitchEditor({ part }: { part: Part }) {
  const { store } = useEditor();
  const patch = (p: Partial<Part>) => commit(store, E.updatePart(store.getState().sheet, part.id, p));
  return (
    <fieldset className="radio" data-testid="switch-editor">
      <legend>State</legend>
      <label><input type="radio" name={`sw-${part.id}`} data-testid="switch-closed" checked={part.closed !== false} onChange={() => patch({ closed: true })} /> closed</label>
      <label><input type="radio" name={`sw-${part.id}`} data-testid="switch-open" checked={part.closed === false} onChange={() => patch({ closed: false })} /> open</label>
      <Field key={`${part.id}-toggles`} label="Toggles at" unit="s" testId="field-togglesS"
        hint="times after 0 at which it flips, in order, separated by commas (used by the time response)"
        value={(part.togglesS ?? []).map((v) => formatEditable(v, 's')).join(', ')}
        apply={async (t) => {
          const r = await quantityList(t, 's', 'Toggles at');
          if ('reason' in r) return r.reason;
          const bad = r.values.findIndex((v, i) => !(v > 0) || (i > 0 && v <= r.values[i - 1]));
          if (bad >= 0) return `Toggles at (entry ${bad + 1}) ${r.values[bad] > 0 ? 'must be later than the time before it' : 'must be greater than 0 s'}`;
          patch({ togglesS: r.values });
          return null;
        }} />
    </fieldset>
  );
}
