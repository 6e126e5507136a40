/**
 * A practical two-winding transformer (field notes, "Practical transformers
 * and test data"): its data in any of three forms, and the conversions between
 * them. The one circuit all forms stand for is the exact equivalent circuit
 * (standard transformer equivalent circuit, from memory):
 *
 *     p1 ─ R1 ─ L1σ ─┬──────────┬─ ideal a:1 ─ R2 ─ L2σ ─ s1
 *                    Rc         Lm
 *     p2 ────────────┴──────────┴─ ideal ──────────────── s2
 *
 * with R1, L1σ, Rc and Lm on the primary side and R2, L2σ the secondary's own
 * values. The standard method derives it from the no-load test (the shunt
 * branch) and the short-circuit test (the series branch, split equally between
 * the sides when referred). The method is solved here exactly rather than to
 * first order, so the derived circuit gives back both test readings when the
 * tests are repeated on it: with the series halves Z (referred) and the shunt
 * impedance W, the no-load test sees Z + W and the short-circuit test
 * Z + Z·W/(Z + W); eliminating W leaves Z² − 2·Z·Znl + Zsc·Znl = 0, whose
 * small root is Z = Znl·(1 − √(1 − Zsc/Znl)) = Zsc/(1 + √(1 − Zsc/Znl)). Both tests, taken on either
 * side, see the same pair of impedances (the split is equal), so the side only
 * decides the referral by a².
 */
import { cadd, cdiv, cmul, csqrt, csub, type C } from './complex';

export type TestSide = 'primary' | 'secondary';
export type PowerForm = 'circuit' | 'tests' | 'perUnit';

export interface Rating {
  /** rated apparent power, VA */
  va: number;
  /** rated voltages, V RMS */
  v1: number;
  v2: number;
  /** rated frequency, Hz */
  hz: number;
}

/** Equivalent-circuit values: R and leakage L of each side (its own values), the shunt branch on the primary. */
export interface EquivalentCircuit {
  /** turns ratio N1/N2 */
  ratio: number;
  r1: number;
  r2: number;
  /** leakage inductances, H */
  l1: number;
  l2: number;
  /** magnetising inductance (primary), H; absent: no magnetising current */
  lm?: number;
  /** core-loss resistance (primary), Ω; absent: no core loss */
  rc?: number;
}

export interface TestReading {
  volts: number;
  amps: number;
  watts: number;
  side: TestSide;
}

export interface TestData {
  noLoad: TestReading;
  shortCircuit: TestReading;
}

export interface PerUnitData {
  /** impedance voltage, % of rated voltage at rated current */
  ukPct: number;
  /** whether the series resistance comes from X/R (else from the load loss) */
  byXr: boolean;
  xr: number;
  /** load loss at rated current, W */
  loadLossW: number;
  /** no-load current, % of rated current */
  i0Pct: number;
  /** no-load loss, W */
  p0W: number;
}

export interface PowerSpec {
  form: PowerForm;
  /** graph elements: exact circuit with an ideal transformer, or coupled windings with k and resistors */
  expansion: 'ratio' | 'coupled';
  rating: Rating;
  circuit?: EquivalentCircuit;
  tests?: TestData;
  perUnit?: PerUnitData;
}

/** Bad or inconsistent data, naming the field (a dotted path in the spec, e.g. "tests.shortCircuit.watts"). */
export class PowerDataError extends Error {
  constructor(readonly field: string, message: string) {
    super(message);
  }
}

const TWO_PI = 2 * Math.PI;
const fail = (field: string, message: string): never => { throw new PowerDataError(field, message); };
const fmt = (v: number) => Number(v.toPrecision(4)).toString();

function checkRating(r: Rating): void {
  if (!(r.va > 0 && Number.isFinite(r.va))) fail('rating.va', 'Rated power must be more than zero');
  if (!(r.v1 > 0 && Number.isFinite(r.v1))) fail('rating.v1', 'Rated primary voltage must be more than zero');
  if (!(r.v2 > 0 && Number.isFinite(r.v2))) fail('rating.v2', 'Rated secondary voltage must be more than zero');
  if (!(r.hz > 0 && Number.isFinite(r.hz))) fail('rating.hz', 'Rated frequency must be more than zero');
}

