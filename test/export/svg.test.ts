import { describe, expect, it } from 'vitest';
import { EXAMPLES, emptySheet, seedIds, sheetToGraph, SHEET_SCHEMA } from '../../src/model';
import { at, sheetBuilder } from '../../src/model/examples/builder';
import type { ComplexJson, SolveResult, TwoTerminalResult } from '../../src/model/graph';
import { formatAngle, formatSI } from '../../src/model/quantity';
import type { Sheet } from '../../src/model/sheet';
import { solveGraph } from '../../src/solver';
import { sheetToSvg, svgToSheet, xmlProblem } from '../../src/export';
import { tableRows, texts, withoutMetadata } from './svgText';

const OPTS = { date: '2026-12-01', version: '0.1.0' };

/** magnitude∠angle written independently of the export: |z| = hypot(re, im), angle = atan2(im, re) in degrees. */
function polar(z: ComplexJson, unit: string): string {
  const m = Math.hypot(z.re, z.im);
  return m === 0 ? `0 ${unit}` : `${formatSI(m, unit, 4)} ∠${formatAngle((Math.atan2(z.im, z.re) * 180) / Math.PI)}`;
}

function solved(sheet: Sheet): SolveResult {
  return solveGraph(sheetToGraph(sheet));
}

/** V1 (10 V ∠0°) across R1 (5 Ω) to ground. */
function divider(amplitudes: 'rms' | 'peak' = 'rms'): Sheet {
  seedIds(11);
  const b = sheetBuilder('Ohm check', 50);
  b.sheet.amplitudes = amplitudes;
  const v = b.part('vsource', 'V1', 100, 200, { value: 10, phaseDeg: 0 });
  const r = b.part('resistor', 'R1', 250, 200, { value: 5, rot: 1 });
  b.part('ground', '', 100, 300);
  b.wire(b.pin(v, 0), at(100, 120), at(250, 120), b.pin(r, 0));
  b.wire(b.pin(v, 1), at(100, 300), at(250, 300), b.pin(r, 1));
  return b.sheet;
}

