/** Phasor text for the analysis views: magnitude∠angle and R + jX. */
import type { ComplexJson } from '../../model/graph';
import { formatAngle, formatSI } from '../../model/quantity';

export const cabs = (z: ComplexJson) => Math.hypot(z.re, z.im);
export const cdeg = (z: ComplexJson) => (Math.atan2(z.im, z.re) * 180) / Math.PI;

export function polarText(z: ComplexJson | null, unit: string): string {
  if (!z) return 'open (no current flows)';
  const m = cabs(z);
  return m === 0 ? `0 ${unit}` : `${formatSI(m, unit, 4)} ∠${formatAngle(cdeg(z))}`;
}

export function rectangularText(z: ComplexJson | null, unit: string): string {
  if (!z) return '—';
  // a part below a billionth of the whole is rounding, shown as 0
  const tiny = 1e-9 * cabs(z);
  const re = Math.abs(z.re) < tiny ? 0 : z.re;
  const im = Math.abs(z.im) < tiny ? 0 : z.im;
  return `${formatSI(re, unit, 4)} ${im < 0 ? '−' : '+'} j${formatSI(Math.abs(im), unit, 4)}`;
}
