import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseGraphModel, solveGraph, transferFunction } from '../../../src/solver';
import type { ComplexJson, GraphModel, TransferResult, TwoTerminalResult } from '../../../src/model/graph';
import { cdiv, cmul, cx, expectClose, expectComplexClose, model } from '../../helpers';
import { build, circuitSpec, specArb } from '../../reference/randomCircuits';
import { densePencil, singularity } from '../../reference/dense-pencil';
import { referenceSolve } from '../../reference/dense-mna';

/** H(s) from the printed gain, zeros and poles. */
function factored(t: TransferResult, s: ComplexJson): ComplexJson {
  let h = cx(t.gain);
  for (const z of t.zeros) h = cmul(h, cx(s.re - z.re, s.im - z.im));
  for (const p of t.poles) h = cdiv(h, cx(s.re - p.re, s.im - p.im));
  return h;
}
/** The same from the printed polynomials. */
function fromPolynomials(t: TransferResult, s: ComplexJson): ComplexJson {
  const horner = (c: number[]) => c.reduce<ComplexJson>((acc, k) => cx(acc.re * s.re - acc.im * s.im + k, acc.re * s.im + acc.im * s.re), cx(0));
  return cdiv(horner(t.numerator), horner(t.denominator));
}
const jw = (f: number) => cx(0, 2 * Math.PI * f);
const byIm = (r: ComplexJson[]) => [...r].sort((a, b) => b.im - a.im);

