/** The model room: sheet schema, migrations, part definitions, topology and the sheet → graph derivation. */
export * from './sheet';
export { parseSheetJson, isSheetJson, isGraphJson, parseSheetText } from './parseSheet';
export { sheetToGraph, deriveCircuit, type DerivedCircuit } from './toGraph';
export { graphToSheet } from './fromGraph';
export { deriveTopology, type Topology } from './topology';
export { migrations, migrate, FIRST_SHEET_VERSION } from './migrations';
export { validateSheet } from './sheetSchema';
export { newId, seedIds, idPrefix } from './ids';
export * from './geometry';
export { PART_DEFS, partDef, pinPositions, partBox, dotPosition } from './parts/registry';
export type { PartDef, Prim, FieldDef } from './parts/registry';
export { formatSI, formatAngle, formatEditable, parseSimple } from './quantity';
export { EXAMPLES, exampleFiles } from './examples';
