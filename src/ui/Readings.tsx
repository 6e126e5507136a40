/** The readings panel: node voltages, part voltages and currents, P and Q; sortable; copy as CSV. */
import { useDeferredValue, useMemo, useState } from 'react';
import { formatAngle, formatSI } from '../model/quantity';
import { rectText } from '../model/drawLayout';
import { CommandButton } from './CommandButton';
import { onSheet, readingRows, sortRows, type SortKey } from './readings';
import { useEditor, useEditorState } from './editorContext';

const COLS: { key: SortKey; label: string; unit?: string }[] = [
  { key: 'name', label: 'Name' },
  { key: 'vMag', label: 'V', unit: 'V' },
  { key: 'iMag', label: 'I', unit: 'A' },
  { key: 'watts', label: 'P', unit: 'W' },
  { key: 'vars', label: 'Q', unit: 'var' },
];

export function Readings() {
  // the table follows the overlay at lower priority, so a long table never holds up the drawing
  const solve = useDeferredValue(useEditorState((s) => s.solve));
  const [limit, setLimit] = useState(120);
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: 'name', dir: 1 });
  const derived = useEditorState((s) => s.derived);
  // while refused, the last good values stand in grey, but only for what is still on the sheet
  const rows = useMemo(() => (solve.result ? onSheet(readingRows(solve.result), derived?.model ?? null) : []), [solve.result, derived]);
  const sorted = useMemo(() => {
    const nodes = sortRows(rows.filter((r) => r.what === 'node'), sort.key, sort.dir);
    const parts = sortRows(rows.filter((r) => r.what === 'part'), sort.key, sort.dir);
    return { nodes, parts };
  }, [rows, sort]);
  const readout = useEditorState((s) => s.readout);
  const { store } = useEditor();
  // the designators of the selected parts: their rows are marked, and a click on a row selects its part
  const selectedRefs = useEditorState((s) => s.selection.map((id) => s.sheet.parts.find((p) => p.id === id)?.ref).filter(Boolean).join('|'));
  const marked = useMemo(() => new Set(selectedRefs.split('|')), [selectedRefs]);
  const pick = (name: string) => {
    const ref = name.replace(/ (primary|secondary)$/, '');
    const part = store.getState().sheet.parts.find((p) => p.ref === ref);
    if (part) store.setState({ selection: [part.id] });
  };
  const stale = solve.stale || solve.status === 'refused';
  /** a phasor cell: magnitude and angle, or real and imaginary parts */
  const cell = (m: number | null, deg: number | null, unit: string) => {
    if (m === null || deg === null) return '';
    if (readout === 'rect') {
      const r = (deg * Math.PI) / 180;
      return m === 0 ? `0 ${unit}` : rectText({ re: m * Math.cos(r), im: m * Math.sin(r) }, unit);
    }
    return <>{fmt(m, unit)} <span className="ang">∠{ang(deg)}</span></>;
  };
  const fmt = (v: number | null, unit: string) => (v === null ? '' : formatSI(v, unit, 4));
  const ang = (v: number | null) => (v === null ? '' : formatAngle(v));
  const header = (
    <thead>
      <tr>
        {COLS.map((c) => (
          <th key={c.key} scope="col" aria-sort={sort.key === c.key ? (sort.dir === 1 ? 'ascending' : 'descending') : 'none'}>
            <button type="button" className="th-btn" title={`Sort by ${c.label}`} onClick={() => setSort({ key: c.key, dir: sort.key === c.key ? (-sort.dir as 1 | -1) : 1 })}>
              {c.label}{sort.key === c.key ? (sort.dir === 1 ? ' ▲' : ' ▼') : ''}
            </button>
          </th>
        ))}
      </tr>
    </thead>
  );
  return (
    <section className={`panel readings ${stale ? 'stale' : ''}`} aria-label="Readings">
      <div className="panel-head">
        <h2 className="panel-title">Readings</h2>
        <span className="muted">{solve.result ? `${solve.result.amplitudes === 'rms' ? 'RMS' : 'peak'} · ${formatSI(solve.result.frequencyHz, 'Hz', 4)}` : ''}{stale ? ' · last good values' : ''}</span>
        <CommandButton id="copy-readings">Copy CSV</CommandButton>
      </div>
      {!solve.result ? (
        <p className="muted">Nothing solved yet — place a source and some parts.</p>
      ) : (
        <div className="table-wrap">
          <table data-testid="readings-parts">
            <caption>Parts (V across, I through along the reference direction)</caption>
            {header}
            <tbody>
              {sorted.parts.slice(0, limit).map((r) => (
                <tr key={r.name} data-name={r.name} className={marked.has(r.name.replace(/ (primary|secondary)$/, '')) ? 'marked' : undefined}>
                  <th scope="row"><button type="button" className="row-btn" title={`Select ${r.name} on the sheet`} onClick={() => pick(r.name)}>{r.name}</button></th>
                  <td data-col="v">{cell(r.vMag, r.vDeg, 'V')}</td>
                  <td data-col="i" data-mag={r.iMag ?? ''} data-deg={r.iDeg ?? ''}>{cell(r.iMag, r.iDeg, 'A')}</td>
                  <td>{fmt(r.watts, 'W')}</td>
                  <td>{fmt(r.vars, 'var')}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <table data-testid="readings-nodes">
            <caption>Nodes (voltage to the reference)</caption>
            <thead><tr><th scope="col">Node</th><th scope="col">V</th></tr></thead>
            <tbody>
              {sorted.nodes.slice(0, limit).map((r) => (
                <tr key={r.name} data-name={r.name}>
                  <th scope="row">{r.name}</th>
                  <td>{cell(r.vMag, r.vDeg, 'V')}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {(sorted.parts.length > limit || sorted.nodes.length > limit) && (
            <button type="button" className="cmd" onClick={() => setLimit(limit + 500)}>Show more rows ({Math.max(sorted.parts.length, sorted.nodes.length) - limit} hidden)</button>
          )}
        </div>
      )}
    </section>
  );
}
