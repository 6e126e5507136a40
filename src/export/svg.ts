/**
 * The solved sheet as one standalone SVG document, made by one pure function
 * (no DOM): the schematic with every overlay, a results table, cautions, a
 * title block, optional plots supplied by the caller, and the editable sheet
 * embedded in the metadata. The page is A4 or Letter landscape; user units
 * are millimetres, the schematic is drawn in sheet units scaled to fit.
 */
import type { SolveResult } from '../model/graph';
import type { Sheet } from '../model/sheet';
import { deriveCircuit, type DerivedCircuit } from '../model/toGraph';
import { GAP, MARGIN, PAD, RIGHT_W, cautionBlock, conventionText, frequencyText, hline, rect, t, titleBlock } from './blocks';
import { sheetMetadata } from './embed';
import { drawingSizeMm, type Paper, type SvgOptions } from './options';
import { PRINT } from './palette';
import { checkedPlots } from './plots';
import { drawSchematic, markedBy } from './schematic';
import { tableBlock } from './table';
import { SANS, num, wrap } from './text';
import { escText, oneLine } from './xml';

export { PAPER_MM, PRINT_MARGIN_MM, drawingSizeMm, type Paper, type PlotFragment, type SvgOptions } from './options';

export function sheetToSvg(sheet: Sheet, result: SolveResult | null, options: SvgOptions = {}): string {
  const paper: Paper = options.paper ?? 'A4';
  const { width: W, height: H } = drawingSizeMm(paper);
  const plots = checkedPlots(options.plots ?? []);
  const derived = deriveCircuit(sheet);
  const circuit: DerivedCircuit = options.groundName ? { ...derived, model: { ...derived.model, ground: options.groundName } } : derived;
  const x0 = MARGIN + PAD, y0 = MARGIN + PAD, x1 = W - MARGIN - PAD, y1 = H - MARGIN - PAD;
  const innerW = x1 - x0, innerH = y1 - y0;

  const tb = titleBlock(sheet, result, options, paper, RIGHT_W);
  const ca = cautionBlock(circuit, result, RIGHT_W);
  const rightH = tb.height + GAP + ca.height;
  const plotW = plots.length ? Math.min(110, innerW * 0.38) : 0;
  const schW = innerW - (plotW ? plotW + GAP * 2 : 0);
  const drawing = drawSchematic(sheet, circuit, result, markedBy(circuit, options.culprits));
  const pad = 12;
  const bw = drawing.box.x1 - drawing.box.x0 + 2 * pad;
  const bh = drawing.box.y1 - drawing.box.y0 + 2 * pad;
  // a wide, low drawing needs little height at the scale the width allows: the table may take the rest
  const LEGEND_H = 7.5;
  const drawingH = Math.max(innerH * 0.3, bh * Math.min(schW / bw, 0.42), plots.length ? innerH * 0.45 : 0) + LEGEND_H + GAP;
  const tableW = innerW - RIGHT_W - GAP * 2;
  const table = tableBlock(circuit, result, options, tableW, Math.max(rightH, innerH - drawingH));
  const bandH = Math.max(rightH, table.height);
  const bandY = y1 - bandH;

  // the drawing area above the band: plots in a column on the right, the schematic in the rest
  const topY = y0, topH = bandY - GAP - y0 - LEGEND_H;
  const plotParts: string[] = [];
  if (plots.length) {
    const titleH = 4;
    const natural = plots.reduce((s, p) => s + titleH + (plotW * p.height) / p.width + GAP, 0);
    const k = Math.min(1, topH / natural);
    let py = topY;
    plots.forEach((p, i) => {
      const w = plotW * k, h = ((plotW * p.height) / p.width) * k;
      const px = x1 - w;
      plotParts.push(`<g class="plot" id="plot-${i + 1}">`);
      if (p.title) plotParts.push(t(oneLine(p.title), px, py + 3, 2.5, { face: 'bold', fill: PRINT.label }));
      plotParts.push(`<svg x="${num(px)}" y="${num(py + titleH)}" width="${num(w)}" height="${num(h)}" viewBox="0 0 ${num(p.width, 4)} ${num(p.height, 4)}" overflow="hidden">${p.svg}</svg>`);
      plotParts.push('</g>');
      py += titleH + h + GAP;
    });
  }
  const s = Math.min(schW / bw, topH / bh, 0.42);
  const ox = x0 + (schW - bw * s) / 2 - (drawing.box.x0 - pad) * s;
  const oy = topY + (topH - bh * s) / 2 - (drawing.box.y0 - pad) * s;
  const lineWidth = Math.min(1.8, Math.max(0.9, 0.3 / s));
  // 10-unit tag text printed below 1.5 mm (about 4 pt) is hard to read
  const small = s < 0.15 ? ' The drawing is scaled down to fit the page: open the embedded sheet in Coilwright to read it closely.' : '';

  const legend = result
    ? `Arrows: current in each part's reference direction (the wire arrows follow Kirchhoff's current law); tags: magnitude∠angle, ${result.amplitudes === 'rms' ? 'RMS' : 'peak'}. Dots: winding polarity.`
    : 'Schematic only: no solved values.';
  const legendText = legend + small;

  const freq = frequencyText(result?.frequencyHz ?? sheet.frequencyHz);
  const title = oneLine(sheet.title) || 'Untitled sheet';
  const out: string[] = [];
  out.push('<?xml version="1.0" encoding="UTF-8"?>');
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${num(W)}mm" height="${num(H)}mm" viewBox="0 0 ${num(W)} ${num(H)}" font-family="${SANS}">`);
  out.push(`<title>${escText(title)}</title>`);
  out.push(`<desc>${escText(`Solved sheet exported by Coilwright${options.version ? ` ${oneLine(options.version)}` : ''}: ${freq}, ${conventionText(result, sheet)}${options.date ? `, ${oneLine(options.date)}` : ''}.`)}</desc>`);
  if (options.embedSheet !== false) out.push(`<metadata>${sheetMetadata(sheet)}</metadata>`);
  out.push(rect(0, 0, W, H, `fill="${PRINT.paper}"`));
  out.push(rect(MARGIN, MARGIN, W - 2 * MARGIN, H - 2 * MARGIN, `fill="none" stroke="${PRINT.frame}" stroke-width="0.5"`));
  out.push(`<g id="schematic" transform="translate(${num(ox, 3)} ${num(oy, 3)}) scale(${num(s, 5)})">`);
  out.push(drawing.render(lineWidth));
  out.push('</g>');
  const legendLines = wrap(legendText, schW, 2.1, 'sans', 2);
  legendLines.forEach((l, i) => out.push(t(l, x0, bandY - GAP - 1.2 - (legendLines.length - 1 - i) * 2.7, 2.1, { fill: PRINT.muted, cls: 'legend' })));
  out.push(...plotParts);
  out.push(hline(MARGIN, W - MARGIN, bandY - GAP + 0.6, PRINT.frame, 0.3));
  out.push(table.render(x0, bandY));
  out.push(ca.render(x1 - RIGHT_W, bandY));
  out.push(tb.render(x1 - RIGHT_W, bandY + ca.height + GAP));
  out.push('</svg>');
  return out.join('\n') + '\n';
}
