/** Sheet → graph model, keeping the links the overlays need (element → part, node → anchor). */
import { GRAPH_SCHEMA, type Coupling, type GraphElement, type GraphModel } from './graph';
import { couplingGraphId } from './couplingName';
import { PART_DEFS, isSource } from './parts/registry';
import type { Sheet } from './sheet';
import { deriveTopology, type Topology } from './topology';

export interface DerivedCircuit {
  model: GraphModel;
  topology: Topology;
  /** graph element id → part id */
  partOfElement: Map<string, string>;
  /** graph coupling id → sheet coupling id */
  couplingOfId: Map<string, string>;
  /** notes about the derivation itself (no ground symbol …) */
  notes: string[];
  /** the sheet this was derived from */
  source: Sheet;
}

export function deriveCircuit(sheet: Sheet): DerivedCircuit {
  const topology = deriveTopology(sheet);
  const elements: GraphElement[] = [];
  const partOfElement = new Map<string, string>();
  const refOfPart = new Map<string, string>();
  sheet.parts.forEach((part, i) => {
    const def = PART_DEFS[part.kind];
    if (!def.toElement) return;
    const el = def.toElement(part, topology.pinNodes[i]);
    elements.push(el);
    partOfElement.set(el.id, part.id);
    refOfPart.set(part.id, el.id);
  });
  const couplings: Coupling[] = [];
  const couplingOfId = new Map<string, string>();
  for (const c of sheet.couplings) {
    const id = couplingGraphId(sheet, c);
    const windings = c.windings.map((w) => refOfPart.get(w) ?? w);
    couplings.push(c.by === 'M' ? { id, windings, henries: c.value } : { id, windings, k: c.value });
    couplingOfId.set(id, c.id);
  }
  const notes: string[] = [];
  let ground = 'gnd';
  // a ground symbol that no part reaches yet (placed before the wires) grounds nothing
  const grounded = topology.hasGround && elements.some((e) => e.nodes.includes('gnd'));
  if (!grounded) {
    const firstSource = sheet.parts.findIndex(isSource);
    const pick = firstSource >= 0 ? topology.pinNodes[firstSource][1] : topology.nodeNames[0];
    if (pick) {
      ground = pick;
      notes.push(topology.hasGround
        ? `The ground symbol is not wired to any part yet: voltages are measured from node ${pick} until it is`
        : `No ground symbol on the sheet: voltages are measured from node ${pick}`);
    }
  }
  const model: GraphModel = {
    schema: GRAPH_SCHEMA,
    frequencyHz: sheet.frequencyHz,
    amplitudes: sheet.amplitudes,
    ground,
    elements,
  };
  if (couplings.length) model.couplings = couplings;
  return { model, topology, partOfElement, couplingOfId, notes, source: sheet };
}

export function sheetToGraph(sheet: Sheet): GraphModel {
  return deriveCircuit(sheet).model;
}
