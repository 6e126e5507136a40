/** The readings table as plain rows (for the panel and for CSV), from a solve result. */
import { csvComment, csvField } from '../export/csvText';
import type { ComplexJson, GraphModel, SolveResult } from '../model/graph';
import { angleDeg, mag } from '../model/phasor';

export interface ReadingRow {
  name: string;
  what: 'node' | 'part';
  vMag: number;
  vDeg: number;
  iMag: number | null;
  iDeg: number | null;
  watts: number | null;
  vars: number | null;
}

const deg = (z: ComplexJson) => (mag(z) === 0 ? 0 : angleDeg(z));

/** Values smaller than this fraction of the largest of their kind are rounding noise and read as zero. */
const NOISE = 1e-12;

function clean(rows: ReadingRow[]): ReadingRow[] {
  const top = { v: 0, i: 0, s: 0 };
  for (const r of rows) {
    top.v = Math.max(top.v, r.vMag);
    top.i = Math.max(top.i, r.iMag ?? 0);
    top.s = Math.max(top.s, Math.abs(r.watts ?? 0), Math.abs(r.vars ?? 0));
  }
  const z = (x: number | null, scale: number) => (x !== null && Math.abs(x) < scale * NOISE ? 0 : x);
  return rows.map((r) => {
    const vMag = z(r.vMag, top.v)!;
    const iMag = z(r.iMag, top.i);
    return {
      ...r, vMag, vDeg: vMag === 0 ? 0 : r.vDeg, iMag, iDeg: iMag === 0 ? 0 : r.iDeg,
      watts: z(r.watts, top.s), vars: z(r.vars, top.s),
    };
  });
}

export function readingRows(result: SolveResult): ReadingRow[] {
  return clean(rawRows(result));
}

/** Rows exactly as solved (the CSV uses these, so it carries the same numbers as the command line). */
export function rawRows(result: SolveResult): ReadingRow[] {
  const rows: ReadingRow[] = [];
  for (const [name, v] of Object.entries(result.nodes)) {
    rows.push({ name, what: 'node', vMag: mag(v), vDeg: deg(v), iMag: null, iDeg: null, watts: null, vars: null });
  }
  for (const [id, r] of Object.entries(result.elements)) {
    if ('current' in r) {
      rows.push({ name: id, what: 'part', vMag: mag(r.voltage), vDeg: deg(r.voltage), iMag: mag(r.current), iDeg: deg(r.current), watts: r.power.watts, vars: r.power.vars });
    } else {
      rows.push({ name: `${id} primary`, what: 'part', vMag: mag(r.voltages[0]), vDeg: deg(r.voltages[0]), iMag: mag(r.currents[0]), iDeg: deg(r.currents[0]), watts: r.power.watts, vars: r.power.vars });
      rows.push({ name: `${id} secondary`, what: 'part', vMag: mag(r.voltages[1]), vDeg: deg(r.voltages[1]), iMag: mag(r.currents[1]), iDeg: deg(r.currents[1]), watts: null, vars: null });
    }
  }
  return rows;
}

/** The rows whose part or node is still in `model` (all of them without one). */
export function onSheet(rows: ReadingRow[], model: GraphModel | null): ReadingRow[] {
  if (!model) return rows;
  const ids = new Set(model.elements.map((e) => e.id));
  const nodes = new Set(model.elements.flatMap((e) => e.nodes));
  return rows.filter((r) => (r.what === 'node' ? nodes.has(r.name) : ids.has(r.name.replace(/ (primary|secondary)$/, ''))));
}

export type SortKey = keyof ReadingRow;

const collator = new Intl.Collator(undefined, { numeric: true });

export function sortRows(rows: ReadingRow[], key: SortKey, dir: 1 | -1): ReadingRow[] {
  return [...rows].sort((a, b) => {
    const x = a[key], y = b[key];
    if (x === y) return 0;
    if (x === null) return 1;
    if (y === null) return -1;
    if (typeof x === 'number' && typeof y === 'number') return (x - y) * dir;
    return collator.compare(String(x), String(y)) * dir;
  });
}

const num = (v: number | null) => (v === null ? '' : Number(v.toPrecision(9)).toString());

export function readingsCsv(result: SolveResult, rows: ReadingRow[], title: string): string {
  const unit = result.amplitudes === 'rms' ? 'RMS' : 'peak';
  const lines = [
    csvComment('Coilwright readings', title),
    csvComment(`frequency ${result.frequencyHz} Hz; amplitudes ${unit}; angles in degrees; linear idealised model (no saturation, inrush or heating)`),
    ['name', 'kind', `voltage_${unit}_V`, 'voltage_deg', `current_${unit}_A`, 'current_deg', 'P_W', 'Q_var'].map(csvField).join(','),
  ];
  for (const r of rows) lines.push([csvField(r.name), csvField(r.what), num(r.vMag), num(r.vDeg), num(r.iMag), num(r.iDeg), num(r.watts), num(r.vars)].join(','));
  return lines.join('\n') + '\n';
}
