/** The results table of the exported sheet: text cells (node voltages, part voltages and currents, P and Q) and their layout. */
import type { ComplexJson, GraphModel, SolveResult } from '../model/graph';
import { isDissipative, sourceKindOf } from '../model/elementFacts';
import { angleDeg, mag } from '../model/phasor';
import { formatAngle, formatSI } from '../model/quantity';
import { couplingName, couplingTitle, pairFigures, windingRefs } from '../model/couplingName';
import type { DerivedCircuit } from '../model/toGraph';
import { powerReport, powerReportLine } from '../model/powerExpansion';
import { hline, rect, t, type Block } from './blocks';
import type { SvgOptions } from './options';
import { PRINT } from './palette';
import { textWidth, wrap } from './text';
import { escAttr, oneLine } from './xml';
import { mutualLimit } from '../model/mutual';

export interface TableRow {
  kind: 'node' | 'part';
  name: string;
  /** magnitude∠angle with units, or '' */
  v: string;
  i: string;
  p: string;
  q: string;
}

/** Magnitude and angle (degrees) as the sheet writes them: "229.9 V ∠-0.3°"; an exact zero reads "0 V". */
export function polarText(m: number, deg: number, unit: string): string {
  return m === 0 ? `0 ${unit}` : `${formatSI(m, unit, 4)} ∠${formatAngle(deg)}`;
}

/** Values below this fraction of the largest of their kind are rounding noise and read as zero (as in the app's readings). */
const NOISE = 1e-12;

export const wattsText = (w: number) => formatSI(w, 'W', 4);
export const varsText = (q: number) => formatSI(q, 'var', 4);

/**
 * One row per node (the ground node, 0 V by definition, left out) and per
 * part (an ideal transformer takes two, primary and secondary, its P and Q on
 * the first). Values below 10⁻¹² of the largest of their kind read as zero,
 * as in the app's readings.
 */
export function resultRows(model: GraphModel, result: SolveResult): TableRow[] {
  const top = { v: 0, i: 0, s: 0 };
  const seeV = (z: ComplexJson) => { top.v = Math.max(top.v, mag(z)); };
  const seeI = (z: ComplexJson) => { top.i = Math.max(top.i, mag(z)); };
  for (const z of Object.values(result.nodes)) seeV(z);
  for (const r of Object.values(result.elements)) {
    if ('current' in r) { seeV(r.voltage); seeI(r.current); } else { r.voltages.forEach(seeV); r.currents.forEach(seeI); }
    top.s = Math.max(top.s, Math.abs(r.power.watts), Math.abs(r.power.vars));
  }
  const polar = (z: ComplexJson, unit: string, scale: number) => {
    const m = mag(z);
    return m < scale * NOISE ? `0 ${unit}` : polarText(m, angleDeg(z), unit);
  };
  const quiet = (x: number) => (Math.abs(x) < top.s * NOISE ? 0 : x);
  const out: TableRow[] = [];
  for (const [name, z] of Object.entries(result.nodes)) {
    if (name !== model.ground) out.push({ kind: 'node', name, v: polar(z, 'V', top.v), i: '', p: '', q: '' });
  }
  for (const [id, r] of Object.entries(result.elements)) {
    const p = wattsText(quiet(r.power.watts)), q = varsText(quiet(r.power.vars));
    if ('current' in r) {
      out.push({ kind: 'part', name: id, v: polar(r.voltage, 'V', top.v), i: polar(r.current, 'A', top.i), p, q });
    } else {
      out.push({ kind: 'part', name: `${id} primary`, v: polar(r.voltages[0], 'V', top.v), i: polar(r.currents[0], 'A', top.i), p, q });
      out.push({ kind: 'part', name: `${id} secondary`, v: polar(r.voltages[1], 'V', top.v), i: polar(r.currents[1], 'A', top.i), p: '', q: '' });
    }
  }
  return out;
}

/** Power delivered by the independent sources and dissipated in resistors (rounding noise, as in the rows, reads as zero). */
export function powerTotals(model: GraphModel, result: SolveResult): { watts: number; vars: number; dissipated: number } {
  let watts = 0, vars = 0, dissipated = 0, top = 0;
  for (const el of model.elements) {
    const r = result.elements[el.id];
    if (!r) continue;
    top = Math.max(top, Math.abs(r.power.watts), Math.abs(r.power.vars));
    if (sourceKindOf(el)) {
      watts -= r.power.watts;
      vars -= r.power.vars;
    } else if (isDissipative(el)) dissipated += r.power.watts;
  }
  const quiet = (x: number) => (Math.abs(x) < top * NOISE ? 0 : x);
  return { watts: quiet(watts), vars: quiet(vars), dissipated: quiet(dissipated) };
}

