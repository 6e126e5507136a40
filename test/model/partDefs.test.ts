/** The part registry: one name per kind, shelf keys, graph element round trip (an invariant of the sheet ↔ graph mapping). */
import { describe, expect, it } from 'vitest';
import { PART_DEFS, PART_OF_ELEMENT, SHELF_KINDS } from '../../src/model/parts/registry';
import { PART_KINDS, type NumericField, type Part } from '../../src/model/sheet';
import { COMMANDS } from '../../src/tools/commands';

describe('part definitions', () => {
  it('give each kind one name, used by the shelf commands as well', () => {
    const names = PART_KINDS.map((k) => PART_DEFS[k].label);
    expect(new Set(names).size).toBe(names.length);
    for (const k of SHELF_KINDS) {
      const cmd = COMMANDS.find((c) => c.id === `place-${k}`)!;
      expect(cmd.label).toBe(PART_DEFS[k].label);
      expect(cmd.keys).toEqual([PART_DEFS[k].shelfKey]);
    }
    expect(PART_DEFS.vsource.label).toBe('AC voltage source');
  });

  it('put the shelf in the order of its keys, each key once', () => {
    const keys = SHELF_KINDS.map((k) => PART_DEFS[k].shelfKey);
    expect(keys).toEqual([...keys].sort());
    expect(new Set(keys).size).toBe(keys.length);
    expect(SHELF_KINDS).not.toContain('arm'); // equivalent arms come only from a T-equivalent
  });

  it('read every graph element kind back as the part that wrote it, with its values', () => {
    // a distinct value in every field a kind edits, so that a field dropped or swapped on the way shows
    const trial: Partial<Record<NumericField, number>> = { value: 0.25, phaseDeg: -30, initialAmps: 0.125, initialVolts: -2.5, onOhms: 0.002, offOhms: 2e8 };
    for (const kind of PART_KINDS) {
      const def = PART_DEFS[kind];
      if (!def.toElement) continue;
      const part: Part = { id: 'p', kind, x: 0, y: 0, rot: 0, mirror: false, ref: 'X1', ...def.defaults };
      for (const f of def.fields) part[f.key] = trial[f.key];
      if (def.editor === 'waveform') part.waveform = { shape: 'square', low: -1, high: 3, frequencyHz: 1000, duty: 0.25 };
      if (def.editor === 'switch') Object.assign(part, { closed: false, togglesS: [1e-3, 2.5e-3] });
      const el = def.toElement(part, def.pins.map((_, i) => `n${i}`));
      expect(PART_OF_ELEMENT[el.kind]).toBe(kind);
      const back = def.fromElement!.values(el);
      for (const f of def.fields) expect(back[f.key], `${kind}.${f.key}`).toBe(trial[f.key]);
      if (def.editor === 'waveform') expect(back.waveform).toEqual(part.waveform);
      if (def.editor === 'switch') expect(back).toMatchObject({ closed: false, togglesS: [1e-3, 2.5e-3] });
    }
  });
});
