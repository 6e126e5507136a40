import { expect } from 'vitest';
import type { ComplexJson, GraphModel, GraphElement, Coupling, TwoTerminalResult, SolveResult } from '../src/model/graph';

/** Complex closeness on real and imaginary parts with a relative epsilon (style of mathjs tools/approx). */
export function expectComplexClose(actual: ComplexJson, expected: ComplexJson, rel = 1e-9, abs = 1e-12): void {
  const scale = Math.max(Math.hypot(expected.re, expected.im), Math.hypot(actual.re, actual.im));
  const tol = rel * scale + abs;
  const err = Math.hypot(actual.re - expected.re, actual.im - expected.im);
  if (!(err <= tol)) {
    throw new Error(`expected ${fmtC(actual)} to be within ${tol.toExponential(2)} of ${fmtC(expected)} (error ${err.toExponential(3)})`);
  }
  expect(err).toBeLessThanOrEqual(tol);
}

export function expectClose(actual: number, expected: number, rel = 1e-9, abs = 1e-12): void {
  const tol = rel * Math.max(Math.abs(expected), Math.abs(actual)) + abs;
  if (!(Math.abs(actual - expected) <= tol)) throw new Error(`expected ${actual} to be within ${tol} of ${expected}`);
}

const fmtC = (c: ComplexJson) => `${c.re}${c.im >= 0 ? '+' : ''}${c.im}j`;

export const cx = (re: number, im = 0): ComplexJson => ({ re, im });
export const cadd = (a: ComplexJson, b: ComplexJson): ComplexJson => cx(a.re + b.re, a.im + b.im);
export const csub = (a: ComplexJson, b: ComplexJson): ComplexJson => cx(a.re - b.re, a.im - b.im);
export const cmul = (a: ComplexJson, b: ComplexJson): ComplexJson => cx(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
export const cdiv = (a: ComplexJson, b: ComplexJson): ComplexJson => {
  const d = b.re * b.re + b.im * b.im;
  return cx((a.re * b.re + a.im * b.im) / d, (a.im * b.re - a.re * b.im) / d);
};
export const cscale = (a: ComplexJson, s: number): ComplexJson => cx(a.re * s, a.im * s);
export const cabs = (a: ComplexJson) => Math.hypot(a.re, a.im);

export function model(frequencyHz: number, elements: GraphElement[], couplings: Coupling[] = [], extra: Partial<GraphModel> = {}): GraphModel {
  return { schema: 'coilwright.graph/1', frequencyHz, amplitudes: 'rms', ground: 'gnd', elements, couplings, ...extra };
}

export function two(result: SolveResult, id: string): TwoTerminalResult {
  return result.elements[id] as TwoTerminalResult;
}

/** Largest |got − exact| over a time response's samples, and the largest |exact| (P of the contract's accuracy rule). */
export function worstDeviation(timesS: number[], got: number[], exact: (t: number) => number): { err: number; peak: number } {
  let err = 0;
  let peak = 0;
  timesS.forEach((t, k) => {
    const e = exact(t);
    err = Math.max(err, Math.abs(got[k] - e));
    peak = Math.max(peak, Math.abs(e));
  });
  return { err, peak };
}
