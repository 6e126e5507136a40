/** SI-prefixed numbers: formatting for display, and the fast path of parsing. */

const PREFIX: Record<string, number> = {
  f: 1e-15, p: 1e-12, n: 1e-9, u: 1e-6, 'µ': 1e-6, 'μ': 1e-6, m: 1e-3, k: 1e3, K: 1e3, M: 1e6, G: 1e9, T: 1e12,
};

const DISPLAY: [number, string][] = [
  [1e12, 'T'], [1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p'], [1e-15, 'f'],
];

/** Unit symbols the parser accepts after a number, by the quantity's canonical unit. */
const UNIT_ALIASES: Record<string, string[]> = {
  'Ω': ['Ω', 'ω', 'ohms', 'ohm', 'Ohm', 'R'],
  H: ['H', 'h'],
  F: ['F'],
  V: ['V', 'v'],
  A: ['A'],
  Hz: ['Hz', 'hz', 'HZ'],
  '°': ['°', 'deg'],
  '': [],
};

/** The SI prefix a value is shown with, and its scale (0.0047 → "m", 1e-3). */
export function siScale(v: number): { scale: number; prefix: string } {
  const a = Math.abs(v);
  let scale = 1;
  let prefix = '';
  for (const [s, p] of DISPLAY) {
    scale = s;
    prefix = p;
    if (a >= s * 0.99995) break;
  }
  return { scale, prefix };
}

/** Format with an SI prefix and `digits` significant figures, e.g. 0.0047 H → "4.7 mH". */
export function formatSI(v: number, unit: string, digits = 4): string {
  if (!Number.isFinite(v)) return `— ${unit}`.trim();
  if (v === 0) return unit ? `0 ${unit}` : '0';
  const { scale, prefix: pre } = siScale(v);
  const n = v / scale;
  let txt = Number(n.toPrecision(digits)).toString();
  if (txt.includes('e')) txt = n.toPrecision(digits);
  return unit || pre ? `${txt} ${pre}${unit}` : txt;
}

/**
 * Number for editing fields: with an SI prefix and no unit for quantities
 * with a unit ("4.7m" for 4.7 mH); plain for pure numbers and angles ("0.995", "-30").
 */
export function formatEditable(v: number, unit = 'x'): string {
  if (unit === '' || unit === '°') return Number(v.toPrecision(9)).toString();
  return formatSI(v, '', 6).replace(' ', '');
}

/** An angle in degrees to one decimal, in the one range (-180°, 180°]: a half turn reads 180.0°, never -180.0°. */
export function formatAngle(deg: number): string {
  let d = Math.round(wrapDeg(deg) * 10) / 10;
  if (d <= -180) d += 360;
  if (d === 0) d = 0; // no "-0.0°"
  return `${d.toFixed(1)}°`;
}

/** An angle in degrees wrapped into (-180°, 180°]. */
export function wrapDeg(deg: number): number {
  const d = ((deg + 180) % 360 + 360) % 360 - 180;
  return d === -180 ? 180 : d;
}

function stripUnit(text: string, unit: string): string {
  const t = text.trim();
  for (const alias of UNIT_ALIASES[unit] ?? [unit]) {
    if (alias && t.endsWith(alias)) {
      const rest = t.slice(0, -alias.length);
      // keep "m" of "mH" etc.: only strip when what is left still ends in a digit, a prefix or a space
      if (/[\d.\sfpnuµμmkKMGT)]$/.test(rest)) return rest.trim();
    }
  }
  return t;
}

const SIMPLE = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([fpnuµμmkKMGT]?)$/;

/**
 * Parse the plain form (number, optional SI prefix, optional unit). Returns
 * null when the text is not of that form (it may still be an expression).
 */
export function parseSimple(text: string, unit: string): number | null {
  const m = SIMPLE.exec(stripUnit(text, unit));
  if (!m) return null;
  const v = Number(m[1]) * (m[2] ? PREFIX[m[2]] : 1);
  return Number.isFinite(v) ? v : null;
}

/** Rewrite prefixed numbers inside an expression (`4.7m*2` → `(4.7e-3)*2`). */
export function expandPrefixes(text: string, unit: string): string {
  const body = stripUnit(text, unit);
  return body.replace(/(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s*([fpnuµμmkKMGT])(?![A-Za-z_µμ])/g, (_all, n: string, e: string | undefined, p: string) => {
    return `(${n}${e ?? ''}*${PREFIX[p]})`;
  });
}
