/**
 * Numbered migrations of saved sheets: `migrations[n]` turns a version-n
 * object into version n+1. Every version from 1 up to SHEET_VERSION - 1 has one.
 *
 * v1: parts carried `angle` in degrees, no mirror; no `amplitudes` (always RMS).
 * v2: quarter turns `rot` and `mirror`; `amplitudes`; couplings stored only `k`.
 * v3: couplings say whether their value is k or M (`by`, `value`).
 * v4: the `arm` part kind (equivalent-circuit arm); nothing to change in older files.
 * v5: couplings lose their own designator (`ref`; they are named by their
 *     windings); the sheet gains `titleBlock` (ISO 7200 data fields) and
 *     `display` (which readings the drawing shows), filled with defaults.
 * v6: windings carry `initialAmps` and capacitors `initialVolts` (filled with
 *     0, the value at t = 0 they always had); sources may carry a `waveform`
 *     (without one they follow their phasor, as before); the `switch` part
 *     kind (`closed`, `onOhms`, `offOhms`, `togglesS`).
 * v7: the `power` part kind (a practical transformer, its data in `power`);
 *     windings may carry their core's inductance factor `alH`; nothing to
 *     change in older files.
 */
import { SHEET_SCHEMA_PREFIX, SHEET_VERSION } from './sheet';

type Json = Record<string, unknown>;

export const FIRST_SHEET_VERSION = 1;

export const migrations: Record<number, (s: Json) => Json> = {
  1: (s) => ({
    ...s,
    schema: `${SHEET_SCHEMA_PREFIX}2`,
    amplitudes: 'rms',
    parts: asArray(s.parts).map((p) => {
      const { angle, ...rest } = p as Json;
      const deg = typeof angle === 'number' ? angle : 0;
      return { ...rest, rot: (((Math.round(deg / 90) % 4) + 4) % 4), mirror: false };
    }),
    couplings: asArray(s.couplings),
  }),
  2: (s) => ({
    ...s,
    schema: `${SHEET_SCHEMA_PREFIX}3`,
    couplings: asArray(s.couplings).map((c) => {
      const { k, ...rest } = c as Json;
      return { ...rest, by: 'k', value: k };
    }),
  }),
  3: (s) => ({ ...s, schema: `${SHEET_SCHEMA_PREFIX}4` }),
  4: (s) => ({
    ...s,
    schema: `${SHEET_SCHEMA_PREFIX}5`,
    couplings: asArray(s.couplings).map((c) => {
      const { ref: _ref, ...rest } = c as Json;
      return rest;
    }),
  }),
  5: (s) => ({
    ...s,
    schema: `${SHEET_SCHEMA_PREFIX}6`,
    parts: asArray(s.parts).map((p) => {
      if (!p || typeof p !== 'object') return p; // the schema says what is wrong with it
      const part = p as Json;
      if (part.kind === 'winding' && part.initialAmps === undefined) return { ...part, initialAmps: 0 };
      if (part.kind === 'capacitor' && part.initialVolts === undefined) return { ...part, initialVolts: 0 };
      return part;
    }),
  }),
  6: (s) => ({ ...s, schema: `${SHEET_SCHEMA_PREFIX}7` }),
};

function asArray(v: unknown): unknown[] {
  return Array.isArray(v) ? v : [];
}

/** Apply migrations from `from` up to the current version. */
export function migrate(obj: Json, from: number): Json {
  let s = obj;
  for (let v = from; v < SHEET_VERSION; v++) {
    const step = migrations[v];
    if (!step) throw new Error(`no migration from sheet version ${v}`);
    s = step(s);
  }
  return s;
}
