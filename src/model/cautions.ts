/**
 * Safety cautions from a solve (field notes, "Cautions"): voltages above
 * extra-low voltage (50 V AC RMS, IEC 61140 / IEC 60364, from memory), and a
 * winding coupled to a current-carrying winding that feeds an open or very
 * high-impedance load (an open current-transformer secondary; common practice).
 */
import type { GraphModel, SolveResult } from './graph';
import { powerReport } from './powerExpansion';
import type { DerivedCircuit } from './toGraph';
import { mag } from './phasor';
import { formatSI } from './quantity';

export const ELV_AC_RMS = 50;
/** above this, a winding's load counts as open */
export const OPEN_LOAD_OHMS = 1e5;

export interface Caution {
  kind: 'elv' | 'open-winding' | 'open-secondary' | 'overload';
  text: string;
  /** what the caution is about, to mark on the drawing: an element by its graph id, or a node */
  target: { kind: 'element' | 'node'; id: string } | null;
}

export function cautionsFor(model: GraphModel, result: SolveResult): Caution[] {
  const out: Caution[] = [];
  // at 0 Hz the values are DC and the limit differs (120 V ripple-free); only AC is checked here
  const toRms = result.amplitudes === 'peak' ? 1 / Math.SQRT2 : 1;
  let worst = 0;
  let where = '';
  let target: Caution['target'] = null;
  const nodeNames = Object.keys(result.nodes);
  for (const n of nodeNames) {
    const v = mag(result.nodes[n]) * toRms;
    if (v > worst) { worst = v; where = `node ${n}`; target = { kind: 'node', id: n }; }
  }
  for (const [id, r] of Object.entries(result.elements)) {
    const vs = 'voltage' in r ? [r.voltage] : r.voltages;
    for (const z of vs) {
      const v = mag(z) * toRms;
      if (v > worst) { worst = v; where = id; target = { kind: 'element', id }; }
    }
  }
  const limit = model.frequencyHz === 0 ? 120 : ELV_AC_RMS;
  if (worst > limit) {
    out.push({
      kind: 'elv',
      target,
      text: `${where} reaches ${formatSI(worst, 'V', 4)} ${model.frequencyHz === 0 ? 'DC' : 'RMS'}, above extra-low voltage (${limit} V ${model.frequencyHz === 0 ? 'ripple-free DC' : 'AC RMS'}). This model is linear and idealised: insulation, creepage, fusing and protective earth are not checked. Building or testing it must follow local electrical codes and licensed practice.`,
    });
  }
  for (const c of model.couplings ?? []) {
    const currents = c.windings.map((w) => {
      const r = result.elements[w];
      return r && 'current' in r ? { id: w, i: mag(r.current), v: mag(r.voltage) } : null;
    });
    const carrying = currents.filter((x) => x && x.i > 1e-6);
    for (const w of currents) {
      if (!w || w.v === 0) continue;
      const open = w.i === 0 || w.v / w.i > OPEN_LOAD_OHMS;
      if (open && carrying.some((x) => x && x.id !== w.id)) {
        out.push({
          kind: 'open-winding',
          target: { kind: 'element', id: w.id },
          text: `Winding ${w.id} is coupled to a current-carrying winding but feeds an open or very high-impedance load (${formatSI(w.v * toRms, 'V', 4)} RMS across it). An open current-transformer secondary can develop dangerous voltage: keep a burden connected or the winding shorted, following local codes and licensed practice.`,
        });
      }
    }
  }
  return out;
}

/**
 * An ideal transformer whose secondary closes no circuit while a current
 * source drives its primary side: the model has no solution (the secondary
 * voltage would have to be infinite), which is exactly the hazard of an open
 * current-transformer secondary (common practice: never open-circuit a CT
 * secondary under load). Read from the graph alone, so it is named even when
 * the solve is refused.
 */
export function openSecondaries(model: GraphModel): Caution[] {
  const out: Caution[] = [];
  for (const t of model.elements) {
    if (t.kind !== 'ideal-transformer') continue;
    // a current source closes no path for the secondary current, nor does an open switch (its leakage resistance is no burden)
    const find = galvanicSections(model, (e) => e !== t && !(e.kind === 'switch' && !e.closed));
    const [p1, p2, s1, s2] = t.nodes;
    if (find(s1) === find(s2)) continue;
    const driven = model.elements.some((e) => e.kind === 'current-source' && [find(e.nodes[0]), find(e.nodes[1])].some((r) => r === find(p1) || r === find(p2)));
    if (!driven) continue;
    out.push({
      kind: 'open-secondary',
      target: { kind: 'element', id: t.id },
      text: `The secondary of ${t.id} is open while a current source drives its primary: this is an open current-transformer secondary, which develops dangerous voltage (the ideal model has no finite answer at all). Connect the burden or short the secondary before the primary carries current, following local codes and licensed practice.`,
    });
  }
  return out;
}

/**
 * The galvanic sections of a model: `find(node)` names the section a node is
 * in. Each element `joins` allows joins its nodes (a two-port each side); a
 * current source joins nothing.
 */
export function galvanicSections(model: GraphModel, joins: (e: GraphModel['elements'][number]) => boolean = () => true): (node: string) => string {
  const parent = new Map<string, string>();
  const find = (n: string): string => {
    let r = n;
    while (parent.has(r) && parent.get(r) !== r) r = parent.get(r)!;
    return r;
  };
  const join = (a: string, b: string) => { const ra = find(a), rb = find(b); if (ra !== rb) parent.set(ra, rb); };
  for (const e of model.elements) {
    if (e.kind === 'current-source' || !joins(e)) continue;
    if (e.kind === 'ideal-transformer') { join(e.nodes[0], e.nodes[1]); join(e.nodes[2], e.nodes[3]); continue; }
    join(e.nodes[0], e.nodes[1]);
  }
  return find;
}

/**
 * A practical transformer loaded above its rating: either winding's current
 * above its rated current (S/V). A linear model shows no heating; in practice
 * the windings overheat and the insulation ages (common practice: keep within
 * the nameplate rating unless its data allow an overload).
 */
export function overloads(circuit: DerivedCircuit, result: SolveResult): Caution[] {
  const out: Caution[] = [];
  for (const part of circuit.source.parts) {
    const x = circuit.expansions.get(part.id);
    if (!x || !part.power || !x.elements.every((e) => result.elements[e.id])) continue;
    const r = powerReport(part.power, x, result);
    if (!(r.worstLoad > 1 + 1e-9)) continue;
    out.push({
      kind: 'overload',
      target: { kind: 'element', id: x.elements[0].id },
      text: `${part.ref} is loaded to ${Number((100 * r.worstLoad).toPrecision(3))} % of its rated current (${formatSI(part.power.rating.va, 'VA', 4)} rating). This model is linear: it shows no heating, but an overloaded transformer overheats its windings and ages its insulation. Keep within the nameplate rating; overloading, protection and fusing must follow the maker's data, local electrical codes and licensed practice.`,
    });
  }
  return out;
}
