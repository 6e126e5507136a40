import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { SHEET_LIMITS, sheetBoundsProblem, validateSheet } from '../../src/model/sheetSchema';
import { ROW_LENGTH, graphToSheet } from '../../src/model/fromGraph';
import { decodeSheetPayload, encodeSheetPayload } from '../../src/model/link';
import { parseSheetText } from '../../src/model/parseSheet';
import type { Sheet } from '../../src/model/sheet';
import { createEditorStore } from '../../src/store/createEditorStore';
import { commit } from '../../src/store/actions';
import { moveSelection } from '../../src/model/edits';
import { model } from '../helpers';

/**
 * The sheet schema bounds coordinates, names, titles and counts, and says
 * which field passed which bound; an edit that would pass a bound is not
 * made. (The bounds themselves are the editor's choice; the checks are
 * against the numbers in SHEET_LIMITS.)
 */

const example = (): Sheet => parseSheetText(readFileSync('examples/sheets/isolation-transformer-230v.json', 'utf8'));
const reason = (s: unknown) => {
  const r = validateSheet(s);
  return r.ok ? null : r.reason;
};

describe('sheet bounds', () => {
  it('refuse a far coordinate, a huge title or name and too many points, naming the field and the bound', () => {
    const far = example();
    far.parts[2].x = 1e20;
    expect(reason(far)).toBe(`parts[2].x: must lie between -${SHEET_LIMITS.coordinate} and ${SHEET_LIMITS.coordinate} (sheet coordinates are bounded)`);
    const edge = example();
    edge.parts[2].x = SHEET_LIMITS.coordinate;
    expect(reason(edge)).toBeNull();
    const title = example();
    title.title = 'x'.repeat(3_000_000);
    expect(reason(title)).toBe('title: is 3000000 characters long; a title has at most 200');
    const ref = example();
    ref.parts[1].ref = 'R'.repeat(5000);
    expect(reason(ref)).toMatch(/^parts\[1\]\.ref: is 5000 characters long; a name has at most 128/);
    const wire = example();
    wire.wires[0].pts = Array.from({ length: 2 * SHEET_LIMITS.wirePoints + 2 }, (_, i) => i);
    expect(reason(wire)).toMatch(/^wires\[0\]\.pts: has more than 1000 points/);
  });

  it('a link carrying such a sheet is refused with the same line', async () => {
    const far = example();
    far.parts[0].y = -1e20;
    const payload = await encodeSheetPayload(far);
    await expect(decodeSheetPayload(payload)).rejects.toThrow('parts[0].y: must lie between -1000000 and 1000000');
  });

  it('an edit that would carry a part beyond the bounds is not made, and says why', () => {
    const sheet = example();
    const store = createEditorStore(sheet);
    commit(store, moveSelection(sheet, new Set([sheet.parts[0].id]), 2e6, 0));
    expect(store.getState().sheet).toBe(sheet);
    expect(store.getState().notice?.text).toMatch(/not made: parts and wires must stay within 1000000 units/);
    expect(sheetBoundsProblem(sheet)).toBeNull();
  });

  it('a large graph model is laid out in rows that stay within the bounds', () => {
    const n = 3 * ROW_LENGTH + 5;
    const elements = Array.from({ length: n }, (_, i) => ({ id: `R${i}`, kind: 'resistor' as const, nodes: [`n${i}`, 'gnd'] as [string, string], ohms: 1 }));
    const sheet = graphToSheet(model(50, elements));
    expect(validateSheet(sheet).ok).toBe(true);
    const xs = sheet.parts.map((p) => p.x);
    const ys = new Set(sheet.parts.filter((p) => p.kind === 'resistor').map((p) => p.y));
    expect(ys.size).toBe(4); // ceil(125 / 40) rows
    expect(Math.max(...xs)).toBeLessThan(150 * ROW_LENGTH + 200);
  });
});
