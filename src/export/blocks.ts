/** Pieces of the page in millimetres: text and rules, the title block, the cautions. */
import type { SolveResult } from '../model/graph';
import { cautionsFor, openSecondaries, overloads } from '../model/cautions';
import { formatSI } from '../model/quantity';
import type { Sheet } from '../model/sheet';
import type { DerivedCircuit } from '../model/toGraph';
import type { Paper, SvgOptions } from './options';
import { PRINT } from './palette';
import { MONO, num, textWidth, wrap, type Face } from './text';
import { escText, oneLine } from './xml';

export const MARGIN = 1;
export const PAD = 4.5;
export const GAP = 4;
export const RIGHT_W = 98;

export interface Block { height: number; render: (x: number, y: number) => string }

export function t(s: string, x: number, y: number, size: number, o: { fill?: string; face?: Face; anchor?: 'start' | 'middle' | 'end'; cls?: string } = {}): string {
  const face = o.face ?? 'sans';
  const font = face === 'mono' ? ` font-family="${MONO}"` : '';
  const weight = face === 'bold' ? ' font-weight="700"' : '';
  const anchor = o.anchor && o.anchor !== 'start' ? ` text-anchor="${o.anchor}"` : '';
  const cls = o.cls ? ` class="${o.cls}"` : '';
  return `<text x="${num(x)}" y="${num(y)}" font-size="${num(size)}" fill="${o.fill ?? PRINT.ink}"${font}${weight}${anchor}${cls}>${escText(s)}</text>`;
}

export const rect = (x: number, y: number, w: number, h: number, attrs: string) =>
  `<rect x="${num(x)}" y="${num(y)}" width="${num(w)}" height="${num(h)}" ${attrs}/>`;
export const hline = (x0: number, x1: number, y: number, color: string = PRINT.rule, w = 0.2) =>
  `<line x1="${num(x0)}" y1="${num(y)}" x2="${num(x1)}" y2="${num(y)}" stroke="${color}" stroke-width="${w}"/>`;

export function conventionText(result: SolveResult | null, sheet: Sheet): string {
  const amp = result?.amplitudes ?? sheet.amplitudes;
  if ((result?.frequencyHz ?? sheet.frequencyHz) === 0) return 'DC values; P = V·I';
  return amp === 'rms' ? 'RMS phasors; S = V·I*' : 'Peak phasors; S = ½·V·I*';
}

export function frequencyText(f: number): string {
  return f === 0 ? '0 Hz (DC)' : formatSI(f, 'Hz', 6);
}

// ---------- title block ----------

/** Text in the title block and the cautions is at least 2.5 mm high, the usual minimum for drawings (common practice). */
export const MIN_TEXT = 2.5;

/**
 * The title block, laid out on the data fields of ISO 7200 in a design of
 * our own: an accent bar down the left; the title and supplementary title
 * across the top; then two columns of fields, each a line with its name on
 * the left and its value on the right over a dotted rule; the notes; a
 * foot line with the program. Empty fields show a dash.
 */
