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
    // wiring drawn in the example: Vmains+ → Rp → (Rcore ‖ Lp) → gnd; Ls → Rs → Rload → Ls
    expect(byId.Vmains.nodes).toEqual(['n1', 'gnd']);
    expect(byId.Rp.nodes).toEqual(['n1', 'n2']);
    expect(byId.Rcore.nodes).toEqual(['n2', 'gnd']);
    expect(byId.Lp.nodes).toEqual(['n2', 'gnd']);
    expect(byId.Ls.nodes).toEqual(['n3', 'n4']);
    expect(byId.Rs.nodes).toEqual(['n3', 'n5']);
    expect(byId.Rload.nodes).toEqual(['n5', 'n4']);
    expect(byId.Vmains).toMatchObject({ kind: 'voltage-source', magnitude: 230, phaseDeg: 0 });
    expect(byId.Rload).toMatchObject({ kind: 'resistor', ohms: 105.8 });
    expect(g.couplings).toEqual([{ id: 'Lp~Ls', windings: ['Lp', 'Ls'], k: 0.998 }]); // named by its windings
  });

  it('joins node labels and several grounds by name', () => {
    const g = sheetToGraph(currentTransformerSheet());
    const byId = Object.fromEntries(g.elements.map((e) => [e.id, e]));
    expect(byId.Rburden.nodes).toEqual(['burden', 'gnd']); // label "burden" on the burden's top wire
    expect(byId.Lsec.nodes[1]).toBe('gnd'); // second ground symbol sits on the secondary's return wire
    expect(byId.Iline.nodes).toEqual(['gnd', 'n1']);
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
