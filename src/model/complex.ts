/** Complex arithmetic on { re, im } pairs, for the few closed forms the model layer works out itself. */
export interface C { re: number; im: number }

export const cadd = (a: C, b: C): C => ({ re: a.re + b.re, im: a.im + b.im });
export const csub = (a: C, b: C): C => ({ re: a.re - b.re, im: a.im - b.im });
export const cmul = (a: C, b: C): C => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
export const cdiv = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
/** The principal square root (real part >= 0). */
export function csqrt(a: C): C {
  const m = Math.hypot(a.re, a.im);
  const re = Math.sqrt((m + a.re) / 2);
  const im = Math.sqrt(Math.max(0, (m - a.re) / 2));
  return { re, im: a.im < 0 ? -im : im };
}
export const cabs = (a: C) => Math.hypot(a.re, a.im);
export const cconjMul = (a: C, b: C): C => ({ re: a.re * b.re + a.im * b.im, im: a.im * b.re - a.re * b.im });
