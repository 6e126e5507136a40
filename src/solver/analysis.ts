import type { GraphModel, GraphElement, InductorEl, SolveResult, ComplexJson } from '../model/graph';
import { ModelRefusal } from './errors';
import { SolverSession } from './phasor/session';
import { dotSign, isWinding, sourceRole } from './elements/registry';
import { mutualLimit } from '../model/mutual';

/** Complex numbers as plain pairs, for the analyses' answers. */
export interface Cx { re: number; im: number }

const cdiv = (a: Cx, b: Cx): Cx => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
const cmul = (a: Cx, b: Cx): Cx => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });

// ---------------------------------------------------------------- k and M

/** M = k·sqrt(L1·L2). Throws a RangeError naming the bad value. */
export function mutualFromK(k: number, l1: number, l2: number): number {
  if (!(k >= 0 && k <= 1)) throw new RangeError(`k = ${k} is out of range: the coupling coefficient must be between 0 and 1`);
  if (!(l1 > 0 && l2 > 0)) throw new RangeError('both self-inductances must be greater than 0');
  return k * mutualLimit(l1, l2);
}

/** k = M / sqrt(L1·L2). Throws a RangeError when M is beyond sqrt(L1·L2). */
export function kFromMutual(m: number, l1: number, l2: number): number {
  if (!(l1 > 0 && l2 > 0)) throw new RangeError('both self-inductances must be greater than 0');
  const mMax = mutualLimit(l1, l2);
  if (!(m >= 0 && m <= mMax * (1 + 1e-12))) {
    throw new RangeError(`M = ${m} H is out of range: it must be between 0 and sqrt(L1·L2) = ${mMax} H`);
  }
  return Math.min(1, m / mMax);
}

// ---------------------------------------------------------------- Tellegen

/**
 * Tellegen's theorem (B. D. H. Tellegen, 1952): the complex powers of all
 * elements sum to zero. Returns the sum and its size relative to the largest
 * element power, a check on any solve.
 */
export function tellegenResidual(result: SolveResult): { watts: number; vars: number; largest: number; relative: number } {
  let watts = 0;
  let vars = 0;
  let largest = 0;
  for (const r of Object.values(result.elements)) {
    watts += r.power.watts;
    vars += r.power.vars;
    largest = Math.max(largest, Math.hypot(r.power.watts, r.power.vars));
    if ('voltages' in r) {
      // each side's own power counts towards the scale too
      for (let s = 0; s < 2; s++) {
        const v = r.voltages[s];
        const i = r.currents[s];
        largest = Math.max(largest, Math.hypot(v.re, v.im) * Math.hypot(i.re, i.im));
      }
    }
  }
  const size = Math.hypot(watts, vars);
  return { watts, vars, largest, relative: largest > 0 ? size / largest : 0 };
}

// ---------------------------------------------------------------- helpers

function findElement(model: GraphModel, id: string): GraphElement {
  const el = model.elements.find((e) => e.id === id);
  if (!el) throw new ModelRefusal(`element "${id}" is not in this model`, [{ kind: 'element', id }]);
  return el;
}

/** The same model with every independent source set to zero (voltage sources short, current sources open). */
function withSourcesZeroed(model: GraphModel, except?: string): GraphModel {
  return {
    ...model,
    elements: model.elements.map((e) =>
      sourceRole(e) && e.id !== except ? { ...e, magnitude: 0, phaseDeg: 0 } : e,
    ),
  };
}

function uniqueId(model: GraphModel, base: string): string {
  const taken = new Set([...model.elements.map((e) => e.id), ...(model.couplings ?? []).map((c) => c.id)]);
  let id = base;
  for (let i = 2; taken.has(id); i++) id = `${base}${i}`;
  return id;
}

function uniqueNode(model: GraphModel, base: string): string {
  const taken = new Set(model.elements.flatMap((e) => e.nodes));
  let id = base;
  for (let i = 2; taken.has(id); i++) id = `${base}${i}`;
  return id;
}

// ---------------------------------------------------------------- source impedance

export interface PortImpedance {
  /** impedance in ohms; null when the port is open (no current can flow) */
  z: Cx | null;
  /** admittance in siemens (0 for an open port) */
  y: Cx;
}

/**
 * Driving-point impedance the source sees at its terminals: the rest of the
 * circuit with every other independent source set to zero, Z = V/I with I the
 * current the source delivers out of its nodes[0] terminal (voltage source) or
 * out of its nodes[1] terminal (current source).
 */