/** The impedance a test reading stands for, R + jX (inductive), refusing readings no impedance gives. */
function testImpedance(t: TestReading, at: string, name: string): C {
  if (!(t.volts > 0 && Number.isFinite(t.volts))) fail(`${at}.volts`, `${name} voltage must be more than zero`);
  if (!(t.amps > 0 && Number.isFinite(t.amps))) fail(`${at}.amps`, `${name} current must be more than zero`);
  if (!(t.watts >= 0 && Number.isFinite(t.watts))) fail(`${at}.watts`, `${name} power must be zero or more`);
  const s = t.volts * t.amps;
  if (t.watts > s) fail(`${at}.watts`, `${name} power (${fmt(t.watts)} W) is above the apparent power V·I (${fmt(s)} VA): no impedance takes more real power than V·I`);
  const r = t.watts / (t.amps * t.amps);
  const z = t.volts / t.amps;
  return { re: r, im: Math.sqrt(Math.max(0, z * z - r * r)) };
}

/** The equivalent circuit from the two tests (exact form of the standard method, see the header). */
export function circuitFromTests(rating: Rating, tests: TestData, at = 'tests'): EquivalentCircuit {
  checkRating(rating);
  const a = rating.v1 / rating.v2;
  const w = TWO_PI * rating.hz;
  const refer = (z: C, side: TestSide) => (side === 'secondary' ? { re: z.re * a * a, im: z.im * a * a } : z);
  const znl = refer(testImpedance(tests.noLoad, `${at}.noLoad`, 'No-load test'), tests.noLoad.side);
  const zsc = refer(testImpedance(tests.shortCircuit, `${at}.shortCircuit`, 'Short-circuit test'), tests.shortCircuit.side);
  if (!(Math.hypot(zsc.re, zsc.im) < Math.hypot(znl.re, znl.im))) {
    fail(`${at}.shortCircuit.volts`, 'The short-circuit test shows an impedance no smaller than the no-load test: check the readings and the sides they were taken on');
  }
  const one = { re: 1, im: 0 };
  // Znl·(1 − √(1 − Zsc/Znl)) written without the cancellation: Zsc / (1 + √(1 − Zsc/Znl))
  const z = cdiv(zsc, cadd(one, csqrt(csub(one, cdiv(zsc, znl)))));
  const tol = 1e-12 * Math.hypot(zsc.re, zsc.im);
  if (z.re < -tol) fail(`${at}.shortCircuit.watts`, `The tests give a negative winding resistance (${fmt(z.re)} Ω per side): the short-circuit power is too low for the no-load readings`);
  if (z.im < -tol) fail(`${at}.shortCircuit.volts`, `The tests give a negative leakage reactance (${fmt(z.im)} Ω per side): the short-circuit voltage is too low for its power`);
  const ym = cdiv(one, csub(znl, z));
  const tolY = 1e-12 * Math.hypot(ym.re, ym.im);
  if (ym.re < -tolY) fail(`${at}.noLoad.watts`, 'The tests give a negative core-loss resistance: the no-load power is too low for the winding resistance the short-circuit test shows');
  if (ym.im > tolY) fail(`${at}.noLoad.amps`, 'The tests give a negative magnetising reactance: check the no-load current and power');
  const r = Math.max(0, z.re), x = Math.max(0, z.im);
  const out: EquivalentCircuit = { ratio: a, r1: r, r2: r / (a * a), l1: x / w, l2: x / (w * a * a) };
  if (ym.im < -tolY) out.lm = -1 / (w * ym.im);
  if (ym.re > tolY) out.rc = 1 / ym.re;
  return out;
}

function checkCircuit(c: EquivalentCircuit, at = 'circuit'): void {
  if (!(c.ratio > 0 && Number.isFinite(c.ratio))) fail(`${at}.ratio`, 'Turns ratio must be more than zero');
  const nonNeg: [keyof EquivalentCircuit, string][] = [['r1', 'Primary resistance R1'], ['r2', 'Secondary resistance R2'], ['l1', 'Primary leakage L1σ'], ['l2', 'Secondary leakage L2σ']];
  for (const [k, name] of nonNeg) if (!((c[k] as number) >= 0 && Number.isFinite(c[k] as number))) fail(`${at}.${k}`, `${name} must be zero or more`);
  if (c.lm !== undefined && !(c.lm > 0 && Number.isFinite(c.lm))) fail(`${at}.lm`, 'Magnetising inductance Lm must be more than zero (leave it empty for none)');
  if (c.rc !== undefined && !(c.rc > 0 && Number.isFinite(c.rc))) fail(`${at}.rc`, 'Core-loss resistance Rc must be more than zero (leave it empty for none)');
}

