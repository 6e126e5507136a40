import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { solveGraph, tellegenResidual } from '../../src/solver';
import type { GraphModel, SolveResult, ComplexJson } from '../../src/model/graph';
import { referenceSolve } from '../reference/dense-mna';
import { specArb, build } from '../reference/randomCircuits';
import { cabs } from '../helpers';

/**
 * Property tests on random valid circuits of up to 60 nodes. Checks: an
 * independent dense solve (mathjs lusolve), Kirchhoff's current law at every
 * node, Tellegen's theorem (Tellegen, 1952), and the dot rules of the contract
 * (flipping both dots of a pair changes nothing; flipping one equals −M).
 */

function close(a: ComplexJson, b: ComplexJson, scale: number, rel: number): boolean {
  return Math.hypot(a.re - b.re, a.im - b.im) <= rel * scale + 1e-12;
}

function maxNodeVoltage(r: SolveResult): number {
  return Math.max(1e-12, ...Object.values(r.nodes).map(cabs));
}

function terminalCurrents(r: SolveResult, m: GraphModel): Map<string, ComplexJson> {
  const sum = new Map<string, ComplexJson>();
  const addTo = (node: string, c: ComplexJson, sign: number) => {
    const s = sum.get(node) ?? { re: 0, im: 0 };
    sum.set(node, { re: s.re + sign * c.re, im: s.im + sign * c.im });
  };
  for (const e of m.elements) {
    const res = r.elements[e.id];
    if ('currents' in res && e.kind === 'ideal-transformer') {
      addTo(e.nodes[0], res.currents[0], 1);
      addTo(e.nodes[1], res.currents[0], -1);
      addTo(e.nodes[2], res.currents[1], 1);
      addTo(e.nodes[3], res.currents[1], -1);
    } else if ('current' in res) {
      addTo(e.nodes[0], res.current, 1);
      addTo(e.nodes[1], res.current, -1);
    }
  }
  return sum;
}

describe('random circuits', () => {
  it('agree with an independent dense solve (mathjs lusolve) to 1e-9', () => {
    fc.assert(
      fc.property(specArb, (s) => {
        const m = build(s);
        const r = solveGraph(m);
        const ref = referenceSolve(m);
        const scale = maxNodeVoltage(r);
        for (const [name, v] of ref.nodes) {
          if (!close(r.nodes[name], v, scale, 1e-9)) throw new Error(`node ${name}: ${JSON.stringify(r.nodes[name])} vs reference ${JSON.stringify(v)}`);
        }
      }),
      { numRuns: 25, seed: 20261201 },
    );
  });

  it('satisfy KCL at every node and Tellegen within 1e-9 of the largest element power', () => {
    fc.assert(
      fc.property(specArb, (s) => {
        const m = build(s);
        const r = solveGraph(m);
        const currents = Object.values(r.elements).flatMap((e) => ('currents' in e ? e.currents : [e.current]));
        const scale = Math.max(1e-12, ...currents.map(cabs));
        for (const [node, c] of terminalCurrents(r, m)) {
          // KCL: the currents leaving a node sum to zero
          if (cabs(c) > 1e-9 * scale) throw new Error(`KCL at ${node}: ${cabs(c)} vs scale ${scale}`);
        }
        // Tellegen's theorem (Tellegen, 1952)
        expect(tellegenResidual(r).relative).toBeLessThan(1e-9);
      }),
      { numRuns: 40, seed: 7 },
    );
  });

  it('flipping both dots of a pair changes nothing; flipping one equals negating M', () => {
    fc.assert(
      fc.property(specArb, (s) => {
        const m = build(s);
        if (!m.couplings?.length) return;
        const pair = m.couplings[0].windings;
        const flip = (mm: GraphModel, ids: string[]): GraphModel => ({
          ...mm,
          elements: mm.elements.map((e) => (e.kind === 'inductor' && ids.includes(e.id) ? { ...e, dot: e.dot === 'second' ? 'first' : 'second' } : e)),
        });
        const a = solveGraph(m);
        const both = solveGraph(flip(m, pair));
        const scale = maxNodeVoltage(a);
        for (const name of Object.keys(a.nodes)) {
          if (!close(both.nodes[name], a.nodes[name], scale, 1e-9)) throw new Error(`both-dot flip changed node ${name}`);
        }
        // one dot flipped (every coupling has one pair here) vs the reference with every M negated
        const singles = m.couplings.map((c) => c.windings[0]);
        const one = solveGraph(flip(m, singles));
        const ref = referenceSolve(m, -1);
        const s2 = maxNodeVoltage(one);
        for (const [name, v] of ref.nodes) {
          if (!close(one.nodes[name], v, s2, 1e-9)) throw new Error(`single flip vs −M differs at ${name}`);
        }
      }),
      { numRuns: 20, seed: 99 },
    );
  });
});
