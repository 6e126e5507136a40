/** Designators: R1, L1, C1, V1, I1, T1; unique on a sheet (couplings are named by their windings). */
import { nameProblem } from './names';
import type { Sheet } from './sheet';

export function usedRefs(sheet: Sheet): Set<string> {
  const s = new Set<string>();
  for (const p of sheet.parts) if (p.ref) s.add(p.ref.toUpperCase());
  return s;
}

export function nextRef(prefix: string, used: Set<string>): string {
  if (!prefix) return '';
  for (let n = 1; ; n++) {
    const r = `${prefix}${n}`;
    if (!used.has(r.toUpperCase())) {
      used.add(r.toUpperCase());
      return r;
    }
  }
}

/** Reason a designator cannot be given to `ownerId`, or null when it can. */
export function refProblem(sheet: Sheet, ownerId: string, ref: string): string | null {
  const r = ref.trim();
  if (!r) return 'A designator cannot be empty';
  const problem = nameProblem(r);
  if (problem) return `A designator ${problem}`;
  if (r.toLowerCase() === 'gnd') return '"gnd" is the ground node name';
  const clash = sheet.parts.find((p) => p.id !== ownerId && p.ref.toUpperCase() === r.toUpperCase());
  if (clash) return `${r} is already used on this sheet; designators must be unique`;
  return null;
}
