import { describe, expect, it } from 'vitest';
import { EXAMPLES, deriveCircuit, seedIds, sheetToGraph } from '../../src/model';
import { isolationTransformerSheet } from '../../src/model/examples/isolation';
import { currentTransformerSheet } from '../../src/model/examples/currentTransformer';

describe('sheetToGraph', () => {
  it('derives the demo isolation transformer: elements, nodes, values and coupling', () => {
    seedIds(1);
    const g = sheetToGraph(isolationTransformerSheet());
    expect(g.schema).toBe('coilwright.graph/1');
    expect(g.frequencyHz).toBe(50); // the sheet's own frequency, mains 50 Hz (field notes)
    expect(g.ground).toBe('gnd');
    const byId = Object.fromEntries(g.elements.map((e) => [e.id, e]));
    // wiring drawn in the example: V1+ → R1 → L1 → gnd; L2 → R2 → (R3 ‖ C1) → L2
    expect(byId.V1.nodes).toEqual(['n1', 'gnd']);
    expect(byId.R1.nodes).toEqual(['n1', 'n2']);
    expect(byId.L1.nodes).toEqual(['n2', 'gnd']);
    expect(byId.L2.nodes).toEqual(['n3', 'n4']);
    expect(byId.R2.nodes).toEqual(['n3', 'n5']);
    expect(byId.R3.nodes).toEqual(['n5', 'n4']);
    expect(byId.C1.nodes).toEqual(['n5', 'n4']);
    expect(byId.V1).toMatchObject({ kind: 'voltage-source', magnitude: 230, phaseDeg: 0 });
    expect(byId.C1).toMatchObject({ kind: 'capacitor', farads: 10e-6 });
    expect(g.couplings).toEqual([{ id: 'K1', windings: ['L1', 'L2'], k: 0.995 }]);
  });

  it('joins node labels and several grounds by name', () => {
    const g = sheetToGraph(currentTransformerSheet());
    const byId = Object.fromEntries(g.elements.map((e) => [e.id, e]));
    expect(byId.R2.nodes).toEqual(['burden', 'gnd']); // label "burden" on the burden's top wire
    expect(byId.L2.nodes[1]).toBe('gnd'); // second ground symbol sits on the secondary's return wire
    expect(byId.I1.nodes).toEqual(['gnd', 'n1']);
  });

  it('every example derives without notes and with unique element ids', () => {
    for (const ex of EXAMPLES) {
      const d = deriveCircuit(ex.make());
      expect(d.notes).toEqual([]);
      const ids = d.model.elements.map((e) => e.id);
      expect(new Set(ids).size).toBe(ids.length);
    }
  });
});
