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
  const t = tCheck(before.model, 'Lpad~Lveh'); // the coupling's graph id: its windings' names

  it('solves to the same port voltages and currents as the pair', () => {
    const { sheet: drawn, record } = substituteT(sheet, k1.id, t);
    const after = deriveCircuit(drawn);
    expect(after.model.couplings ?? []).toHaveLength(0);
    // L1 − M = 48 µH in each series arm, M = 12 µH as the shunt (field notes, T-equivalent; k = 0.2 of 60 µH)
    const arms = after.model.elements.filter((e) => e.kind === 'inductance-arm');
    expect(arms.map((e) => (e as { henries: number }).henries).sort().map((h) => Math.round(h * 1e9) / 1e3)).toEqual([12, 48, 48]);
    // names of their own, no windings left (so no polarity dots), joined by wires, not node labels
    expect(arms.map((e) => e.id)).toEqual(['Lt1', 'Lt2', 'Lt3']);
    expect(after.model.elements.some((e) => e.kind === 'inductor')).toBe(false);
    expect(drawn.parts.some((p) => p.kind === 'label')).toBe(false);
    expect(drawn.wires.length).toBe(sheet.wires.length + record.wires.length);
    const a = solveGraph(parseGraphModel(before.model));
    const b = solveGraph(parseGraphModel(after.model));
    const agree = portAgreement(a, b, new Set(['Lpad', 'Lveh']), new Set(record.reversed), record.arms);
    expect(agree.compared).toBeGreaterThan(8);
    expect(agree.maxRel).toBeLessThan(1e-9); // the T is exact at the ports (field notes)
  });

  it('puts the pair back exactly', () => {
    const { sheet: drawn, record } = substituteT(sheet, k1.id, t);
    expect(restorePair(drawn, record)).toEqual(sheet); // the original sheet (identity)
  });

  it('refuses a winding linked twice', () => {
    const twice = { ...sheet, couplings: [...sheet.couplings, { ...k1, id: 'coupling:x' }] };
    expect(() => substituteT(twice, k1.id, t)).toThrow(/also coupled by k\(Lpad,Lveh\)/);
  });
});
