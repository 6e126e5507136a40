/** Magnitude and angle of phasors as the result interchange writes them. */
import type { ComplexJson } from './graph';

export const mag = (z: ComplexJson) => Math.hypot(z.re, z.im);
export const angleDeg = (z: ComplexJson) => (Math.atan2(z.im, z.re) * 180) / Math.PI;
