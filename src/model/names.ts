import type { SolveResult } from './graph';

/**
 * The one rule for names, wherever they come from: the designator and
 * node-name fields, sheet files and links (the sheet schema), and graph
 * models read by the solver. A name is 1 to MAX_NAME_CHARS characters with
 * no space at either end and none of the characters that are invisible or
 * change how the text around them is shown: control characters, line and
 * paragraph separators, bidirectional marks, embeddings, overrides and
 * isolates, zero-width and other format characters, and broken UTF-16.
 *
 * Names are keys of the result tables; those are built with no prototype
 * (`nameTable`), so names such as "__proto__" or "constructor" are names like
 * any other.
 */

export const MAX_NAME_CHARS = 128;
/** The longest sheet title. */
export const MAX_TITLE_CHARS = 200;

// Cc: C0 and C1 controls and DEL; Cf: format characters (bidi controls, zero-width, BOM …); Zl, Zp: line and paragraph separators
const HIDDEN = /[\p{Cc}\p{Cf}\p{Zl}\p{Zp}]/u;
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;
const BIDI = /[\u061C\u200E\u200F\u202A-\u202E\u2066-\u2069]/;
const ZERO_WIDTH = /[\u200B-\u200D\u2060\uFEFF]/;

const hex = (c: string) => `U+${c.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;

function kindOf(c: string): string {
  if (BIDI.test(c)) return `a bidirectional control (${hex(c)}) that changes the order text is shown in`;
  if (ZERO_WIDTH.test(c)) return `an invisible zero-width character (${hex(c)})`;
  if (/\p{Cc}/u.test(c)) return `a control character (${hex(c)})`;
  if (/[\p{Zl}\p{Zp}]/u.test(c)) return `a line break (${hex(c)})`;
  return `an invisible format character (${hex(c)})`;
}

/** Why text cannot be shown as it is (a hidden or broken character), or null. */
export function hiddenCharProblem(text: string): string | null {
  const m = HIDDEN.exec(text);
  if (m) return `holds ${kindOf(m[0])}; names and titles may hold no control, format or bidirectional characters`;
  if (LONE_SURROGATE.test(text)) return 'holds a broken character (half of a UTF-16 surrogate pair)';
  return null;
}

/** Why `name` cannot be a name (as "… must …" / "… holds …", to follow the field it belongs to), or null. */
export function nameProblem(name: string): string | null {
  if (name.length === 0) return 'must not be empty';
  if (name.length > MAX_NAME_CHARS) return `is ${name.length} characters long; a name has at most ${MAX_NAME_CHARS}`;
  const hidden = hiddenCharProblem(name);
  if (hidden) return hidden;
  if (name.trim() !== name) return 'must not begin or end with a space';
  return null;
}

/** Why `title` cannot be a sheet title, or null. */
export function titleProblem(title: string): string | null {
  if (title.length > MAX_TITLE_CHARS) return `is ${title.length} characters long; a title has at most ${MAX_TITLE_CHARS}`;
  return hiddenCharProblem(title);
}

/**
 * A name as it may be quoted in a message: hidden characters spelled out as
 * \u{…} so they cannot reorder or hide the message, long names cut short.
 */
export function shownName(text: string, max = 40): string {
  const cut = text.length > max ? `${text.slice(0, max)}…` : text;
  return `"${cut.replace(/[\p{Cc}\p{Cf}\p{Zl}\p{Zp}\uD800-\uDFFF]/gu, (c) => `\\u{${c.codePointAt(0)!.toString(16)}}`)}"`;
}

/** A table keyed by names: no inherited keys, so any name reads and writes as itself. */
export function nameTable<T>(): Record<string, T> {
  return Object.create(null) as Record<string, T>;
}

/** The same entries in a table with no prototype (for objects that crossed a thread, which come back as ordinary objects). */
export function asNameTable<T>(obj: Record<string, T>): Record<string, T> {
  if (Object.getPrototypeOf(obj) === null) return obj;
  const t = nameTable<T>();
  for (const k of Object.keys(obj)) t[k] = obj[k];
  return t;
}

/** A solve result whose node and element tables have no prototype (after it crossed from a worker). */
export function withNameTables(result: SolveResult): SolveResult {
  return { ...result, nodes: asNameTable(result.nodes), elements: asNameTable(result.elements) };
}
