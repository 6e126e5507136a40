/**
 * One definition per element kind (registered in ./registry.ts): its schema,
 * what it is to the graph checks, how it stamps into the descriptor system
 * G·x + C·dx/dt = B·u, and how its current is read back. Every analysis
 * (phasor, sweep, s-domain, time domain) is derived from these definitions; no
 * other solver file asks for an element's kind.
 */
import type { z } from 'zod';
import type { FactRoles, Sweepable } from '../../model/elementFacts';

/**
 * What an element is to the graph checks and the power views. Whether it is a
 * source, a loss or a winding are facts the editor needs too: each definition
 * takes them from src/model/elementFacts.ts.
 */
export interface ElementRoles extends FactRoles {
  /** terminal pairs the element joins into one galvanic part (an ideal transformer: each side, not the two sides) */
  galvanic: readonly (readonly [number, number])[];
  /** passes direct current at 0 Hz (a capacitor and a current source do not) */
  conductsDc: boolean;
  /** fixes the voltage between terminals 0 and 1: always (a voltage source), at 0 Hz only (an inductance, a short there), or never */
  fixesVoltage: 'always' | 'dc' | 'never';
  /** what the element stores (time domain): a capacitor's voltage, an inductance's current */
  state?: 'voltage' | 'current';
}

/**
 * Where an element's stamps go. Unknowns are node voltages (terminal t's node
 * via `node(t)`, −1 for a reference node, whose stamps are dropped) and the
 * branch currents the element asks for (`branch(b)`).
 */
export interface StampTarget {
  node(t: number): number;
  branch(b: number): number;
  /** G[r][c] += v (the constant, real part) */
  g(r: number, c: number, v: number): void;
  /** C[r][c] += v (the part that multiplies d/dt, or s, or jω) */
  c(r: number, c: number, v: number): void;
  /** B: the element's own source adds v·u to row r of the right-hand side */
  b(r: number, v: number): void;
}

/** Per-analysis facts an element stamps by: the state of a switch. */
export interface StampState {
  /** whether a switch is closed (its `closed` field unless an analysis says otherwise) */
  closed?: boolean;
}

/**
 * How the current through one port is read back from the solution: v/R; s·C·v;
 * a branch unknown times a gain; or the element's own source value.
 */
export type CurrentRule<E> =
  | { kind: 'resistance'; ohms: (el: E, state: StampState) => number }
  | { kind: 'capacitance'; farads: (el: E) => number }
  | { kind: 'branch'; branch: number; gain: (el: E) => number }
  | { kind: 'source' };

/** A port: two terminals whose voltage difference and current a result reports. */
export interface PortRule<E> {
  terminals: readonly [number, number];
  current: CurrentRule<E>;
}

export type { Sweepable };

export interface ElementDef<E extends { id: string; kind: string; nodes: string[] } = { id: string; kind: string; nodes: string[] }> {
  kind: E['kind'];
  /** reads and checks the element's fields (the refusal names the field) */
  schema: z.ZodType<E>;
  /** number of terminals (2, or 4 for an ideal transformer) */
  terminals: 2 | 4;
  roles: ElementRoles;
  /** branch-current unknowns the element needs in the full (branch) form of the system */
  branches: number;
  /** stamps the element into G, C and B */
  stamp(el: E, at: StampTarget, state: StampState): void;
  /** the ports a result reports: one (voltage, current) or two (voltages, currents: primary, secondary) */
  ports: readonly PortRule<E>[];
  /** the source's phasor (magnitude∠phase as re, im) for an independent source */
  phasor?(el: E): { re: number; im: number };
  /** the value the analysis views may sweep, if any */
  sweepable?: Sweepable<E>;
  /** a two-sided element's constraint V(side 0) = ratio·V(side 1), for the loop check of the graph */
  ratio?(el: E): number;
  /**
   * Time domain, the element's initial state: a capacitance puts its charge C·v(0) into its rows
   * (`put(row, v)` as its C stamp would for the voltage v(0)); an inductance gives i(0) of its branch,
   * whose flux linkage the core reads through C with the mutual terms.
   */
  initialCharge?(el: E, node: (t: number) => number, put: (row: number, v: number) => void): void;
  initialCurrent?(el: E): number;
  /** phrases for refusals that name the element's role ("a short at 0 Hz") */
  dcNote?: string;
}

/** Shared stamps. */
export function conductance(at: StampTarget, y: number, into: 'g' | 'c' = 'g'): void {
  const a = at.node(0);
  const b = at.node(1);
  const put = into === 'g' ? at.g : at.c;
  put.call(at, a, a, y);
  put.call(at, b, b, y);
  put.call(at, a, b, -y);
  put.call(at, b, a, -y);
}

/**
 * Branch current k flowing from terminal ta to terminal tb through the element
 * (KCL columns), with the matching voltage terms in row k (its constraint
 * row), both scaled by `gain`.
 */
export function branchIncidence(at: StampTarget, k: number, ta: number, tb: number, gain: number): void {
  const a = at.node(ta);
  const b = at.node(tb);
  at.g(a, k, gain);
  at.g(b, k, -gain);
  at.g(k, a, gain);
  at.g(k, b, -gain);
}
