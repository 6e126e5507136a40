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

export function parseValue(text: string, unit: string): ValueParse {
  const t = text.trim();
  if (t === '') return { ok: false, reason: 'enter a value' };
  const simple = parseSimple(t, unit);
  if (simple !== null) return { ok: true, value: simple };
  let v: unknown;
  try {
    v = math.evaluate(expandPrefixes(t, unit));
  } catch (e) {
    const msg = e instanceof Error ? e.message : String(e);
    return { ok: false, reason: `not a number or expression (${msg.split('\n')[0].slice(0, 80)})` };
  }
  if (typeof v !== 'number') return { ok: false, reason: 'the expression does not give a plain number' };
  if (!Number.isFinite(v)) return { ok: false, reason: 'the expression does not give a finite number' };
  return { ok: true, value: v };
}
