/**
 * Sheet ↔ graph of the time-domain fields (contract: time-and-s-domain.md,
 * "New fields and one new kind"): initial values of windings and capacitors,
 * source waveforms, the switch; and the migration of version 5 sheets.
 */
import { describe, expect, it } from 'vitest';
import { graphToSheet } from '../../src/model/fromGraph';
import type { GraphModel } from '../../src/model/graph';
import { parseSheetJson } from '../../src/model/parseSheet';
import { at, sheetBuilder } from '../../src/model/examples/builder';
import { SHEET_SCHEMA } from '../../src/model/sheet';
import { sheetToGraph } from '../../src/model/toGraph';
import { parseGraphModel } from '../../src/solver';

/** V1 (square wave) → S1 (switch) → L1 ‖ C1 to ground, L1 coupled to L2 loaded by R2. */
function timeSheet() {
  const b = sheetBuilder('time fields', 1000);
  const v = b.part('vsource', 'V1', 100, 200, { value: 5, waveform: { shape: 'square', low: 0, high: 12, frequencyHz: 85e3, duty: 0.5, edgeS: 1e-7 } });
  const s = b.part('switch', 'S1', 200, 170, { closed: false, togglesS: [1e-3, 4e-3] });
  const l1 = b.part('winding', 'L1', 300, 200, { value: 1e-3, initialAmps: 0.5 });
  const c1 = b.part('capacitor', 'C1', 380, 200, { value: 1e-6, initialVolts: -3, rot: 1 });
  const l2 = b.part('winding', 'L2', 500, 200, { value: 1e-3 });
  const r2 = b.part('resistor', 'R2', 600, 200, { value: 10, rot: 1 });
  const g = b.part('ground', '', 100, 300);
  b.wire(b.pin(v, 0), b.pin(s, 0));
  b.wire(b.pin(s, 1), b.pin(l1, 0));
  b.wire(b.pin(l1, 0), b.pin(c1, 0));
  b.wire(b.pin(v, 1), b.pin(g, 0));
  b.wire(b.pin(l1, 1), at(300, 300), b.pin(g, 0));
  b.wire(b.pin(c1, 1), at(380, 300), at(300, 300));
  b.wire(b.pin(l2, 0), b.pin(r2, 0));
  b.wire(b.pin(l2, 1), b.pin(r2, 1));
  b.couple([l1, l2], 0.3);
  return b.sheet;
}

describe('the time-domain fields of a sheet', () => {
  it('derive into the graph model as the contract names them', () => {
    const g = sheetToGraph(timeSheet());
    const byId = Object.fromEntries(g.elements.map((e) => [e.id, e]));
    expect(byId.V1).toMatchObject({ kind: 'voltage-source', magnitude: 5, waveform: { shape: 'square', low: 0, high: 12, frequencyHz: 85e3, duty: 0.5, edgeS: 1e-7 } });
    expect(byId.S1).toEqual({ id: 'S1', kind: 'switch', nodes: byId.S1.nodes, closed: false, onOhms: 0.001, offOhms: 1e9, togglesS: [1e-3, 4e-3] });
    expect(byId.L1).toMatchObject({ kind: 'inductor', initialAmps: 0.5 });
    expect(byId.C1).toMatchObject({ kind: 'capacitor', initialVolts: -3 });
    // a value at its default (0) is left out: the file means the same as before these fields existed
    expect('initialAmps' in byId.L2).toBe(false);
    // the solver's reader takes the derived model as it is
    expect(() => parseGraphModel(g)).not.toThrow();
  });

  it('a source without a waveform stays a plain phasor source', () => {
    const sheet = timeSheet();
    const v = sheet.parts.find((p) => p.ref === 'V1')!;
    delete v.waveform;
    const src = sheetToGraph(sheet).elements.find((e) => e.id === 'V1')!;
    expect(src).toEqual({ id: 'V1', kind: 'voltage-source', nodes: src.nodes, magnitude: 5, phaseDeg: 0 });
  });

  it('read back from a graph model to the same fields', () => {
    const model = sheetToGraph(timeSheet());
    const back = sheetToGraph(graphToSheet(model as GraphModel));
    expect(back.elements).toEqual(model.elements);
  });

  it('survive a save and a reload unchanged', () => {
    const sheet = timeSheet();
    expect(parseSheetJson(JSON.parse(JSON.stringify(sheet)))).toEqual(sheet);
  });

  it('are refused in a sheet file by the rules of the graph model, naming the field', () => {
    const bad = (patch: (s: any) => void) => {
      const s = JSON.parse(JSON.stringify(timeSheet()));
      patch(s);
      return () => parseSheetJson(s);
    };
    // a square wave whose edge is longer than its high part (contract: "square")
    expect(bad((s) => { s.parts[0].waveform.edgeS = 1e-5; })).toThrow(/parts\[0\]\.waveform\.edgeS: is longer than the part of the period it opens/);
    expect(bad((s) => { s.parts[0].waveform.shape = 'triangle'; })).toThrow(/parts\[0\]\.waveform\.shape: must be one of "constant", "sine", "step", "square", "points"/);
    expect(bad((s) => { s.parts[1].togglesS = [2e-3, 1e-3]; })).toThrow(/parts\[1\]\.togglesS\[1\]: must be later than the time before it/);
    expect(bad((s) => { s.parts[1].togglesS = [0]; })).toThrow(/parts\[1\]\.togglesS\[0\]: must be greater than 0 s/);
    expect(bad((s) => { s.parts[2].initialAmps = 'lots'; })).toThrow(/parts\[2\]\.initialAmps/);
    expect(bad((s) => { s.parts[1].onOhms = 0; })).toThrow(/parts\[1\]\.onOhms: must be greater than 0/);
  });
});

describe('a version 5 sheet', () => {
  it('migrates to version 6 with the initial values windings and capacitors always had (0)', () => {
    const v5 = {
      schema: 'coilwright.sheet/5', title: 'old', frequencyHz: 50, amplitudes: 'rms',
      parts: [
        { id: 'part:a', kind: 'winding', x: 0, y: 0, rot: 1, mirror: false, ref: 'L1', value: 0.1, dot: 'first' },
        { id: 'part:b', kind: 'capacitor', x: 100, y: 0, rot: 0, mirror: false, ref: 'C1', value: 1e-6 },
        { id: 'part:c', kind: 'vsource', x: 200, y: 0, rot: 1, mirror: false, ref: 'V1', value: 10, phaseDeg: 0 },
      ],
      wires: [], couplings: [],
    };
    const s = parseSheetJson(v5);
    expect(s.schema).toBe(SHEET_SCHEMA);
    expect(s.parts.map((p) => [p.ref, p.initialAmps, p.initialVolts, p.waveform])).toEqual([
      ['L1', 0, undefined, undefined],
      ['C1', undefined, 0, undefined],
      ['V1', undefined, undefined, undefined], // no waveform: it still follows its phasor
    ]);
  });
});