describe('sheetToSvg on the example sheets', () => {
  for (const ex of EXAMPLES) {
    it(`${ex.key}: well-formed XML, A4 landscape in millimetres`, () => {
      seedIds(3);
      const sheet = ex.make();
      const svg = sheetToSvg(sheet, solved(sheet), OPTS);
      expect(xmlProblem(svg)).toBeNull();
      expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg ')).toBe(true);
      // A4 is 297 mm × 210 mm (ISO 216), landscape, less the browser's default print margin of 10.5 mm a side
      expect(svg).toMatch(/<svg [^>]*width="276mm" height="189mm" viewBox="0 0 276 189"/);
    });

    it(`${ex.key}: every number in the results table is the solver's`, () => {
      seedIds(3);
      const sheet = ex.make();
      const model = sheetToGraph(sheet);
      const result = solveGraph(model);
      const rows = tableRows(sheetToSvg(sheet, result, OPTS));
      // powers below 10⁻¹² of the largest are double-precision rounding noise and read as 0 (the readings' rule)
      const top = Math.max(...Object.values(result.elements).flatMap((r) => [Math.abs(r.power.watts), Math.abs(r.power.vars)]));
      const quiet = (x: number) => (Math.abs(x) < top * 1e-12 ? 0 : x);
      const nodes = Object.keys(result.nodes).filter((n) => n !== model.ground);
      const parts = Object.keys(result.elements).filter((id) => 'current' in result.elements[id]);
      // one row per node other than the reference, one per part, two per ideal transformer (primary, secondary)
      const names = Object.keys(result.elements).flatMap((id) => ('current' in result.elements[id] ? [id] : [`${id} primary`, `${id} secondary`]));
      expect(rows.map((r) => r.name)).toEqual([...nodes, ...names]);
      for (const n of nodes) {
        const row = rows.find((r) => r.kind === 'node' && r.name === n)!;
        expect(row.cells.v).toBe(polar(result.nodes[n], 'V'));
      }
      for (const id of parts) {
        const r = result.elements[id] as TwoTerminalResult;
        const row = rows.find((x) => x.kind === 'part' && x.name === id)!;
        expect(row.cells).toEqual({
          name: id,
          v: polar(r.voltage, 'V'),
          i: polar(r.current, 'A'),
          p: formatSI(quiet(r.power.watts), 'W', 4),
          q: formatSI(quiet(r.power.vars), 'var', 4),
        });
      }
    });

    it(`${ex.key}: the power summary is the solver's, and balances (Tellegen)`, () => {
      seedIds(3);
      const sheet = ex.make();
      const model = sheetToGraph(sheet);
      const result = solveGraph(model);
      const svg = sheetToSvg(sheet, result, OPTS);
      let p = 0, q = 0, loss = 0;
      for (const el of model.elements) {
        const pw = result.elements[el.id].power;
        if (el.kind.endsWith('-source')) { p -= pw.watts; q -= pw.vars; }
        if (el.kind === 'resistor' || el.kind === 'switch') loss += pw.watts; // a switch is a resistance (contract)
      }
      // ideal windings and capacitors absorb no real power, so the sources' P is the resistors' and switches' (Tellegen, 1952)
      expect(Math.abs(p - loss)).toBeLessThan(1e-9 * p);
      const summary = texts(svg).find((t) => t.startsWith('Sources deliver'))!;
      expect(summary).toContain(`P = ${formatSI(p, 'W', 4)}`);
      expect(summary).toContain(`resistors dissipate ${formatSI(loss, 'W', 4)}`);
      expect(summary).toMatch(Math.abs(q) < 1e-9 * p ? /Q = 0 var/ : new RegExp(`Q = ${formatSI(q, 'var', 4)}`));
    });

    it(`${ex.key}: sheet → SVG → sheet comes back identical`, () => {
      seedIds(5);
      const sheet = ex.make();
      const back = svgToSheet(sheetToSvg(sheet, solved(sheet), OPTS));
      expect(back).toEqual(sheet);
      expect(JSON.stringify(back)).toBe(JSON.stringify(sheet));
    });
  }

  it('draws what the canvas draws: polarity dots, the coupling with k, junctions, arrows and tags', () => {
    seedIds(3);
    const sheet = EXAMPLES.find((e) => e.key === 'isolation')!.make();
    const result = solved(sheet);
    const svg = sheetToSvg(sheet, result, OPTS);
    expect(svg.match(/class="polarity-dot"/g)).toHaveLength(2); // two coupled windings, one dot each
    expect(texts(svg)).toContain('k(Lp,Ls) = 0.998'); // the example's coupling coefficient, named by its windings Lp and Ls
    // three junctions in the example's wiring: the ground corner, and both ends of the Rcore ‖ Lp pair
    expect(/<g id="junctions"[^>]*>([\s\S]*?)<\/g>/.exec(svg)![1].match(/<circle/g)).toHaveLength(3);
    // the load current tag reads the solver's Rload current
    const r3 = result.elements.Rload as { current: ComplexJson };
    expect(texts(svg)).toContain(polar(r3.current, 'A'));
    expect(texts(svg)).toContain(`n1: ${polar(result.nodes.n1, 'V')}`); // 230 V source node tag
    expect(svg).toMatch(/<g id="current-arrows"[^>]*>\s*<line /);
  });

  it('is repeatable: the same inputs give the same text', () => {
    seedIds(3);
    const sheet = EXAMPLES[1].make();
    const result = solved(sheet);
    expect(sheetToSvg(sheet, result, OPTS)).toBe(sheetToSvg(sheet, result, OPTS));
  });
});

