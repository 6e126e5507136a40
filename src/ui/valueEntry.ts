/** Value entry through the lazily loaded expression module (mathjs stays out of the first load). */
import type { ValueParse } from '../model/expr';

let mod: Promise<typeof import('../model/expr')> | null = null;

export function preloadExpr(): void {
  mod ??= import('../model/expr');
}

export async function parseEntry(text: string, unit: string): Promise<ValueParse> {
  preloadExpr();
  return (await mod!).parseValue(text, unit);
}
