/**
 * Everything the sheet can leave the editor as: the SVG sheet (with the
 * panel's paper, notes and plots), the results and sweep as CSV, a PNG of the
 * canvas, a print that is the SVG sheet, and a link that carries the sheet.
 */
import { version as APP_VERSION } from '../../../package.json';
import { sheetLink } from '../../model/link';
import type { Sheet } from '../../model/sheet';
import { notify } from '../../store/actions';
import type { EditorState, EditorStore } from '../../store/types';
import { download, downloadSheet, sheetFileName } from '../files';
import { analysisOutputs } from './analysisHook';
import { plotsOnScreen, plotsShown, sweepFromAnalysisStore } from './analysisScreen';
import { shareSettings } from './settings';

export type OutputKind = 'panel' | 'link' | 'svg' | 'csv' | 'sweep-csv' | 'png' | 'copy-png' | 'print' | 'file';


const baseName = (sheet: Sheet) => sheetFileName(sheet).replace(/\.coilwright\.json$/, '');

/** The shown result when it belongs to the sheet as it is now. */
function solvedNow(s: EditorState) {
  return s.solve.status === 'solved' && s.solve.result && s.solve.circuit?.source === s.sheet ? { result: s.solve.result, circuit: s.solve.circuit } : null;
}

type ExportModule = typeof import('../../export');
let exportModule: ExportModule | null = null;

/** The export code, loaded on first use (printing needs it at hand: the browser's beforeprint cannot wait). */
export async function loadExport(): Promise<ExportModule> {
  return (exportModule ??= await import('../../export'));
}

export function exportLoaded(): ExportModule | null {
  return exportModule;
}

/** The SVG sheet as the panel's settings say; `plotsDropped` names why the plots were left out, if they were. */
export function svgNow(store: EditorStore, m: ExportModule): { svg: string; plotsDropped: string | null } {
  const s = store.getState();
  const o = shareSettings.getState();
  const solved = solvedNow(s);
  const base = {
    paper: o.paper,
    notes: o.notes.trim() || undefined,
    date: new Date().toISOString().slice(0, 10),
    version: APP_VERSION,
    unsolvedReason: solved ? undefined : s.solve.status === 'refused' && s.solve.refusal ? s.solve.refusal.message : s.sheet.parts.length === 0 ? 'There is nothing on this sheet to solve.' : 'The solve had not finished when the picture was made.',
    groundName: solved ? solved.circuit.model.ground : undefined,
    culprits: !solved && s.solve.status === 'refused' ? s.solve.refusal?.culprits : undefined,
  };
  const provider = analysisOutputs().plots ?? (plotsShown() ? plotsOnScreen : undefined);
  if (o.includePlots && provider) {
    try {
      const plots = provider();
      if (plots.length) return { svg: m.sheetToSvg(s.sheet, solved?.result ?? null, { ...base, plots }), plotsDropped: null };
    } catch (e) {
      return { svg: m.sheetToSvg(s.sheet, solved?.result ?? null, base), plotsDropped: e instanceof Error ? e.message : String(e) };
    }
  }
  return { svg: m.sheetToSvg(s.sheet, solved?.result ?? null, base), plotsDropped: null };
}

export async function currentSvg(store: EditorStore): Promise<{ svg: string; plotsDropped: string | null }> {
  return svgNow(store, await loadExport());
}

async function saveSvg(store: EditorStore): Promise<void> {
  const { svg, plotsDropped } = await currentSvg(store);
  download(`${baseName(store.getState().sheet)}.svg`, svg, 'image/svg+xml');
  notify(store, plotsDropped ? `Picture saved as SVG without the plots: ${plotsDropped}` : 'Picture saved as SVG', plotsDropped ? 'error' : 'info');
}

async function saveResultsCsv(store: EditorStore): Promise<void> {
  const s = store.getState();
  const solved = solvedNow(s);
  if (!solved) return notify(store, 'Nothing solved to write yet: the results CSV needs a solved sheet', 'error');
  const { resultsCsv } = await import('../../export/csv');
  download(`${baseName(s.sheet)}-results.csv`, resultsCsv(solved.circuit.model, s.solve.raw ?? solved.result, s.sheet.title), 'text/csv');
  notify(store, 'Results saved as CSV');
}

async function saveSweepCsv(store: EditorStore): Promise<void> {
  const given = analysisOutputs().sweep;
  const table = given ? given() : sweepFromAnalysisStore();
  if (!table) return notify(store, 'No sweep to write yet: run one in the sweep view first', 'error');
  const { sweepCsv } = await import('../../export/csv');
  const s = store.getState();
  download(`${baseName(s.sheet)}-sweep.csv`, sweepCsv({ title: s.sheet.title, amplitudes: s.sheet.amplitudes, ...table }), 'text/csv');
  notify(store, 'Sweep saved as CSV');
}