describe('results, conventions and cautions', () => {
  it('Ohm check: 10 V across 5 Ω gives 2 A and 20 W (RMS)', () => {
    const sheet = divider('rms');
    const svg = sheetToSvg(sheet, solved(sheet), OPTS);
    const r1 = tableRows(svg).find((r) => r.name === 'R1')!;
    expect(r1.cells.i).toBe('2 A ∠0.0°'); // I = V/R = 10/5 (Ohm's law)
    expect(r1.cells.p).toBe('20 W'); // P = V·I with RMS phasors (field notes)
    expect(r1.cells.q).toBe('0 var'); // a resistor absorbs no reactive power
    expect(texts(svg)).toContain('RMS phasors; S = V·I*');
    expect(texts(svg).join(' ')).toMatch(/Magnitudes are RMS values \(S = V·I\*\)/);
  });

  it('peak convention: the same circuit absorbs ½·V·I = 10 W, and the sheet says peak', () => {
    const sheet = divider('peak');
    const svg = sheetToSvg(sheet, solved(sheet), OPTS);
    expect(tableRows(svg).find((r) => r.name === 'R1')!.cells.p).toBe('10 W'); // S = ½·V·I* for peak phasors (field notes)
    expect(texts(svg)).toContain('Peak phasors; S = ½·V·I*');
  });

  it('always states the linear-model caution; the hazardous-voltage caution only above 50 V RMS', () => {
    const linear = /no saturation, inrush or temperature rise/; // field notes, "Cautions"
    const hazard = /above extra-low voltage \(50 V AC RMS\)[\s\S]*local electrical codes and licensed practice/; // IEC 61140 limit (field notes)
    seedIds(3);
    const iso = EXAMPLES.find((e) => e.key === 'isolation')!.make(); // 230 V mains
    const isoText = texts(sheetToSvg(iso, solved(iso), OPTS)).join(' ');
    expect(isoText).toMatch(linear);
    expect(isoText).toMatch(hazard);
    const low = divider('rms'); // 10 V only
    const lowText = texts(sheetToSvg(low, solved(low), OPTS)).join(' ');
    expect(lowText).toMatch(linear);
    expect(lowText).not.toMatch(/Hazardous voltage/);
    // 60 V peak is 42.4 V RMS (peak/√2): still extra-low voltage
    const peak = divider('peak');
    peak.parts[0].value = 60;
    expect(texts(sheetToSvg(peak, solved(peak), OPTS)).join(' ')).not.toMatch(/Hazardous voltage/);
    // 80 V peak is 56.6 V RMS: above it
    peak.parts[0].value = 80;
    expect(texts(sheetToSvg(peak, solved(peak), OPTS)).join(' ')).toMatch(hazard);
  });

  it('title block: title, date, frequency, convention, notes, program and version', () => {
    seedIds(3);
    const sheet = EXAMPLES.find((e) => e.key === 'wireless')!.make();
    const svg = sheetToSvg(sheet, solved(sheet), { ...OPTS, notes: 'Pad gap 150 mm.' });
    const tb = texts(svg.slice(svg.indexOf('<g id="title-block">'))).join(' | ');
    expect(tb.replace(' | ', ' ')).toContain('Wireless charging pair, series-series');
    expect(tb).toContain('2026-12-01');
    // the ISO 7200 data fields are all there, by name (empty ones as a dash)
    for (const name of ['Document number', 'Revision', 'Sheet', 'Date of issue', 'Status', 'Owner', 'Drawn by', 'Checked by', 'Approved by']) expect(tb).toContain(name);
    expect(tb).toContain('85 kHz'); // the example's 85 kHz (field notes: vehicle wireless charging)
    expect(tb).toContain('RMS phasors; S = V·I*');
    expect(tb).toContain('Pad gap 150 mm.');
    expect(tb).toContain('Coilwright 0.1.0');
  });

  it('prints the title block and the cautions at 2.5 mm or more (the usual minimum for drawings, common practice), and the couplings with M, k and the turns ratio', () => {
    seedIds(3);
    const sheet = EXAMPLES.find((e) => e.key === 'isolation')!.make();
    sheet.titleBlock = { ...sheet.titleBlock, number: 'CW-0042', revision: 'B', drawnBy: 'A. Engineer', checkedBy: 'B. Checker' };
    const svg = sheetToSvg(sheet, solved(sheet), OPTS);
    for (const id of ['title-block', 'cautions']) {
      const block = /<g id="ID">([\s\S]*?)<\/g>/.exec(svg.replace('ID', ''))?.[1] ?? svg.slice(svg.indexOf(`<g id="${id}">`), svg.indexOf('</g>', svg.indexOf(`<g id="${id}">`)));
      const sizes = [...block.matchAll(/font-size="([\d.]+)"/g)].map((m) => Number(m[1]));
      expect(sizes.length).toBeGreaterThan(3);
      expect(Math.min(...sizes), id).toBeGreaterThanOrEqual(2.5);
    }
    const tb = texts(svg.slice(svg.indexOf('<g id="title-block">')));
    for (const v of ['CW-0042', 'B', 'A. Engineer', 'B. Checker']) expect(tb).toContain(v);
    // k = 0.998 of two 3.2 H windings: M = 0.998 · 3.2 H = 3.194 H, turns ratio √(3.2/3.2) = 1 : 1 (field notes, M = k·√(L1·L2))
    expect(texts(svg)).toContain('k(Lp,Ls): Lp = 3.2 H, Ls = 3.2 H, M(Lp,Ls) = 3.194 H, k(Lp,Ls) = 0.998, effective turns ratio √(Lp/Ls) = 1 : 1');
  });

  it('Letter paper is 279.4 mm × 215.9 mm landscape (8.5 in × 11 in), less 10.5 mm print margins', () => {
    const sheet = divider();
    const svg = sheetToSvg(sheet, solved(sheet), { ...OPTS, paper: 'Letter' });
    expect(svg).toMatch(/width="258.4mm" height="194.9mm" viewBox="0 0 258.4 194.9"/);
    expect(xmlProblem(svg)).toBeNull();
  });

  it('without a result: the schematic, the reason, no readings', () => {
    const sheet = divider();
    const svg = sheetToSvg(sheet, null, { ...OPTS, unsolvedReason: 'element "R1": ohms must be greater than 0' });
    expect(xmlProblem(svg)).toBeNull();
    expect(svg).not.toContain('id="current-arrows"');
    expect(texts(svg).join(' ')).toContain('Not solved. element "R1": ohms must be greater than 0');
    expect(svgToSheet(svg)).toEqual(sheet);
  });

  it('marks what a refusal names in red: the part, the coupling, the node', () => {
    seedIds(3);
    const sheet = EXAMPLES.find((e) => e.key === 'isolation')!.make();
    const svg = sheetToSvg(sheet, null, {
      ...OPTS,
      unsolvedReason: 'coupling "Lp~Ls": k = 1.2 must be between 0 and 1',
      culprits: [{ kind: 'element', id: 'Rload' }, { kind: 'coupling', id: 'Lp~Ls' }, { kind: 'node', id: 'n5' }],
    });
    expect(xmlProblem(svg)).toBeNull();
    const marks = /<g id="culprits"[^>]*>([\s\S]*?)<\/g>/.exec(svg)![1];
    expect(marks.match(/<rect class="culprit"/g)).toHaveLength(1); // Rload
    expect(marks.match(/<circle class="culprit"/g)).toHaveLength(1); // node n5
    expect(svg).toMatch(/class="coupling culprit"/);
    expect(svg).toMatch(/fill="#b42318"[^>]*class="ref">Rload</);
    expect(svg).not.toMatch(/fill="#b42318"[^>]*class="ref">Rp</);
  });

  it('takes plots as SVG fragments and refuses unsafe or broken ones', () => {
    const sheet = divider();
    const result = solved(sheet);
    const plot = { title: 'Sweep of |I(R1)|', svg: '<path d="M0 50 L100 10" stroke="#333" fill="none"/><text x="2" y="8">A &amp; B</text>', width: 100, height: 60 };
    const svg = sheetToSvg(sheet, result, { ...OPTS, plots: [plot] });
    expect(xmlProblem(svg)).toBeNull();
    expect(svg).toContain('<svg x="');
    expect(texts(svg)).toContain('Sweep of |I(R1)|');
    // a whole <svg> element as a string, sized by its viewBox
    const whole = '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 80 40"><circle cx="20" cy="20" r="10"/></svg>';
    const svg2 = sheetToSvg(sheet, result, { ...OPTS, plots: [whole] });
    expect(xmlProblem(svg2)).toBeNull();
    expect(svg2).toMatch(/viewBox="0 0 80 40" overflow="hidden"><svg xmlns/);
    expect(() => sheetToSvg(sheet, result, { plots: ['<g/>'] })).toThrow(/plot 1 must be an <svg> element/);
    expect(() => sheetToSvg(sheet, result, { plots: [{ ...plot, svg: '<g><script>alert(1)</script></g>' }] })).toThrow(/plot 1 holds a script/);
    expect(() => sheetToSvg(sheet, result, { plots: [{ ...plot, svg: '<g onload="x()"/>' }] })).toThrow(/plot 1/);
    expect(() => sheetToSvg(sheet, result, { plots: [{ ...plot, svg: '<g><path></g>' }] })).toThrow(/plot 1 is not well-formed/);
  });
});

