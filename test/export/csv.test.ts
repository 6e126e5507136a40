import { describe, expect, it } from 'vitest';
import { EXAMPLES, seedIds, sheetToGraph } from '../../src/model';
import { at, sheetBuilder } from '../../src/model/examples/builder';
import { RESULTS_HEADER, csvField, parseCsv, resultsCsv, sweepCsv, sweepTableOf } from '../../src/export/csv';
import { frequencyGrid, solveGraph, sweepGraph } from '../../src/solver';

/** V1 (10 V ∠0°) across R1 (5 Ω) to ground. */
function divider() {
  seedIds(21);
  const b = sheetBuilder('Ohm check', 50);
  const v = b.part('vsource', 'V1', 100, 200, { value: 10, phaseDeg: 0 });
  const r = b.part('resistor', 'R1', 250, 200, { value: 5, rot: 1 });
  b.part('ground', '', 100, 300);
  b.wire(b.pin(v, 0), at(100, 120), at(250, 120), b.pin(r, 0));
  b.wire(b.pin(v, 1), at(100, 300), at(250, 300), b.pin(r, 1));
  return b.sheet;
}

const col = (name: string) => RESULTS_HEADER.indexOf(name);

describe('results CSV', () => {
  it('a divider reads Ohm\'s law', () => {
    const sheet = divider();
    const model = sheetToGraph(sheet);
    const rows = parseCsv(resultsCsv(model, solveGraph(model), sheet.title));
    expect(rows[0]).toEqual(RESULTS_HEADER);
    const r1 = rows.find((r) => r[0] === 'R1')!;
    // Ohm's law: 10 V across 5 Ω is 2 A; P = V·I = 20 W, Q = 0 (RMS convention, S = V·I*)
    expect(Math.abs(Number(r1[col('V_mag')]))).toBeCloseTo(10, 12);
    expect(Number(r1[col('I_mag')])).toBeCloseTo(2, 12);
    expect(Number(r1[col('P_W')])).toBeCloseTo(20, 12);
    expect(Math.abs(Number(r1[col('Q_var')]))).toBeLessThan(1e-12);
  });

  for (const ex of EXAMPLES) {
    it(`${ex.key}: every value is the solver's, to the last bit`, () => {
      seedIds(3);
      const sheet = ex.make();
      const model = sheetToGraph(sheet);
      const result = solveGraph(model);
      const text = resultsCsv(model, result, sheet.title);
      expect(text.split('\r\n')[0]).toBe(`# Coilwright results,"${sheet.title}"`);
      const rows = parseCsv(text).slice(1);
      const byName = new Map(rows.map((r) => [r[0], r]));
      // shortest round-trip decimal form: Number(String(x)) === x for every double (ECMA-262 Number::toString)
      for (const [name, v] of Object.entries(result.nodes)) {
        const r = byName.get(name)!;
        expect(r[1]).toBe('node');
        expect([Number(r[col('V_re')]), Number(r[col('V_im')])]).toEqual([v.re, v.im]);
        expect(Number(r[col('V_mag')])).toBe(Math.hypot(v.re, v.im)); // |z| = hypot(re, im)
      }
      for (const [id, e] of Object.entries(result.elements)) {
        if (!('current' in e)) continue;
        const r = byName.get(id)!;
        expect([Number(r[col('V_re')]), Number(r[col('V_im')]), Number(r[col('I_re')]), Number(r[col('I_im')])]).toEqual([e.voltage.re, e.voltage.im, e.current.re, e.current.im]);
        expect([Number(r[col('P_W')]), Number(r[col('Q_var')])]).toEqual([e.power.watts, e.power.vars]);
        const deg = (Math.atan2(e.current.im, e.current.re) * 180) / Math.PI; // angle = atan2(im, re) in degrees
        expect(Number(r[col('I_deg')])).toBe(e.current.re === 0 && e.current.im === 0 ? 0 : deg);
      }
      // an ideal transformer (inside a practical one too) writes a primary and a secondary row
      const sides = Object.values(result.elements).filter((e) => !('current' in e)).length;
      expect(rows).toHaveLength(Object.keys(result.nodes).length + Object.keys(result.elements).length + sides);
    });
  }

  it('every text field is quoted, and text a spreadsheet would run as a formula is defused', () => {
    // RFC 4180 §2: quoted fields, quotes doubled; a cell beginning with = + - @ tab or CR is prefixed with an apostrophe (OWASP, CSV Injection)
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('plain')).toBe('"plain"');
    for (const start of ['=', '+', '-', '@', '\t', '\r', '\uFF1D']) expect(csvField(`${start}1+1`)).toBe(`"'${start}1+1"`);
    expect(csvField('=HYPERLINK("http://x","y")')).toBe(`"'=HYPERLINK(""http://x"",""y"")"`);
    expect(parseCsv(`${csvField('x,"y"\r\nz')},2\r\n`)).toEqual([['x,"y"\r\nz', '2']]); // identity through the reader
    const sheet = divider();
    sheet.title = 'a\r\nb <script>';
    const model = sheetToGraph(sheet);
    const text = resultsCsv(model, solveGraph(model), sheet.title);
    expect(text.split('\r\n')[0]).toBe('# Coilwright results,"a b <script>"'); // a title cannot break out of its comment line
  });

  it('a title or name built to run as a formula lands in a cell as plain text', () => {
    const sheet = divider();
    sheet.title = 'Bench,=1+1';
    sheet.parts[0].ref = "=cmd|' /C calc'!A0";
    sheet.parts[1].ref = '@SUM(1)';
    const model = sheetToGraph(sheet);
    const text = resultsCsv(model, solveGraph(model), sheet.title);
    // split as a spreadsheet splits (RFC 4180), comment lines included: no text cell may begin with a formula character (numbers such as -2 are numbers)
    for (const line of text.split('\r\n').filter(Boolean)) {
      for (const cell of parseCsv(line.replace(/^#/, 'comment'))[0]) {
        if (!Number.isFinite(Number(cell))) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
      }
    }
    expect(parseCsv(text.split('\r\n')[0].replace(/^#/, 'x'))[0]).toEqual(['x Coilwright results', 'Bench,=1+1']);
    expect(parseCsv(text).map((r) => r[0])).toContain("'=cmd|' /C calc'!A0");
  });
});

describe('sweep CSV', () => {
  it('carries the solver\'s sweep exactly, one row per frequency', () => {
    seedIds(4);
    const sheet = EXAMPLES.find((e) => e.key === 'wireless')!.make();
    const model = sheetToGraph(sheet);
    const freqs = frequencyGrid(60e3, 110e3, 25, true);
    const sweep = sweepGraph(model, freqs);
    const rows = parseCsv(sweepCsv(sweepTableOf(sweep, sheet.title)));
    const head = rows[0];
    expect(head[0]).toBe('f_Hz');
    expect(rows).toHaveLength(1 + freqs.length);
    const [id, el] = Object.entries(sweep.elements).find(([, e]) => e.current)!;
    const re = head.indexOf(`I(${id}) re A`), im = head.indexOf(`I(${id}) im A`), mg = head.indexOf(`I(${id}) mag A`);
    expect(re).toBeGreaterThan(0);
    freqs.forEach((f, i) => {
      const r = rows[i + 1];
      expect(Number(r[0])).toBe(f); // the sweep's own frequencies
      expect([Number(r[re]), Number(r[im])]).toEqual([el.current![i].re, el.current![i].im]); // the solver's values, round-trip exact
      expect(Number(r[mg])).toBe(Math.hypot(el.current![i].re, el.current![i].im)); // |z| = hypot(re, im)
    });
  });

  it('writes interleaved traces from the analysis views and refuses a ragged one', () => {
    const table = { title: 'pair', frequenciesHz: [1, 2], traces: [{ label: 'Zin(V1)', unit: 'Ω', values: [3, 4, 0, -1] }] };
    const rows = parseCsv(sweepCsv(table));
    expect(rows[0]).toEqual(['f_Hz', 'Zin(V1) re Ω', 'Zin(V1) im Ω', 'Zin(V1) mag Ω', 'Zin(V1) deg deg']);
    // 3 + 4j: magnitude 5 (3-4-5 triangle), angle atan2(4, 3) = 53.13°; -j: magnitude 1, angle -90°
    expect(rows[1].map(Number)).toEqual([1, 3, 4, 5, (Math.atan2(4, 3) * 180) / Math.PI]);
    expect(rows[2].map(Number)).toEqual([2, 0, -1, 1, -90]);
    expect(() => sweepCsv({ ...table, traces: [{ label: 'x', unit: 'V', values: [1, 2] }] })).toThrow('sweep trace x has 1 points, the sweep has 2');
  });
});
