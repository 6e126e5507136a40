import { describe, expect, it } from 'vitest';
import { isSheetJson, parseSheetJson, seedIds } from '../../src/model';
import { parseSheetText } from '../../src/model/parseSheet';
import { isolationTransformerSheet } from '../../src/model/examples/isolation';

describe('sheet files', () => {
  it('a saved sheet reads back unchanged', () => {
    seedIds(7);
    const s = isolationTransformerSheet();
    expect(parseSheetText(JSON.stringify(s))).toEqual(s);
    expect(isSheetJson(JSON.parse(JSON.stringify(s)))).toBe(true);
  });

  it('refuses what is not a sheet, naming why', () => {
    expect(() => parseSheetText('{ nope')).toThrow(/not valid JSON/);
    expect(() => parseSheetJson([1, 2])).toThrow(/expected a JSON object/);
    expect(() => parseSheetJson({ title: 'x' })).toThrow(/no "schema" field/);
    expect(() => parseSheetJson({ schema: 'someone.else/1' })).toThrow(/foreign/);
    expect(() => parseSheetJson({ schema: 'coilwright.sheet/99', parts: [] })).toThrow(/newer than this editor reads \(up to 7\)/);
    expect(() => parseSheetJson({ schema: 'coilwright.graph/1', elements: [] })).toThrow(/graph model, not a sheet/);
    expect(isSheetJson({ schema: 'coilwright.graph/1' })).toBe(false);
  });

  it('names the damaged field of a current-version sheet', () => {
    const s = JSON.parse(JSON.stringify(isolationTransformerSheet()));
    s.parts[2].x = 'left';
    expect(() => parseSheetJson(s)).toThrow(/parts\[2\]\.x/);
    const t = JSON.parse(JSON.stringify(isolationTransformerSheet()));
    t.couplings[0].windings = [t.parts[0].id, t.parts[2].id];
    expect(() => parseSheetJson(t)).toThrow(/not a winding/);
  });

  it('fills defaults leniently', () => {
    const s = parseSheetJson({ schema: 'coilwright.sheet/3', frequencyHz: 60, parts: [{ id: 'part:a', kind: 'resistor', x: 0, y: 0, value: 5 }] });
    expect(s).toMatchObject({ title: 'Untitled sheet', amplitudes: 'rms', wires: [], couplings: [] });
    expect(s.parts[0]).toMatchObject({ rot: 0, mirror: false, ref: '' });
  });
});
