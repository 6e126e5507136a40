import type { GraphModel, SolveResult } from '../model/graph';
import { tellegenResidual } from './analysis';
import { ELEMENT_DEFS, sourceRole } from './elements/registry';

export interface PowerRow {
  id: string;
  kind: string;
  /** P: real power absorbed (W); negative for a part that delivers */
  watts: number;
  /** Q: reactive power absorbed (var) */
  vars: number;
  /** |S| (VA) */
  va: number;
  /** P/|S|, 1 for a resistor, 0 for an ideal reactance; null when |S| = 0 */
  powerFactor: number | null;
  /**
   * Whether the current lags or leads the voltage in the direction the power
   * flows: for a load, the current taken in (lagging when Q > 0 is absorbed);
   * for a source, the current given out (lagging when the source delivers
   * Q > 0, i.e. when the impedance it sees is inductive). null when Q = 0.
   */
  sense: 'lagging' | 'leading' | null;
}

export interface PowerSummary {
  rows: PowerRow[];
  /** real and reactive power delivered by all independent sources (positive when delivering) */
  delivered: { watts: number; vars: number };
  /** real power absorbed by all resistors */
  dissipated: number;
  tellegen: ReturnType<typeof tellegenResidual>;
}

/** Per-part P, Q, |S| and power factor; totals; the Tellegen check (Tellegen, 1952). */
export function powerSummary(model: GraphModel, result: SolveResult): PowerSummary {
  const rows: PowerRow[] = [];
  let dw = 0;
  let dv = 0;
  let dissipated = 0;
  for (const el of model.elements) {
    const r = result.elements[el.id];
    if (!r) continue;
    const { watts, vars } = r.power;
    const va = Math.hypot(watts, vars);
    const source = sourceRole(el) !== undefined;
    // Q given out by a source is −Q absorbed; below a billionth of |S| it is rounding
    const q = source ? -vars : vars;
    const sense = Math.abs(vars) <= 1e-9 * va ? null : q > 0 ? 'lagging' : 'leading';
    rows.push({ id: el.id, kind: el.kind, watts, vars, va, powerFactor: va === 0 ? null : Math.abs(watts) / va, sense });
    if (source) {
      dw -= watts;
      dv -= vars;
    }
    if (ELEMENT_DEFS[el.kind].roles.dissipative) dissipated += watts;
  }
  return { rows, delivered: { watts: dw, vars: dv }, dissipated, tellegen: tellegenResidual(result) };
}

/** Real power into `loadId` over real power delivered by `sourceId`; null when the source delivers none. */
export function efficiency(result: SolveResult, sourceId: string, loadId: string): number | null {
  const src = result.elements[sourceId];
  const load = result.elements[loadId];
  if (!src || !load) return null;
  const delivered = -src.power.watts;
  if (!(delivered > 0)) return null;
  return load.power.watts / delivered;
}
