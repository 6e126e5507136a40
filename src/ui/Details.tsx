/** The details panel: edits the selected part or coupling, or the sheet when nothing is selected. */
import { nameProblem, titleProblem } from '../model/names';
import { formatEditable } from '../model/quantity';
import { couplingName } from '../model/couplingName';
import { PART_DEFS, contributes, isCouplable } from '../model/parts/registry';
import * as E from '../model/edits';
import { PART_KINDS, TITLE_FIELDS, type DisplaySettings, type Part, type SheetCoupling } from '../model/sheet';
import { commit, renamePart } from '../store/actions';
import { CommandButton } from './CommandButton';
import { Field, quantity } from './Field';
import { useEditor, useEditorState } from './editorContext';
import { PowerEditor } from './PowerEditor';
import { SwitchEditor, WaveformEditor } from './TimeEditors';
import { parseEntry } from './valueEntry';
import { mutualLimit } from '../model/mutual';
import { inductanceFromTurns, turnsFromInductance } from '../model/couplingMeasure';

export function Details() {
  const selection = useEditorState((s) => s.selection);
  const sheet = useEditorState((s) => s.sheet);
  const items = selection.map((id) => sheet.parts.find((p) => p.id === id) ?? sheet.couplings.find((c) => c.id === id) ?? sheet.wires.find((w) => w.id === id)).filter(Boolean);
  let body;
  if (items.length === 0) body = <SheetDetails />;
  else if (items.length > 1) body = <Several count={items.length} windings={items.filter((x) => 'kind' in x! && isCouplable(x as Part)).length} />;
  else if ('kind' in items[0]!) body = <PartDetails part={items[0] as Part} />;
  else if ('windings' in items[0]!) body = <CouplingDetails c={items[0] as SheetCoupling} />;
  else body = <p className="muted">A wire. Drag one of its pieces sideways to reroute it (its ends stay put); Delete removes it.</p>;
  return (
    <section className="panel details" aria-label="Details">
      <h2 className="panel-title">Details</h2>
      {body}
    </section>
  );
}

function SheetDetails() {
  const { store } = useEditor();
  const sheet = useEditorState((s) => s.sheet);
  const set = (patch: Partial<typeof sheet>) => commit(store, { ...store.getState().sheet, ...patch });
  return (
    <div className="form" data-testid="sheet-details">
      <p className="muted">The sheet (select a part to edit it).</p>
      <Field label="Title" value={sheet.title} testId="sheet-title" apply={(t) => {
        const title = t.trim();
        if (!title) return 'A title cannot be empty';
        const problem = titleProblem(title);
        if (problem) return `The title ${problem}`;
        set({ title });
        return null;
      }} />
      <Field
        label="Frequency" unit="Hz" value={formatEditable(sheet.frequencyHz, 'Hz')} testId="sheet-frequency" live
        hint="e.g. 50, 85k, 1/(2*pi*1e-3)"
        apply={async (t) => {
          const r = await quantity(t, 'Hz', (v) => (v >= 0 ? null : 'Frequency must be 0 Hz or more'));
          if ('reason' in r) return r.reason;
          set({ frequencyHz: r.value });
          return null;
        }}
      />
      <details className="tb-fields" data-testid="title-block-fields">
        <summary>Title block (ISO 7200 fields)</summary>
        {TITLE_FIELDS.map((f) => (
          <Field key={f.key} label={f.label} value={sheet.titleBlock[f.key]} testId={`tb-${f.key}`}
            apply={(t) => (t.length > 200 ? 'Keep it under 200 characters' : (set({ titleBlock: { ...store.getState().sheet.titleBlock, [f.key]: t.trim() } }), null))} />
        ))}
      </details>
      <DisplayFields />
      <fieldset className="radio">
        <legend>Amplitudes</legend>
        {(['rms', 'peak'] as const).map((a) => (
          <label key={a}>
            <input type="radio" name="amplitudes" checked={sheet.amplitudes === a} onChange={() => set({ amplitudes: a })} /> {a === 'rms' ? 'RMS' : 'Peak'}
          </label>
        ))}
      </fieldset>
    </div>
  );
}

