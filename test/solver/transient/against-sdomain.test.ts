import { describe, expect, it } from 'vitest';
import { worstDeviation } from '../../helpers';
import fc from 'fast-check';
import { parseGraphModel, transferFunction, transientGraph } from '../../../src/solver';
import type { GraphElement, GraphModel, TransferResult } from '../../../src/model/graph';
import { build, circuitSpec } from '../../reference/randomCircuits';

/**
 * The time response of a unit step against the inverse Laplace transform of
 * the s-domain answer (an independent engine: `tf`'s poles and residues, from
 * the pencil (G, C)): y(t) = H(0) + Σ_p (R_p/p)·e^(p·t) for simple poles p ≠ 0,
 * R_p = gain·Π(p − z)/Π_(q≠p)(p − q) (partial fractions, standard).
 */

type C = { re: number; im: number };
const mul = (a: C, b: C): C => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const div = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};

/** The step response from the factored H, or null where it has a pole at 0 or a repeated pole. */
function stepResponse(t: TransferResult): ((time: number) => number) | null {
  const { poles, zeros, gain } = t;
  if (gain === 0) return () => 0;
  if (zeros.length > poles.length) return null; // improper: an impulse at the step
  for (let i = 0; i < poles.length; i++) {
    if (Math.hypot(poles[i].re, poles[i].im) === 0) return null;
    for (let j = 0; j < i; j++) if (Math.hypot(poles[i].re - poles[j].re, poles[i].im - poles[j].im) <= 1e-6 * Math.hypot(poles[i].re, poles[i].im)) return null;
  }
  let h0: C = { re: gain, im: 0 };
  for (const z of zeros) h0 = mul(h0, { re: -z.re, im: -z.im });
  for (const p of poles) h0 = div(h0, { re: -p.re, im: -p.im });
  const terms = poles.map((p, i) => {
    let r: C = { re: gain, im: 0 };
    for (const z of zeros) r = mul(r, { re: p.re - z.re, im: p.im - z.im });
    poles.forEach((q, j) => {
      if (j !== i) r = div(r, { re: p.re - q.re, im: p.im - q.im });
    });
    return { p, c: div(r, p) };
  });
  return (time) => {
    let y = h0.re;
    for (const { p, c } of terms) {
      const e = Math.exp(p.re * time);
      y += e * (c.re * Math.cos(p.im * time) - c.im * Math.sin(p.im * time));
    }
    return y;
  };
}

const stepped = (m: GraphModel, input: string): GraphModel => ({
  ...m,
  elements: m.elements.map((e) =>
    e.kind === 'voltage-source' || e.kind === 'current-source'
      ? ({ ...e, magnitude: 0, phaseDeg: 0, waveform: e.id === input ? { shape: 'step', before: 0, after: 1, atS: 0 } : undefined } as GraphElement)
      : e.kind === 'capacitor' ? { ...e, initialVolts: 0 } : e.kind === 'inductor' ? { ...e, initialAmps: 0 } : e,
  ),
});

const compare = (r: { timesS: number[] }, got: number[], exact: (t: number) => number) => worstDeviation(r.timesS, got, exact);

describe('the time response is the inverse of the s-domain answer', () => {
  it('a loaded coupled pair stepped at its primary', () => {
    const m = parseGraphModel({
      schema: 'coilwright.graph/1', frequencyHz: 1000, amplitudes: 'peak', ground: 'gnd',
      elements: [
        { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
        { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 2 },
        { id: 'Lp', kind: 'inductor', nodes: ['b', 'gnd'], henries: 3e-3 },
        { id: 'Ls', kind: 'inductor', nodes: ['c', 'gnd'], henries: 12e-3, dot: 'second' },
        { id: 'Cs', kind: 'capacitor', nodes: ['c', 'd'], farads: 2e-6 },
        { id: 'RL', kind: 'resistor', nodes: ['d', 'gnd'], ohms: 22 },
      ],
      couplings: [{ id: 'K', windings: ['Lp', 'Ls'], k: 0.7 }],
    });
    const s = stepped(m, 'V1');
    for (const out of ['current:RL', 'current:Lp', 'node:c']) {
      const t = transferFunction(s, 'V1', out);
      const y = stepResponse(t)!;
      const r = transientGraph(s, { stopS: 0.02, stepS: 2e-5, tolerance: 1e-7, start: 'given' });
      const [kind, name] = out.split(':');
      const got = kind === 'node' ? r.nodes[name] : r.elements[name].current!;
      const { err, peak } = compare(r, got, y);
      // the contract's accuracy at --tolerance 1e-7: within 1e-5 of the quantity's largest magnitude
      expect(err).toBeLessThan(1e-5 * peak);
    }
  });

  it('random circuits: a step response equals the residues at the poles of tf to 1e-6', () => {
    let compared = 0;
    fc.assert(
      fc.property(circuitSpec(3, 12), fc.nat(), (spec, pick) => {
        const m = parseGraphModel(build({ ...spec, transformer: false }));
        const sources = m.elements.filter((e) => e.kind === 'voltage-source' || e.kind === 'current-source');
        const input = sources[pick % sources.length].id;
        const target = m.elements[pick % m.elements.length];
        const output = pick % 2 === 0 ? `node:${target.nodes[0]}` : `current:${target.id}`;
        const s = stepped(m, input);
        const t = transferFunction(s, input, output);
        const y = stepResponse(t);
        if (!y || t.poles.length === 0) return;
        const mags = t.poles.map((p) => Math.hypot(p.re, p.im)).sort((a, b) => a - b);
        const stop = 3 / mags[Math.floor(mags.length / 2)];
        const r = transientGraph(s, { stopS: stop, stepS: stop / 200, tolerance: 1e-8, start: 'given' });
        const [kind, name] = output.split(':');
        const got = kind === 'node' ? r.nodes[name] : r.elements[name].current!;
        const { err, peak } = compare(r, got, y);
        // within 1e-6 of the largest magnitude (or rounding level of the run's scale)
        const floor = 1e-9 * Math.max(...Object.values(r.nodes).flat().map(Math.abs), 1e-30);
        if (!(err <= 1e-6 * peak + floor)) throw new Error(`${input} → ${output}: error ${err} of ${peak}`);
        compared++;
      }),
      { numRuns: 25, seed: 9090 },
    );
    expect(compared).toBeGreaterThan(10);
  });
});
