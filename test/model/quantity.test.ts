import { describe, expect, it } from 'vitest';
import { parseValue } from '../../src/model/expr';
import { formatSI, formatAngle } from '../../src/model/quantity';

const ok = (t: string, unit: string) => {
  const r = parseValue(t, unit);
  if (!r.ok) throw new Error(r.reason);
  return r.value;
};

describe('value entry', () => {
  it('reads SI prefixes and units', () => {
    expect(ok('4.7m', 'H')).toBeCloseTo(4.7e-3, 15); // milli = 1e-3 (SI)
    expect(ok('4.7 mH', 'H')).toBeCloseTo(4.7e-3, 15);
    expect(ok('10k', 'Ω')).toBe(1e4);
    expect(ok('2.2µF', 'F')).toBeCloseTo(2.2e-6, 18);
    expect(ok('2.2u', 'F')).toBeCloseTo(2.2e-6, 18);
    expect(ok('85 kHz', 'Hz')).toBe(85e3);
    expect(ok('1M', 'Ω')).toBe(1e6); // capital M is mega
    expect(ok('230', 'V')).toBe(230);
    expect(ok('-30°', '°')).toBe(-30);
  });

  it('evaluates simple expressions', () => {
    expect(ok('1/(2*pi*50)', 'H')).toBeCloseTo(1 / (2 * Math.PI * 50), 15); // closed form
    expect(ok('2*4.7m', 'H')).toBeCloseTo(9.4e-3, 15);
    expect(ok('sqrt(2)*230', 'V')).toBeCloseTo(Math.SQRT2 * 230, 12);
  });

  it('refuses what is not a number, with a reason', () => {
    const r = parseValue('abc', 'Ω');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toBe('"abc" is not a value: "abc" is not a known name (numbers may carry a prefix like 4.7m; expressions may use pi, e, sqrt, sin, cos, tan, log, log10, exp, abs)');
    expect(parseValue('', 'Ω').ok).toBe(false);
    expect(parseValue('1/0', 'Ω').ok).toBe(false);
  });

  it('reads turns ratios as the trade writes them, and never shows the expression library\'s own text', () => {
    expect(ok('1:200', '')).toBeCloseTo(1 / 200, 15); // a 1:200 current transformer: primary turns over secondary turns
    expect(ok('1000:5', '')).toBe(200);
    expect(ok('2.5:1', '')).toBe(2.5);
    expect(ok('1 : 200', '')).toBeCloseTo(0.005, 15);
    for (const bad of ['1:0', '1:2:3', 'n:1', '1:', '2*(3', 'x+1']) {
      const r = parseValue(bad, '');
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.reason.startsWith(`"`)).toBe(true); // names the text refused
        expect(r.reason).not.toMatch(/is not a function|Unexpected|SyntaxError|Undefined symbol|char \d/);
      }
    }
  });

  it('formats with SI prefixes', () => {
    expect(formatSI(0.0047, 'H')).toBe('4.7 mH');
    expect(formatSI(58.43e-9, 'F')).toBe('58.43 nF');
    expect(formatSI(230, 'V')).toBe('230 V');
    expect(formatSI(85000, 'Hz')).toBe('85 kHz');
    expect(formatAngle(-174.52)).toBe('-174.5°');
    expect(formatAngle(190)).toBe('-170.0°'); // angles wrap into (-180°, 180°]
    // a half turn has one name, whichever side rounding leaves it on
    expect(formatAngle(-180)).toBe('180.0°');
    expect(formatAngle(180)).toBe('180.0°');
    expect(formatAngle(-179.96)).toBe('180.0°');
    expect(formatAngle(179.96)).toBe('180.0°');
    expect(formatAngle(-0.01)).toBe('0.0°');
  });
});

describe('editable numbers', () => {
  it('keep prefixes for quantities and plain figures for k, ratios and angles', async () => {
    const { formatEditable } = await import('../../src/model/quantity');
    expect(formatEditable(0.0047, 'H')).toBe('4.7m');
    expect(formatEditable(85000, 'Hz')).toBe('85k');
    expect(formatEditable(0.995, '')).toBe('0.995');
    expect(formatEditable(-30, '°')).toBe('-30');
  });
});

describe('rectangular readouts', () => {
  it('share one SI prefix chosen by the magnitude', async () => {
    const { rectText, phasorText } = await import('../../src/model/drawLayout');
    expect(rectText({ re: 2.05, im: -0.447 }, 'A')).toBe('2.05 − j0.447 A');
    expect(rectText({ re: 0.1, im: 0.05 }, 'A')).toBe('100 + j50 mA'); // |z| = 111.8 mA picks milli
    expect(phasorText({ re: 0, im: 2 }, 'V')).toBe('2 V ∠90.0°');
    expect(phasorText({ re: 0, im: 2 }, 'V', 4, 'rect')).toBe('0 + j2 V');
  });
});
