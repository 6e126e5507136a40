/**
 * Text without a renderer: estimated widths for the export's fonts and word
 * wrapping by those estimates. The estimates lean wide so that text fits in
 * any of the fallback fonts.
 */

export const SANS = "'DejaVu Sans', 'Liberation Sans', Arial, Helvetica, sans-serif";
export const MONO = "'DejaVu Sans Mono', 'Liberation Mono', Consolas, Menlo, monospace";

/** average advance per character, in em */
const EM = { sans: 0.58, bold: 0.63, mono: 0.602 } as const;
export type Face = keyof typeof EM;

const count = (s: string) => {
  let n = 0;
  for (const _ of s) n++;
  return n;
};

export function textWidth(s: string, size: number, face: Face = 'sans'): number {
  return count(s) * size * EM[face];
}

/** Break text into lines no wider than `width`; words longer than a line are cut. At most `maxLines`, the last ending in "…" when cut short. */
export function wrap(text: string, width: number, size: number, face: Face = 'sans', maxLines = Infinity): string[] {
  const perLine = Math.max(4, Math.floor(width / (size * EM[face])));
  const lines: string[] = [];
  for (const para of text.split(/\r?\n/)) {
    let line = '';
    for (let word of para.split(/\s+/).filter(Boolean)) {
      while (count(word) > perLine) {
        const room = line ? perLine - count(line) - 1 : perLine;
        if (room >= 4) {
          const head = [...word].slice(0, room).join('');
          line = line ? `${line} ${head}` : head;
          word = [...word].slice(room).join('');
        }
        lines.push(line);
        line = '';
      }
      if (!line) line = word;
      else if (count(line) + 1 + count(word) <= perLine) line += ` ${word}`;
      else {
        lines.push(line);
        line = word;
      }
    }
    if (line || para.trim() === '') lines.push(line);
  }
  while (lines.length > 1 && lines[lines.length - 1] === '') lines.pop();
  if (lines.length > maxLines) {
    const kept = lines.slice(0, maxLines);
    const last = [...kept[maxLines - 1]];
    kept[maxLines - 1] = `${last.slice(0, Math.max(0, perLine - 1)).join('')}…`;
    return kept;
  }
  return lines;
}

/** A number for an attribute: at most `d` decimals, no trailing zeros, never "-0". */
export function num(v: number, d = 2): string {
  const s = Number(v.toFixed(d));
  return (s === 0 ? 0 : s).toString();
}
