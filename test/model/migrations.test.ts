import { describe, expect, it } from 'vitest';
import { FIRST_SHEET_VERSION, migrations, parseSheetJson, SHEET_SCHEMA, SHEET_VERSION } from '../../src/model';

describe('sheet migrations', () => {
  it('have no gaps from the first version to the current one', () => {
    for (let v = FIRST_SHEET_VERSION; v < SHEET_VERSION; v++) expect(typeof migrations[v]).toBe('function');
    expect(migrations[SHEET_VERSION]).toBeUndefined();
  });

  it('bring a version 1 sheet up to date', () => {
    const v1 = {
      schema: 'coilwright.sheet/1',
      title: 'old',
      frequencyHz: 50,
      parts: [
        { id: 'part:a', kind: 'winding', x: 0, y: 0, angle: 90, ref: 'L1', value: 0.1, dot: 'first' },
        { id: 'part:b', kind: 'winding', x: 100, y: 0, angle: 270, ref: 'L2', value: 0.1, dot: 'second' },
      ],
      wires: [{ id: 'wire:a', pts: [0, -30, 0, -60] }],
      couplings: [{ id: 'coupling:a', ref: 'K1', windings: ['part:a', 'part:b'], k: 0.5 }],
    };
    const s = parseSheetJson(v1);
    expect(s.schema).toBe(SHEET_SCHEMA); // migrated to the current version
    expect(s.amplitudes).toBe('rms'); // version 1 was always RMS
    expect(s.parts.map((p) => [p.rot, p.mirror])).toEqual([[1, false], [3, false]]); // 90° and 270° are one and three quarter turns
    expect(s.couplings[0]).toMatchObject({ by: 'k', value: 0.5 });
  });

  it('bring a version 2 sheet up to date', () => {
    const s = parseSheetJson({ schema: 'coilwright.sheet/2', frequencyHz: 60, amplitudes: 'peak', parts: [], wires: [], couplings: [] });
    expect(s).toMatchObject({ schema: SHEET_SCHEMA, amplitudes: 'peak', frequencyHz: 60 });
  });
});
