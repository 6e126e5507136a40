import { describe, expect, it } from 'vitest';
import { wirelessPairSheet } from '../../src/model/examples/wireless';
import { seedIds } from '../../src/model/ids';
import { portAgreement } from '../../src/model/resultCompare';
import { restorePair, substituteT } from '../../src/model/tEquivalentSheet';
import { deriveCircuit } from '../../src/model/toGraph';
import { parseGraphModel, solveGraph } from '../../src/solver';
import { tCheck } from '../../src/worker/analysisTasks';

describe('T-equivalent drawn on the sheet', () => {
  seedIds(7);
  const sheet = wirelessPairSheet();
  const before = deriveCircuit(sheet);
  const k1 = sheet.couplings[0];
  const t = tCheck(before.model, k1.ref);

  it('solves to the same port voltages and currents as the pair', () => {
    const { sheet: drawn, record } = substituteT(sheet, k1.id, t);
    const after = deriveCircuit(drawn);
    expect(after.model.couplings ?? []).toHaveLength(0);
    // L1 − M = 48 µH drawn as a plain winding, M = 12 µH as the shunt (field notes, T-equivalent; k = 0.2 of 60 µH)
    const kinds = after.model.elements.filter((e) => e.kind === 'inductor').map((e) => (e as { henries: number }).henries).sort();
    expect(kinds.map((h) => Math.round(h * 1e9) / 1e3)).toEqual([12, 48, 48]);
    const a = solveGraph(parseGraphModel(before.model));
    const b = solveGraph(parseGraphModel(after.model));
    const agree = portAgreement(a, b, new Set(['L1', 'L2']), new Set(record.reversed));
    expect(agree.compared).toBeGreaterThan(8);
    expect(agree.maxRel).toBeLessThan(1e-9); // the T is exact at the ports (field notes)
  });

  it('puts the pair back exactly', () => {
    const { sheet: drawn, record } = substituteT(sheet, k1.id, t);
    expect(restorePair(drawn, record)).toEqual(sheet); // the original sheet (identity)
  });

  it('refuses a winding linked twice', () => {
    const twice = { ...sheet, couplings: [...sheet.couplings, { ...k1, id: 'coupling:x', ref: 'K2' }] };
    expect(() => substituteT(twice, k1.id, t)).toThrow(/K2/);
  });
});
