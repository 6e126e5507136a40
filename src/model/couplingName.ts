/**
 * A coupling is named by the windings it joins, in the trade's notation:
 * k₁₂ or M₁₂ when the windings are L1 and L2 (one letter, numbered), else
 * k(Lp,Ls). It has no designator of its own; its graph-model id is the
 * winding names joined by "~" ("L1~L2").
 */
import { formatSI } from './quantity';
import type { Sheet, SheetCoupling } from './sheet';

const SUB = '₀₁₂₃₄₅₆₇₈₉';

export function windingRefs(sheet: Pick<Sheet, 'parts'>, cp: SheetCoupling): string[] {
  return cp.windings.map((id) => sheet.parts.find((p) => p.id === id)?.ref || '?');
}

/** "₁₂" for L1 and L2; "(Lp,Ls)" when the names do not share one letter and single digits. */
export function pairSubscript(refs: string[]): string {
  const m = refs.map((r) => /^([A-Za-z]+)(\d)$/.exec(r));
  if (m.every((x) => x && x[1] === m[0]![1])) return m.map((x) => SUB[Number(x![2])]).join('');
  return `(${refs.join(',')})`;
}

/** The quantity's name: "k₁₂", "M₁₂", "k(Lp,Ls)". */
export function couplingName(sheet: Pick<Sheet, 'parts'>, cp: SheetCoupling, symbol: 'k' | 'M' = cp.by): string {
  return `${symbol}${pairSubscript(windingRefs(sheet, cp))}`;
}

/** The graph-model id of a coupling: its windings' names joined by "~". */
export function couplingGraphId(sheet: Pick<Sheet, 'parts'>, cp: SheetCoupling): string {
  return windingRefs(sheet, cp).join('~');
}

/** The label drawn on the sheet: "k₁₂ = 0.995" or "M₁₂ = 49.75 mH". */
export function couplingText(sheet: Pick<Sheet, 'parts'>, cp: SheetCoupling): string {
  return `${couplingName(sheet, cp)} = ${cp.by === 'k' ? Number(cp.value.toPrecision(4)) : formatSI(cp.value, 'H', 4)}`;
}

/** The same with the winding names spelled out, for panels and tables: "k₁₂ (L1–L2) = 0.995". */
export function couplingTitle(sheet: Pick<Sheet, 'parts'>, cp: SheetCoupling): string {
  const refs = windingRefs(sheet, cp);
  const name = couplingName(sheet, cp);
  return name.includes('(') ? name : `${name} (${refs.join('–')})`;
}