/** The series impedances (primary-referred) and the shunt admittance at a frequency. */
export function branches(c: EquivalentCircuit, hz: number): { z1: C; z2: C; ym: C } {
  const w = TWO_PI * hz;
  const a2 = c.ratio * c.ratio;
  return {
    z1: { re: c.r1, im: w * c.l1 },
    z2: { re: a2 * c.r2, im: a2 * w * c.l2 },
    ym: { re: c.rc ? 1 / c.rc : 0, im: c.lm ? -1 / (w * c.lm) : 0 },
  };
}

/** The two tests repeated on the circuit, on the primary at rated voltage and rated current. */
export function testsFromCircuit(rating: Rating, c: EquivalentCircuit): TestData {
  checkRating(rating);
  checkCircuit(c);
  const { z1, z2, ym } = branches(c, rating.hz);
  const one = { re: 1, im: 0 };
  const ynl = cdiv(ym, cadd(one, cmul(z1, ym)));
  const zsc = cadd(z1, cdiv(z2, cadd(one, cmul(z2, ym))));
  const v0 = rating.v1, isc = rating.va / rating.v1;
  return {
    noLoad: { volts: v0, amps: v0 * Math.hypot(ynl.re, ynl.im), watts: v0 * v0 * ynl.re, side: 'primary' },
    shortCircuit: { volts: isc * Math.hypot(zsc.re, zsc.im), amps: isc, watts: isc * isc * zsc.re, side: 'primary' },
  };
}

/** Per-unit data from tests taken at rated current and rated voltage on the primary. */
function perUnitFromRatedTests(rating: Rating, t: TestData): PerUnitData {
  const ir = rating.va / rating.v1;
  const q = Math.sqrt(Math.max(0, (t.shortCircuit.volts * t.shortCircuit.amps) ** 2 - t.shortCircuit.watts ** 2));
  return {
    ukPct: (100 * t.shortCircuit.volts) / rating.v1,
    byXr: false,
    xr: t.shortCircuit.watts > 0 ? q / t.shortCircuit.watts : 0,
    loadLossW: t.shortCircuit.watts,
    i0Pct: (100 * t.noLoad.amps) / ir,
    p0W: t.noLoad.watts,
  };
}

export function perUnitFromCircuit(rating: Rating, c: EquivalentCircuit): PerUnitData {
  return perUnitFromRatedTests(rating, testsFromCircuit(rating, c));
}

/** The tests the per-unit data stand for: short-circuit at rated current, no-load at rated voltage, on the primary. */
export function testsFromPerUnit(rating: Rating, p: PerUnitData): TestData {
  checkRating(rating);
  const at = 'perUnit';
  if (!(p.ukPct > 0 && p.ukPct < 100)) fail(`${at}.ukPct`, 'Impedance voltage must lie between 0 and 100 %');
  if (!(p.i0Pct > 0 && p.i0Pct < 100)) fail(`${at}.i0Pct`, 'No-load current must lie between 0 and 100 %');
  if (!(p.p0W >= 0 && Number.isFinite(p.p0W))) fail(`${at}.p0W`, 'No-load loss must be zero or more');
  const ir = rating.va / rating.v1;
  const vsc = (p.ukPct / 100) * rating.v1;
  let psc: number;
  if (p.byXr) {
    if (!(p.xr >= 0 && Number.isFinite(p.xr))) fail(`${at}.xr`, 'X/R must be zero or more');
    psc = (vsc * ir) / Math.sqrt(1 + p.xr * p.xr);
  } else {
    if (!(p.loadLossW >= 0 && Number.isFinite(p.loadLossW))) fail(`${at}.loadLossW`, 'Load loss must be zero or more');
    if (p.loadLossW > vsc * ir) fail(`${at}.loadLossW`, `Load loss (${fmt(p.loadLossW)} W) is above the short-circuit apparent power uk·S (${fmt(vsc * ir)} VA)`);
    psc = p.loadLossW;
  }
  const i0 = (p.i0Pct / 100) * ir;
  if (p.p0W > rating.v1 * i0) fail(`${at}.p0W`, `No-load loss (${fmt(p.p0W)} W) is above the no-load apparent power i0·S (${fmt(rating.v1 * i0)} VA)`);
  return {
    noLoad: { volts: rating.v1, amps: i0, watts: p.p0W, side: 'primary' },
    shortCircuit: { volts: vsc, amps: ir, watts: psc, side: 'primary' },
  };
}

