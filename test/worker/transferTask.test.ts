/** The s-domain view's work in the analysis worker, and the texts the view shows. */
import { describe, expect, it } from 'vitest';
import { transfer } from '../../src/worker/analysisTasks';
import { factoredText, polynomialText, rootFacts } from '../../src/ui/analysis/splane';
import { model } from '../helpers';

const R = 10, L = 1e-3, C = 1e-6;

/** V1 → R → L → C to ground; a second, separate loop R2 ‖ C2 that V1 does not reach. */
function rlc() {
  return model(1000, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: R },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'c'], henries: L, dot: 'first' },
    { id: 'C1', kind: 'capacitor', nodes: ['c', 'gnd'], farads: C },
    { id: 'R2', kind: 'resistor', nodes: ['x', 'gnd'], ohms: 1000 },
    { id: 'C2', kind: 'capacitor', nodes: ['x', 'gnd'], farads: 1e-6 },
  ]);
}

describe('the transfer task', () => {
  it('gives the series RLC its two poles and marks the separate RC as not seen', () => {
    const a = transfer(rlc(), 'V1', 'node:c');
    // series RLC: ω0 = 1/√(LC), ζ = (R/2)·√(C/L) (closed form, common practice)
    const w0 = 1 / Math.sqrt(L * C);
    const zeta = (R / 2) * Math.sqrt(C / L);
    expect(a.poles).toHaveLength(2);
    for (const p of a.poles) {
      const f = rootFacts(p);
      expect(f.omega0).toBeCloseTo(w0, 6);
      expect(f.zeta!).toBeCloseTo(zeta, 9);
      expect(f.q!).toBeCloseTo(1 / (2 * zeta), 6);
    }
    // V(c)/V = 1/(LC s² + RC s + 1): gain 1/(LC), no zeros (voltage divider in s, closed form)
    expect(a.zeros).toEqual([]);
    expect(a.gain).toBeCloseTo(1 / (L * C), 0);
    // the RC loop's own natural frequency −1/(R2·C2) (first-order decay, closed form) is there but not a pole of H
    const rc = a.naturalFrequencies.findIndex((n) => Math.abs(n.re + 1000) < 1e-6 && n.im === 0);
    expect(rc).toBeGreaterThanOrEqual(0);
    expect(a.seen[rc]).toBe(false);
    expect(a.seen.filter(Boolean)).toHaveLength(2);
  });

  it('refuses an unknown output naming it', () => {
    expect(() => transfer(rlc(), 'V1', 'node:zz')).toThrow(/"zz" is not a node/);
  });
});

describe('the s-plane texts', () => {
  it('write H out with its factors and polynomials', () => {
    expect(factoredText(2, [{ re: 0, im: 0 }], [{ re: -3, im: 0 }])).toBe('H(s) = 2 · s / (s + 3)');
    expect(polynomialText([1, -2.5, 0])).toBe('s^2 − 2.5·s');
    expect(factoredText(0, [], [])).toBe('H(s) = 0');
  });
  it('say no Q and no damping ratio where none is defined', () => {
    expect(rootFacts({ re: 0, im: 0 })).toEqual({ omega0: 0, hz: 0, zeta: null, q: null });
    // on the jω axis: ζ = 0, undamped, Q left out (1/(2ζ) is unbounded)
    expect(rootFacts({ re: 0, im: 2 * Math.PI })).toMatchObject({ hz: 1, zeta: 0, q: null });
  });
});
