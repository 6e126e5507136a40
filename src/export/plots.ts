/** Plots the caller supplies (sweep, phasor diagram) as SVG fragments: sized, checked for well-formedness, refused when they carry scripts. */
import type { PlotFragment } from './options';
import { xmlProblem } from './xml';

const UNSAFE = /<\s*(script|foreignObject|iframe|object|embed)\b|\son[a-z]+\s*=|(?:href|src)\s*=\s*["']\s*javascript:/i;

/** The size of a whole `<svg>` element given as a string: its plain-number width and height, else its viewBox. */
function svgSize(text: string): { width: number; height: number } | null {
  const open = /^\s*<svg\b([^>]*)>/.exec(text);
  if (!open) return null;
  const attr = (name: string) => new RegExp(`\\s${name}\\s*=\\s*["']([^"']*)["']`).exec(open[1])?.[1];
  // plain-number width and height are the size it draws at; without them it fills the space given, in its viewBox's proportions
  const w = Number(attr('width')), h = Number(attr('height'));
  if (w > 0 && h > 0) return { width: w, height: h };
  const vb = attr('viewBox')?.trim().split(/[\s,]+/).map(Number);
  return vb && vb.length === 4 && vb[2] > 0 && vb[3] > 0 ? { width: vb[2], height: vb[3] } : null;
}

export function checkedPlots(plots: (PlotFragment | string)[]): PlotFragment[] {
  return plots.map((given, i) => {
    let p: PlotFragment;
    if (typeof given === 'string') {
      const size = svgSize(given);
      if (!size) throw new Error(`plot ${i + 1} must be an <svg> element with a viewBox, or width and height in plain numbers`);
      p = { svg: given, ...size };
    } else p = given;
    const problem = xmlProblem(p.svg, true);
    if (problem) throw new Error(`plot ${i + 1} is not well-formed SVG: ${problem.message}`);
    if (UNSAFE.test(p.svg)) throw new Error(`plot ${i + 1} holds a script, an event handler or embedded content, which a sheet may not carry`);
    if (!(p.width > 0 && p.height > 0 && Number.isFinite(p.width) && Number.isFinite(p.height))) throw new Error(`plot ${i + 1} needs a positive width and height`);
    return p;
  });
}
