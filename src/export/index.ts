/** The export room: a sheet and its results as a standalone SVG document, and the sheet back out of one. */
export { sheetToSvg, PAPER_MM, PRINT_MARGIN_MM, drawingSizeMm, type Paper, type PlotFragment, type SvgOptions } from './svg';
export { svgToSheet, sheetMetadata, EMBED_NS } from './embed';
export { resultRows, polarText, powerTotals, type TableRow } from './table';
export { escText, escAttr, xmlProblem, unescapeXml, type XmlProblem } from './xml';
