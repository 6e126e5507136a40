/**
 * A practical transformer in the graph model: the elements every analysis
 * already understands (resistors, inductors, an ideal transformer for the
 * ratio, or coupled windings with k), and its report at a solved operating
 * point: load, copper and core loss, efficiency, regulation, per-unit series
 * impedance.
 */
import type { ComplexJson, Coupling, GraphElement, SolveResult } from './graph';
import { cabs, cadd, cconjMul, cdiv, cmul, type C } from './complex';
import { branches, circuitOf, perUnitSeries, type EquivalentCircuit, type PowerSpec } from './powerTransformer';

export interface Expansion {
  elements: GraphElement[];
  couplings: Coupling[];
  /** the part's four terminal nodes: primary dotted, primary other, secondary dotted, secondary other */
  terminals: [string, string, string, string];
  /** ids of the copper-loss resistors and of the core-loss resistor */
  copper: string[];
  core: string[];
}

/** Element and node names inside the part: its designator, a dot, a name of the equivalent circuit. */
export const innerName = (ref: string, name: string) => `${ref}.${name}`;

/**
 * The elements of the part between its terminal nodes. Zero resistances and
 * leakages are left out (their nodes merge), so is an absent shunt branch.
 */
export function expandPower(ref: string, spec: PowerSpec, nodes: string[]): Expansion {
  const c = circuitOf(spec);
  const [p1, p2, s1, s2] = nodes as [string, string, string, string];
  const n = (name: string) => innerName(ref, name);
  const elements: GraphElement[] = [];
  const couplings: Coupling[] = [];
  const copper: string[] = [];
  const core: string[] = [];
  /** a series chain from `from`, ending on `last` when given; each element present adds a node; returns the node it ends on */
  const chain = (from: string, items: { id: string; r?: number; l?: number }[], last?: string): string => {
    let at = from;
    const present = items.filter((it) => (it.r ?? it.l ?? 0) > 0);
    present.forEach((it, i) => {
      const to = i === present.length - 1 && last ? last : n(`${it.id}.out`);
      if (it.r !== undefined) { elements.push({ id: n(it.id), kind: 'resistor', nodes: [at, to], ohms: it.r }); copper.push(n(it.id)); }
      else elements.push({ id: n(it.id), kind: 'inductor', nodes: [at, to], henries: it.l!, dot: 'first' });
      at = to;
    });
    return at;
  };
  const shunt = (at: string, lm: number | undefined, withLm: boolean) => {
    if (c.rc) { elements.push({ id: n('Rc'), kind: 'resistor', nodes: [at, p2], ohms: c.rc }); core.push(n('Rc')); }
    if (withLm && lm) elements.push({ id: n('Lm'), kind: 'inductor', nodes: [at, p2], henries: lm, dot: 'first' });
  };
  if (spec.expansion === 'coupled') {
    const lm = c.lm!;
    const a = c.ratio;
    const x = chain(p1, [{ id: 'R1', r: c.r1 }]);
    const y = chain(s1, [{ id: 'R2', r: c.r2 }]);
    shunt(x, lm, false);
    elements.push({ id: n('W1'), kind: 'inductor', nodes: [x, p2], henries: c.l1 + lm, dot: 'first' });
    elements.push({ id: n('W2'), kind: 'inductor', nodes: [y, s2], henries: c.l2 + lm / (a * a), dot: 'first' });
    couplings.push({ id: n('k'), windings: [n('W1'), n('W2')], k: Math.min(1, (lm / a) / Math.sqrt((c.l1 + lm) * (c.l2 + lm / (a * a)))) });
  } else {
    const b = chain(p1, [{ id: 'R1', r: c.r1 }, { id: 'L1', l: c.l1 }]);
    shunt(b, c.lm, true);
    // the secondary's series branch, from the ideal transformer out to the terminal
    const items = [{ id: 'R2', r: c.r2 }, { id: 'L2', l: c.l2 }];
    const sec = items.some((it) => (it.r ?? it.l ?? 0) > 0) ? n('sec') : s1;
    chain(sec, items, s1);
    elements.push({ id: n('N'), kind: 'ideal-transformer', nodes: [b, p2, sec, s2], ratio: c.ratio });
  }
  return { elements, couplings, terminals: [p1, p2, s1, s2], copper, core };
}

/** The current entering a terminal node from the outside into the part, by KCL over the part's elements. */
function terminalCurrent(x: Expansion, result: SolveResult, node: string): C {
  let re = 0, im = 0;
  for (const el of x.elements) {
    const r = result.elements[el.id];
    if (!r) continue;
    const add = (i: ComplexJson, sign: number) => { re += sign * i.re; im += sign * i.im; };
    if ('current' in r) {
      if (el.nodes[0] === node) add(r.current, 1);
      if (el.nodes[1] === node) add(r.current, -1);
    } else {
      el.nodes.forEach((nd, k) => { if (nd === node) add(r.currents[k >> 1], k % 2 === 0 ? 1 : -1); });
    }
  }
  return { re, im };
}

