/**
 * Results and sweeps as CSV (RFC 4180: comma-separated, CRLF line ends).
 * Numbers are written in JavaScript's shortest round-trip form, so a reader
 * gets back exactly the doubles the solver produced. Every text field is
 * quoted and defused against spreadsheet formulas (OWASP, CSV Injection);
 * comment lines start with `#` and carry any user text (a title, a node
 * name) in fields of its own, quoted and defused like the rest.
 */
import type { ComplexJson, GraphModel, SolveResult, SweepResult } from '../model/graph';
import { csvComment, csvField } from './csvText';

export { csvComment, csvField };

const EOL = '\r\n';

/** A number in its shortest round-trip form; '' for a missing value. */
export function csvNumber(x: number | null | undefined): string {
  if (x === null || x === undefined) return '';
  if (!Number.isFinite(x)) return '';
  return Object.is(x, -0) ? '0' : String(x);
}

const mag = (z: ComplexJson) => Math.hypot(z.re, z.im);
const deg = (z: ComplexJson) => (z.re === 0 && z.im === 0 ? 0 : (Math.atan2(z.im, z.re) * 180) / Math.PI);
const phasor = (z: ComplexJson | null) => (z ? [csvNumber(z.re), csvNumber(z.im), csvNumber(mag(z)), csvNumber(deg(z))] : ['', '', '', '']);

export const RESULTS_HEADER = [
  'name', 'kind',
  'V_re', 'V_im', 'V_mag', 'V_deg',
  'I_re', 'I_im', 'I_mag', 'I_deg',
  'P_W', 'Q_var',
];

/**
 * The solved values as CSV: one row per node (voltage to the reference node)
 * and per part (voltage across and current through in its reference
 * direction, P and Q absorbed); an ideal transformer gives a primary and a
 * secondary row, its P and Q on the first. Values are the solver's, unrounded.
 */
export function resultsCsv(model: GraphModel, result: SolveResult, title = ''): string {
  const unit = result.amplitudes === 'rms' ? 'RMS' : 'peak';
  const lines = [
    csvComment('Coilwright results', title),
    csvComment(`${result.frequencyHz} Hz; magnitudes are ${unit} values; angles in degrees; P and Q absorbed by each part (negative: delivered); linear idealised model`),
    csvComment('node voltages are to the node', model.ground),
    RESULTS_HEADER.map(csvField).join(','),
  ];
  const node = csvField('node');
  for (const [name, v] of Object.entries(result.nodes)) {
    lines.push([csvField(name), node, ...phasor(v), ...phasor(null), '', ''].join(','));
  }
  for (const el of model.elements) {
    if (!Object.hasOwn(result.elements, el.id)) continue;
    const r = result.elements[el.id];
    const kind = csvField(el.kind);
    if ('current' in r) {
      lines.push([csvField(el.id), kind, ...phasor(r.voltage), ...phasor(r.current), csvNumber(r.power.watts), csvNumber(r.power.vars)].join(','));
    } else {
      lines.push([csvField(`${el.id} primary`), kind, ...phasor(r.voltages[0]), ...phasor(r.currents[0]), csvNumber(r.power.watts), csvNumber(r.power.vars)].join(','));
      lines.push([csvField(`${el.id} secondary`), kind, ...phasor(r.voltages[1]), ...phasor(r.currents[1]), '', ''].join(','));
    }
  }
  return lines.join(EOL) + EOL;
}

/** Sweep data as the analysis views hold it: one complex series per trace, real and imaginary parts interleaved. */
export interface SweepTable {
  title?: string;
  amplitudes?: 'rms' | 'peak';
  frequenciesHz: ArrayLike<number>;
  traces: { label: string; unit: string; values: ArrayLike<number> }[];
  /** a value sweep: the value swept, one per row (written beside the frequency) */
  swept?: { label: string; unit: string; values: ArrayLike<number> };
}