describe('other circuits', () => {
  it('an ideal transformer takes two rows, primary and secondary, with the closed-form values', () => {
    seedIds(31);
    const b = sheetBuilder('Step-down 2:1', 50);
    const v = b.part('vsource', 'V1', 100, 200, { value: 10 });
    const tx = b.part('transformer', 'T1', 300, 200, { value: 2, rot: 0 });
    const r = b.part('resistor', 'R1', 420, 200, { value: 5, rot: 1 });
    b.part('ground', '', 100, 300);
    b.wire(b.pin(v, 0), b.pin(tx, 0));
    b.wire(b.pin(v, 1), at(100, 300));
    b.wire(at(100, 300), at(260, 300), b.pin(tx, 1));
    b.wire(b.pin(tx, 2), b.pin(r, 0));
    b.wire(b.pin(tx, 3), b.pin(r, 1));
    const svg = sheetToSvg(b.sheet, solved(b.sheet), OPTS);
    expect(xmlProblem(svg)).toBeNull();
    const rows = tableRows(svg);
    // V_s = V_p / ratio = 5 V; I_s = V_s / R = 1 A; I_p = I_s / ratio = 0.5 A (ideal transformer, contract);
    // the secondary current enters its dotted terminal, so it reads 1 A at 180°
    expect(rows.find((x) => x.name === 'T1 primary')!.cells).toMatchObject({ v: '10 V ∠0.0°', i: '500 mA ∠0.0°', p: '0 W' });
    expect(rows.find((x) => x.name === 'T1 secondary')!.cells).toMatchObject({ v: '5 V ∠0.0°', i: '1 A ∠180.0°' });
    expect(rows.find((x) => x.name === 'R1')!.cells).toMatchObject({ i: '1 A ∠0.0°', p: '5 W' }); // P = V²/R = 25/5
    // the transformer's own current arrows: one per side
    expect(texts(svg).filter((x) => x === '500 mA ∠0.0°').length).toBeGreaterThanOrEqual(1);
  });

  it('at 0 Hz the sheet says DC', () => {
    const sheet = divider();
    sheet.frequencyHz = 0;
    const svg = sheetToSvg(sheet, solved(sheet), OPTS);
    expect(texts(svg)).toContain('0 Hz (DC)');
    expect(texts(svg)).toContain('DC values; P = V·I');
    expect(tableRows(svg).find((r) => r.name === 'R1')!.cells.p).toBe('20 W'); // P = V²/R = 100/5 (Joule)
  });

  it('an empty sheet still makes a well-formed page that reads back', () => {
    const sheet = emptySheet('Nothing yet');
    const svg = sheetToSvg(sheet, null, OPTS);
    expect(xmlProblem(svg)).toBeNull();
    expect(svg).not.toMatch(/NaN|Infinity/);
    expect(svgToSheet(svg)).toEqual(sheet);
  });

  it('is pure: leaves its inputs untouched', () => {
    seedIds(3);
    const sheet = EXAMPLES[0].make();
    const result = solved(sheet);
    const before = JSON.stringify([sheet, result]);
    const freeze = (o: unknown): void => {
      if (o && typeof o === 'object') {
        Object.freeze(o);
        for (const v of Object.values(o)) freeze(v);
      }
    };
    freeze(sheet);
    freeze(result);
    expect(() => sheetToSvg(sheet, result, OPTS)).not.toThrow();
    expect(JSON.stringify([sheet, result])).toBe(before);
  });
});

