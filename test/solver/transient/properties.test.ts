import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ModelRefusal, parseGraphModel, transferFunction, transientGraph } from '../../../src/solver';
import type { GraphElement, GraphModel, InductorEl } from '../../../src/model/graph';
import { build, circuitSpec } from '../../reference/randomCircuits';

/**
 * Physical invariants of the time response on random circuits with initial
 * values and sine sources: the energy balance (what the sources deliver is the
 * change in stored energy, ½Cv² + ½iᵀLi, plus what the resistors dissipate;
 * energy argument, standard) and the dot rule (flipping both dots of a pair
 * changes nothing; graph-model contract).
 */

const withInitials = (m: GraphModel, seed: number): GraphModel => ({
  ...m,
  elements: m.elements.map((e, i) => {
    const v = Math.sin(seed + 7 * i);
    if (e.kind === 'capacitor') return { ...e, initialVolts: 3 * v };
    if (e.kind === 'inductor') return { ...e, initialAmps: 0.05 * v };
    return e;
  }) as GraphElement[],
});

function storedEnergy(m: GraphModel, r: ReturnType<typeof transientGraph>, k: number): number {
  let e = 0;
  const byId = new Map(m.elements.map((x) => [x.id, x]));
  for (const el of m.elements) {
    if (el.kind === 'capacitor') e += 0.5 * el.farads * r.elements[el.id].voltage![k] ** 2;
    if (el.kind === 'inductor') e += 0.5 * el.henries * r.elements[el.id].current![k] ** 2;
  }
  for (const c of m.couplings ?? []) {
    const [a, b] = c.windings.map((w) => byId.get(w) as InductorEl);
    const mm = c.henries ?? c.k! * Math.sqrt(a.henries * b.henries);
    const d = (a.dot === 'second' ? -1 : 1) * (b.dot === 'second' ? -1 : 1);
    e += mm * d * r.elements[a.id].current![k] * r.elements[b.id].current![k];
  }
  return e;
}

describe('time response invariants on random circuits', () => {
  it('∫p·dt of the sources = change of stored energy + energy dissipated', () => {
    fc.assert(
      fc.property(circuitSpec(3, 8), fc.nat(), (spec, seed) => {
        const m = withInitials(parseGraphModel(build({ ...spec, transformer: false, freq: 1000 })), seed);
        // a window of 40 time constants of the fastest mode, sampled at a hundredth of it
        const source = m.elements.find((e) => e.kind === 'voltage-source')!.id;
        const fastest = Math.max(2 * Math.PI * 1000, ...transferFunction(m, source, `node:${m.elements[0].nodes[0]}`).naturalFrequencies.map((p) => Math.hypot(p.re, p.im)));
        const n = 4000;
        const stop = 40 / fastest;
        let r: ReturnType<typeof transientGraph>;
        try {
          r = transientGraph(m, { stopS: stop, stepS: stop / n, tolerance: 1e-9, start: 'given' });
        } catch (e) {
          // a random circuit the engine refuses (a node left with nothing but a part on itself) has no balance
          // to check; the refusals themselves are tested through the command line
          if (e instanceof ModelRefusal) return fc.pre(false);
          throw e;
        }
        const h = stop / n;
        // Simpson's rule over the samples (n even)
        const integral = (p: number[]) => {
          let acc = p[0] + p[n];
          for (let k = 1; k < n; k++) acc += (k % 2 ? 4 : 2) * p[k];
          return (acc * h) / 3;
        };
        let delivered = 0;
        let dissipated = 0;
        let scale = 0;
        for (const el of m.elements) {
          const w = integral(r.elements[el.id].power);
          scale = Math.max(scale, Math.abs(w));
          if (el.kind === 'voltage-source' || el.kind === 'current-source') delivered -= w;
          if (el.kind === 'resistor') dissipated += w;
        }
        const change = storedEnergy(m, r, n) - storedEnergy(m, r, 0);
        // the scale includes the stored energy itself: a circuit at rest with zero sources balances to rounding
        scale = Math.max(scale, Math.abs(change), storedEnergy(m, r, 0), storedEnergy(m, r, n), 1e-30);
        const miss = Math.abs(delivered - change - dissipated);
        // the run asks 1e-9 of each waveform; the sum over the window of products of samples is held to 1e-5
        if (!(miss <= 1e-5 * scale)) throw new Error(`energy balance off by ${miss} of ${scale}`);
      }),
      { numRuns: 8, seed: 5150 },
    );
  });

  it('flipping both dots of a pair changes nothing', () => {
    fc.assert(
      fc.property(circuitSpec(4, 10), (spec) => {
        const m = withInitials(parseGraphModel(build({ ...spec, transformer: false, freq: 2000 })), 3);
        if (!m.couplings?.length) return;
        const pair = m.couplings[0].windings;
        // both windings reversed end for end, and both dots moved along: the same circuit
        const flipped: GraphModel = {
          ...m,
          elements: m.elements.map((e) => (e.kind === 'inductor' && pair.includes(e.id) ? { ...e, dot: e.dot === 'second' ? 'first' : 'second' } : e)),
        };
        const opts = { stopS: 1e-3, stepS: 1e-5, tolerance: 1e-7, start: 'given' as const };
        const a = transientGraph(m, opts);
        const b = transientGraph(flipped, opts);
        let top = 0;
        for (const v of Object.values(a.nodes)) for (const x of v) top = Math.max(top, Math.abs(x));
        for (const [name, v] of Object.entries(a.nodes)) {
          v.forEach((x, k) => expect(Math.abs(x - b.nodes[name][k])).toBeLessThanOrEqual(1e-9 * top + 1e-300));
        }
      }),
      { numRuns: 10, seed: 77 },
    );
  });
});