const nodeV = (result: SolveResult, n: string): C => result.nodes[n] ?? { re: 0, im: 0 };
const diff = (a: C, b: C): C => ({ re: a.re - b.re, im: a.im - b.im });

/** The part's own terminal reading, as an ideal transformer's result reads (primary then secondary, currents into the dotted terminals). */
export function terminalResult(x: Expansion, result: SolveResult) {
  const [p1, p2, s1, s2] = x.terminals;
  const v1 = diff(nodeV(result, p1), nodeV(result, p2));
  const v2 = diff(nodeV(result, s1), nodeV(result, s2));
  const i1 = terminalCurrent(x, result, p1);
  const i2 = terminalCurrent(x, result, s1);
  const half = result.amplitudes === 'peak' ? 0.5 : 1;
  const s = cadd(cconjMul(v1, i1), cconjMul(v2, i2));
  return { voltages: [v1, v2] as [C, C], currents: [i1, i2] as [C, C], power: { watts: half * s.re, vars: half * s.im } };
}

export interface PowerReport {
  /** secondary current over rated secondary current */
  load: number;
  /** the larger of the two windings' currents over their rated currents */
  worstLoad: number;
  copperW: number;
  coreW: number;
  inputW: number;
  outputW: number;
  /** output over input, null when power does not flow from primary to secondary */
  efficiency: number | null;
  /** (no-load − loaded secondary voltage) / loaded, primary voltage held; null when it cannot be read */
  regulation: number | null;
  /** per-unit series impedance (both sides, referred) at the sheet's frequency; null at 0 Hz */
  zpu: C | null;
  /** RMS terminal values */
  v1: number; v2: number; i1: number; i2: number;
}

export function powerReport(spec: PowerSpec, x: Expansion, result: SolveResult): PowerReport {
  const c: EquivalentCircuit = circuitOf(spec);
  const t = terminalResult(x, result);
  const rms = result.amplitudes === 'peak' ? Math.SQRT1_2 : 1;
  const half = result.amplitudes === 'peak' ? 0.5 : 1;
  const watts = (id: string) => {
    const r = result.elements[id];
    return r ? r.power.watts : 0;
  };
  const copperW = x.copper.reduce((s, id) => s + watts(id), 0);
  const coreW = x.core.reduce((s, id) => s + watts(id), 0);
  const inputW = half * cconjMul(t.voltages[0], t.currents[0]).re;
  // the secondary delivers what leaves its dotted terminal into the load
  const outputW = -half * cconjMul(t.voltages[1], t.currents[1]).re;
  const v1 = cabs(t.voltages[0]) * rms, v2 = cabs(t.voltages[1]) * rms;
  const i1 = cabs(t.currents[0]) * rms, i2 = cabs(t.currents[1]) * rms;
  const r = spec.rating;
  const load = i2 / (r.va / r.v2);
  const worstLoad = Math.max(load, i1 / (r.va / r.v1));
  const scale = Math.max(Math.abs(inputW), Math.abs(outputW), 1e-300);
  const efficiency = inputW > 1e-12 * scale && outputW > 1e-12 * scale ? outputW / inputW : null;
  let regulation: number | null = null;
  let zpu: C | null = null;
  if (result.frequencyHz > 0) {
    const { z1, ym } = branches(c, result.frequencyHz);
    // open-circuit secondary voltage with the primary voltage held: V1 / (1 + Z1·Ym) / a
    const v2nl = (v1 * cabs(cdiv({ re: 1, im: 0 }, cadd({ re: 1, im: 0 }, cmul(z1, ym))))) / c.ratio;
    if (v2 > 1e-12 * v2nl && v2nl > 0) regulation = (v2nl - v2) / v2;
    zpu = perUnitSeries(r, c, result.frequencyHz);
  }
  return { load, worstLoad, copperW, coreW, inputW, outputW, efficiency, regulation, zpu, v1, v2, i1, i2 };
}

/** The report in one line, for the exported sheet: "T1: load 96.6 % of 25 kVA; copper 360.5 W, core 91.76 W; efficiency 97.63 %; …". */
export function powerReportLine(ref: string, spec: PowerSpec, r: PowerReport): string {
  const pct = (v: number, d: number) => `${Number((100 * v).toPrecision(d))} %`;
  const w = (v: number) => `${Number(v.toPrecision(4))} W`;
  const parts = [
    `${ref}: load ${pct(r.load, 3)} of ${Number(spec.rating.va.toPrecision(4))} VA`,
    `copper ${w(r.copperW)}, core ${w(r.coreW)}`,
    `efficiency ${r.efficiency === null ? '—' : pct(r.efficiency, 4)}`,
    `regulation ${r.regulation === null ? '—' : pct(r.regulation, 3)}`,
  ];
  if (r.zpu) parts.push(`z = ${Number(r.zpu.re.toPrecision(3))} + j${Number(r.zpu.im.toPrecision(3))} pu`);
  return parts.join('; ');
}