describe('transfer functions against closed forms', () => {
  // series RLC: R = 10 Ω, L = 1 mH, C = 1 µF
  const R = 10, L = 1e-3, C = 1e-6;
  const rlc = parseGraphModel(model(50, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: R },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'c'], henries: L },
    { id: 'C1', kind: 'capacitor', nodes: ['c', 'gnd'], farads: C },
  ]));

  it('series RLC: ω0 = 1/√(LC), ζ = (R/2)·√(C/L), H = ω0²/(s² + 2ζω0·s + ω0²) at the capacitor', () => {
    const t = transferFunction(rlc, 'V1', 'node:c');
    const w0 = 1 / Math.sqrt(L * C); // standard second-order circuit, from memory
    const zeta = (R / 2) * Math.sqrt(C / L);
    const [p1, p2] = byIm(t.poles);
    expectComplexClose(p1, cx(-zeta * w0, w0 * Math.sqrt(1 - zeta * zeta)), 1e-12);
    expectComplexClose(p2, cx(-zeta * w0, -w0 * Math.sqrt(1 - zeta * zeta)), 1e-12);
    expect(t.zeros).toEqual([]);
    expectClose(t.gain, w0 * w0, 1e-12);
    expect(t.denominator.length).toBe(3);
    expectClose(t.denominator[1], R / L, 1e-12);
    expectClose(t.denominator[2], 1 / (L * C), 1e-12);
    expect(t.naturalFrequencies).toHaveLength(2);
  });

  it('current through a capacitor across a source is improper: H = s·C', () => {
    const m = parseGraphModel(model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'C1', kind: 'capacitor', nodes: ['a', 'gnd'], farads: 4.7e-6 },
    ]));
    const t = transferFunction(m, 'V1', 'current:C1');
    // i = C·dv/dt (definition of capacitance)
    expect(t.zeros).toEqual([cx(0)]);
    expect(t.poles).toEqual([]);
    expectClose(t.gain, 4.7e-6, 1e-12);
    expect(t.numerator).toHaveLength(2);
    expect(t.denominator).toEqual([1]);
  });

  it('an integrator has its pole at s = 0 exactly: inductor current from a voltage source, I = V/(sL)', () => {
    const m = parseGraphModel(model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: 0.25 },
    ]));
    const t = transferFunction(m, 'V1', 'current:L1');
    expect(t.poles).toEqual([cx(0)]); // v = L·di/dt (definition of inductance)
    expect(t.zeros).toEqual([]);
    expectClose(t.gain, 4, 1e-12);
    const c = transferFunction(parseGraphModel(model(50, [
      { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 1, phaseDeg: 0 },
      { id: 'C1', kind: 'capacitor', nodes: ['a', 'gnd'], farads: 2e-3 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 5 },
      { id: 'R2', kind: 'resistor', nodes: ['b', 'gnd'], ohms: 5 },
    ])), 'I1', 'current:R1');
    // a current source into C ∥ (R1 + R2): I_R = I/(1 + s·C·(R1+R2)), pole at −1/(C·(R1+R2)) (RC divider, from memory)
    expect(c.poles).toHaveLength(1);
    expectClose(c.poles[0].re, -1 / (2e-3 * 10), 1e-12);
  });

  it('two identical lossless tuned circuits coupled by k have natural frequencies ω0/√(1 ± k)', () => {
    const Lw = 60e-6, Cw = 58.43e-9, k = 0.2;
    const m = parseGraphModel(model(85e3, [
      { id: 'I1', kind: 'current-source', nodes: ['gnd', 'a'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: Lw },
      { id: 'C1', kind: 'capacitor', nodes: ['a', 'gnd'], farads: Cw },
      { id: 'L2', kind: 'inductor', nodes: ['b', 'gnd'], henries: Lw },
      { id: 'C2', kind: 'capacitor', nodes: ['b', 'gnd'], farads: Cw },
    ], [{ id: 'K', windings: ['L1', 'L2'], k }]));
    const t = transferFunction(m, 'I1', 'node:b');
    const w0 = 1 / Math.sqrt(Lw * Cw);
    // coupled-resonator theory, from memory (field notes)
    const expected = [w0 / Math.sqrt(1 - k), w0 / Math.sqrt(1 + k)];
    const up = t.naturalFrequencies.filter((p) => p.im > 0).sort((a, b) => b.im - a.im);
    expect(up).toHaveLength(2);
    up.forEach((p, i) => {
      expect(p.re).toBe(0); // lossless: on the jω axis
      expectClose(p.im, expected[i], 1e-10);
    });
    expect(t.poles).toHaveLength(4);
  });

  it('a loaded coupled pair: 1/H is the reflected-impedance input R1 + sL1 − s²M²/(sL2 + R2 + RL)', () => {
    const [R1, L1, L2, k, R2, RL] = [2, 3e-3, 12e-3, 0.7, 1.5, 22];
    const M = k * Math.sqrt(L1 * L2);
    const m = parseGraphModel(model(1000, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: R1 },
      { id: 'Lp', kind: 'inductor', nodes: ['b', 'gnd'], henries: L1 },
      { id: 'Ls', kind: 'inductor', nodes: ['c', 'gnd'], henries: L2, dot: 'second' },
      { id: 'R2', kind: 'resistor', nodes: ['c', 'd'], ohms: R2 },
      { id: 'RL', kind: 'resistor', nodes: ['d', 'gnd'], ohms: RL },
    ], [{ id: 'K', windings: ['Lp', 'Ls'], k }]));
    const t = transferFunction(m, 'V1', 'current:R1');
    for (const f of [1, 30, 500, 8000, 2e5]) {
      const s = jw(f);
      // reflected impedance (ωM)²/Z22 in s form, standard result (field notes); independent of the dots
      const z22 = cx(R2 + RL, s.im * L2);
      const zin = cx(R1 - cdiv(cx(-s.im * s.im * M * M), z22).re, s.im * L1 - cdiv(cx(-s.im * s.im * M * M), z22).im);
      expectComplexClose(factored(t, s), cdiv(cx(1), zin), 1e-10);
      expectComplexClose(fromPolynomials(t, s), cdiv(cx(1), zin), 1e-9);
    }
  });

  it('a mode the output does not see is a natural frequency but not a pole', () => {
    // V1 fixes node a; the branch R2–C2 hangs on it and cannot move node b (RC circuits, from memory)
    const m = parseGraphModel(model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 1000 },
      { id: 'C1', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 1e-6 },
      { id: 'R2', kind: 'resistor', nodes: ['a', 'c'], ohms: 10 },
      { id: 'C2', kind: 'capacitor', nodes: ['c', 'gnd'], farads: 1e-3 },
    ]));
    const t = transferFunction(m, 'V1', 'node:b');
    expect(t.naturalFrequencies.map((p) => p.re).sort((a, b) => a - b)).toHaveLength(2);
    expect(t.poles).toHaveLength(1);
    expectClose(t.poles[0].re, -1 / (1000 * 1e-6), 1e-10);
    expectClose(t.gain, 1 / (1000 * 1e-6), 1e-10);
  });

  it('an output the input cannot reach is H ≡ 0 with a warning', () => {
    const m = parseGraphModel(model(50, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R1', kind: 'resistor', nodes: ['a', 'gnd'], ohms: 10 },
      { id: 'V2', kind: 'voltage-source', nodes: ['b', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'R2', kind: 'resistor', nodes: ['b', 'c'], ohms: 10 },
      { id: 'C2', kind: 'capacitor', nodes: ['c', 'gnd'], farads: 1e-6 },
    ]));
    const t = transferFunction(m, 'V1', 'node:c');
    expect(t.gain).toBe(0);
    expect(t.zeros).toEqual([]);
    expect(t.poles).toEqual([]);
    expect(t.numerator).toEqual([]);
    expect(t.denominator).toEqual([]);
    expect(t.warnings.join(' ')).toMatch(/0 at every frequency/);
    expect(t.naturalFrequencies).toHaveLength(1);
  });

  it('series capacitors and a mutual inductance put a triple zero at s = 0 exactly (the 85 kHz pair)', () => {
    const m = parseGraphModel(model(85000, [
      { id: 'Vinv', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 50, phaseDeg: 0 },
      { id: 'Cp', kind: 'capacitor', nodes: ['a', 'b'], farads: 5.843e-8 },
      { id: 'Rcp', kind: 'resistor', nodes: ['b', 'c'], ohms: 0.05 },
      { id: 'Lpad', kind: 'inductor', nodes: ['c', 'gnd'], henries: 6e-5 },
      { id: 'Lveh', kind: 'inductor', nodes: ['d', 'r'], henries: 6e-5 },
      { id: 'Rcs', kind: 'resistor', nodes: ['d', 'e'], ohms: 0.05 },
      { id: 'Cs', kind: 'capacitor', nodes: ['e', 'f'], farads: 5.843e-8 },
      { id: 'Rbat', kind: 'resistor', nodes: ['f', 'r'], ohms: 8 },
    ], [{ id: 'K', windings: ['Lpad', 'Lveh'], k: 0.2 }]));
    const t = transferFunction(m, 'Vinv', 'current:Rbat');
    expect(t.zeros).toEqual([cx(0), cx(0), cx(0)]);
    expect(t.poles).toHaveLength(4);
    // high-frequency limit of I2/V1 = sM/(s²(L1L2 − M²)): gain = M/(L1·L2·(1 − k²)) (coupled inductors, from memory)
    expectClose(t.gain, (0.2 * 6e-5) / (6e-5 * 6e-5 * (1 - 0.04)), 1e-9);
  });
});