type Col = { key: Exclude<keyof TableRow, 'kind'>; head: string };
const NODE_COLS: Col[] = [{ key: 'name', head: 'Node' }, { key: 'v', head: 'Voltage' }];
const PART_COLS: Col[] = [{ key: 'name', head: 'Part' }, { key: 'v', head: 'Voltage' }, { key: 'i', head: 'Current' }, { key: 'p', head: 'P' }, { key: 'q', head: 'Q' }];

interface Section { cols: Col[]; rows: TableRow[]; groups: number; shown: TableRow[] }

export function tableBlock(circuit: DerivedCircuit, result: SolveResult | null, o: SvgOptions, width: number, maxHeight: number): Block {
  if (!result) {
    const why = o.unsolvedReason ? oneLine(o.unsolvedReason) : 'No solve result was given.';
    const lines = wrap(`Not solved. ${why}`, width - 4, 2.6, 'sans', 6);
    const height = 8 + lines.length * 3.4;
    return {
      height,
      render: (x, y) => `<g id="results">${t('Results', x, y + 4, 3.2, { face: 'bold' })}${lines.map((l, i) => t(l, x, y + 8.5 + i * 3.4, 2.6, { fill: PRINT.caution, cls: 'unsolved' })).join('')}</g>`,
    };
  }
  const all = resultRows(circuit.model, result);
  const tot = powerTotals(circuit.model, result);
  // an isolated section is measured from its own reference node, not from the ground
  const measured = result.warnings.some((w) => /^isolated part/.test(w))
    ? `node voltages from each section's own reference node (${circuit.model.ground} where joined to it; an isolated section's reference: see the notes)`
    : `node voltages to ${circuit.model.ground}`;
  const convention = result.amplitudes === 'rms' ? 'RMS' : 'peak';
  const lead = result.frequencyHz === 0
    ? `DC values; ${measured}; P = V·I absorbed by each part (negative: delivered).`
    : `Magnitudes are ${convention} values (${result.amplitudes === 'rms' ? 'S = V·I*' : 'S = ½·V·I*'}), angles in degrees; ${measured}; P and Q absorbed by each part (negative: delivered).`;
  const summary = `Sources deliver P = ${wattsText(tot.watts)}, Q = ${varsText(tot.vars)}; resistors dissipate ${wattsText(tot.dissipated)}.`;
  const couplingLines = [...couplingSummary(circuit), ...transformerSummary(circuit, result)];

  // node voltages and part readings side by side, each in as many groups as the height needs,
  // at the largest font (2.5 mm down to 1.7 mm) at which all groups fit the width
  const sections: Section[] = [
    { cols: NODE_COLS, rows: all.filter((r) => r.kind === 'node'), groups: 1, shown: [] },
    { cols: PART_COLS, rows: all.filter((r) => r.kind === 'part'), groups: 1, shown: [] },
  ].filter((sec) => sec.rows.length > 0);
  // column widths at a 1 mm font (widths grow in proportion to the font size)
  const unitW = new Map<Section, number[]>();
  for (const sec of sections) {
    unitW.set(sec, sec.cols.map((c) => {
      let w = textWidth(c.head, 0.92, 'bold');
      for (const r of sec.rows) w = Math.max(w, textWidth(r[c.key], 1, c.key === 'name' ? 'sans' : 'mono'));
      return w;
    }));
  }
  const colW = (sec: Section, size: number) => unitW.get(sec)!.map((w) => w * size);
  const colGap = (size: number) => size * 1.4;
  const groupW = (sec: Section, size: number) => colW(sec, size).reduce((a, b) => a + b, 0) + colGap(size) * (sec.cols.length - 1);
  const GROUP_GAP = 6;
  const leadLines = wrap(lead, width, 2.2);
  const headH = 5.2 + leadLines.length * 3 + 1.2;
  const footH = 4.6 + couplingLines.length * 3.6;
  const rowsFit = (size: number) => Math.max(2, Math.floor((maxHeight - headH - footH) / (size * 1.5)) - 1);
  const totalW = (size: number) => sections.reduce((w, sec) => w + sec.groups * (groupW(sec, size) + GROUP_GAP), -GROUP_GAP);
  let size = 2.5;
  for (;;) {
    for (const sec of sections) sec.groups = Math.max(1, Math.ceil(sec.rows.length / rowsFit(size)));
    if (totalW(size) <= width || size <= 1.7) break;
    size = Math.round((size - 0.1) * 10) / 10;
  }
  // still too wide at the smallest font: fewer groups (parts first give way), and the rows that do not fit are left out
  while (totalW(size) > width && sections.some((sec) => sec.groups > 1)) {
    const sec = [...sections].reverse().find((x) => x.groups > 1)!;
    sec.groups--;
  }
  const cap = rowsFit(size);
  let omitted = 0;
  for (const sec of sections) {
    sec.shown = sec.rows.length <= sec.groups * cap ? sec.rows : sec.rows.slice(0, sec.groups * (cap - 1));
    omitted += sec.rows.length - sec.shown.length;
  }
  const rh = size * 1.5;
  const tallest = Math.max(...sections.map((sec) => Math.ceil(sec.shown.length / sec.groups)), 0);
  const height = headH + (tallest + 1 + (omitted ? 1 : 0)) * rh + footH;

  const render = (x: number, y: number) => {
    const out: string[] = [`<g id="results">`];
    out.push(t('Results', x, y + 4, 3.2, { face: 'bold' }));
    leadLines.forEach((l, i) => out.push(t(l, x, y + 7.6 + i * 3, 2.2, { fill: PRINT.label, cls: 'convention' })));
    const top = y + headH;
    let gx = x;
    let bottom = top;
    for (const sec of sections) {
      const widths = colW(sec, size);
      const gw = groupW(sec, size);
      const per = Math.ceil(sec.shown.length / sec.groups);
      for (let g = 0; g < sec.groups; g++) {
        const part = sec.shown.slice(g * per, (g + 1) * per);
        const xs: number[] = [];
        let cx = gx;
        for (let c = 0; c < sec.cols.length; c++) {
          xs.push(cx);
          cx += widths[c] + colGap(size);
        }
        const right = gx + gw + 1;
        let cy = top;
        out.push(rect(gx, cy, right - gx, rh, `fill="${PRINT.band}"`));
        sec.cols.forEach((c, k) => out.push(t(c.head, xs[k] + 0.4, cy + rh * 0.7, size * 0.92, { face: 'bold', fill: PRINT.label })));
        cy += rh;
        out.push(hline(gx, right, cy, PRINT.frame, 0.3));
        for (const r of part) {
          out.push(`<g class="row" data-kind="${r.kind}" data-name="${escAttr(r.name)}">`);
          sec.cols.forEach((c, k) => {
            const v = r[c.key];
            if (v === '') return;
            const fill = c.key === 'i' ? PRINT.current : c.key === 'v' && r.kind === 'node' ? PRINT.voltage : PRINT.ink;
            out.push(t(v, xs[k] + 0.4, cy + rh * 0.72, size, { face: c.key === 'name' ? 'sans' : 'mono', cls: `cell ${c.key}`, fill }));
          });
          out.push('</g>');
          cy += rh;
          out.push(hline(gx, right, cy, PRINT.rule, 0.15));
        }
        bottom = Math.max(bottom, cy);
        gx += gw + GROUP_GAP;
      }
    }
    let cy = bottom;
    if (omitted) {
      out.push(t(`… ${omitted} more rows do not fit on this page; the app's readings and the command line's solve list them all.`, x, cy + rh * 0.72, size * 0.9, { fill: PRINT.caution }));
      cy += rh;
    }
    out.push(t(summary, x, cy + 3.8, 2.3, { fill: PRINT.ink, cls: 'summary' }));
    couplingLines.forEach((l, i) => out.push(t(l, x, cy + 7.4 + i * 3.6, 2.3, { fill: PRINT.coupling, cls: 'coupling-row' })));
    out.push('</g>');
    return out.join('\n');
  };
  return { height, render };
}

