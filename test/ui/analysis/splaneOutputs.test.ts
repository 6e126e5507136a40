/** The s-plane view's CSV and the pole marks it lends the sweep, from a real transfer answer. */
import { describe, expect, it } from 'vitest';
import { transfer } from '../../../src/worker/analysisTasks';
import { poleMarks, sPlaneCsv } from '../../../src/ui/analysis/splane';
import { parseCsv } from '../../../src/export/csv';
import { model } from '../../helpers';

const R = 10, L = 1e-3, C = 1e-6;
const rlc = () => model(1000, [
  { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
  { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: R },
  { id: 'L1', kind: 'inductor', nodes: ['b', 'c'], henries: L },
  { id: 'C1', kind: 'capacitor', nodes: ['c', 'gnd'], farads: C },
]);
// series RLC: ω0 = 1/√(LC), ζ = (R/2)·√(C/L), Q = 1/(2ζ) (closed form, common practice)
const w0 = 1 / Math.sqrt(L * C);
const f0 = w0 / (2 * Math.PI);
const zeta = (R / 2) * Math.sqrt(C / L);

describe('s-plane CSV', () => {
  it('one row per pole and natural frequency with ω0, f, ζ and Q, after H(s) in comments', () => {
    const text = sPlaneCsv(transfer(rlc(), 'V1', 'node:c'));
    const lines = text.split('\n');
    expect(lines[0]).toMatch(/^# Coilwright transfer function from V1 to node:c/);
    const rows = parseCsv(text); // comment lines (#) skipped by the reader
    expect(rows[0]).toEqual(['root', 'sigma_per_s', 'omega_rad_per_s', 'omega0_rad_per_s', 'f_Hz', 'zeta', 'Q', 'seen_by_this_H']);
    const poles = rows.filter((r) => r[0] === 'pole');
    expect(poles).toHaveLength(2);
    for (const p of poles) {
      expect(Number(p[3]) / w0).toBeCloseTo(1, 9);
      expect(Number(p[4]) / f0).toBeCloseTo(1, 9);
      expect(Number(p[5]) / zeta).toBeCloseTo(1, 9);
      expect(Number(p[6]) * 2 * zeta).toBeCloseTo(1, 9);
    }
    expect(rows.filter((r) => r[0] === 'natural frequency').every((r) => r[7] === 'yes')).toBe(true);
    expect(text).not.toMatch(/NaN|Infinity|null|undefined/);
  });
});

describe('pole marks on the sweep', () => {
  it('one rule at |p|/2π = f0 for the conjugate pair, inside the sweep range only', () => {
    const a = transfer(rlc(), 'V1', 'node:c');
    const marks = poleMarks(a, 10, 100e3);
    expect(marks).toHaveLength(1); // one of each conjugate pair
    expect(marks[0].x / f0).toBeCloseTo(1, 9); // |p| = ω0 for a second-order pair (closed form)
    expect(marks[0].rule).toBe(true);
    expect(marks[0].label).toMatch(/^pole 5\.033 kHz, Q 3\.162$/); // f0 = 5.0329 kHz, Q = 1/(2ζ) = √10
    expect(poleMarks(a, 10, 1000)).toEqual([]);
  });
});
