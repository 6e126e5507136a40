import type { ComplexJson, GraphModel, InductorEl, SolveResult } from '../model/graph';
import { ModelRefusal } from './errors';
import { SolverSession } from './phasor/session';
import { sourceImpedance, type PortImpedance } from './analysis';
import { isWinding, sourceRole } from './elements/registry';

/** One quantity that differs between two solves. */
export interface Change {
  /** "node a", "R1 current", "R1 power" … */
  label: string;
  target: { kind: 'node' | 'element'; id: string };
  quantity: 'voltage' | 'current' | 'power';
  before: ComplexJson;
  after: ComplexJson;
  delta: ComplexJson;
}

export interface DotComparison {
  winding: string;
  flipped: GraphModel;
  before: SolveResult;
  after: SolveResult;
  changes: Change[];
  inputImpedance: { source: string; before: PortImpedance; after: PortImpedance }[];
}

/** The model with one winding's polarity dot moved to its other terminal. */
export function flipDot(model: GraphModel, windingId: string): GraphModel {
  const w = model.elements.find((e) => e.id === windingId);
  if (!w || !isWinding(w)) {
    throw new ModelRefusal(`element "${windingId}" is not a winding of this model`, [{ kind: 'element', id: windingId }]);
  }
  return {
    ...model,
    elements: model.elements.map((e) => (e.id === windingId ? { ...(e as InductorEl), dot: (e as InductorEl).dot === 'second' ? 'first' : 'second' } : e)),
  };
}

const sub = (a: ComplexJson, b: ComplexJson): ComplexJson => ({ re: a.re - b.re, im: a.im - b.im });
const mag = (a: ComplexJson) => Math.hypot(a.re, a.im);

/**
 * Lists every quantity that differs between two results of the same
 * structure, largest relative change first. Differences below `rel` of the
 * larger magnitude (rounding) are left out.
 */
export function diffResults(before: SolveResult, after: SolveResult, rel = 1e-9): Change[] {
  const out: (Change & { weight: number })[] = [];
  const push = (label: string, target: Change['target'], quantity: Change['quantity'], b: ComplexJson, a: ComplexJson) => {
    const d = sub(a, b);
    const scale = Math.max(mag(a), mag(b));
    if (mag(d) <= rel * scale || scale === 0) return;
    out.push({ label, target, quantity, before: b, after: a, delta: d, weight: mag(d) / scale });
  };
  for (const [name, v] of Object.entries(before.nodes)) {
    if (after.nodes[name]) push(`node ${name}`, { kind: 'node', id: name }, 'voltage', v, after.nodes[name]);
  }
  for (const [id, r] of Object.entries(before.elements)) {
    const a = after.elements[id];
    if (!a) continue;
    const target = { kind: 'element' as const, id };
    if ('voltages' in r && 'voltages' in a) {
      ['primary', 'secondary'].forEach((side, s) => {
        push(`${id} ${side} voltage`, target, 'voltage', r.voltages[s], a.voltages[s]);
        push(`${id} ${side} current`, target, 'current', r.currents[s], a.currents[s]);
      });
    } else if ('voltage' in r && 'voltage' in a) {
      push(`${id} voltage`, target, 'voltage', r.voltage, a.voltage);
      push(`${id} current`, target, 'current', r.current, a.current);
    }
    push(`${id} power`, target, 'power', { re: r.power.watts, im: r.power.vars }, { re: a.power.watts, im: a.power.vars });
  }
  out.sort((x, y) => y.weight - x.weight);
  return out.map(({ weight: _w, ...c }) => c);
}

/**
 * The solved circuit as drawn against the same circuit with one winding's dot
 * flipped: every quantity that changes, and the impedance each source sees
 * both ways. The model itself is not changed.
 */
export function compareDotFlip(model: GraphModel, windingId: string, frequencyHz = model.frequencyHz): DotComparison {
  const flipped = flipDot(model, windingId);
  const before = new SolverSession(model).solveAt(frequencyHz);
  const after = new SolverSession(flipped).solveAt(frequencyHz);
  const sources = model.elements.filter((e) => sourceRole(e) !== undefined);
  return {
    winding: windingId,
    flipped,
    before,
    after,
    changes: diffResults(before, after),
    inputImpedance: sources.map((s) => ({
      source: s.id,
      before: sourceImpedance(model, s.id, frequencyHz),
      after: sourceImpedance(flipped, s.id, frequencyHz),
    })),
  };
}
