/** Prefixed ids (`part:…`, `wire:…`, `coupling:…`, `sheet:…`), deterministic when seeded (tests). */

export type IdPrefix = 'part' | 'wire' | 'coupling' | 'sheet';

let state = (Math.random() * 2 ** 32) >>> 0;

/** Seed the generator so that ids repeat from run to run (used by tests). */
export function seedIds(seed: number): void {
  state = seed >>> 0;
}

function next(): number {
  // mulberry32
  state = (state + 0x6d2b79f5) >>> 0;
  let t = state;
  t = Math.imul(t ^ (t >>> 15), t | 1);
  t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
  return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
}

const ALPHABET = '0123456789abcdefghijklmnopqrstuvwxyz';

export function newId(prefix: IdPrefix): string {
  let s = '';
  for (let i = 0; i < 10; i++) s += ALPHABET[Math.floor(next() * 36)];
  return `${prefix}:${s}`;
}

export function idPrefix(id: string): IdPrefix | null {
  const p = id.slice(0, id.indexOf(':'));
  return p === 'part' || p === 'wire' || p === 'coupling' || p === 'sheet' ? p : null;
}
