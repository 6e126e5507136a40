/** Reading an exported SVG back as text in tests (no DOM in Node). */
import { unescapeXml } from '../../src/export/xml';

export interface Row { kind: string; name: string; cells: Record<string, string> }

const unesc = (s: string) => {
  const u = unescapeXml(s);
  if (u === null) throw new Error(`broken character data: ${s}`);
  return u;
};

/** The rows of the results table: `<g class="row">` groups and their `cell` texts. */
export function tableRows(svg: string): Row[] {
  const start = svg.indexOf('<g id="results">');
  const end = svg.indexOf('<g id="cautions">');
  if (start < 0 || end < start) throw new Error('no results table');
  const results = [svg.slice(start, end), svg.slice(start, end)];
  const rows: Row[] = [];
  const rowRe = /<g class="row" data-kind="([^"]*)" data-name="([^"]*)">([\s\S]*?)<\/g>/g;
  let m: RegExpExecArray | null;
  while ((m = rowRe.exec(results[1]))) {
    const cells: Record<string, string> = {};
    const cellRe = /<text [^>]*class="cell (\w+)"[^>]*>([^<]*)<\/text>/g;
    let c: RegExpExecArray | null;
    while ((c = cellRe.exec(m[3]))) cells[c[1]] = unesc(c[2]);
    rows.push({ kind: m[1], name: unesc(m[2]), cells });
  }
  return rows;
}

/** Every text node's content (unescaped), in document order. */
export function texts(svg: string): string[] {
  const out: string[] = [];
  const re = /<(text|title|desc)\b[^>]*>([^<]*)<\/\1>/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(svg))) out.push(unesc(m[2]));
  return out;
}

/** The document with the embedded sheet taken out (to look at the drawing alone). */
export function withoutMetadata(svg: string): string {
  return svg.replace(/<metadata>[\s\S]*?<\/metadata>/, '');
}