/** What the drawing shows: readings by kind, and the part kinds whose readings are left out. */
function DisplayFields() {
  const { store } = useEditor();
  const display = useEditorState((s) => s.sheet.display);
  const set = (patch: Partial<DisplaySettings>) => {
    const s = store.getState().sheet;
    commit(store, { ...s, display: { ...s.display, ...patch } });
  };
  const kinds = PART_KINDS.filter((k) => contributes(PART_DEFS[k]));
  return (
    <details className="tb-fields" data-testid="display-fields">
      <summary>What the drawing shows</summary>
      <fieldset className="radio">
        <legend>Readings</legend>
        <label><input type="checkbox" data-testid="show-part-currents" checked={display.partCurrents} onChange={(e) => set({ partCurrents: e.target.checked })} /> currents beside parts</label>
        <label><input type="checkbox" data-testid="show-wire-currents" checked={display.wireCurrents} onChange={(e) => set({ wireCurrents: e.target.checked })} /> currents on wires</label>
        <label><input type="checkbox" data-testid="show-node-voltages" checked={display.nodeVoltages} onChange={(e) => set({ nodeVoltages: e.target.checked })} /> node voltages</label>
      </fieldset>
      <fieldset className="radio">
        <legend>Readings of these kinds</legend>
        {kinds.map((k) => (
          <label key={k}><input type="checkbox" data-testid={`show-kind-${k}`} checked={!display.hideKinds.includes(k)}
            onChange={(e) => set({ hideKinds: e.target.checked ? display.hideKinds.filter((x) => x !== k) : [...display.hideKinds, k] })} /> {PART_DEFS[k].label}</label>
        ))}
      </fieldset>
    </details>
  );
}

function Several({ count, windings }: { count: number; windings: number }) {
  return (
    <div className="form">
      <p>{count} items selected{windings ? `, ${windings} of them windings` : ''}.</p>
      <div className="row-buttons">
        <CommandButton id="turn" />
        <CommandButton id="mirror" />
        {windings >= 2 && <CommandButton id="link" />}
        <CommandButton id="remove" />
      </div>
    </div>
  );
}

function PartDetails({ part }: { part: Part }) {
  const { store } = useEditor();
  const def = PART_DEFS[part.kind];
  const sheetDisplay = useEditorState((s) => s.sheet.display);
  const patch = (p: Partial<Part>) => commit(store, E.updatePart(store.getState().sheet, part.id, p));
  return (
    <div className="form" data-testid="part-details">
      <p className="kind">{def.label}</p>
      {def.prefix && <Field label="Designator" value={part.ref} testId="field-ref" apply={(t) => renamePart(store, part.id, t)} />}
      {def.nameField && (
        <Field label={def.nameField.label} value={part.name ?? ''} testId="field-name" hint={def.nameField.hint}
          apply={(t) => {
            const problem = nameProblem(t.trim());
            if (problem) return `A node name ${problem}`;
            patch({ name: t.trim() });
            return null;
          }} />
      )}
      {def.fields.map((f) => (
        <Field
          key={`${part.id}-${f.key}`}
          live
          label={f.label}
          unit={f.unit}
          testId={`field-${f.key}`}
          value={f.editText ? f.editText(part[f.key] ?? 0) : formatEditable(part[f.key] ?? 0, f.unit)}
          hint={f.hint ?? (f.key === 'value' ? 'e.g. 4.7m, 4.7 mH, 1/(2*pi*50)' : undefined)}
          apply={async (t) => {
            // an entry that cannot be read is refused naming the field; the field's own check names it already
            const r = await parseEntry(t, f.unit);
            if (!r.ok) return `${f.label}: ${r.reason}`;
            const bad = f.check(r.value);
            if (bad) return bad;
            patch({ [f.key]: r.value });
            return null;
          }}
        />
      ))}
      {def.editor === 'waveform' && <WaveformEditor part={part} />}
      {def.editor === 'switch' && <SwitchEditor part={part} />}
      {def.editor === 'power' && <PowerEditor part={part} />}
      {def.couplable && <TurnsFields part={part} patch={patch} />}
      {def.couplable && (
        <div className="field">
          <span className="label">Polarity dot</span>
          <div className="row-buttons">
            <span className="muted">{part.dot === 'second' ? 'at the second terminal' : 'at the first terminal'}</span>
            <CommandButton id="swap-dot" />
          </div>
        </div>
      )}
      {contributes(def) && (
        <label className="check"><input type="checkbox" data-testid="show-part-readings" checked={!sheetDisplay.hideParts.includes(part.id)}
          onChange={(e) => commit(store, { ...store.getState().sheet, display: { ...sheetDisplay, hideParts: e.target.checked ? sheetDisplay.hideParts.filter((x) => x !== part.id) : [...sheetDisplay.hideParts, part.id] } })} /> show this part's readings on the drawing</label>
      )}
      <div className="row-buttons">
        <CommandButton id="turn" />
        <CommandButton id="mirror" />
        <CommandButton id="remove" />
      </div>
    </div>
  );
}

