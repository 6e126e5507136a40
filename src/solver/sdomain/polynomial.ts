/** Real polynomials from roots, highest power first, and complex helpers for the s-domain. */
import type { Roots } from './pencil';

export interface C { re: number; im: number }

export const cmul = (a: C, b: C): C => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
export const cdiv = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};

/**
 * Monic real polynomial Π(s − r) of roots given with their conjugates (a
 * complex root with im > 0 is paired with its conjugate, which must follow in
 * the list somewhere). Coefficients highest power first.
 */
export function monicFromRoots(roots: Roots): number[] {
  let p = [1];
  const used = new Uint8Array(roots.re.length);
  const mul = (q: number[]) => {
    const out = new Array(p.length + q.length - 1).fill(0);
    for (let i = 0; i < p.length; i++) for (let j = 0; j < q.length; j++) out[i + j] += p[i] * q[j];
    p = out;
  };
  for (let i = 0; i < roots.re.length; i++) {
    if (used[i]) continue;
    used[i] = 1;
    const re = roots.re[i];
    const im = roots.im[i];
    if (im === 0) {
      mul([1, -re]);
      continue;
    }
    let mate = -1;
    for (let j = i + 1; j < roots.re.length; j++) {
      if (!used[j] && roots.re[j] === re && roots.im[j] === -im) {
        mate = j;
        break;
      }
    }
    if (mate >= 0) used[mate] = 1;
    // (s − r)(s − r̄) = s² − 2·Re r·s + |r|²; an unpaired complex root keeps its real part only
    if (mate >= 0) mul([1, -2 * re, re * re + im * im]);
    else mul([1, -re]);
  }
  return p;
}

/** Π(s − r) at a complex s. */
export function rootProduct(roots: Roots, s: C): C {
  let acc: C = { re: 1, im: 0 };
  for (let i = 0; i < roots.re.length; i++) acc = cmul(acc, { re: s.re - roots.re[i], im: s.im - roots.im[i] });
  return acc;
}
