/**
 * XML text for the export: escaping of anything a user typed, and a strict
 * well-formedness check (balanced tags, quoted attributes, no raw `<` or `&`
 * in text) that runs without a DOM.
 */

// characters XML 1.0 does not allow at all, even as references; lone surrogates too
const FORBIDDEN = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

/** Text content: `&`, `<`, `>` become references; characters XML cannot carry become U+FFFD. */
export function escText(s: string): string {
  return s.replace(FORBIDDEN, '\uFFFD').replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** Attribute values (always written in double quotes); line breaks and tabs are kept as references. */
export function escAttr(s: string): string {
  return escText(s).replace(/"/g, '&quot;').replace(/'/g, '&apos;').replace(/\n/g, '&#10;').replace(/\r/g, '&#13;').replace(/\t/g, '&#9;');
}

/** One line of text for a label: runs of white space (line breaks included) become one space. */
export function oneLine(s: string): string {
  return s.replace(/\s+/g, ' ').trim();
}

const NAMED: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

/** Undo XML escaping: the five named references and numeric ones; null on an unknown or broken reference. */
export function unescapeXml(s: string): string | null {
  let bad = false;
  const out = s.replace(/&(#x[0-9a-fA-F]+|#[0-9]+|[A-Za-z]+);|&/g, (all, ref: string | undefined) => {
    if (ref === undefined) {
      bad = true;
      return all;
    }
    if (ref[0] === '#') {
      const code = ref[1] === 'x' ? parseInt(ref.slice(2), 16) : parseInt(ref.slice(1), 10);
      if (!(code >= 0 && code <= 0x10ffff)) {
        bad = true;
        return all;
      }
      return String.fromCodePoint(code);
    }
    const v = NAMED[ref];
    if (v === undefined) bad = true;
    return v ?? all;
  });
  return bad ? null : out;
}

export interface XmlProblem { message: string; offset: number }

const NAME = /^[A-Za-z_:][A-Za-z0-9_.:-]*/;
const REF = /^&(#x[0-9a-fA-F]+|#[0-9]+|[A-Za-z][A-Za-z0-9]*);/;
const BAD_CHAR = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/;

/**
 * Strict check of XML well-formedness. `fragment` allows several (or no) root
 * elements and no prolog, for pieces of SVG supplied to the export. Returns
 * null when well-formed, else the first problem found. Entity references other
 * than the five predefined ones and numeric references are refused (no DTD).
 */
export function xmlProblem(text: string, fragment = false): XmlProblem | null {
  const stack: string[] = [];
  let roots = 0;
  let i = 0;
  const n = text.length;
  const fail = (message: string, at = i): XmlProblem => ({ message, offset: at });
  const bad = BAD_CHAR.exec(text);
  if (bad) return fail(`character U+${bad[0].charCodeAt(0).toString(16).padStart(4, '0')} is not allowed in XML`, bad.index);
  if (!fragment && text.startsWith('<?xml')) {
    const end = text.indexOf('?>');
    if (end < 0) return fail('unterminated XML declaration');
    i = end + 2;
  }
  const checkText = (from: number, to: number): XmlProblem | null => {
    for (let j = from; j < to; j++) {
      const ch = text[j];
      if (ch === '&') {
        const m = REF.exec(text.slice(j, j + 12));
        if (!m) return fail('a bare "&" in text', j);
        if (!m[1].startsWith('#') && !(m[1] in NAMED)) return fail(`unknown entity &${m[1]};`, j);
      } else if (ch === '>' && text.startsWith(']]>', j - 2) && j - 2 >= from) {
        return fail('"]]>" in text', j - 2);
      }
    }
    if (stack.length === 0 && !fragment && text.slice(from, to).trim() !== '') return fail('text outside the root element', from);
    return null;
  };
  while (i < n) {
    const lt = text.indexOf('<', i);
    const textEnd = lt < 0 ? n : lt;
    const p = checkText(i, textEnd);
    if (p) return p;
    if (lt < 0) break;
    i = lt;
    if (text.startsWith('<!--', i)) {
      const end = text.indexOf('-->', i + 4);
      if (end < 0) return fail('unterminated comment');
      if (text.slice(i + 4, end).includes('--')) return fail('"--" inside a comment');
      i = end + 3;
    } else if (text.startsWith('<![CDATA[', i)) {
      if (stack.length === 0) return fail('CDATA outside an element');
      const end = text.indexOf(']]>', i + 9);
      if (end < 0) return fail('unterminated CDATA section');
      i = end + 3;
    } else if (text.startsWith('<?', i)) {
      const end = text.indexOf('?>', i + 2);
      if (end < 0) return fail('unterminated processing instruction');
      if (/^<\?xml[\s?]/i.test(text.slice(i, i + 6))) return fail('XML declaration not at the start');
      i = end + 2;
    } else if (text.startsWith('<!', i)) {
      return fail('declarations (DOCTYPE, ENTITY) are not accepted');
    } else if (text.startsWith('</', i)) {
      const m = NAME.exec(text.slice(i + 2));
      if (!m) return fail('a closing tag without a name');
      const after = i + 2 + m[0].length;
      const close = /^\s*>/.exec(text.slice(after));
      if (!close) return fail(`malformed closing tag </${m[0]}`);
      const open = stack.pop();
      if (open !== m[0]) return fail(open === undefined ? `</${m[0]}> closes nothing` : `</${m[0]}> closes <${open}>`);
      i = after + close[0].length;
    } else {
      const m = NAME.exec(text.slice(i + 1));
      if (!m) return fail('a "<" that starts no tag');
      const name = m[0];
      let j = i + 1 + name.length;
      const seen = new Set<string>();
      let selfClosing = false;
      for (;;) {
        const ws = /^\s*/.exec(text.slice(j))![0].length;
        j += ws;
        if (text.startsWith('/>', j)) { selfClosing = true; j += 2; break; }
        if (text[j] === '>') { j += 1; break; }
        if (j >= n) return fail(`unterminated tag <${name}`);
        if (ws === 0) return fail(`attributes of <${name}> need white space between them`, j);
        const a = NAME.exec(text.slice(j));
        if (!a) return fail(`malformed attribute in <${name}>`, j);
        if (seen.has(a[0])) return fail(`attribute ${a[0]} given twice in <${name}>`, j);
        seen.add(a[0]);
        j += a[0].length;
        const eq = /^\s*=\s*/.exec(text.slice(j));
        if (!eq) return fail(`attribute ${a[0]} of <${name}> has no value`, j);
        j += eq[0].length;
        const q = text[j];
        if (q !== '"' && q !== "'") return fail(`attribute ${a[0]} of <${name}> is not quoted`, j);
        const end = text.indexOf(q, j + 1);
        if (end < 0) return fail(`unterminated attribute ${a[0]} of <${name}>`, j);
        const value = text.slice(j + 1, end);
        if (value.includes('<')) return fail(`"<" inside attribute ${a[0]} of <${name}>`, j);
        for (let k = value.indexOf('&'); k >= 0; k = value.indexOf('&', k + 1)) {
          const r = REF.exec(value.slice(k, k + 12));
          if (!r || (!r[1].startsWith('#') && !(r[1] in NAMED))) return fail(`a bare "&" in attribute ${a[0]} of <${name}>`, j + 1 + k);
        }
        j = end + 1;
      }
      if (stack.length === 0) {
        roots++;
        if (!fragment && roots > 1) return fail('a second root element', i);
      }
      if (!selfClosing) stack.push(name);
      i = j;
    }
  }
  if (stack.length) return fail(`<${stack[stack.length - 1]}> is never closed`, n);
  if (!fragment && roots === 0) return fail('no root element', 0);
  return null;
}