/** The solver's sweep result as a table: every node voltage, then each part's voltage and current. */
export function sweepTableOf(sweep: SweepResult, title?: string): SweepTable {
  const traces: SweepTable['traces'] = [];
  const flat = (zs: ComplexJson[]) => zs.flatMap((z) => [z.re, z.im]);
  for (const [name, zs] of Object.entries(sweep.nodes)) traces.push({ label: `V(${name})`, unit: 'V', values: flat(zs) });
  for (const [id, r] of Object.entries(sweep.elements)) {
    if (r.voltage && r.current) {
      traces.push({ label: `V(${id})`, unit: 'V', values: flat(r.voltage) });
      traces.push({ label: `I(${id})`, unit: 'A', values: flat(r.current) });
    } else if (r.voltages && r.currents) {
      traces.push({ label: `V(${id} primary)`, unit: 'V', values: flat(r.voltages.map((p) => p[0])) });
      traces.push({ label: `I(${id} primary)`, unit: 'A', values: flat(r.currents.map((p) => p[0])) });
      traces.push({ label: `V(${id} secondary)`, unit: 'V', values: flat(r.voltages.map((p) => p[1])) });
      traces.push({ label: `I(${id} secondary)`, unit: 'A', values: flat(r.currents.map((p) => p[1])) });
    }
  }
  return { title, amplitudes: sweep.amplitudes, frequenciesHz: sweep.frequenciesHz, traces };
}

/** One row per frequency; for each trace its real and imaginary parts, magnitude and angle (degrees). */
export function sweepCsv(table: SweepTable): string {
  const n = table.frequenciesHz.length;
  for (const t of table.traces) {
    if (t.values.length !== 2 * n) throw new Error(`sweep trace ${t.label} has ${t.values.length / 2} points, the sweep has ${n}`);
  }
  const unit = table.amplitudes === 'peak' ? 'peak' : 'RMS';
  const head = ['f_Hz'];
  const cleanUnit = (u: string) => u.replace(/[^\p{L}\p{N}.%/_-]+/gu, '') || '1';
  if (table.swept) {
    if (table.swept.values.length !== n) throw new Error(`the swept values have ${table.swept.values.length} points, the sweep has ${n}`);
    head.push(`${table.swept.label} ${cleanUnit(table.swept.unit)}`);
  }
  for (const t of table.traces) {
    const u = t.unit.replace(/[^\p{L}\p{N}.%/_-]+/gu, '') || '1';
    for (const part of ['re', 'im', 'mag', 'deg']) head.push(`${t.label} ${part} ${part === 'deg' ? 'deg' : u}`);
  }
  const lines = [
    csvComment('Coilwright sweep', table.title ?? ''),
    csvComment(`magnitudes are ${unit} values; angles in degrees; linear idealised model`),
    head.map(csvField).join(','),
  ];
  for (let i = 0; i < n; i++) {
    const row = [csvNumber(table.frequenciesHz[i])];
    if (table.swept) row.push(csvNumber(table.swept.values[i]));
    for (const t of table.traces) row.push(...phasor({ re: t.values[2 * i], im: t.values[2 * i + 1] }));
    lines.push(row.join(','));
  }
  return lines.join(EOL) + EOL;
}

/** Parse CSV written by these functions (RFC 4180 quoting; `#` lines skipped): rows of fields. */
export function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let i = 0;
  while (i < text.length) {
    if (text[i] === '#') {
      const e = text.indexOf('\n', i);
      i = e < 0 ? text.length : e + 1;
      continue;
    }
    const row: string[] = [];
    for (;;) {
      let field = '';
      if (text[i] === '"') {
        i++;
        for (;;) {
          if (i >= text.length) throw new Error('CSV: a quoted field is not closed');
          if (text[i] === '"') {
            if (text[i + 1] === '"') { field += '"'; i += 2; continue; }
            i++;
            break;
          }
          field += text[i++];
        }
      } else {
        while (i < text.length && text[i] !== ',' && text[i] !== '\r' && text[i] !== '\n') field += text[i++];
      }
      row.push(field);
      if (text[i] === ',') { i++; continue; }
      if (text[i] === '\r') i++;
      if (text[i] === '\n') i++;
      break;
    }
    rows.push(row);
  }
  return rows;
}
