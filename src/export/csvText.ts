/** Text fields and comment lines of our CSV files, safe to open in a spreadsheet (kept apart so the editor's panels can use them without the whole CSV writer). */

/**
 * What a spreadsheet reads as the start of a formula or command when a cell
 * begins with it: = + - @ tab and carriage return (OWASP, CSV Injection), and
 * for good measure a line feed and the full-width = + - @.
 */
const FORMULA_START = /^[=+\-@\t\r\n\uFF1D\uFF0B\uFF0D\uFF20]/;

/** One text field: always quoted, quotes doubled (RFC 4180), and a field that begins like a formula defused with a leading apostrophe (OWASP). */
export function csvField(text: string): string {
  const s = FORMULA_START.test(text) ? `'${text}` : text;
  return `"${s.replace(/"/g, '""')}"`;
}

/** A comment line: our own words after `#` (no commas, so one cell), then user text in defused fields of their own. */
export function csvComment(words: string, ...fields: string[]): string {
  return [`# ${words.replace(/[\r\n,"]+/g, ' ')}`, ...fields.map((f) => csvField(f.replace(/[\r\n]+/g, ' ')))].join(',');
}
