import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { seedIds } from '../../src/model';
import { validateSheet } from '../../src/model/sheetSchema';
import { at, sheetBuilder } from '../../src/model/examples/builder';
import { sheetToSvg, svgToSheet, xmlProblem } from '../../src/export';

/**
 * Whatever text a sheet holds, the export stays well-formed XML (W3C XML 1.0,
 * from memory); the embedded sheet reads back exactly when its names and
 * title obey the name rules, and is refused in one line naming the field
 * otherwise.
 */

const anyText = fc.string({ unit: 'binary', maxLength: 40 });

describe('export with arbitrary user text', () => {
  it('is well-formed, and round-trips or is refused naming the field', () => {
    fc.assert(
      fc.property(anyText, anyText, anyText, anyText, anyText, (title, ref, name, notes, coupling) => {
        seedIds(9);
        const b = sheetBuilder(title, 50);
        const v = b.part('vsource', ref, 100, 200, { value: 10 });
        const l1 = b.part('winding', `${ref}a`, 250, 200, { value: 0.1 });
        const l2 = b.part('winding', `${ref}b`, 350, 200, { value: 0.1, rot: 3, mirror: true });
        b.part('label', '', 250, 120, { name });
        b.wire(b.pin(v, 0), at(100, 120), at(250, 120), b.pin(l1, 0));
        b.couple([l1, l2], 0.5);
        const svg = sheetToSvg(b.sheet, null, { date: notes, notes, version: ref });
        expect(xmlProblem(svg)).toBeNull();
        const valid = validateSheet(b.sheet);
        if (valid.ok) expect(svgToSheet(svg)).toEqual(b.sheet);
        else {
          expect(() => svgToSheet(svg)).toThrow(valid.reason);
          expect(valid.reason).toMatch(/^(title|parts\[\d+\]\.(ref|name)|couplings\[0\]\.ref): /);
          expect(valid.reason).not.toMatch(/\n/);
        }
      }),
      { numRuns: 150, seed: 20261201 },
    );
  });
});
