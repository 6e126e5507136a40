/**
 * A pair's coupling from bench readings (field notes, "Coupling from bench
 * readings"), and windings from turns on a core:
 *
 * - series aiding and opposing: L_aid − L_opp = 4M (common practice);
 * - one winding's inductance with the other open and shorted:
 *   k = √(1 − L_sc/L_oc) (from memory: shorting the partner leaves L(1 − k²));
 * - the voltage ratio under no load: driving winding 1 with winding 2 open,
 *   V2/V1 = M/L1 when the winding resistance is small against ωL1, so
 *   M = L1·V2/V1 (standard coupled-winding law, from memory);
 * - L = N²·A_L with A_L the core's inductance factor (common practice).
 *
 * Each returns k and M for the pair on the sheet, or a reason naming the reading at fault.
 */

export type BenchMethod = 'series' | 'open-short' | 'voltage-ratio';

export interface BenchReading {
  method: BenchMethod;
  /** series: L aiding, L opposing; open-short: L open, L shorted; voltage-ratio: V driven, V open */
  a: number;
  b: number;
  /** voltage-ratio: which winding is driven (0 or 1) */
  driven?: 0 | 1;
}

export type BenchAnswer = { ok: true; k: number; m: number; note?: string } | { ok: false; field: 'a' | 'b'; reason: string };

const fmt = (v: number) => Number(v.toPrecision(4)).toString();

export function couplingFromBench(r: BenchReading, l1: number, l2: number): BenchAnswer {
  const root = Math.sqrt(l1 * l2);
  if (!(l1 > 0 && l2 > 0)) return { ok: false, field: 'a', reason: 'Both windings need an inductance above zero first' };
  const bad = (field: 'a' | 'b', reason: string): BenchAnswer => ({ ok: false, field, reason });
  if (!(r.a > 0 && Number.isFinite(r.a))) return bad('a', `${FIELDS[r.method][0]} must be more than zero`);
  if (!(r.b >= 0 && Number.isFinite(r.b))) return bad('b', `${FIELDS[r.method][1]} must be zero or more`);
  let m: number;
  let note: string | undefined;
  if (r.method === 'series') {
    if (!(r.a > r.b)) return bad('a', 'The series-aiding inductance must be above the opposing one (swap them if the dots were the other way)');
    m = (r.a - r.b) / 4;
    // L_aid + L_opp = 2(L1 + L2): a check on the readings against the sheet's windings
    const sum = (r.a + r.b) / 2;
    const off = Math.abs(sum - (l1 + l2)) / (l1 + l2);
    if (off > 0.05) note = `(L_aid + L_opp)/2 = ${fmt(sum)} H differs from L1 + L2 = ${fmt(l1 + l2)} H on the sheet by ${fmt(off * 100)} %`;
  } else if (r.method === 'open-short') {
    if (!(r.b < r.a)) return bad('b', 'The inductance with the other winding shorted must be below the one with it open');
    const k = Math.sqrt(1 - r.b / r.a);
    m = k * root;
  } else {
    const driven = r.driven ?? 0;
    m = ((driven === 0 ? l1 : l2) * r.b) / r.a;
  }
  const k = m / root;
  if (k > 1 + 1e-12) return bad('b', `The readings give k = ${fmt(k)}, above 1: no pair of windings couples more than fully; check them against the windings' inductances`);
  return { ok: true, k: Math.min(1, k), m: Math.min(m, root), note };
}

/** The labels of the two readings of each method, with their units. */
export const FIELDS: Record<BenchMethod, [string, string, string]> = {
  series: ['L in series aiding', 'L in series opposing', 'H'],
  'open-short': ['L of one winding, the other open', 'L of the same winding, the other shorted', 'H'],
  'voltage-ratio': ['V across the driven winding', 'V across the open winding', 'V'],
};

/** L = N²·A_L (common practice). */
export const inductanceFromTurns = (turns: number, alH: number) => turns * turns * alH;
/** N = √(L/A_L). */
export const turnsFromInductance = (henries: number, alH: number) => Math.sqrt(henries / alH);