/** The drawing and its overlay as shown, cropped to what is drawn, on white, at the screen's pixel density (grid and selection left out). */
export async function canvasPng(): Promise<Blob> {
  const layers = [...document.querySelectorAll('[data-testid="sheet-canvas"] canvas')] as HTMLCanvasElement[];
  if (layers.length < 3) throw new Error('the drawing is not on screen');
  const [, sheet, overlay] = layers;
  const drawn = document.createElement('canvas');
  drawn.width = sheet.width;
  drawn.height = sheet.height;
  const d = drawn.getContext('2d', { willReadFrequently: true })!;
  d.drawImage(sheet, 0, 0);
  d.drawImage(overlay, 0, 0);
  // the box of every pixel drawn, with a margin
  const { data, width, height } = d.getImageData(0, 0, drawn.width, drawn.height);
  let x0 = width, y0 = height, x1 = -1, y1 = -1;
  for (let y = 0; y < height; y++) {
    const row = y * width * 4;
    for (let x = 0; x < width; x++) {
      if (data[row + x * 4 + 3] === 0) continue;
      if (x < x0) x0 = x;
      if (x > x1) x1 = x;
      if (y < y0) y0 = y;
      y1 = y;
    }
  }
  if (x1 < 0) throw new Error('there is nothing drawn on the sheet');
  const pad = Math.round(16 * (window.devicePixelRatio || 1));
  x0 = Math.max(0, x0 - pad); y0 = Math.max(0, y0 - pad);
  x1 = Math.min(width - 1, x1 + pad); y1 = Math.min(height - 1, y1 + pad);
  const out = document.createElement('canvas');
  out.width = x1 - x0 + 1;
  out.height = y1 - y0 + 1;
  const c = out.getContext('2d')!;
  c.fillStyle = '#ffffff';
  c.fillRect(0, 0, out.width, out.height);
  c.drawImage(drawn, -x0, -y0);
  return new Promise((resolve, reject) => out.toBlob((b) => (b ? resolve(b) : reject(new Error('the browser made no PNG'))), 'image/png'));
}

async function savePng(store: EditorStore): Promise<void> {
  download(`${baseName(store.getState().sheet)}.png`, await canvasPng(), 'image/png');
  notify(store, 'Canvas saved as PNG');
}

async function copyPng(store: EditorStore): Promise<void> {
  const blob = await canvasPng();
  try {
    await navigator.clipboard.write([new ClipboardItem({ 'image/png': blob })]);
    notify(store, 'Canvas copied as a picture: paste it anywhere');
  } catch {
    download(`${baseName(store.getState().sheet)}.png`, blob, 'image/png');
    notify(store, 'The browser did not allow copying a picture; it was saved as PNG instead');
  }
}

/** Make (and remember) the link for the sheet as it is now. */
export async function makeLink(store: EditorStore): Promise<void> {
  const base = `${location.origin}${location.pathname}${location.search}`;
  const r = await sheetLink(store.getState().sheet, base);
  shareSettings.setState({ link: r.ok ? { url: r.url, chars: r.chars } : { problem: r.reason } });
}

async function copyLink(store: EditorStore): Promise<void> {
  await makeLink(store);
  const link = shareSettings.getState().link;
  if (!link || 'problem' in link) {
    shareSettings.setState({ open: true });
    return notify(store, link && 'problem' in link ? link.problem : 'No link could be made', 'error');
  }
  try {
    await navigator.clipboard.writeText(link.url);
    notify(store, 'Link copied: whoever opens it sees this sheet solved');
  } catch {
    shareSettings.setState({ open: true });
    notify(store, 'The browser did not allow copying; the link is in the Share panel to copy by hand');
  }
}

/** Put the SVG sheet into the print-only container (PrintSheet sets this when it mounts). */
let preparePrint: (store: EditorStore) => Promise<void> = async () => undefined;
export function setPrintPreparer(f: (store: EditorStore) => Promise<void>): void {
  preparePrint = f;
}

export async function runOutput(store: EditorStore, what: OutputKind): Promise<void> {
  try {
    switch (what) {
      case 'panel': shareSettings.setState({ open: !shareSettings.getState().open }); return;
      case 'link': return await copyLink(store);
      case 'svg': return await saveSvg(store);
      case 'csv': return await saveResultsCsv(store);
      case 'sweep-csv': return await saveSweepCsv(store);
      case 'png': return await savePng(store);
      case 'copy-png': return await copyPng(store);
      case 'file': downloadSheet(store.getState().sheet); return notify(store, 'Sheet saved as a file');
      case 'print':
        await preparePrint(store);
        window.print();
        return;
    }
  } catch (e) {
    notify(store, `Could not make the ${what === 'print' ? 'print' : what.toUpperCase()}: ${e instanceof Error ? e.message : String(e)}`, 'error');
  }
}
