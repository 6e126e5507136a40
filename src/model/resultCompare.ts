/** How far two solve results of related circuits differ on the parts they share. */
import type { ComplexJson, SolveResult } from './graph';

const abs = (a: ComplexJson) => Math.hypot(a.re, a.im);

/**
 * Largest relative difference between the element voltages and currents two
 * results share (each kind scaled by its own largest magnitude so that
 * near-zero quantities do not blow up the ratio). `skipVoltage`: elements
 * whose own voltage is not a port quantity (the arms that replace windings);
 * `reversed`: elements whose reference direction runs the other way after;
 * `renamed`: elements that go by another name after (a winding and the arm
 * that takes its place).
 */
export function portAgreement(before: SolveResult, after: SolveResult, skipVoltage: Set<string> = new Set(), reversed: Set<string> = new Set(), renamed: Record<string, string> = {}): { maxRel: number; compared: number } {
  const pairs: { a: ComplexJson; b: ComplexJson; kind: 'v' | 'i' }[] = [];
  for (const [id, r] of Object.entries(before.elements)) {
    const q = after.elements[renamed[id] ?? id];
    if (!q) continue;
    if ('voltage' in r && 'voltage' in q) {
      if (!skipVoltage.has(id)) pairs.push({ a: r.voltage, b: q.voltage, kind: 'v' });
      const sign = reversed.has(id) ? -1 : 1;
      pairs.push({ a: r.current, b: { re: sign * q.current.re, im: sign * q.current.im }, kind: 'i' });
    } else if ('voltages' in r && 'voltages' in q) {
      for (let s = 0; s < 2; s++) pairs.push({ a: r.voltages[s], b: q.voltages[s], kind: 'v' }, { a: r.currents[s], b: q.currents[s], kind: 'i' });
    }
  }
  const scale = { v: 0, i: 0 };
  for (const p of pairs) scale[p.kind] = Math.max(scale[p.kind], abs(p.a), abs(p.b));
  let maxRel = 0;
  for (const p of pairs) {
    const s = Math.max(abs(p.a), abs(p.b), 1e-9 * scale[p.kind]);
    if (s > 0) maxRel = Math.max(maxRel, Math.hypot(p.a.re - p.b.re, p.a.im - p.b.im) / s);
  }
  return { maxRel, compared: pairs.length };
}
