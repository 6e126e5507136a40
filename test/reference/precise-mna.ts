/**
 * A high-precision reference for small models: the full branch form of Modified Nodal Analysis written
 * straight from the contract's equations (shared/spec/graph-model.md; C.-W. Ho, A. E. Ruehli,
 * P. A. Brennan, IEEE Trans. Circuits and Systems, 1975), every double taken at its exact decimal value,
 * ω = 2πf with π to 80 digits, and the complex system solved in its real form [[Re, −Im], [Im, Re]] by
 * mathjs `lusolve` in BigNumber arithmetic at 80 significant digits (mathjs, a general-purpose library;
 * decimal.js underneath; comparisons exact, see `big`). Currents, voltages and powers are derived in the same arithmetic and only then
 * rounded to doubles. It shares no code with the solver: its own node numbering, its own galvanic parts
 * (the contract's rule: each isolated part's first node met, reading elements in order, is its reference),
 * and parts with both terminals on one node simply stamp what the equations say.
 */
import { bignumberDependencies, create, lusolveDependencies, type BigNumber } from 'mathjs';
import type { GraphModel, GraphElement, InductorEl } from '../../src/model/graph';
import { exactDecimal } from '../solver/sparse/exact';

// relTol and absTol: mathjs compares by them (default 1e-12 and 1e-15), and lusolve skips an elimination
// step whose multiplier compares equal to 0, which would drop every entry below 1e-15; exact comparisons here
const big = create({ bignumberDependencies, lusolveDependencies }, { precision: 80, relTol: 1e-78, absTol: 0 });
type B = BigNumber;
const B0 = big.bignumber(0);
const B1 = big.bignumber(1);
const PI = big.bignumber(-1).acos();
const exact = (x: number): B => big.bignumber(exactDecimal(x));

/** A complex number of BigNumbers. */
interface Z { re: B; im: B }
const zc = (re: B, im: B = B0): Z => ({ re, im });
const zadd = (a: Z, b: Z): Z => zc(a.re.plus(b.re), a.im.plus(b.im));
const zsub = (a: Z, b: Z): Z => zc(a.re.minus(b.re), a.im.minus(b.im));
const zmul = (a: Z, b: Z): Z => zc(a.re.times(b.re).minus(a.im.times(b.im)), a.re.times(b.im).plus(a.im.times(b.re)));
const zconj = (a: Z): Z => zc(a.re, a.im.neg());
const zscale = (a: Z, s: B): Z => zc(a.re.times(s), a.im.times(s));

export interface PreciseC { re: number; im: number }
export interface PreciseElement {
  /** one entry per port (a transformer: primary, secondary) */
  voltages: PreciseC[];
  currents: PreciseC[];
  power: { watts: number; vars: number };
}
export interface PreciseSolution {
  nodes: Map<string, PreciseC>;
  elements: Map<string, PreciseElement>;
}

const toC = (z: Z): PreciseC => ({ re: Number(z.re.toString()) + 0, im: Number(z.im.toString()) + 0 });

function hasBranch(e: GraphElement): boolean {
  return e.kind === 'inductor' || e.kind === 'inductance-arm' || e.kind === 'voltage-source' || e.kind === 'ideal-transformer';
}

