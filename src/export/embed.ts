/**
 * The editable sheet carried inside the exported SVG: its JSON, XML-escaped,
 * in `<metadata>` as `<coilwright:sheet>` in our own namespace. Escaping (not
 * CDATA) means `]]>` or any markup a user typed stays plain character data.
 */
import { parseSheetJson } from '../model/parseSheet';
import type { Sheet } from '../model/sheet';
import { escText, unescapeXml } from './xml';

export const EMBED_NS = 'urn:x-coilwright:svg-embed:1';

/** The `<coilwright:sheet>` element holding the sheet's JSON. */
export function sheetMetadata(sheet: Sheet): string {
  // JSON.stringify already writes control characters and lone surrogates as \u escapes; U+FFFE and U+FFFF are not XML characters
  const json = JSON.stringify(sheet).replace(/[\uFFFE\uFFFF]/g, (c) => `\\u${c.charCodeAt(0).toString(16)}`);
  return `<coilwright:sheet xmlns:coilwright="${EMBED_NS}" encoding="json">${escText(json)}</coilwright:sheet>`;
}

const NO_SHEET = 'This SVG carries no Coilwright sheet (export it from Coilwright with the sheet embedded)';

/** Character data of an element's content: references resolved, CDATA sections unwrapped; null when damaged. */
function characterData(raw: string): string | null {
  let out = '';
  let i = 0;
  while (i < raw.length) {
    const c = raw.indexOf('<![CDATA[', i);
    const chunk = raw.slice(i, c < 0 ? raw.length : c);
    if (chunk.includes('<')) return null;
    const text = unescapeXml(chunk);
    if (text === null) return null;
    out += text;
    if (c < 0) break;
    const end = raw.indexOf(']]>', c + 9);
    if (end < 0) return null;
    out += raw.slice(c + 9, end);
    i = end + 3;
  }
  return out;
}

/** The editable sheet inside an exported SVG; throws an Error with a one-line message when there is none or it is damaged. */
export function svgToSheet(svgText: string): Sheet {
  if (typeof svgText !== 'string' || !/<svg[\s>]/.test(svgText)) throw new Error('Not an SVG file');
  // the element in our namespace, whatever prefix a re-saving tool gave it
  const open = /<([A-Za-z_][\w.-]*):sheet\b([^>]*)>/g;
  let m: RegExpExecArray | null;
  let found: { prefix: string; start: number } | null = null;
  while ((m = open.exec(svgText))) {
    const prefix = m[1];
    const quote = (x: string) => x.replace(/[.:-]/g, '\\$&');
    const declared = m[2].includes(EMBED_NS) || new RegExp(`xmlns:${quote(prefix)}\\s*=\\s*["']${quote(EMBED_NS)}["']`).test(svgText);
    if (m[2].trimEnd().endsWith('/')) {
      if (declared) throw new Error('The sheet embedded in this SVG is empty');
      continue;
    }
    if (declared) {
      found = { prefix, start: m.index + m[0].length };
      break;
    }
  }
  if (!found) throw new Error(NO_SHEET);
  const end = svgText.indexOf(`</${found.prefix}:sheet>`, found.start);
  if (end < 0) throw new Error('The sheet embedded in this SVG is damaged: it is cut short');
  const data = characterData(svgText.slice(found.start, end));
  if (data === null) throw new Error('The sheet embedded in this SVG is damaged: its text is not valid XML character data');
  let json: unknown;
  try {
    json = JSON.parse(data);
  } catch {
    throw new Error('The sheet embedded in this SVG is damaged: it is not valid JSON');
  }
  try {
    return parseSheetJson(json);
  } catch (e) {
    throw new Error(`The sheet embedded in this SVG: ${(e as Error).message}`);
  }
}