describe('escaping of everything a user typed', () => {
  const HOSTILE = `<script>alert("x")</script> ]]> & 'quotes' "double" <!-- --> &amp; \u0001`;

  function hostileSheet(): Sheet {
    seedIds(21);
    const b = sheetBuilder(HOSTILE, 50);
    const v = b.part('vsource', 'V<1>&"', 100, 200, { value: 10 });
    const r = b.part('resistor', 'R]]>1', 250, 200, { value: 5, rot: 1 });
    b.part('ground', '', 100, 300);
    b.part('label', '', 250, 120, { name: '<b>n&1</b>' });
    b.wire(b.pin(v, 0), at(100, 120), at(250, 120), b.pin(r, 0));
    b.wire(b.pin(v, 1), at(100, 300), at(250, 300), b.pin(r, 1));
    return b.sheet;
  }

  it('hostile title, designators, node names and notes stay text', () => {
    const sheet = hostileSheet();
    const result = solved(sheet);
    const svg = sheetToSvg(sheet, result, { ...OPTS, notes: HOSTILE, version: '1 <b>' });
    expect(xmlProblem(svg)).toBeNull(); // strict XML 1.0 well-formedness (W3C XML 1.0, from memory)
    const drawing = withoutMetadata(svg);
    expect(drawing).not.toMatch(/<script|<b>|<!--/);
    expect(drawing).not.toContain('\u0001'); // not an XML 1.0 character: written as U+FFFD
    const all = texts(svg);
    // the title is written literally (white space folded to one line; the control character as U+FFFD)
    const title = HOSTILE.replace('\u0001', '\uFFFD');
    expect(all).toContain(title);
    expect(all).toContain('V<1>&"');
    expect(all).toContain('R]]>1');
    expect(all).toContain('<b>n&1</b>');
    expect(all.some((t) => t.startsWith('<b>n&1</b>: 10 V'))).toBe(true); // node tag: V1's 10 V
    expect(tableRows(svg).map((r) => r.name)).toContain('<b>n&1</b>');
    expect(all).toContain('Coilwright 1 <b>');
  });

  it('the embedded sheet survives "]]>" and markup exactly; control characters are carried and refused on reading', () => {
    const sheet = hostileSheet();
    sheet.title = 'Bench <b> ]]>';
    sheet.parts[1].ref = ']]><![CDATA[x]]>\uFFFF';
    const svg = sheetToSvg(sheet, null, OPTS);
    expect(xmlProblem(svg)).toBeNull();
    expect(svgToSheet(svg)).toEqual(sheet);
    // a name no editor field accepts (names rule: no control characters, no broken UTF-16)
    sheet.parts[1].ref = 'R\u0000\uD800';
    const bad = sheetToSvg(sheet, null, OPTS);
    expect(xmlProblem(bad)).toBeNull();
    expect(() => svgToSheet(bad)).toThrow(/parts\[1\]\.ref: holds a control character \(U\+0000\)/);
  });
});

