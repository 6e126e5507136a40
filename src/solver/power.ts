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
    rows.push({ id: el.id, kind: el.kind, watts, vars, va, powerFactor: va === 0 ? null : Math.abs(watts) / va });
    if (sourceRole(el)) {
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
