/** The practical transformer on the sheet: saved and read back, refused with the field named, expanded, cautioned. */
import { describe, expect, it } from 'vitest';
import { overloads } from '../../src/model/cautions';
import { EXAMPLES } from '../../src/model/examples';
import { parseSheetJson } from '../../src/model/parseSheet';
import { partReadings, deriveCircuit } from '../../src/model/toGraph';
import type { TransformerResult } from '../../src/model/graph';
import type { Sheet } from '../../src/model/sheet';
import { solveGraph } from '../../src/solver';

const distribution = () => EXAMPLES.find((e) => e.key === 'distribution')!.make();

describe('practical transformer on the sheet', () => {
  it('is read back as saved, and a version-6 sheet still reads (nothing changed in older files)', () => {
    const s = distribution();
    expect(parseSheetJson(JSON.parse(JSON.stringify(s)))).toEqual(s);
    const iso = EXAMPLES.find((e) => e.key === 'isolation')!.make();
    const old = { ...JSON.parse(JSON.stringify(iso)), schema: 'coilwright.sheet/6' };
    expect(parseSheetJson(old).parts).toEqual(iso.parts);
  });

  it('refuses inconsistent test data in a file, naming the field', () => {
    const s = JSON.parse(JSON.stringify(distribution()));
    const t = s.parts.find((p: { kind: string }) => p.kind === 'power');
    t.power.tests.shortCircuit.watts = 5000; // above 440 V · 2.273 A
    expect(() => parseSheetJson(s)).toThrow(/power\.tests\.shortCircuit\.watts: Short-circuit test power \(5000 W\) is above the apparent power/);
  });

  it('expands into graph elements named after the part, and reads as one part at its terminals', () => {
    const s = distribution();
    const c = deriveCircuit(s);
    const t = s.parts.find((p) => p.kind === 'power')!;
    const ids = c.model.elements.filter((e) => e.id.startsWith('T1.')).map((e) => e.id);
    expect(ids).toEqual(['T1.R1', 'T1.L1', 'T1.Rc', 'T1.Lm', 'T1.R2', 'T1.L2', 'T1.N']);
    for (const id of ids) expect(c.partOfElement.get(id)).toBe(t.id);
    const r = solveGraph(c.model);
    const byPart = partReadings(c, r);
    const term = byPart.elements.T1 as TransformerResult;
    expect(byPart.partOfElement.get('T1')).toBe(t.id);
    expect(Object.keys(byPart.elements).some((k) => k.startsWith('T1.'))).toBe(false);
    // the part absorbs its losses only (Tellegen over the part, 1952): copper + core
    const losses = ['T1.R1', 'T1.R2', 'T1.Rc'].reduce((sum, id) => sum + r.elements[id].power.watts, 0);
    expect(Math.abs(term.power.watts - losses)).toBeLessThan(1e-9 * losses);
    // the secondary current it reports is the load's (KCL at the secondary pin)
    const load = r.elements.Rload1 as { current: { re: number; im: number } };
    const sw = r.elements.Shalf as { current: { re: number; im: number } };
    expect(Math.hypot(term.currents[1].re + load.current.re + sw.current.re, term.currents[1].im + load.current.im + sw.current.im)).toBeLessThan(1e-9);
  });

  it('cautions above its rating, deferring to codes and licensed practice, and not at rating', () => {
    const s = distribution();
    expect(overloads(deriveCircuit(s), solveGraph(deriveCircuit(s).model))).toEqual([]);
    const heavy: Sheet = { ...s, parts: s.parts.map((p) => (p.ref.startsWith('Rload') ? { ...p, value: (p.value ?? 1) / 2 } : p)) };
    const c = deriveCircuit(heavy);
    const cautions = overloads(c, solveGraph(c.model));
    expect(cautions).toHaveLength(1);
    expect(cautions[0].text).toMatch(/T1 is loaded to 1\d\d % of its rated current/);
    expect(cautions[0].text).toMatch(/local electrical codes and licensed practice/);
  });
});