/** One line per practical transformer: its report at the solved operating point. */
export function transformerSummary(circuit: DerivedCircuit, result: SolveResult): string[] {
  const out: string[] = [];
  for (const part of circuit.source.parts) {
    const x = circuit.expansions.get(part.id);
    if (!x || !part.power || !x.elements.every((e) => result.elements[e.id])) continue;
    out.push(powerReportLine(part.ref, part.power, powerReport(part.power, x, result)));
  }
  return out;
}

/**
 * One line per coupling, named by its windings: both self-inductances, M and
 * k (M = k·√(L1·L2), field notes) and the effective turns ratio √(L1/L2)
 * (inductance goes with the turns squared; common practice).
 */
export function couplingSummary(circuit: DerivedCircuit): string[] {
  const sheet = circuit.source;
  const out: string[] = [];
  for (const cp of sheet.couplings) {
    const f = pairFigures(sheet, cp);
    if (!f) continue;
    const [a, b] = windingRefs(sheet, cp);
    out.push(`${couplingTitle(sheet, cp)}: ${a} = ${formatSI(f.l1, 'H', 4)}, ${b} = ${formatSI(f.l2, 'H', 4)}, ${couplingName(sheet, cp, 'M')} = ${formatSI(f.m, 'H', 4)}, ${couplingName(sheet, cp, 'k')} = ${Number(f.k.toPrecision(4))}, effective turns ratio √(${a}/${b}) = ${f.ratio}`);
  }
  return out;
}