/** The output phasor by the independent dense reference (test/reference/dense-mna.ts). */
function referenceOutput(m: GraphModel, output: string): ComplexJson {
  const ref = referenceSolve(m);
  const [what, name] = output.split(':');
  const v = (n: string) => ref.nodes.get(n) ?? cx(0);
  if (what === 'node') return v(name);
  const el = m.elements.find((e) => e.id === name)!;
  const across = cx(v(el.nodes[0]).re - v(el.nodes[1]).re, v(el.nodes[0]).im - v(el.nodes[1]).im);
  if (what === 'voltage') return across;
  const w = 2 * Math.PI * m.frequencyHz;
  switch (el.kind) {
    case 'resistor': return cx(across.re / el.ohms, across.im / el.ohms);
    case 'capacitor': return cmul(cx(0, w * el.farads), across);
    case 'current-source': return cx(el.magnitude * Math.cos((el.phaseDeg * Math.PI) / 180), el.magnitude * Math.sin((el.phaseDeg * Math.PI) / 180));
    default: return ref.branch.get(name)!;
  }
}

describe('transfer functions of random circuits', () => {
  it('H(jω) from the printed gain, zeros and poles equals an independent dense solve to 1e-9, and the phasor solve', () => {
    fc.assert(
      fc.property(specArb, fc.nat(), fc.nat(), (s, pickIn, pickOut) => {
        const m = parseGraphModel(build(s));
        const sources = m.elements.filter((e) => e.kind === 'voltage-source' || e.kind === 'current-source');
        const input = sources[pickIn % sources.length].id;
        const target = m.elements[pickOut % m.elements.length];
        const output = pickOut % 3 === 0 ? `node:${target.nodes[0]}` : pickOut % 3 === 1 ? `current:${target.id}` : `voltage:${target.id}`;
        const t = transferFunction(m, input, output);
        for (const f of [3.3, 170, 9100, 2.4e5]) {
          // only the input on, at 1∠0
          const one: GraphModel = {
            ...m,
            frequencyHz: f,
            elements: m.elements.map((e) => (e.kind === 'voltage-source' || e.kind === 'current-source' ? { ...e, magnitude: e.id === input ? 1 : 0, phaseDeg: 0 } : e)),
          };
          const ref = referenceOutput(one, output); // dense MNA in branch form, mathjs lusolve
          const r = solveGraph(one); // the phasor engine (graph-model contract)
          const [what, name] = output.split(':');
          const el = r.elements[name] as TwoTerminalResult | { voltages: ComplexJson[]; currents: ComplexJson[] };
          const y = what === 'node' ? r.nodes[name] : what === 'voltage' ? ('voltage' in el ? el.voltage : el.voltages[0]) : 'current' in el ? el.current : el.currents[0];
          const h = factored(t, jw(f));
          // relative to the output, or to 1e-3 of the largest voltage or current of the solve (rounding level)
          const all = [...Object.values(r.nodes), ...Object.values(r.elements).flatMap((e) => ('current' in e ? [e.current, e.voltage] : [...e.currents, ...e.voltages]))];
          const top = Math.max(...all.map((v) => Math.hypot(v.re, v.im)));
          const scale = Math.max(Math.hypot(ref.re, ref.im), 1e-3 * top, 1e-12);
          if (t.gain === 0) {
            // H ≡ 0 (contract: "vanishes to rounding at every frequency"): the output is at rounding level of the solve
            if (!(Math.hypot(ref.re, ref.im) <= 1e-9 * top)) throw new Error(`${input} → ${output} at ${f} Hz: taken as 0, reference ${ref.re}+${ref.im}j of ${top}`);
            continue;
          }
          const err = Math.hypot(h.re - ref.re, h.im - ref.im);
          if (!(err <= 1e-9 * scale)) throw new Error(`${input} → ${output} at ${f} Hz: factored ${h.re}+${h.im}j vs reference ${ref.re}+${ref.im}j`);
          // the phasor engine stamps windings as admittances, which costs it digits below about 1 kHz here
          const errPhasor = Math.hypot(h.re - y.re, h.im - y.im);
          if (!(errPhasor <= 1e-7 * scale)) throw new Error(`${input} → ${output} at ${f} Hz: factored ${h.re}+${h.im}j vs phasor ${y.re}+${y.im}j`);
        }
      }),
      { numRuns: 40, seed: 20261202 },
    );
  });

  it('natural frequencies make the independent dense pencil G + s·C singular, and are complete', () => {
    fc.assert(
      fc.property(circuitSpec(3, 10), (s) => {
        const m = parseGraphModel(build({ ...s, transformer: false }));
        const t = transferFunction(m, m.elements.find((e) => e.kind === 'voltage-source')!.id, `node:${m.elements[0].nodes[0]}`);
        const p = densePencil(m);
        for (const nf of t.naturalFrequencies) {
          // at a natural frequency G + s·C is singular: a solve blows up (mathjs lusolve)
          const sing = singularity(p, nf);
          if (!(sing > 1e9)) throw new Error(`G + sC is regular at ${nf.re}+${nf.im}j (${sing})`);
        }
        // and nowhere else among points between them: det(G + sC) has exactly this many roots, so
        // the regular pencil is regular at points off the roots
        for (const f of [0.37, 1.9, 7.3]) {
          const off = { re: -f * 1000, im: f * 2222 };
          if (t.naturalFrequencies.some((nf) => Math.hypot(nf.re - off.re, nf.im - off.im) < 1e-3 * Math.hypot(off.re, off.im))) continue;
          expect(singularity(p, off)).toBeLessThan(1e9);
        }
      }),
      { numRuns: 25, seed: 4242 },
    );
  });
});
