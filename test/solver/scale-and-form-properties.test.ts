import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { SolverSession, ModelRefusal } from '../../src/solver';
import type { GraphModel, GraphElement, SolveResult, ComplexJson } from '../../src/model/graph';
import { circuitSpec, build } from '../reference/randomCircuits';

/**
 * Two invariants of the phasor solve on random circuits (test/reference/randomCircuits.ts):
 * 1. Impedance and frequency scaling (network theory, from memory): with every impedance multiplied by a and
 *    the frequency by b (R → aR, L → aL/b, C → C/(ab), f → bf, current sources I → I/a, k and turns ratios
 *    kept), node voltages are unchanged and every current is divided by a. Checked for a, b in 10^±6.
 * 2. The admittance form of windings (reciprocal inductance matrix) and the branch form (every winding current
 *    an unknown) are two writings of the same equations (Ho, Ruehli and Brennan, 1975): their answers agree,
 *    across 12 decades of frequency.
 * Both to 1e-9 of the largest quantity of its kind (node voltage, element current).
 */

type Port = { v: ComplexJson[]; i: ComplexJson[] };

function ports(r: SolveResult): Map<string, Port> {
  const out = new Map<string, Port>();
  for (const [id, e] of Object.entries(r.elements)) {
    out.set(id, 'voltages' in e ? { v: e.voltages, i: e.currents } : { v: [e.voltage], i: [e.current] });
  }
  return out;
}

const largest = (xs: ComplexJson[]) => Math.max(1e-300, ...xs.map((x) => Math.hypot(x.re, x.im)));

/** Every node voltage and element current of `a` against `b`, currents of `a` multiplied by `iScale`. */
function agree(a: SolveResult, b: SolveResult, iScale: number, tol: number) {
  const va = Object.entries(a.nodes);
  const vMax = largest(Object.values(b.nodes));
  for (const [n, v] of va) {
    const w = b.nodes[n];
    expect(Math.hypot(v.re - w.re, v.im - w.im), `node ${n}`).toBeLessThanOrEqual(tol * vMax);
  }
  const pa = ports(a);
  const pb = ports(b);
  const iMax = largest([...pb.values()].flatMap((p) => p.i));
  const pvMax = largest([...pb.values()].flatMap((p) => p.v));
  for (const [id, p] of pa) {
    const q = pb.get(id)!;
    p.i.forEach((c, t) => expect(Math.hypot(c.re * iScale - q.i[t].re, c.im * iScale - q.i[t].im), `current of ${id}`).toBeLessThanOrEqual(tol * iMax));
    p.v.forEach((c, t) => expect(Math.hypot(c.re - q.v[t].re, c.im - q.v[t].im), `voltage of ${id}`).toBeLessThanOrEqual(tol * pvMax));
  }
}

function scaled(m: GraphModel, a: number, b: number): GraphModel {
  const el = (e: GraphElement): GraphElement => {
    switch (e.kind) {
      case 'resistor': return { ...e, ohms: e.ohms * a };
      case 'inductor': return { ...e, henries: (e.henries * a) / b };
      case 'capacitor': return { ...e, farads: e.farads / (a * b) };
      case 'current-source': return { ...e, magnitude: e.magnitude / a };
      case 'voltage-source':
      case 'ideal-transformer': return e;
      default: throw new Error(`no scaling rule for ${e.kind}`);
    }
  };
  return { ...m, frequencyHz: m.frequencyHz * b, elements: m.elements.map(el) };
}

/** The solve, or the refusal's message. */
function attempt(f: () => SolveResult): SolveResult | string {
  try {
    return f();
  } catch (e) {
    if (e instanceof ModelRefusal) return e.message;
    throw e;
  }
}

const spec = circuitSpec(3, 30);

describe('random circuits under impedance and frequency scaling', () => {
  it('keep their node voltages and divide their currents by the impedance factor, a and b in 10^±6', () => {
    fc.assert(
      fc.property(spec, fc.double({ min: -6, max: 6, noNaN: true }), fc.double({ min: -6, max: 6, noNaN: true }), (s, ua, ub) => {
        const m = build(s);
        const a = 10 ** ua;
        const b = 10 ** ub;
        const base = attempt(() => new SolverSession(m).solveAt(m.frequencyHz));
        const sm = scaled(m, a, b);
        const other = attempt(() => new SolverSession(sm).solveAt(sm.frequencyHz));
        if (typeof base === 'string' || typeof other === 'string') {
          // the same physics: refused alike or solved alike
          expect(typeof other).toBe(typeof base);
          return;
        }
        agree(other, base, a, 1e-9);
      }),
      { numRuns: 60, seed: 11 },
    );
  });
});

describe('admittance and branch forms of windings', () => {
  it('agree on random circuits from 1 mHz to 1 GHz', () => {
    let fewer = 0;
    fc.assert(
      fc.property(spec, fc.double({ min: -3, max: 9, noNaN: true }), (s, u) => {
        const m = build(s);
        const f = 10 ** u;
        const a = new SolverSession(m, undefined, 'admittance');
        const b = new SolverSession(m, undefined, 'ac');
        // the two really are different writings: the admittance form drops the winding currents' unknowns
        if (a.mna.n < b.mna.n) fewer++;
        const admittance = attempt(() => a.solveAt(f));
        const branch = attempt(() => b.solveAt(f));
        if (typeof admittance === 'string' || typeof branch === 'string') {
          expect(typeof branch).toBe(typeof admittance);
          return;
        }
        agree(admittance, branch, 1, 1e-9);
      }),
      { numRuns: 60, seed: 12 },
    );
    expect(fewer).toBeGreaterThan(30);
  });
});
