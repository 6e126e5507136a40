/** Sheet → graph model, keeping the links the overlays need (element → part, node → anchor). */
import { GRAPH_SCHEMA, type Coupling, type ElementResult, type GraphElement, type GraphModel, type SolveResult } from './graph';
import { couplingGraphId } from './couplingName';
import { PART_DEFS, isSource } from './parts/registry';
import { PowerDataError } from './powerTransformer';
import { terminalResult, type Expansion } from './powerExpansion';
import type { Sheet } from './sheet';
import { deriveTopology, type Topology } from './topology';

export interface DerivedCircuit {
  model: GraphModel;
  topology: Topology;
  /** graph element id → part id (the elements of an expanded part too) */
  partOfElement: Map<string, string>;
  /** part id → the elements it expands into (a practical transformer) */
  expansions: Map<string, Expansion>;
  /** the ids of elements inside an expanded part */
  inner: Set<string>;
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
  const expansions = new Map<string, Expansion>();
  const inner = new Set<string>();
  const innerCouplings: Coupling[] = [];
  const notes: string[] = [];
  sheet.parts.forEach((part, i) => {
    const def = PART_DEFS[part.kind];
    if (def.expand) {
      try {
        const x = def.expand(part, topology.pinNodes[i]);
        expansions.set(part.id, x);
        for (const el of x.elements) {
          elements.push(el);
          partOfElement.set(el.id, part.id);
          inner.add(el.id);
        }
        innerCouplings.push(...x.couplings);
      } catch (e) {
        if (!(e instanceof PowerDataError)) throw e;
        notes.push(`${part.ref} is left out of the circuit: ${e.message}`);
      }
      return;
    }
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
  couplings.push(...innerCouplings);
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
  return { model, topology, partOfElement, expansions, inner, couplingOfId, notes, source: sheet };
}

export function sheetToGraph(sheet: Sheet): GraphModel {
  return deriveCircuit(sheet).model;
}

/**
 * The readings by sheet part: the result with the elements inside expanded
 * parts replaced by each such part's own terminal reading (primary then
 * secondary, as an ideal transformer's), keyed by the part's designator.
 */
export function partReadings(circuit: DerivedCircuit, result: SolveResult): { elements: Record<string, ElementResult>; partOfElement: Map<string, string> } {
  if (!circuit.expansions.size) return { elements: result.elements, partOfElement: circuit.partOfElement };
  const elements: Record<string, ElementResult> = Object.create(null);
  const partOfElement = new Map<string, string>();
  for (const id in result.elements) {
    if (circuit.inner.has(id)) continue;
    elements[id] = result.elements[id];
    const p = circuit.partOfElement.get(id);
    if (p) partOfElement.set(id, p);
  }
  const refs = new Map(circuit.source.parts.map((p) => [p.id, p.ref]));
  for (const [partId, x] of circuit.expansions) {
    if (!x.elements.some((e) => result.elements[e.id])) continue;
    const key = `${refs.get(partId) ?? partId}`;
    elements[key] = terminalResult(x, result);
    partOfElement.set(key, partId);
  }
  return { elements, partOfElement };
}