export function sourceImpedance(model: GraphModel, sourceId: string, frequencyHz = model.frequencyHz): PortImpedance {
  const src = findElement(model, sourceId);
  if (!sourceRole(src)) {
    throw new ModelRefusal(`element "${sourceId}" is a ${src.kind}, not a source`, [{ kind: 'element', id: sourceId }]);
  }
  const test = withSourcesZeroed(model, sourceId);
  test.elements = test.elements.map((e) => (e.id === sourceId ? { ...(e as typeof src), magnitude: 1, phaseDeg: 0 } : e));
  const res = new SolverSession(test).solveAt(frequencyHz);
  const r = res.elements[sourceId] as { voltage: ComplexJson; current: ComplexJson };
  if (sourceRole(src) === 'voltage') {
    const delivered = { re: -r.current.re, im: -r.current.im };
    return portFromAdmittance(delivered);
  }
  // current source: 1 A out of nodes[1]; the port voltage is V(n1) − V(n0)
  const v = { re: -r.voltage.re, im: -r.voltage.im };
  return { z: v, y: v.re === 0 && v.im === 0 ? { re: Infinity, im: 0 } : cdiv({ re: 1, im: 0 }, v) };
}

function portFromAdmittance(y: Cx): PortImpedance {
  const mag = Math.hypot(y.re, y.im);
  return { z: mag === 0 ? null : cdiv({ re: 1, im: 0 }, y), y };
}

/**
 * Admittance the rest of the circuit presents at an element's terminals, with
 * the element itself (and its couplings) removed and independent sources zeroed.
 */
export function externalAdmittance(model: GraphModel, elementId: string, frequencyHz = model.frequencyHz): Cx {
  const el = findElement(model, elementId);
  const zeroed = withSourcesZeroed(model);
  const testId = uniqueId(model, `${elementId}_test`);
  const couplings = (model.couplings ?? [])
    .map((c) => ({ ...c, windings: c.windings.filter((w) => w !== elementId) }))
    .filter((c) => c.windings.length >= 2 && (c.henries === undefined || c.windings.length === 2));
  const test: GraphModel = {
    ...zeroed,
    elements: [
      ...zeroed.elements.filter((e) => e.id !== elementId),
      { id: testId, kind: 'voltage-source', nodes: [el.nodes[0], el.nodes[1]], magnitude: 1, phaseDeg: 0 },
    ],
    couplings,
  };
  const res = new SolverSession(test).solveAt(frequencyHz);
  const cur = (res.elements[testId] as { current: ComplexJson }).current;
  return { re: -cur.re, im: -cur.im };
}

// ---------------------------------------------------------------- reflected impedance

export interface Reflection {
  /** the coupled partner whose loop reflects into the winding */
  partner: string;
  coupling: string;
  mutualHenries: number;
  /** the partner loop's own impedance, jωL2 + Z_ext (null when that loop is open) */
  loopImpedance: Cx | null;
  /** (ωM)² / Z22, zero for an open partner loop */
  reflected: Cx;
}

/**
 * PAIRWISE, one partner at a time: the impedance (ωM)² / Z22 that each coupled partner alone would
 * reflect, with Z22 = jωL2 + Z_ext2 its loop impedance (standard result; field notes), ignoring the
 * partners' coupling to each other. With two or more partners these do not add up to what the winding
 * sees; use `reflectedImpedance` (the full loop) for that. Independent of the dots.
 */
export function reflectedImpedances(model: GraphModel, windingId: string, frequencyHz = model.frequencyHz): Reflection[] {
  const w = findElement(model, windingId);
  if (!isWinding(w)) throw new ModelRefusal(`element "${windingId}" is a ${w.kind}, not a winding`, [{ kind: 'element', id: windingId }]);
  const omega = 2 * Math.PI * frequencyHz;
  const out: Reflection[] = [];
  for (const c of model.couplings ?? []) {
    if (!c.windings.includes(windingId)) continue;
    for (const partner of c.windings) {
      if (partner === windingId) continue;
      const p = findElement(model, partner) as InductorEl;
      const m = c.henries ?? c.k! * mutualLimit(w.henries, p.henries);
      const yExt = externalAdmittance(model, partner, frequencyHz);
      // Y_loop = 1 / (jωL2 + 1/Y_ext) = Y_ext / (1 + jωL2·Y_ext)
      const denom = { re: 1 - omega * p.henries * yExt.im, im: omega * p.henries * yExt.re };
      const yLoop = cdiv(yExt, denom);
      const wm2 = (omega * m) ** 2;
      const open = yLoop.re === 0 && yLoop.im === 0;
      out.push({
        partner,
        coupling: c.id,
        mutualHenries: m,
        loopImpedance: open ? null : cdiv({ re: 1, im: 0 }, yLoop),
        reflected: { re: wm2 * yLoop.re + 0, im: wm2 * yLoop.im + 0 }, // + 0 turns −0 into 0
      });
    }
  }
  return out;
}

