/**
 * The small facts about each graph element kind that the editor needs as well
 * as the solver: whether it is an independent source (and of what), whether the
 * power views count it as a loss, whether couplings may name it as a winding,
 * and which value the analysis views may sweep or slide. The solver's element
 * definitions (src/solver/elements/<kind>.ts) take their roles and sweepable
 * value from here, so each fact is written once; the type below makes the
 * compiler ask for a row for every kind the solver registers.
 */
import type { ElementKind, GraphElement } from './graph';

/** A value the analysis views may sweep or slide (a part's resistance, capacitance, inductance). */
export interface Sweepable<E> {
  /** the field it lives in */
  field: keyof E & string;
  /** what the value is, for labels ("resistance") */
  what: string;
  unit: string;
  /** the slider spans value/span .. value·span */
  span: number;
}

export interface FactRoles {
  /** an independent source: what it drives */
  source?: 'voltage' | 'current';
  /** counted as a loss by the power views (a resistor) */
  dissipative?: boolean;
  /** an inductor that couplings may name as a winding */
  winding?: boolean;
}

export interface ElementFacts<E = GraphElement> {
  roles: FactRoles;
  /** the value the analysis views may sweep, if any */
  sweepable?: Sweepable<E>;
}

type FactsOf<K extends ElementKind> = ElementFacts<Extract<GraphElement, { kind: K }>>;

export const ELEMENT_FACTS: { readonly [K in ElementKind]: FactsOf<K> } = {
  resistor: { roles: { dissipative: true }, sweepable: { field: 'ohms', what: 'resistance', unit: 'Ω', span: 100 } },
  inductor: { roles: { winding: true }, sweepable: { field: 'henries', what: 'inductance', unit: 'H', span: 10 } },
  capacitor: { roles: {}, sweepable: { field: 'farads', what: 'capacitance', unit: 'F', span: 10 } },
  'voltage-source': { roles: { source: 'voltage' } },
  'current-source': { roles: { source: 'current' } },
  'ideal-transformer': { roles: {} },
  'inductance-arm': { roles: {} },
  switch: { roles: { dissipative: true } },
};

function factsOf(el: GraphElement): ElementFacts {
  return ELEMENT_FACTS[el.kind] as ElementFacts;
}

/** What kind of independent source an element is, if any. */
export function sourceKindOf(el: GraphElement): 'voltage' | 'current' | undefined {
  return factsOf(el).roles.source;
}

export function isDissipative(el: GraphElement): boolean {
  return factsOf(el).roles.dissipative === true;
}

/** The element's sweepable value and its present size, or null when it has none. */
export function sweepableOf(el: GraphElement): (Sweepable<GraphElement> & { value: number }) | null {
  const s = factsOf(el).sweepable;
  if (!s) return null;
  const value = (el as unknown as Record<string, unknown>)[s.field];
  return typeof value === 'number' ? { ...s, value } : null;
}

/** The element with its sweepable value set to `value` (unchanged when it has none). */
export function withSweptValue<E extends GraphElement>(el: E, value: number): E {
  const s = factsOf(el).sweepable;
  return s ? { ...el, [s.field]: value } : el;
}
