/**
 * The example sheets are the one definition of each scenario: the files in
 * examples/sheets and examples/graphs are what they write, and the README's
 * key figures are what the app shows when it opens them (solved, and printed
 * with the readings' own number format).
 */
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { formatJson } from '../../src/cli/format';
import { EXAMPLES, exampleFiles } from '../../src/model/examples';
import type { SolveResult, TwoTerminalResult } from '../../src/model/graph';
import { formatSI } from '../../src/model/quantity';
import { deriveCircuit } from '../../src/model/toGraph';
import { efficiency, parseGraphModel, solveGraph, sourceImpedance, transientGraph } from '../../src/solver';
import { powerReport } from '../../src/model/powerExpansion';

const ROOT = resolve(__dirname, '../..');
const two = (r: SolveResult, id: string) => r.elements[id] as TwoTerminalResult;
const abs = (z: { re: number; im: number }) => Math.hypot(z.re, z.im);

/** The figures of each scenario as the README states them, computed from the app's solve of the example sheet. */
const FIGURES: Record<string, (sheet: ReturnType<(typeof EXAMPLES)[number]['make']>) => string> = {
  isolation: (sheet) => {
    const m = parseGraphModel(deriveCircuit(sheet).model);
    const r = solveGraph(m);
    const load = two(r, 'Rload');
    return `load ${formatSI(abs(load.current), 'A', 4)}, ${formatSI(abs(load.voltage), 'V', 4)}, ${formatSI(load.power.watts, 'W', 4)}; efficiency ${(efficiency(r, 'Vmains', 'Rload')! * 100).toFixed(1)} %`;
  },
  wireless: (sheet) => {
    const m = parseGraphModel(deriveCircuit(sheet).model);
    const r = solveGraph(m);
    const z = sourceImpedance(m, 'Vinv').z!;
    // "resistive": the reactance is under a thousandth of the resistance
    const resistive = Math.abs(z.im) < 1e-3 * z.re ? ' resistive' : '';
    return `input ${formatSI(z.re, 'Ω', 3)}${resistive}; ${formatSI(two(r, 'Rbat').power.watts, 'W', 4)} into the load; efficiency ${(efficiency(r, 'Vinv', 'Rbat')! * 100).toFixed(1)} %`;
  },
  // the phasor is the square wave's fundamental: the steady state the time response settles into
  'wireless-square': (sheet) => {
    const m = parseGraphModel(deriveCircuit(sheet).model);
    const r = solveGraph(m);
    return `fundamental ${formatSI(abs(two(r, 'Vinv').voltage), 'V', 4)} rms; ${formatSI(two(r, 'Rbat').power.watts, 'W', 4)} into the load at the fundamental; efficiency ${(efficiency(r, 'Vinv', 'Rbat')! * 100).toFixed(1)} %`;
  },
  // the time response (test/solver/transient/examples.test.ts holds it to closed forms)
  'switch-in': (sheet) => {
    const m = parseGraphModel(deriveCircuit(sheet).model);
    const i = two(solveGraph(m), 'Lpzero').current;
    const r = transientGraph(m, { stopS: 0.04, stepS: 1e-4, tolerance: 1e-4, start: 'given' }, ['Lpcrest', 'Lpzero']);
    const first = (id: string) => Math.max(...r.elements[id].current!.map(Math.abs));
    return `magnetising current ${formatSI(Math.SQRT2 * abs(i), 'A', 3)} peak in the steady state; first peak ${formatSI(first('Lpzero'), 'A', 3)} switched in at the zero, ${formatSI(first('Lpcrest'), 'A', 3)} at the crest`;
  },
  'ct-opens': (sheet) => {
    const m = parseGraphModel(deriveCircuit(sheet).model);
    const r = transientGraph(m, { stopS: 0.06, stepS: 1e-5, tolerance: 1e-4, start: 'given' }, ['terminal', 'Lsec']);
    const k0 = r.timesS.findIndex((t) => Math.abs(t - 0.025) < 1e-12);
    const v = r.nodes.terminal.map(Math.abs);
    const crest = Math.max(...v);
    return `${formatSI(Math.abs(r.elements.Lsec.current![k0]), 'A', 3)} in the secondary as the burden opens at 25 ms; then up to ${formatSI(crest, 'V', 3)} at ${formatSI(r.timesS[v.indexOf(crest)], 's', 3)}`;
  },
  'current-transformer': (sheet) => {
    const c = deriveCircuit(sheet).model;
    const r = solveGraph(parseGraphModel(c));
    const b = two(r, 'Rburden');
    // the open secondary: the burden a megohm (field notes: an open CT secondary forces its current into what remains)
    const open = solveGraph(parseGraphModel({ ...c, elements: c.elements.map((e) => (e.id === 'Rburden' ? { ...e, ohms: 1e6 } : e)) }));
    const vOpen = abs(two(open, 'Lsec').voltage);
    return `${formatSI(abs(b.current), 'A', 3)} and ${formatSI(abs(b.voltage), 'V', 3)} at the burden; open secondary > ${Math.floor(vOpen / 100) * 100} V`;
  },
  distribution: (sheet) => {
    const at = (closed: boolean) => {
      const s = { ...sheet, parts: sheet.parts.map((p) => (p.kind === 'switch' ? { ...p, closed } : p)) };
      const c = deriveCircuit(s);
      const t = s.parts.find((p) => p.kind === 'power')!;
      const rep = powerReport(t.power!, c.expansions.get(t.id)!, solveGraph(parseGraphModel(c.model)));
      return `efficiency ${(rep.efficiency! * 100).toFixed(2)} %, regulation ${(rep.regulation! * 100).toFixed(2)} %`;
    };
    return `full load: ${at(true)}; half load: ${at(false)}`;
  },
  control: (sheet) => {
    const c = deriveCircuit(sheet);
    const t = sheet.parts.find((p) => p.kind === 'power')!;
    const rep = powerReport(t.power!, c.expansions.get(t.id)!, solveGraph(parseGraphModel(c.model)));
    return `load ${(rep.load * 100).toFixed(1)} %; efficiency ${(rep.efficiency! * 100).toFixed(1)} %, regulation ${(rep.regulation! * 100).toFixed(2)} %`;
  },
};

describe('example files', () => {
  it('are exactly what the example sheets write (sheet and graph model from one definition)', () => {
    for (const f of exampleFiles()) {
      expect(readFileSync(join(ROOT, f.path), 'utf8'), `${f.path}: run node scripts/write-example-sheets.mjs`).toBe(formatJson(f.json) + '\n');
    }
  });

  it('carry the README\'s key figures as the app shows them', () => {
    const readme = readFileSync(join(ROOT, 'README.md'), 'utf8');
    for (const ex of EXAMPLES) {
      const row = readme.split('\n').find((l) => l.startsWith(`| \`${ex.file}\``));
      expect(row, `README lists ${ex.file}`).toBeDefined();
      const stated = row!.split('|').map((c) => c.trim())[3];
      expect(stated).toBe(FIGURES[ex.key](ex.make()));
    }
  });
});