function CouplingDetails({ c }: { c: SheetCoupling }) {
  const { store } = useEditor();
  const sheet = useEditorState((s) => s.sheet);
  const names = c.windings.map((w) => sheet.parts.find((p) => p.id === w)?.ref ?? '?');
  const patch = (p: Partial<SheetCoupling>) => commit(store, E.updateCoupling(store.getState().sheet, c.id, p));
  const two = c.windings.length === 2;
  return (
    <div className="form" data-testid="coupling-details">
      <p className="kind" data-testid="coupling-name">Coupling {couplingName(sheet, c, 'k')} / {couplingName(sheet, c, 'M')} between {names.join(' and ')}</p>
      {two && (
        <fieldset className="radio">
          <legend>Given as</legend>
          <label><input type="radio" name="by" checked={c.by === 'k'} onChange={() => patch({ by: 'k', value: kFromM(sheet, c) })} /> coupling coefficient k</label>
          <label><input type="radio" name="by" checked={c.by === 'M'} onChange={() => patch({ by: 'M', value: mutualFromK(sheet, c) })} /> mutual inductance M</label>
        </fieldset>
      )}
      <Field
        key={`${c.id}-${c.by}`}
        live
        label={c.by === 'k' ? `${couplingName(sheet, c, 'k')}, coupling coefficient (0 to 1)` : `${couplingName(sheet, c, 'M')}, mutual inductance`}
        unit={c.by === 'k' ? '' : 'H'}
        testId="field-coupling"
        value={formatEditable(c.value, c.by === 'k' ? '' : 'H')}
        apply={async (t) => {
          const r = await quantity(t, c.by === 'k' ? '' : 'H', c.by === 'k'
            ? (v) => (v >= 0 && v <= 1 ? null : 'k must lie between 0 and 1 (k > 1 would create energy)')
            : (v) => (v >= 0 ? null : 'M must be zero or more'));
          if ('reason' in r) return r.reason;
          patch({ value: r.value });
          return null;
        }}
      />
      <div className="row-buttons"><CommandButton id="remove" /></div>
    </div>
  );
}

/** M = k·sqrt(L1·L2) for the two windings (graph-model contract). */
function mutualFromK(sheet: { parts: Part[] }, c: SheetCoupling): number {
  const [a, b] = c.windings.map((w) => sheet.parts.find((p) => p.id === w)?.value ?? 0);
  return c.by === 'k' ? c.value * mutualLimit(a, b) : c.value;
}

/** k = M / sqrt(L1·L2), at most 1. */
function kFromM(sheet: { parts: Part[] }, c: SheetCoupling): number {
  if (c.by === 'k') return c.value;
  const [a, b] = c.windings.map((w) => sheet.parts.find((p) => p.id === w)?.value ?? 0);
  return a > 0 && b > 0 ? Math.min(1, c.value / mutualLimit(a, b)) : 0.9;
}

/** A winding by its turns on a core: L = N²·A_L (common practice); the inductance stays the one value the circuit uses. */
function TurnsFields({ part, patch }: { part: Part; patch: (p: Partial<Part>) => void }) {
  const al = part.alH;
  return (
    <details className="tb-fields" data-testid="turns-fields" open={al !== undefined}>
      <summary>By turns on a core (L = N²·A_L)</summary>
      <Field key={`${part.id}-al`} label="Core inductance factor A_L (per turn²)" unit="H" testId="field-al" hint="from the core's data, e.g. 250n (250 nH per turn²); empty for none"
        value={al === undefined ? '' : formatEditable(al, 'H')}
        apply={async (t) => {
          if (!t.trim()) { patch({ alH: undefined }); return null; }
          const r = await quantity(t, 'H', (v) => (v > 0 ? null : 'A_L must be more than zero'));
          if ('reason' in r) return r.reason;
          patch({ alH: r.value });
          return null;
        }} />
      {al !== undefined && (
        <Field key={`${part.id}-turns`} live label="Turns N" testId="field-turns" hint={`sets the inductance to N²·A_L; now ${Number(turnsFromInductance(part.value ?? 0, al).toPrecision(5))} turns`}
          value={formatEditable(turnsFromInductance(part.value ?? 0, al), '')}
          apply={async (t) => {
            const r = await quantity(t, '', (v) => (v > 0 ? null : 'Turns must be more than zero'));
            if ('reason' in r) return r.reason;
            patch({ value: inductanceFromTurns(r.value, al) });
            return null;
          }} />
      )}
    </details>
  );
}
