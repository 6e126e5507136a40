/**
 * The two practical-transformer scenarios (src/model/examples/distribution.ts,
 * control.ts): key figures at the solved operating point, each against a
 * textbook formula (first order, from memory) and against the exact solve.
 */
import { describe, expect, it } from 'vitest';
import { EXAMPLES } from '../../src/model/examples';
import { CONTROL_SPEC } from '../../src/model/examples/control';
import { DISTRIBUTION_SPEC } from '../../src/model/examples/distribution';
import type { Sheet } from '../../src/model/sheet';
import { powerReport } from '../../src/model/powerExpansion';
import { circuitOf, perUnitSeries } from '../../src/model/powerTransformer';
import { deriveCircuit } from '../../src/model/toGraph';
import { parseGraphModel, solveGraph, tellegenResidual } from '../../src/solver';
import { expectClose } from '../helpers';

function solveAt(key: string, switchClosed = true) {
  const made = EXAMPLES.find((e) => e.key === key)!.make();
  const sheet: Sheet = { ...made, parts: made.parts.map((p) => (p.kind === 'switch' ? { ...p, closed: switchClosed } : p)) };
  const c = deriveCircuit(sheet);
  const r = solveGraph(parseGraphModel(c.model));
  const t = sheet.parts.find((p) => p.kind === 'power')!;
  return { report: powerReport(t.power!, c.expansions.get(t.id)!, r), r, c };
}

describe('example: 25 kVA distribution transformer entered from its tests', () => {
  const full = solveAt('distribution', true);
  const half = solveAt('distribution', false);
  const z = perUnitSeries(DISTRIBUTION_SPEC.rating, circuitOf(DISTRIBUTION_SPEC), 50);

  it('solves full and half load with the stated efficiency and regulation', () => {
    // key figures of this scenario (README), from the exact solve
    expect(full.report.efficiency!).toBeCloseTo(0.9763, 4);
    expect(full.report.regulation!).toBeCloseTo(0.03456, 5);
    expect(half.report.efficiency!).toBeCloseTo(0.9809, 4);
    expect(half.report.regulation!).toBeCloseTo(0.01723, 5);
    expect(full.report.load).toBeCloseTo(0.966, 3);
    expect(half.report.load).toBeCloseTo(0.491, 3);
    // Tellegen's theorem over the whole expanded circuit (Tellegen, 1952)
    expect(tellegenResidual(full.r).relative).toBeLessThan(1e-12);
  });

  it('agrees with the first-order textbook formulas', () => {
    for (const { report: rep } of [full, half]) {
      // regulation ≈ x·(ur·cos φ + ux·sin φ) at lagging pf 0.8, x the per-unit current (field notes, from memory)
      const x = rep.load;
      const approx = x * (z.re * 0.8 + z.im * 0.6);
      expect(Math.abs(rep.regulation! - approx)).toBeLessThan(0.05 * approx);
      // efficiency = P_out / (P_out + P_core + P_cu), losses at their test values: P0 and x²·Psc (field notes, from memory)
      const pOut = rep.outputW;
      const eta = pOut / (pOut + 95 + x * x * 380);
      expect(Math.abs(rep.efficiency! - eta)).toBeLessThan(5e-4);
    }
    // core loss nearly the no-load loss at rated voltage; copper loss ∝ current² (standard, from memory)
    expect(full.report.coreW).toBeGreaterThan(88);
    expect(full.report.coreW).toBeLessThan(95);
    expectClose(full.report.copperW / half.report.copperW, (full.report.i2 / half.report.i2) ** 2, 0.03);
  });
});

describe('example: 250 VA control transformer entered per unit', () => {
  const { report: rep } = solveAt('control');
  const z = perUnitSeries(CONTROL_SPEC.rating, circuitOf(CONTROL_SPEC), 50);

  it('gives back its per-unit data: uk and ur from the series impedance', () => {
    // uk ≈ |z| and ur = load loss / S to first order (field notes, from memory); exactly, the short circuit includes the shunt
    expectClose(Math.hypot(z.re, z.im), 0.06, 2e-3);
    expectClose(z.re, 10 / 250, 2e-3);
  });

  it('solves the coil load with the stated figures', () => {
    expect(rep.load).toBeCloseTo(0.762, 3);
    expect(rep.efficiency!).toBeCloseTo(0.8999, 4);
    expect(rep.regulation!).toBeCloseTo(0.0478, 4);
    // first order at pf 0.6 lagging (field notes, from memory)
    const approx = rep.load * (z.re * 0.6 + z.im * 0.8);
    expect(Math.abs(rep.regulation! - approx)).toBeLessThan(0.08 * approx);
    expectClose(rep.inputW, rep.outputW + rep.copperW + rep.coreW, 1e-9);
  });
});
