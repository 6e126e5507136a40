import { describe, expect, it } from 'vitest';
import { graphToSheet } from '../../src/model/fromGraph';
import type { GraphModel } from '../../src/model/graph';
import { sheetToGraph } from '../../src/model/toGraph';

// the example model of the graph-model contract
const model: GraphModel = {
  schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd',
  elements: [
    { id: 'Vin', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 230, phaseDeg: 0 },
    { id: 'Rw', kind: 'resistor', nodes: ['a', 'b'], ohms: 0.4 },
    { id: 'Lp', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.8, dot: 'first' },
    { id: 'Ls', kind: 'inductor', nodes: ['c', 'gnd'], henries: 0.05, dot: 'second' },
    { id: 'Cs', kind: 'capacitor', nodes: ['c', 'd'], farads: 2.2e-6 },
    { id: 'Rl', kind: 'resistor', nodes: ['d', 'gnd'], ohms: 12 },
    { id: 'Iaux', kind: 'current-source', nodes: ['gnd', 'd'], magnitude: 0.1, phaseDeg: -30 },
    { id: 'Tx', kind: 'ideal-transformer', nodes: ['d', 'gnd', 'e', 'gnd'], ratio: 4 },
    { id: 'Re', kind: 'resistor', nodes: ['e', 'gnd'], ohms: 100 },
  ],
  couplings: [{ id: 'Kps', windings: ['Lp', 'Ls'], k: 0.92 }],
};

describe('opening a graph model', () => {
  it('lays it out as a sheet that derives the same model back', () => {
    const sheet = graphToSheet(model);
    const back = sheetToGraph(sheet);
    expect(back.elements).toEqual(model.elements); // same ids, kinds, node names, values and dots
    expect(back.couplings).toEqual([{ ...model.couplings![0], id: 'Lp~Ls' }]); // a coupling is named by its windings on the sheet
    expect(back.frequencyHz).toBe(50);
    expect(back.ground).toBe('gnd');
  });

  it('keeps a coupling given as M', () => {
    const m: GraphModel = { ...model, couplings: [{ id: 'Kps', windings: ['Lp', 'Ls'], henries: 0.15 }] };
    // a coupling comes back named by its windings (the sheet gives couplings no designator of their own)
    expect(sheetToGraph(graphToSheet(m)).couplings).toEqual([{ id: 'Lp~Ls', windings: ['Lp', 'Ls'], henries: 0.15 }]);
  });
});