describe('svgToSheet refuses in one line', () => {
  const sheet = divider();
  const svg = sheetToSvg(sheet, solved(sheet), OPTS);
  const oneLine = (f: () => unknown, re: RegExp) => {
    let msg = '';
    try {
      f();
    } catch (e) {
      msg = (e as Error).message;
    }
    expect(msg).toMatch(re);
    expect(msg).not.toContain('\n');
  };

  it('no embedded sheet', () => {
    oneLine(() => svgToSheet(sheetToSvg(sheet, null, { embedSheet: false })), /carries no Coilwright sheet/);
    oneLine(() => svgToSheet('<svg xmlns="http://www.w3.org/2000/svg"/>'), /carries no Coilwright sheet/);
    oneLine(() => svgToSheet('hello'), /Not an SVG file/);
  });

  it('damaged embedded sheet', () => {
    oneLine(() => svgToSheet(svg.replace('"frequencyHz":50', '"frequencyHz":"fast"')), /damaged.*frequencyHz/);
    oneLine(() => svgToSheet(svg.replace('"schema"', '"sch')), /damaged: it is not valid JSON/); // the first "schema" is the embedded sheet's
    oneLine(() => svgToSheet(svg.replace(/<\/coilwright:sheet>[\s\S]*$/, '')), /cut short/);
    oneLine(() => svgToSheet(svg.replace('"title":"', '"title":"&bogus;')), /not valid XML character data/);
    oneLine(() => svgToSheet(svg.replace(SHEET_SCHEMA, 'coilwright.sheet/99')), /newer than this editor reads/);
  });

  it('reads a sheet a re-saving tool wrapped in CDATA or gave another prefix', () => {
    const inner = /<coilwright:sheet [^>]*>([^<]*)<\/coilwright:sheet>/.exec(svg)![1];
    const json = inner.replace(/&quot;/g, '"').replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&amp;/g, '&');
    const cdata = svg.replace(inner, `<![CDATA[${json}]]>`);
    expect(svgToSheet(cdata)).toEqual(sheet);
    const renamed = svg.replace(/coilwright:sheet/g, 'ns1:sheet').replace('xmlns:coilwright=', 'xmlns:ns1=');
    expect(svgToSheet(renamed)).toEqual(sheet);
  });
});

describe('sheetToSvg with a practical transformer', () => {
  it('prints its report at the operating point beside the readings (the figures of test/model/powerExamples.test.ts)', () => {
    seedIds(3);
    const sheet = EXAMPLES.find((e) => e.key === 'distribution')!.make();
    const line = texts(sheetToSvg(sheet, solved(sheet), OPTS)).find((t) => t.startsWith('T1: load'));
    expect(line).toBe('T1: load 96.6 % of 25000 VA; copper 360.5 W, core 91.76 W; efficiency 97.63 %; regulation 3.46 %; z = 0.0152 + j0.037 pu');
  });
});
