/** Reading sheet files: recognise, migrate, validate; refuse with one clear line. */
import { GRAPH_SCHEMA } from './graph';
import { FIRST_SHEET_VERSION, migrate } from './migrations';
import { SHEET_SCHEMA_PREFIX, SHEET_VERSION, type Sheet } from './sheet';
import { validateSheet } from './sheetSchema';

function schemaOf(json: unknown): string | null {
  if (typeof json !== 'object' || json === null || Array.isArray(json)) return null;
  const s = (json as Record<string, unknown>).schema;
  return typeof s === 'string' ? s : null;
}

/** True when the object claims to be a Coilwright sheet (any version). */
export function isSheetJson(json: unknown): boolean {
  const s = schemaOf(json);
  return s !== null && s.startsWith(SHEET_SCHEMA_PREFIX);
}

export function isGraphJson(json: unknown): boolean {
  return schemaOf(json) === GRAPH_SCHEMA;
}

/** Validate and migrate a parsed sheet file; throws an Error with a one-line message. */
export function parseSheetJson(json: unknown): Sheet {
  if (typeof json !== 'object' || json === null || Array.isArray(json)) {
    throw new Error('Not a Coilwright sheet: expected a JSON object');
  }
  const schema = schemaOf(json);
  if (schema === null) throw new Error('Not a Coilwright sheet: no "schema" field');
  if (schema === GRAPH_SCHEMA) throw new Error('This is a graph model, not a sheet; open it as a graph model');
  if (!schema.startsWith(SHEET_SCHEMA_PREFIX)) throw new Error(`Not a Coilwright sheet: schema "${schema.slice(0, 60)}" is foreign`);
  const tail = schema.slice(SHEET_SCHEMA_PREFIX.length);
  if (!/^\d+$/.test(tail)) throw new Error(`Unknown sheet schema "${schema.slice(0, 60)}"`);
  const version = Number(tail);
  if (version > SHEET_VERSION) {
    throw new Error(`Sheet version ${version} is newer than this editor reads (up to ${SHEET_VERSION}); update Coilwright`);
  }
  if (version < FIRST_SHEET_VERSION) throw new Error(`Unknown sheet version ${version}`);
  const current = migrate(json as Record<string, unknown>, version);
  const r = validateSheet(current);
  if (!r.ok) throw new Error(`Sheet is damaged: ${r.reason}`);
  return r.sheet;
}

/** Parse file text (JSON) into a sheet; throws with a one-line message. */
export function parseSheetText(text: string): Sheet {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new Error('Not a Coilwright sheet: the file is not valid JSON');
  }
  return parseSheetJson(json);
}
