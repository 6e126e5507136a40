/** Sheet files: save as our JSON, open a sheet or a graph-model file; anything else is refused with a reason. */
import { graphToSheet } from '../model/fromGraph';
import { isGraphJson, parseSheetJson } from '../model/parseSheet';
import { validateSheet } from '../model/sheetSchema';
import type { GraphModel } from '../model/graph';
import type { Sheet } from '../model/sheet';

/**
 * Reads untrusted graph-model JSON into a checked model, or throws with one
 * line. The solver owns that check; the boot file hands it in, so the editor
 * does not reach into the solver itself.
 */
export type GraphReader = (json: unknown) => Promise<GraphModel>;

export function sheetFileName(sheet: Sheet): string {
  const base = sheet.title.trim().replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'sheet';
  return `${base}.coilwright.json`;
}

/** Hands text or a blob to the browser as a download. */
export function download(name: string, data: string | Blob, type: string): void {
  const url = URL.createObjectURL(typeof data === 'string' ? new Blob([data], { type }) : data);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function downloadSheet(sheet: Sheet): void {
  download(sheetFileName(sheet), JSON.stringify(sheet, null, 2), 'application/json');
}

/** Read the text of a chosen file as a sheet; throws an Error with a one-line message. */
export async function readSheetFile(parse: { text: string; name: string }, readGraph?: GraphReader): Promise<Sheet> {
  if (/^\s*(<\?xml|<svg|<!--)/.test(parse.text)) {
    const { svgToSheet } = await import('../export');
    return svgToSheet(parse.text);
  }
  let json: unknown;
  try {
    json = JSON.parse(parse.text);
  } catch {
    throw new Error(`${parse.name} is not a Coilwright file: it is not valid JSON`);
  }
  if (isGraphJson(json)) {
    if (!readGraph) throw new Error(`${parse.name} is a graph model; this reader opens sheets only`);
    const model = await readGraph(json);
    // the title comes from the file's name, less what a title may not hold
    const title = parse.name.replace(/\.json$/i, '').replace(/[\p{Cc}\p{Cf}\p{Zl}\p{Zp}\uD800-\uDFFF]/gu, '').slice(0, 120);
    const laidOut = validateSheet(graphToSheet(model, title || 'Imported graph model'));
    if (!laidOut.ok) throw new Error(`${parse.name} is a graph model that cannot be drawn as a sheet: ${laidOut.reason}`);
    return laidOut.sheet;
  }
  return parseSheetJson(json);
}
