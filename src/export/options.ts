/** What the export takes besides the sheet and its results: paper, dates, notes, plots. */
import type { RefusalCulprit } from '../model/graph';

export type Paper = 'A4' | 'Letter';

/** Landscape paper sizes in millimetres (ISO 216; ANSI Letter 8.5 × 11 in). */
export const PAPER_MM: Record<Paper, { width: number; height: number }> = {
  A4: { width: 297, height: 210 },
  Letter: { width: 279.4, height: 215.9 },
};

/**
 * The margin a browser prints with by default (about 0.4 in, 10.2 mm; common
 * practice), with a little to spare. A browser prints an SVG file at its own
 * size without shrinking it, so the document is the paper less these margins:
 * it prints on one sheet with the default settings.
 */
export const PRINT_MARGIN_MM = 10.5;

/** The size of the exported document for a paper: the paper less the print margins. */
export function drawingSizeMm(paper: Paper): { width: number; height: number } {
  const p = PAPER_MM[paper];
  return { width: p.width - 2 * PRINT_MARGIN_MM, height: p.height - 2 * PRINT_MARGIN_MM };
}

/** An SVG fragment drawn by the caller (a sweep or phasor plot) in its own units, 0..width × 0..height. */
export interface PlotFragment {
  title?: string;
  svg: string;
  width: number;
  height: number;
}

export interface SvgOptions {
  paper?: Paper;
  /** the study's date as it should be printed (passed in so that output is repeatable) */
  date?: string;
  notes?: string;
  /** the program's version, printed in the title block */
  version?: string;
  /** carry the editable sheet in the metadata (default true) */
  embedSheet?: boolean;
  /** sweep or phasor plots: fragments with their size, or whole `<svg>` elements (sized by their viewBox or width and height) */
  plots?: (PlotFragment | string)[];
  /** why there is no result, printed in place of the table (e.g. the refusal) */
  unsolvedReason?: string;
  /** what a refusal names (elements and couplings by graph id, nodes by name): marked in red on the drawing */
  culprits?: RefusalCulprit[];
  /** the reference node's name in `result`, when the result was solved from a model whose ground is not the sheet's ("gnd") */
  groundName?: string;
}

/** the frame's inset from the document's edge (the printer's margin lies outside the document) */