export function titleBlock(sheet: Sheet, result: SolveResult | null, o: SvgOptions, paper: Paper, width: number): Block {
  const tbf = sheet.titleBlock;
  const title = oneLine(sheet.title) || 'Untitled sheet';
  const inner = width - 8;
  const titleLines = wrap(title, inner, 4, 'bold', 2);
  const subLines = tbf.subtitle.trim() ? wrap(oneLine(tbf.subtitle), inner, 2.8, 'sans', 2) : [];
  const notes = (o.notes ?? '').trim();
  const noteLines = notes ? wrap(notes.replace(/\r\n?/g, '\n'), inner, MIN_TEXT, 'sans', 6) : [];
  const dash = (v: string) => oneLine(v).trim() || '—';
  const left: [string, string, string][] = [
    ['Document number', dash(tbf.number), 'tb-number'],
    ['Revision', dash(tbf.revision), 'tb-revision'],
    ['Sheet', dash(tbf.sheet), 'tb-sheet'],
    ['Date of issue', dash(o.date ?? ''), 'tb-date'],
    ['Status', dash(tbf.status), 'tb-status'],
  ];
  const right: [string, string, string][] = [
    ['Owner', dash(tbf.owner), 'tb-owner'],
    ['Drawn by', dash(tbf.drawnBy), 'tb-drawn'],
    ['Checked by', dash(tbf.checkedBy), 'tb-checked'],
    ['Approved by', dash(tbf.approvedBy), 'tb-approved'],
    ['Frequency', frequencyText(result?.frequencyHz ?? sheet.frequencyHz), 'tb-frequency'],
  ];
  const rowH = 4.4;
  const headH = 3 + titleLines.length * 4.8 + subLines.length * 3.5 + 1.5;
  const gridH = left.length * rowH + 1;
  const convH = 4.6;
  const notesH = noteLines.length ? 1.5 + noteLines.length * 3.3 : 0;
  const footH = 5;
  const height = headH + gridH + convH + notesH + footH;
  const render = (x: number, y: number) => {
    const out: string[] = [`<g id="title-block">`];
    out.push(rect(x, y, width, height, `fill="${PRINT.paper}" stroke="${PRINT.frame}" stroke-width="0.35"`));
    out.push(rect(x, y, 2, height, `fill="${PRINT.coupling}" stroke="none"`));
    const x0 = x + 5;
    let cy = y + 3;
    titleLines.forEach((line) => { cy += 4.8; out.push(t(line, x0, cy - 0.8, 4, { face: 'bold', cls: 'tb-title' })); });
    subLines.forEach((line) => { cy += 3.5; out.push(t(line, x0, cy - 0.6, 2.8, { fill: PRINT.label, cls: 'tb-subtitle' })); });
    cy = y + headH;
    const colW = (width - 7) / 2 - 2;
    const field = (cx: number, ry: number, [name, value, cls]: [string, string, string]) => {
      out.push(t(name, cx, ry + 3.2, MIN_TEXT, { fill: PRINT.muted, cls: 'tb-name' }));
      const v = wrap(value, colW - textWidth(name, MIN_TEXT, 'sans') - 2, 2.8, 'bold', 1)[0] ?? '';
      out.push(t(v, cx + colW, ry + 3.2, 2.8, { face: 'bold', anchor: 'end', cls }));
      out.push(`<line x1="${num(cx)}" y1="${num(ry + rowH - 0.2)}" x2="${num(cx + colW)}" y2="${num(ry + rowH - 0.2)}" stroke="${PRINT.rule}" stroke-width="0.2" stroke-dasharray="0.4 0.6"/>`);
    };
    left.forEach((f, i) => field(x0, cy + i * rowH, f));
    right.forEach((f, i) => field(x0 + colW + 4, cy + i * rowH, f));
    cy += gridH;
    out.push(t(conventionText(result, sheet), x0, cy + 3.4, MIN_TEXT, { fill: PRINT.label, cls: 'tb-convention' }));
    out.push(t(`${paper} landscape`, x + width - 2.5, cy + 3.4, MIN_TEXT, { fill: PRINT.label, anchor: 'end', cls: 'tb-paper' }));
    cy += convH;
    if (noteLines.length) {
      noteLines.forEach((line, i) => out.push(t(line, x0, cy + 3.2 + i * 3.3, MIN_TEXT, { cls: 'tb-notes' })));
      cy += notesH;
    }
    out.push(hline(x + 2, x + width, cy, PRINT.frame, 0.25));
    out.push(t(`Coilwright${o.version ? ` ${oneLine(o.version)}` : ''}`, x0, cy + 3.6, 2.8, { face: 'bold', cls: 'tb-program' }));
    out.push(t(result ? 'solved sheet' : 'sheet, not solved', x + width - 2.5, cy + 3.6, MIN_TEXT, { fill: PRINT.muted, anchor: 'end' }));
    out.push('</g>');
    return out.join('\n');
  };
  return { height, render };
}

// ---------- cautions and notes ----------

export function cautionBlock(circuit: DerivedCircuit, result: SolveResult | null, width: number): Block {
  const size = MIN_TEXT;
  const lh = 3.2;
  const inner = width - 6;
  type Para = { head?: string; lines: string[]; color: string; cls: string };
  const paras: Para[] = [];
  const add = (head: string | undefined, body: string, color: string, cls: string) =>
    paras.push({ head, lines: wrap(oneLine(body), inner, size, 'sans', 12), color, cls });
  add(undefined, 'Linear, idealised model: it shows no saturation, inrush or temperature rise. Check real parts against their data.', PRINT.ink, 'caution-linear');
  if (result) {
    for (const c of cautionsFor(circuit.model, result)) {
      add(c.kind === 'elv' ? '⚠ Hazardous voltage' : '⚠ Open winding', c.text, PRINT.caution, c.kind === 'elv' ? 'caution-voltage' : 'caution-open-winding');
    }
    for (const c of overloads(circuit, result)) add('⚠ Above rating', c.text, PRINT.caution, 'caution-overload');
  }
  for (const c of openSecondaries(circuit.model)) add('⚠ Open current-transformer secondary', c.text, PRINT.caution, 'caution-open-secondary');
  // said of the sheet: an isolated section, not the solver's "isolated part"
  const notes = [...circuit.notes, ...(result?.warnings ?? []).map((w) => w.replace(/^isolated part:\s*/i, 'Isolated section: '))];
  notes.forEach((n, i) => add(i === 0 ? 'From the solve' : undefined, n, PRINT.label, 'solver-note'));
  let height = 5.2;
  for (const p of paras) height += (p.head ? 3.3 : 0) + p.lines.length * lh + 1.3;
  height += 0.6;
  const render = (x: number, y: number) => {
    const out: string[] = [`<g id="cautions">`];
    out.push(rect(x, y, width, height, `fill="${PRINT.cautionFill}" stroke="${PRINT.caution}" stroke-width="0.35"`));
    out.push(t('Cautions', x + 3, y + 4, 2.7, { face: 'bold', fill: PRINT.caution }));
    let cy = y + 5.2;
    for (const p of paras) {
      if (p.head) {
        cy += 3.3;
        out.push(t(p.head, x + 3, cy - 0.6, MIN_TEXT, { face: 'bold', fill: p.color }));
      }
      for (const line of p.lines) {
        cy += lh;
        out.push(t(line, x + 3, cy - 0.5, size, { fill: p.color, cls: p.cls }));
      }
      cy += 1.3;
    }
    out.push('</g>');
    return out.join('\n');
  };
  return { height, render };
}