export function circuitFromPerUnit(rating: Rating, p: PerUnitData): EquivalentCircuit {
  const tests = testsFromPerUnit(rating, p);
  try {
    return circuitFromTests(rating, tests);
  } catch (e) {
    if (!(e instanceof PowerDataError)) throw e;
    throw new PowerDataError(e.field.includes('noLoad') ? 'perUnit.i0Pct' : 'perUnit.ukPct', e.message);
  }
}

/** The equivalent circuit the spec stands for (throws PowerDataError naming the field). */
export function circuitOf(spec: PowerSpec): EquivalentCircuit {
  checkRating(spec.rating);
  if (spec.form === 'circuit') {
    if (!spec.circuit) fail('circuit', 'The equivalent-circuit values are missing');
    checkCircuit(spec.circuit!);
    return spec.circuit!;
  }
  if (spec.form === 'tests') {
    if (!spec.tests) fail('tests', 'The test readings are missing');
    return circuitFromTests(spec.rating, spec.tests!);
  }
  if (!spec.perUnit) fail('perUnit', 'The per-unit data are missing');
  return circuitFromPerUnit(spec.rating, spec.perUnit!);
}

/** The problem with the spec, or null. */
export function powerSpecProblem(spec: PowerSpec): PowerDataError | null {
  try {
    circuitOf(spec);
    if (spec.expansion === 'coupled' && !circuitOf(spec).lm) return new PowerDataError('expansion', 'Coupled windings need a finite magnetising inductance Lm');
    return null;
  } catch (e) {
    if (e instanceof PowerDataError) return e;
    throw e;
  }
}

/** All three forms of one transformer, derived from its present form. */
export interface PowerForms {
  circuit: EquivalentCircuit;
  tests: TestData;
  perUnit: PerUnitData;
}

export function allForms(spec: PowerSpec): PowerForms {
  const circuit = circuitOf(spec);
  const rated = testsFromCircuit(spec.rating, circuit);
  return {
    circuit,
    tests: spec.form === 'tests' && spec.tests ? spec.tests : rated,
    perUnit: spec.form === 'perUnit' && spec.perUnit ? spec.perUnit : perUnitFromRatedTests(spec.rating, rated),
  };
}

/** The spec turned to another form, its values derived from the present one (so both stand for one circuit). */
export function switchForm(spec: PowerSpec, form: PowerForm): PowerSpec {
  if (form === spec.form) return spec;
  // the tests and per-unit forms take the turns ratio from the rated voltages (a transformer's rated
  // voltages are its no-load voltages, common practice), so leaving the circuit form carries its ratio there
  const rating = spec.form === 'circuit' && spec.circuit ? { ...spec.rating, v2: spec.rating.v1 / spec.circuit.ratio } : spec.rating;
  const f = allForms({ ...spec, rating });
  return { ...spec, rating, form, circuit: f.circuit, tests: f.tests, perUnit: f.perUnit, [form]: f[form] };
}

/** Per-unit series impedance (both sides, referred) at a frequency, on the primary's base V1²/S. */
export function perUnitSeries(rating: Rating, c: EquivalentCircuit, hz: number): C {
  const { z1, z2 } = branches(c, hz);
  const zb = (rating.v1 * rating.v1) / rating.va;
  return { re: (z1.re + z2.re) / zb, im: (z1.im + z2.im) / zb };
}

/** A spec entered from its tests: [volts, amps, watts, side] of each. */
export function specFromTests(rating: Rating, noLoad: [number, number, number, TestSide], shortCircuit: [number, number, number, TestSide]): PowerSpec {
  const reading = ([volts, amps, watts, side]: [number, number, number, TestSide]): TestReading => ({ volts, amps, watts, side });
  return { form: 'tests', expansion: 'ratio', rating, tests: { noLoad: reading(noLoad), shortCircuit: reading(shortCircuit) } };
}

/** A spec to start from: a 1 kVA, 230 V / 115 V, 50 Hz transformer entered from its tests (values of our own). */
export function defaultPowerSpec(): PowerSpec {
  return specFromTests({ va: 1000, v1: 230, v2: 115, hz: 50 }, [230, 0.12, 14, 'primary'], [9.2, 1000 / 230, 24, 'primary']);
}
