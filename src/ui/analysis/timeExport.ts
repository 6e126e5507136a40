/** The time view's measurements as a small SVG table for the SVG sheet (the plot itself goes as it is on screen). */
import type { PlotFragment } from '../../export/options';
import { escText } from '../../export/xml';
import { formatSI } from '../../model/quantity';
import type { Measures } from './timeMath';

export interface MeasureTableRow { label: string; unit: string; m: Measures; settle: number | null }

const COLS = ['trace', 'peak', 'time of peak', 'peak-to-peak', 'mean', 'RMS', 'settling (2 %)'];
const WIDTHS = [120, 80, 80, 86, 80, 80, 90];

export function measureTableSvg(rows: MeasureTableRow[], window: [number, number]): PlotFragment {
  const rowH = 16;
  const width = WIDTHS.reduce((a, b) => a + b, 0) + 8;
  const height = rowH * (rows.length + 1) + 10;
  const s = (t: number) => formatSI(t, 's', 4);
  const cells = (texts: string[], y: number, bold: boolean) => {
    let x = 4;
    return texts.map((tx, i) => {
      const out = `<text x="${x + (i ? WIDTHS[i] - 4 : 0)}" y="${y}" font-size="10" font-family="system-ui, sans-serif"${bold ? ' font-weight="600"' : ''}${i ? ' text-anchor="end"' : ''}>${escText(tx)}</text>`;
      x += WIDTHS[i];
      return out;
    }).join('');
  };
  const body = rows.map((r, k) => cells([
    r.label, formatSI(r.m.peak, r.unit, 4), s(r.m.timeOfPeak), formatSI(r.m.peakToPeak, r.unit, 4),
    formatSI(r.m.mean, r.unit, 4), formatSI(r.m.rms, r.unit, 4), r.settle === null ? 'not settled' : s(r.settle),
  ], rowH * (k + 2), false)).join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">`
    + `<line x1="4" x2="${width - 4}" y1="${rowH + 4}" y2="${rowH + 4}" stroke="#bbb"/>${cells(COLS, rowH, true)}${body}</svg>`;
  return { title: `Measurements over ${s(window[0])} to ${s(window[1])}`, svg, width, height };
}