/** What every partner of a winding, loaded by its own circuit and coupled to the others, reflects into it. */
export interface LoopReflection {
  winding: string;
  /** every winding coupled to it, in the order of the couplings */
  partners: string[];
  couplings: string[];
  /** Z_in − jωL1 at the winding's terminals (its own circuit taken away), in ohms; 0 when no partner loop carries current */
  reflected: Cx;
}

/**
 * The impedance reflected into a winding by all its partners at once: the winding is taken out of its own
 * circuit and driven by 1 A (every independent source zeroed, the partners left in theirs, coupled to the
 * winding and to each other), and Z_refl = Z_in − jωL1 = Σ_j jω·M1j·I_j with the dots' signs (coupled-winding
 * equations, field notes). It is summed from the partners' currents rather than by subtracting jωL1 from
 * Z_in, so a weak coupling keeps its digits. For one partner it is (ωM)²/Z22.
 */
export function reflectedImpedance(model: GraphModel, windingId: string, frequencyHz = model.frequencyHz): LoopReflection {
  const w = findElement(model, windingId);
  if (!isWinding(w)) throw new ModelRefusal(`element "${windingId}" is a ${w.kind}, not a winding`, [{ kind: 'element', id: windingId }]);
  const signed = new Map<string, number>();
  const couplings: string[] = [];
  for (const c of model.couplings ?? []) {
    if (!c.windings.includes(windingId)) continue;
    couplings.push(c.id);
    for (const partner of c.windings) {
      if (partner === windingId) continue;
      const p = findElement(model, partner) as InductorEl;
      const m = c.henries ?? c.k! * mutualLimit(w.henries, p.henries);
      signed.set(partner, (signed.get(partner) ?? 0) + m * dotSign(w) * dotSign(p));
    }
  }
  const partners = [...signed.keys()];
  const omega = 2 * Math.PI * frequencyHz;
  if (partners.length === 0 || omega === 0) return { winding: windingId, partners, couplings, reflected: { re: 0, im: 0 } };
  const zeroed = withSourcesZeroed(model);
  const a = uniqueNode(model, `${windingId}_a`);
  const b = uniqueNode({ ...model, elements: [...model.elements, { ...w, nodes: [a, a] }] }, `${windingId}_b`);
  const drive = uniqueId(model, `${windingId}_drive`);
  const elements: GraphElement[] = zeroed.elements.map((e) => (e.id === windingId ? { ...(e as InductorEl), nodes: [a, b] } : e));
  // 1 A out of the drive's nodes[1] = a, into the winding's first terminal
  elements.push({ id: drive, kind: 'current-source', nodes: [b, a], magnitude: 1, phaseDeg: 0 });
  const stillThere = elements.some((e) => e.id !== drive && e.id !== windingId && e.nodes.includes(model.ground));
  const res = new SolverSession({ ...zeroed, elements, ground: stillThere ? model.ground : b }).solveAt(frequencyHz);
  let re = 0;
  let im = 0;
  for (const [partner, m] of signed) {
    const i = (res.elements[partner] as { current: ComplexJson }).current;
    // jω·M·I
    re -= omega * m * i.im;
    im += omega * m * i.re;
  }
  return { winding: windingId, partners, couplings, reflected: { re: re + 0, im: im + 0 } };
}

// ---------------------------------------------------------------- T-equivalent

export interface TEquivalent {
  windings: [string, string];
  coupling: string;
  l1: number;
  l2: number;
  /** M with the sign the dots give it relative to the common terminal */
  m: number;
  /** series arm at winding 1: L1 − M */
  arm1: number;
  /** series arm at winding 2: L2 − M */
  arm2: number;
  /** shunt arm: M */
  shunt: number;
  /** the node the two windings share, or null when they share none */
  common: string | null;
  /** the outer terminals of the two arms and their common ends */
  ports: { outer1: string; common1: string; outer2: string; common2: string };
  negativeArms: ('arm1' | 'arm2' | 'shunt')[];
  notes: string[];
}

/**
 * T-equivalent of a coupled pair (standard result; field notes): series arms
 * L1 − M and L2 − M, shunt arm M, with M's sign from the dots relative to the
 * shared terminal. Without a shared terminal the equivalent joins the two
 * sides, so it only holds for the port voltages and currents.
 */
