/**
 * What a singular phasor system most likely means, for the refusal's one line: an exact resonance of a
 * lossless inductor and capacitor, or windings coupled with k = 1 under ideal voltages. Read only when a
 * factorisation has failed, and after a solve that a k = 1 coupling or an exact resonance may have left
 * standing only by rounding (so the resonance search is near-linear, not over every pair of parts).
 */
import type { CapacitorEl, Coupling, GraphModel, InductorEl } from '../../model/graph';
import { mutualLimit } from '../../model/mutual';
import { isWinding } from '../elements/registry';

export interface Resonance { inductor: string; capacitor: string }

/** |ω²·L·C − 1| below this is "exact": what double precision cannot tell from the resonance itself. */
const EXACT = 1e-9;

/**
 * An inductor (or winding, by its self-inductance) and a capacitor that resonate at `frequencyHz` to within
 * double precision (ω0 = 1/√(LC), closed form), preferring a pair that shares a node; null when none does.
 */
export function exactResonance(model: GraphModel, frequencyHz: number): Resonance | null {
  const omega = 2 * Math.PI * frequencyHz;
  if (!(omega > 0)) return null;
  const ls = model.elements.filter((e): e is InductorEl => isWinding(e));
  const cs = model.elements.filter((e): e is CapacitorEl => e.kind === 'capacitor');
  // the capacitors sorted by ln C, so that each inductor looks only at those near its resonant
  // capacitance 1/(ω²·L) (a window in ln C well wider than EXACT), not at every pair: this runs after
  // every solve of a circuit that has windings and capacitors
  const byLog = cs.map((c, index) => ({ c, index, log: Math.log(c.farads) })).sort((a, b) => a.log - b.log);
  const logOmega2 = 2 * Math.log(omega);
  let loose: Resonance | null = null;
  for (const l of ls) {
    const target = -logOmega2 - Math.log(l.henries);
    if (!Number.isFinite(target)) continue;
    let lo = 0;
    let hi = byLog.length;
    while (lo < hi) { const mid = (lo + hi) >> 1; if (byLog[mid].log < target - 1e-8) lo = mid + 1; else hi = mid; }
    const near: typeof byLog = [];
    for (let j = lo; j < byLog.length && byLog[j].log <= target + 1e-8; j++) near.push(byLog[j]);
    near.sort((a, b) => a.index - b.index);
    for (const { c } of near) {
      // ω²·L·C as (ω√L·√C)², so that no product of absurd values overflows first
      const x = omega * Math.sqrt(l.henries) * Math.sqrt(c.farads);
      if (!(Math.abs(x * x - 1) <= EXACT)) continue;
      const pair = { inductor: l.id, capacitor: c.id };
      if (l.nodes.some((n) => c.nodes.includes(n))) return pair;
      loose ??= pair;
    }
  }
  return loose;
}

/** Couplings whose k is 1 to within double precision (given as k, or as M = √(L1·L2)). */
export function perfectCouplings(model: GraphModel): Coupling[] {
  const byId = new Map(model.elements.map((e) => [e.id, e]));
  return (model.couplings ?? []).filter((c) => {
    if (c.k !== undefined) return c.k >= 1 - 1e-12;
    const [a, b] = c.windings.map((w) => (byId.get(w) as InductorEl).henries);
    return c.henries! >= mutualLimit(a, b) * (1 - 1e-12);
  });
}

/** "\"L1\" and \"L2\"", "\"L1\", \"L2\" and \"L3\"" */
export function quotedList(ids: string[]): string {
  const q = ids.map((id) => `"${id}"`);
  return q.length < 2 ? q.join('') : `${q.slice(0, -1).join(', ')} and ${q[q.length - 1]}`;
}
