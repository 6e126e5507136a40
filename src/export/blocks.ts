/** Pieces of the page in millimetres: text and rules, the title block, the cautions. */
import type { SolveResult } from '../model/graph';
import { cautionsFor } from '../model/cautions';
import { formatSI } from '../model/quantity';
import type { Sheet } from '../model/sheet';
import type { DerivedCircuit } from '../model/toGraph';
import type { Paper, SvgOptions } from './options';
import { PRINT } from './palette';
import { MONO, num, wrap, type Face } from './text';
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

export function titleBlock(sheet: Sheet, result: SolveResult | null, o: SvgOptions, paper: Paper, width: number): Block {
  const title = oneLine(sheet.title) || 'Untitled sheet';
  const titleLines = wrap(title, width - 6, 3.6, 'bold', 3);
  const notes = (o.notes ?? '').trim();
  const noteLines = notes ? wrap(notes.replace(/\r\n?/g, '\n'), width - 6, 2.3, 'sans', 8) : [];
  const titleH = 4.5 + titleLines.length * 4.4;
  const cellH = 8.6;
  const notesH = noteLines.length ? 4.6 + noteLines.length * 3 : 0;
  const footH = 6.4;
  const height = titleH + 2 * cellH + notesH + footH;
  const freq = frequencyText(result?.frequencyHz ?? sheet.frequencyHz);
  const render = (x: number, y: number) => {
    const out: string[] = [`<g id="title-block">`];
    out.push(rect(x, y, width, height, `fill="${PRINT.paper}" stroke="${PRINT.frame}" stroke-width="0.45"`));
    const label = (s: string, lx: number, ly: number) => t(s.toUpperCase(), lx, ly, 1.8, { fill: PRINT.muted, cls: 'tb-label' });
    let cy = y;
    out.push(label('Title', x + 2.5, cy + 3));
    titleLines.forEach((line, i) => out.push(t(line, x + 2.5, cy + 7.4 + i * 4.4, 3.6, { face: 'bold', cls: 'tb-title' })));
    cy += titleH;
    const half = width / 2;
    const cell = (name: string, value: string, cx: number, cls: string) => {
      out.push(label(name, cx + 2.5, cy + 2.9));
      // one line, cut to the cell
      out.push(t(wrap(oneLine(value), half - 4, 2.7, 'sans', 1)[0] ?? '', cx + 2.5, cy + 7, 2.7, { cls }));
    };
    out.push(hline(x, x + width, cy, PRINT.frame, 0.3));
    cell('Date', o.date ?? '', x, 'tb-date');
    cell('Frequency', freq, x + half, 'tb-frequency');
    cy += cellH;
    out.push(hline(x, x + width, cy, PRINT.rule, 0.25));
    cell('Phasors', conventionText(result, sheet), x, 'tb-convention');
    cell('Paper', `${paper} landscape`, x + half, 'tb-paper');
    out.push(`<line x1="${num(x + half)}" y1="${num(cy - cellH)}" x2="${num(x + half)}" y2="${num(cy + cellH)}" stroke="${PRINT.rule}" stroke-width="0.25"/>`);
    cy += cellH;
    if (noteLines.length) {
      out.push(hline(x, x + width, cy, PRINT.rule, 0.25));
      out.push(label('Notes', x + 2.5, cy + 3));
      noteLines.forEach((line, i) => out.push(t(line, x + 2.5, cy + 6.6 + i * 3, 2.3, { cls: 'tb-notes' })));
      cy += notesH;
    }
    out.push(rect(x, cy, width, footH, `fill="${PRINT.band}" stroke="${PRINT.frame}" stroke-width="0.3"`));
    out.push(t(`Coilwright${o.version ? ` ${oneLine(o.version)}` : ''}`, x + 2.5, cy + 4.4, 2.8, { face: 'bold', cls: 'tb-program' }));
    out.push(t(result ? 'solved sheet' : 'sheet, not solved', x + width - 2.5, cy + 4.4, 2.2, { fill: PRINT.muted, anchor: 'end' }));
    out.push('</g>');
    return out.join('\n');
  };
  return { height, render };
}

// ---------- cautions and notes ----------

export function cautionBlock(circuit: DerivedCircuit, result: SolveResult | null, width: number): Block {
  const size = 2.2;
  const lh = 2.85;
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
  }
  const notes = [...circuit.notes, ...(result?.warnings ?? [])];
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
        out.push(t(p.head, x + 3, cy - 0.6, 2.3, { face: 'bold', fill: p.color }));
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