export function tEquivalent(model: GraphModel, couplingId: string, pair?: [string, string]): TEquivalent {
  const c = (model.couplings ?? []).find((x) => x.id === couplingId);
  if (!c) throw new ModelRefusal(`coupling "${couplingId}" is not in this model`, [{ kind: 'coupling', id: couplingId }]);
  const [id1, id2] = pair ?? [c.windings[0], c.windings[1]];
  if (!c.windings.includes(id1) || !c.windings.includes(id2) || id1 === id2) {
    throw new ModelRefusal(`coupling "${couplingId}" does not couple "${id1}" with "${id2}"`, [{ kind: 'coupling', id: couplingId }]);
  }
  const w1 = findElement(model, id1) as InductorEl;
  const w2 = findElement(model, id2) as InductorEl;
  const mag = c.henries ?? c.k! * mutualLimit(w1.henries, w2.henries);
  const shared = w1.nodes.find((n) => w2.nodes.includes(n)) ?? null;
  let common1: string;
  let common2: string;
  let s1: number;
  let s2: number;
  if (shared !== null) {
    common1 = common2 = shared;
    // +1 when the dot sits on the outer (non-shared) terminal
    s1 = dotSign(w1) * (w1.nodes[1] === shared ? 1 : -1);
    s2 = dotSign(w2) * (w2.nodes[1] === shared ? 1 : -1);
  } else {
    common1 = w1.nodes[1];
    common2 = w2.nodes[1];
    s1 = dotSign(w1);
    s2 = dotSign(w2);
  }
  const outer1 = w1.nodes[0] === common1 ? w1.nodes[1] : w1.nodes[0];
  const outer2 = w2.nodes[0] === common2 ? w2.nodes[1] : w2.nodes[0];
  const m = mag * s1 * s2;
  const arm1 = w1.henries - m;
  const arm2 = w2.henries - m;
  const negativeArms: TEquivalent['negativeArms'] = [];
  if (arm1 < 0) negativeArms.push('arm1');
  if (arm2 < 0) negativeArms.push('arm2');
  if (m < 0) negativeArms.push('shunt');
  const notes: string[] = [];
  if (negativeArms.length) {
    notes.push('a negative arm is valid for analysis but is not a part you can buy');
  }
  if (shared === null) {
    notes.push(
      `"${id1}" and "${id2}" share no terminal: the T-equivalent joins "${common1}" and "${common2}", removing the isolation, so it holds only for the port voltages and currents`,
    );
  }
  return {
    windings: [id1, id2],
    coupling: couplingId,
    l1: w1.henries,
    l2: w2.henries,
    m,
    arm1,
    arm2,
    shunt: m,
    common: shared,
    ports: { outer1, common1, outer2, common2 },
    negativeArms,
    notes,
  };
}

/** An inductor where the value allows, otherwise an analysis-only inductance arm. */
function arm(id: string, a: string, b: string, henries: number): GraphElement {
  return henries > 0 ? { id, kind: 'inductor', nodes: [a, b], henries } : { id, kind: 'inductance-arm', nodes: [a, b], henries };
}

/**
 * The model with a two-winding coupling replaced by its T-equivalent drawn as
 * three inductors, or inductance arms where an arm is zero or negative. The arms meet at
 * a new centre node; without a shared terminal the two common ends are joined
 * by the shunt arm's far end.
 */
export function substituteTEquivalent(model: GraphModel, couplingId: string): { model: GraphModel; t: TEquivalent; centre: string } {
  const t = tEquivalent(model, couplingId);
  const c = (model.couplings ?? []).find((x) => x.id === couplingId)!;
  if (c.windings.length !== 2) {
    throw new ModelRefusal(`coupling "${couplingId}" couples ${c.windings.length} windings; a T-equivalent replaces a pair`, [{ kind: 'coupling', id: couplingId }]);
  }
  const centre = uniqueNode(model, `${couplingId}_t`);
  const [id1, id2] = t.windings;
  // Without a shared terminal the two common ends become one node: this is
  // what removes the isolation.
  const merge = (n: string) => (t.common === null && n === t.ports.common2 ? t.ports.common1 : n);
  const elements: GraphElement[] = [];
  for (const e of model.elements) {
    if (e.id === id1) elements.push(arm(id1, t.ports.outer1, centre, t.arm1));
    else if (e.id === id2) elements.push(arm(id2, merge(t.ports.outer2), centre, t.arm2));
    else elements.push({ ...e, nodes: e.nodes.map(merge) } as GraphElement);
  }
  elements.push(arm(uniqueId(model, `${couplingId}_M`), centre, t.ports.common1, t.shunt));
  return {
    model: { ...model, ground: merge(model.ground), elements, couplings: (model.couplings ?? []).filter((x) => x.id !== couplingId) },
    t,
    centre,
  };
}

export { cmul as complexMultiply, cdiv as complexDivide };
