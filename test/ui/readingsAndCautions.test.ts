import { describe, expect, it } from 'vitest';
import type { GraphModel, SolveResult } from '../../src/model/graph';
import { cautionsFor, openSecondaries } from '../../src/model/cautions';
import { floorResult } from '../../src/model/resultFloor';
import { isolatedText } from '../../src/ui/Notices';
import { rawRows, readingRows, readingsCsv, sortRows } from '../../src/ui/readings';

const model = (f = 50): GraphModel => ({
  schema: 'coilwright.graph/1', frequencyHz: f, amplitudes: 'rms', ground: 'gnd',
  elements: [
    { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 1, phaseDeg: 0 },
    { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: 1 },
    { id: 'L2', kind: 'inductor', nodes: ['b', 'gnd'], henries: 1 },
  ],
  couplings: [{ id: 'K1', windings: ['L1', 'L2'], k: 0.9 }],
});

const result = (v2: number, i2: number, amplitudes: 'rms' | 'peak' = 'rms'): SolveResult => ({
  schema: 'coilwright.result/1', frequencyHz: 50, amplitudes, warnings: [],
  nodes: { gnd: { re: 0, im: 0 }, a: { re: 0, im: 40 }, b: { re: 0, im: v2 } },
  elements: {
    I1: { voltage: { re: 0, im: -40 }, current: { re: 1, im: 0 }, power: { watts: 0, vars: -40 } },
    L1: { voltage: { re: 0, im: 40 }, current: { re: 1, im: 0 }, power: { watts: 0, vars: 40 } },
    L2: { voltage: { re: 0, im: v2 }, current: { re: i2, im: 0 }, power: { watts: 0, vars: 0 } },
  },
});

describe('cautions', () => {
  it('warn above extra-low voltage, 50 V AC RMS (IEC 61140, from memory)', () => {
    expect(cautionsFor(model(), result(49, 0.5)).map((c) => c.kind)).toEqual([]);
    const c = cautionsFor(model(), result(51, 0.5));
    expect(c.map((x) => x.kind)).toEqual(['elv']);
    expect(c[0].text).toMatch(/local electrical codes and licensed practice/);
    // 70 V peak is 49.5 V RMS: below the limit
    expect(cautionsFor(model(), result(70, 0.5, 'peak')).map((x) => x.kind)).toEqual([]);
  });

  it('warn of a winding coupled to a current-carrying winding feeding an open load (common practice)', () => {
    expect(cautionsFor(model(), result(36, 0)).map((c) => c.kind)).toEqual(['open-winding']);
    expect(cautionsFor(model(), result(36, 0.5)).map((c) => c.kind)).toEqual([]);
  });
});

describe('readings', () => {
  it('list nodes and parts with magnitudes and angles, sortable, and export CSV', () => {
    const rows = readingRows(result(36, 0.5));
    const l2 = rows.find((r) => r.name === 'L2')!;
    expect(l2.vMag).toBe(36);
    expect(l2.vDeg).toBe(90); // j·36 V lies at +90°
    const byV = sortRows(rows.filter((r) => r.what === 'part'), 'vMag', -1).map((r) => r.name);
    expect(byV).toEqual(['I1', 'L1', 'L2']);
    const csv = readingsCsv(result(36, 0.5), rawRows(result(36, 0.5)), 'Test');
    expect(csv).toContain('frequency 50 Hz; amplitudes RMS');
    expect(csv).toContain('"L2","part",36,90,0.5,0,0,0');
    // a title and a name that a spreadsheet would run as formulas stay text (OWASP, CSV Injection)
    const hostile = readingsCsv(result(36, 0.5), rawRows(result(36, 0.5)).map((r) => ({ ...r, name: `=${r.name}` })), 'Bench,=1+1');
    expect(hostile.split('\n')[0]).toBe('# Coilwright readings,"Bench,=1+1"');
    expect(hostile).toContain(`"'=L2","part"`);
  });
});

describe('hazards and notices said of the sheet', () => {
  const ct = (burden: boolean): GraphModel => ({
    schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd',
    elements: [
      { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 100, phaseDeg: 0 },
      { id: 'T1', kind: 'ideal-transformer', nodes: ['a', 'gnd', 's', 'gnd'], ratio: 1 / 200 },
      ...(burden ? [{ id: 'R1', kind: 'resistor' as const, nodes: ['s', 'gnd'] as [string, string], ohms: 1 }] : []),
    ],
  });

  it('name an open secondary of a current-driven ideal transformer, pointing at it (common practice: never open a CT secondary)', () => {
    expect(openSecondaries(ct(true))).toEqual([]);
    const c = openSecondaries(ct(false));
    expect(c.map((x) => [x.kind, x.target])).toEqual([['open-secondary', { kind: 'element', id: 'T1' }]]);
    expect(c[0].text).toMatch(/open current-transformer secondary.*dangerous voltage/);
    expect(c[0].text).toMatch(/local codes and licensed practice/);
    // a burden behind an open switch is no burden; behind a closed one it is
    const switched = (closed: boolean): GraphModel => {
      const m = ct(true);
      m.elements[2] = { ...m.elements[2], nodes: ['b', 'gnd'] } as GraphModel['elements'][number];
      m.elements.push({ id: 'S1', kind: 'switch', nodes: ['s', 'b'], closed });
      return m;
    };
    expect(openSecondaries(switched(false)).map((x) => x.kind)).toEqual(['open-secondary']);
    expect(openSecondaries(switched(true))).toEqual([]);
  });

  it('give voltages in the number format of everything else, and say what they are about', () => {
    const c = cautionsFor(model(), result(15700, 0));
    expect(c.find((x) => x.kind === 'elv')!.text).toMatch(/^node b reaches 15\.7 kV RMS/); // not "1.57e+4 V"
    expect(c.find((x) => x.kind === 'open-winding')!.target).toEqual({ kind: 'element', id: 'L2' });
  });

  it('call an isolated section by what it is, without the solver\'s prefix', () => {
    expect(isolatedText('isolated part: nodes "n3", "n4" have no galvanic path to ground "gnd"')).toBe('nodes "n3", "n4" have no galvanic path to ground "gnd"');
  });

  it('show rounding noise as 0: below 1e-10 of the largest of its kind (a relative floor; double precision leaves about 1e-16)', () => {
    const r = result(36, 0.5);
    r.elements.L2 = { ...r.elements.L2, current: { re: 6.661e-15, im: 0.5 } } as typeof r.elements.L2;
    r.elements.L1 = { ...r.elements.L1, power: { watts: 0, vars: -7.994e-13 } };
    const f = floorResult(r);
    expect(f.elements.L2).toMatchObject({ current: { re: 0, im: 0.5 } });
    expect(f.elements.L1.power.vars).toBe(0);
    expect(f.elements.I1.power.vars).toBe(-40); // real values stay as they are
    expect(f.nodes.a).toEqual({ re: 0, im: 40 });
  });
});
