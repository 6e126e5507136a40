import { describe, expect, it } from 'vitest';
import type { GraphModel, SolveResult } from '../../src/model/graph';
import { cautionsFor } from '../../src/model/cautions';
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