/** The model solved at `frequencyHz` (the model's own by default) to far beyond double precision. */
export function preciseSolve(model: GraphModel, frequencyHz = model.frequencyHz): PreciseSolution {
  // galvanic parts (contract: "Galvanically isolated parts"); a transformer joins each side, not the two
  const parent = new Map<string, string>();
  const find = (a: string): string => {
    let r = a;
    while (parent.get(r) !== r) r = parent.get(r)!;
    return r;
  };
  const join = (a: string, b: string) => parent.set(find(a), find(b));
  for (const e of model.elements) for (const n of e.nodes) if (!parent.has(n)) parent.set(n, n);
  for (const e of model.elements) {
    join(e.nodes[0], e.nodes[1]);
    if (e.kind === 'ideal-transformer') join(e.nodes[2], e.nodes[3]);
  }
  const refs = new Set<string>([model.ground]);
  const partRef = new Map<string, string>([[find(model.ground), model.ground]]);
  for (const e of model.elements) {
    for (const n of e.nodes) {
      if (!partRef.has(find(n))) {
        partRef.set(find(n), n);
        refs.add(n);
      }
    }
  }
  const nodeNames: string[] = [];
  for (const e of model.elements) for (const n of e.nodes) if (!nodeNames.includes(n)) nodeNames.push(n);
  const unknownNodes = nodeNames.filter((n) => !refs.has(n));
  const nodeIdx = new Map(unknownNodes.map((n, i) => [n, i]));
  const branchIds = model.elements.filter(hasBranch).map((e) => e.id);
  const bIdx = new Map(branchIds.map((id, i) => [id, unknownNodes.length + i]));
  const n = unknownNodes.length + branchIds.length;

  const omega = big.bignumber(2).times(PI).times(exact(frequencyHz));
  const A: Z[][] = Array.from({ length: n }, () => Array.from({ length: n }, () => zc(B0)));
  const rhs: Z[] = Array.from({ length: n }, () => zc(B0));
  const add = (r: number | undefined, c: number | undefined, v: Z) => {
    if (r === undefined || c === undefined) return;
    A[r][c] = zadd(A[r][c], v);
  };
  const node = (name: string) => nodeIdx.get(name);
  const phasor = (e: { magnitude: number; phaseDeg: number }): Z => {
    const ph = exact(e.phaseDeg).times(PI).div(180);
    return zc(exact(e.magnitude).times(ph.cos()), exact(e.magnitude).times(ph.sin()));
  };
  const admittanceOf = (e: GraphElement): Z | null => {
    if (e.kind === 'resistor') return zc(B1.div(exact(e.ohms)));
    if (e.kind === 'switch') {
      // contract (time-and-s-domain.md): onOhms when closed, offOhms when open; defaults 1 mΩ and 1 GΩ
      const ohms = e.closed ? (e.onOhms ?? 1e-3) : (e.offOhms ?? 1e9);
      return zc(B1.div(exact(ohms)));
    }
    if (e.kind === 'capacitor') return zc(B0, omega.times(exact(e.farads)));
    return null;
  };
  for (const e of model.elements) {
    const [p, q] = [node(e.nodes[0]), node(e.nodes[1])];
    const y = admittanceOf(e);
    if (y) {
      const ny = zscale(y, big.bignumber(-1));
      add(p, p, y);
      add(q, q, y);
      add(p, q, ny);
      add(q, p, ny);
    } else if (e.kind === 'inductor' || e.kind === 'inductance-arm' || e.kind === 'voltage-source') {
      const k = bIdx.get(e.id)!;
      add(p, k, zc(B1));
      add(q, k, zc(B1.neg()));
      add(k, p, zc(B1));
      add(k, q, zc(B1.neg()));
      if (e.kind === 'voltage-source') rhs[k] = phasor(e);
      else add(k, k, zc(B0, omega.times(exact(e.henries)).neg()));
    } else if (e.kind === 'current-source') {
      const i = phasor(e);
      if (p !== undefined) rhs[p] = zsub(rhs[p], i);
      if (q !== undefined) rhs[q] = zadd(rhs[q], i);
    } else if (e.kind === 'ideal-transformer') {
      const k = bIdx.get(e.id)!;
      const r = exact(e.ratio);
      const [s1, s2] = [node(e.nodes[2]), node(e.nodes[3])];
      // I_p enters the primary dot, I_s = −ratio·I_p the secondary dot; V_p − ratio·V_s = 0
      add(p, k, zc(B1));
      add(q, k, zc(B1.neg()));
      add(s1, k, zc(r.neg()));
      add(s2, k, zc(r));
      add(k, p, zc(B1));
      add(k, q, zc(B1.neg()));
      add(k, s1, zc(r.neg()));
      add(k, s2, zc(r));
    }
  }
  const byId = new Map(model.elements.map((e) => [e.id, e]));
  const dot = (e: InductorEl) => (e.dot === 'second' ? -1 : 1);
  for (const c of model.couplings ?? []) {
    for (let i = 0; i < c.windings.length; i++) {
      for (let j = i + 1; j < c.windings.length; j++) {
        const a = byId.get(c.windings[i]) as InductorEl;
        const b = byId.get(c.windings[j]) as InductorEl;
        // contract: M = k·sqrt(L_i·L_j), or the given henries; sign d_i·d_j
        const m = c.henries !== undefined ? exact(c.henries) : exact(c.k!).times(exact(a.henries).times(exact(b.henries)).sqrt());
        const v = zc(B0, omega.times(m).times(dot(a) * dot(b)).neg());
        add(bIdx.get(a.id), bIdx.get(b.id), v);
        add(bIdx.get(b.id), bIdx.get(a.id), v);
      }
    }
  }
  // real form of the complex system
  const M: B[][] = [];
  for (let i = 0; i < n; i++) M.push([...A[i].map((z) => z.re), ...A[i].map((z) => z.im.neg())]);
  for (let i = 0; i < n; i++) M.push([...A[i].map((z) => z.im), ...A[i].map((z) => z.re)]);
  const b = [...rhs.map((z) => [z.re]), ...rhs.map((z) => [z.im])];
  const raw = big.lusolve(M, b) as unknown as B[][];
  const val = (i: number) => big.bignumber(raw[i][0] as unknown as number);
  const x: Z[] = Array.from({ length: n }, (_, i) => zc(val(i), val(n + i)));

  const v = (name: string): Z => {
    const i = node(name);
    return i === undefined ? zc(B0) : x[i];
  };
  const half = big.bignumber(model.amplitudes === 'peak' && frequencyHz !== 0 ? 0.5 : 1);
  const power = (vs: Z[], is: Z[]) => {
    let s = zc(B0);
    for (let t = 0; t < vs.length; t++) s = zadd(s, zmul(vs[t], zconj(is[t])));
    const w = s.re.times(half);
    const q = s.im.times(half);
    return { watts: Number(w.toString()) + 0, vars: Number(q.toString()) + 0 };
  };
  const elements = new Map<string, PreciseElement>();
  for (const e of model.elements) {
    const vp = zsub(v(e.nodes[0]), v(e.nodes[1]));
    if (e.kind === 'ideal-transformer') {
      const vs = zsub(v(e.nodes[2]), v(e.nodes[3]));
      const ip = x[bIdx.get(e.id)!];
      const is = zscale(ip, exact(e.ratio).neg());
      elements.set(e.id, { voltages: [toC(vp), toC(vs)], currents: [toC(ip), toC(is)], power: power([vp, vs], [ip, is]) });
      continue;
    }
    let i: Z;
    const y = admittanceOf(e);
    if (y) i = zmul(y, vp);
    else if (e.kind === 'current-source') i = phasor(e);
    else i = x[bIdx.get(e.id)!];
    elements.set(e.id, { voltages: [toC(vp)], currents: [toC(i)], power: power([vp], [i]) });
  }
  return { nodes: new Map(nodeNames.map((name) => [name, toC(v(name))])), elements };
}
