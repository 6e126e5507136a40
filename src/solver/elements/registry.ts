/**
 * The element kinds of the graph model, each defined once. The graph-model
 * types are inferred from the definitions' schemas.
 */
import { resistor, type ResistorEl } from './resistor';
import { inductor, type InductorEl } from './inductor';
import { capacitor, type CapacitorEl } from './capacitor';
import { voltageSource, currentSource, type VoltageSourceEl, type CurrentSourceEl } from './sources';
import { idealTransformer, type IdealTransformerEl } from './idealTransformer';
import { inductanceArm, type InductanceArmEl } from './inductanceArm';
import { switchDef, type SwitchEl } from './switch';
import type { ElementDef } from './types';

export type GraphElement =
  | ResistorEl
  | InductorEl
  | CapacitorEl
  | VoltageSourceEl
  | CurrentSourceEl
  | IdealTransformerEl
  | InductanceArmEl
  | SwitchEl;
export type ElementKind = GraphElement['kind'];

type DefOf<K extends ElementKind> = ElementDef<Extract<GraphElement, { kind: K }>>;

/** In the order refusals list them. */
export const ELEMENT_DEFS: { readonly [K in ElementKind]: DefOf<K> } = {
  resistor,
  inductor,
  capacitor,
  'voltage-source': voltageSource,
  'current-source': currentSource,
  'ideal-transformer': idealTransformer,
  'inductance-arm': inductanceArm,
  switch: switchDef,
};

export const ELEMENT_KINDS = Object.keys(ELEMENT_DEFS) as ElementKind[];

export function isElementKind(kind: unknown): kind is ElementKind {
  return typeof kind === 'string' && Object.hasOwn(ELEMENT_DEFS, kind);
}

/** The definition of an element's kind. */
export function defOf<E extends GraphElement>(el: E): ElementDef<E> {
  return ELEMENT_DEFS[el.kind] as unknown as ElementDef<E>;
}

export type { ResistorEl, InductorEl, CapacitorEl, VoltageSourceEl, CurrentSourceEl, IdealTransformerEl, InductanceArmEl, SwitchEl };
export type { ElementDef, ElementRoles, StampTarget, StampState, CurrentRule, PortRule, Sweepable } from './types';
export { dotSign } from './inductor';
export { switchOhms, SWITCH_ON_OHMS, SWITCH_OFF_OHMS } from './switch';
export { waveformAt, waveformCorners, WAVEFORM_SHAPES, type Waveform } from './waveform';

/** What kind of independent source an element is, if any. */
export function sourceRole(el: GraphElement): 'voltage' | 'current' | undefined {
  return ELEMENT_DEFS[el.kind].roles.source;
}
export function isWinding(el: GraphElement): el is InductorEl {
  return ELEMENT_DEFS[el.kind].roles.winding === true;
}
/** Number of ports a result reports for the element: 1 (voltage, current) or 2 (voltages, currents). */
export function portCount(el: GraphElement): number {
  return ELEMENT_DEFS[el.kind].ports.length;
}
