/**
 * Value entry: `4.7m`, `4.7 mH`, `1/(2*pi*50)`. Plain numbers take the fast
 * path; expressions are evaluated by a mathjs instance built with only the
 * functions offered here (the UI loads this module lazily).
 */
import {
  create, evaluateDependencies, addDependencies, subtractDependencies, multiplyDependencies,
  divideDependencies, powDependencies, sqrtDependencies, unaryMinusDependencies, unaryPlusDependencies,
  piDependencies, eDependencies, sinDependencies, cosDependencies, tanDependencies, log10Dependencies,
  logDependencies, expDependencies, absDependencies,
} from 'mathjs';
import { expandPrefixes, parseSimple } from './quantity';

const math = create({
  evaluateDependencies, addDependencies, subtractDependencies, multiplyDependencies, divideDependencies,
  powDependencies, sqrtDependencies, unaryMinusDependencies, unaryPlusDependencies, piDependencies, eDependencies,
  sinDependencies, cosDependencies, tanDependencies, log10Dependencies, logDependencies, expDependencies, absDependencies,
}, { number: 'number' });

export type ValueParse = { ok: true; value: number } | { ok: false; reason: string };

const NAMES = new Set(['pi', 'e', 'sqrt', 'sin', 'cos', 'tan', 'log', 'log10', 'exp', 'abs']);

/**
 * Why a text is not a value, in our own words (the expression library's
 * messages never reach the user): a name we do not know, or the form.
 */
function whyNot(t: string): string {
  const unknown = (t.match(/[A-Za-z_µμΩ°][A-Za-z0-9_]*/g) ?? []).find((w) => !NAMES.has(w) && !/^[fpnuµμmkKMGT]$/.test(w));
  if (unknown) return `"${t}" is not a value: "${unknown}" is not a known name (numbers may carry a prefix like 4.7m; expressions may use pi, e, sqrt, sin, cos, tan, log, log10, exp, abs)`;
  return `"${t}" is not a value: write a number (4.7m, 4.7 mH), an expression like 1/(2*pi*50), or a ratio like 1:200`;
}

function evaluate(t: string, unit: string): ValueParse {
  const simple = parseSimple(t, unit);
  if (simple !== null) return { ok: true, value: simple };
  let v: unknown;
  try {
    v = math.evaluate(expandPrefixes(t, unit));
  } catch {
    return { ok: false, reason: whyNot(t) };
  }
  if (typeof v !== 'number') return { ok: false, reason: `"${t}" does not give a plain number` };
  if (!Number.isFinite(v)) return { ok: false, reason: `"${t}" does not give a finite number` };
  return { ok: true, value: v };
}

/**
 * A number, a prefixed number, an expression, or a ratio as the trade writes
 * it ("1:200", "1000:5", "2.5:1"), which is the first side over the second.
 */
export function parseValue(text: string, unit: string): ValueParse {
  const t = text.trim();
  if (t === '') return { ok: false, reason: 'enter a value' };
  const sides = t.split(':');
  if (sides.length === 2) {
    const a = evaluate(sides[0].trim(), unit);
    const b = evaluate(sides[1].trim(), unit);
    if (!a.ok) return a;
    if (!b.ok) return b;
    if (!(a.value > 0 && b.value > 0)) return { ok: false, reason: `"${t}": both sides of a ratio must be more than zero` };
    return { ok: true, value: a.value / b.value };
  }
  if (sides.length > 2) return { ok: false, reason: `"${t}" is not a value: a ratio has two sides, like 1:200` };
  return evaluate(t, unit);
}
