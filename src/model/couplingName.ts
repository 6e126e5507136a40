/**
 * A coupling is named by the windings it joins, in the trade's notation:
 * k₁₂ or M₁₂ when the windings are L1 and L2 (one letter, numbered), else
 * k(Lp,Ls). It has no designator of its own; its graph-model id is the
 * winding names joined by "~" ("L1~L2").
 */
import { formatSI } from './quantity';
import { mutualLimit } from './mutual';
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

/**
 * A coupled pair's figures: both self-inductances, k and M (M = k·√(L1·L2),
 * field notes) and the effective turns ratio √(L1/L2) (inductance goes with
 * the turns squared; common practice), written as the trade writes a ratio.
 */
export function pairFigures(sheet: Pick<Sheet, 'parts'>, cp: SheetCoupling): { l1: number; l2: number; k: number; m: number; ratio: string } | null {
  const ws = cp.windings.map((id) => sheet.parts.find((p) => p.id === id));
  if (ws.length !== 2 || !ws[0] || !ws[1]) return null;
  const [l1, l2] = ws.map((w) => w!.value ?? 0);
  const root = mutualLimit(l1, l2);
  const k = cp.by === 'k' ? cp.value : root > 0 ? cp.value / root : 0;
  const m = cp.by === 'M' ? cp.value : cp.value * root;
  const n = l2 > 0 ? Math.sqrt(l1 / l2) : 0;
  const ratio = n >= 1 ? `${Number(n.toPrecision(4))} : 1` : n > 0 ? `1 : ${Number((1 / n).toPrecision(4))}` : '—';
  return { l1, l2, k, m, ratio };
}

/**
 * The line drawn under a pair's link in the editor: "√(L₁/L₂) = 2 : 1 · k = 0.998",
 * L₁ the first winding the link names (kept short whatever the windings' names).
 */
export function couplingNote(sheet: Pick<Sheet, 'parts'>, cp: SheetCoupling): string {
  const f = pairFigures(sheet, cp);
  if (!f) return '';
  return `√(L₁/L₂) = ${f.ratio} · k = ${Number(f.k.toPrecision(4))}`;
}
