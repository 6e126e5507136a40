/** A value of a graph model that the analysis views vary: a part's value or a coupling's k. */
import type { GraphModel } from './graph';
import { sweepableOf, withSweptValue } from './elementFacts';

export interface ValueTarget { kind: 'part' | 'coupling'; id: string }

/** A copy of the model with the target's value put in (the model itself is left as it is). */
export function withValue(model: GraphModel, target: ValueTarget, value: number): GraphModel {
  if (target.kind === 'coupling') {
    return { ...model, couplings: (model.couplings ?? []).map((c) => (c.id === target.id ? { id: c.id, windings: c.windings, k: value } : c)) };
  }
  return {
    ...model,
    elements: model.elements.map((e) => (e.id === target.id ? withSweptValue(e, value) : e)),
  };
}

/** Whether the model has the target (a part of a kind with a value to vary, or a coupling). */
export function hasValueTarget(model: GraphModel, target: ValueTarget): boolean {
  if (target.kind === 'coupling') return (model.couplings ?? []).some((c) => c.id === target.id);
  return model.elements.some((e) => e.id === target.id && sweepableOf(e) !== null);
}
