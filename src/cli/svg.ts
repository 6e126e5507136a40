import { basename } from 'node:path';
import { graphToSheet, seedIds } from '../model';
import type { Sheet } from '../model/sheet';
import { sheetToSvg } from '../export';
import { solveGraph } from '../solver';
import { loadModelText } from './load';
import { version } from '../../package.json';

/** The date printed on the sheet: SOURCE_DATE_EPOCH (seconds) when set, for repeatable output, else today (UTC). */
function studyDate(): string {
  const epoch = process.env.SOURCE_DATE_EPOCH;
  const ms = epoch && /^\d+$/.test(epoch) ? Number(epoch) * 1000 : Date.now();
  return new Date(ms).toISOString().slice(0, 10);
}

/**
 * `svg FILE`: solves a saved sheet (or a graph model, laid out simply) and
 * renders the solved sheet as one SVG document with the sheet embedded.
 * Refuses exactly as `solve` does, with a ModelRefusal naming the culprit.
 */
export async function renderSheetSvg(text: string, name: string): Promise<string> {
  const loaded = await loadModelText(text, name);
  const result = solveGraph(loaded.model);
  const options = { date: studyDate(), version, paper: 'A4' as const };
  if (loaded.sheet) return sheetToSvg(loaded.sheet as Sheet, result, options);
  // a graph model is laid out in a row, with fixed ids so that the same model gives the same file
  seedIds(0x5eed);
  const sheet = graphToSheet(loaded.model, basename(name).replace(/\.json$/i, ''));
  return sheetToSvg(sheet, result, { ...options, groundName: loaded.model.ground });
}
