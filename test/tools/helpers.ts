import type { PointerInput } from '../../src/tools/machine';

/** A synthetic pointer event at sheet point (x, y), with the view at zoom 1 and no offset. */
export function at(x: number, y: number, extra: Partial<PointerInput> = {}): PointerInput {
  return { x, y, sx: x, sy: y, button: 0, shift: false, mod: false, alt: false, detail: 1, ...extra };
}

export const key = (k: string, extra: Partial<{ shift: boolean; mod: boolean; alt: boolean }> = {}) => ({ key: k, shift: false, mod: false, alt: false, ...extra });
