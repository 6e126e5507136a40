import { describe, it, expect } from 'vitest';
import { solveGraph, parseGraphModel, reflectedImpedances, substituteTEquivalent, tEquivalent, sourceImpedance, tellegenResidual } from '../../src/solver';
import type { DotEnd, GraphModel } from '../../src/model/graph';
import { model, two, cx, cadd, cdiv, cmul, cscale, cabs, expectComplexClose, expectClose } from '../helpers';

const f = 1000;
const w = 2 * Math.PI * f;
const L1 = 0.01;
const L2 = 0.04;
const k = 0.6;
const M = k * Math.sqrt(L1 * L2);

/** Inductance a 1 V source sees: Im(V/I)/ω, with I delivered by the source. */
function effectiveL(m: GraphModel): number {
  const r = solveGraph(m);
  const i = two(r, 'V1').current;
  const z = cdiv(cx(1), cx(-i.re, -i.im));
  expectClose(z.re, 0, 1e-9, 1e-9);
  return z.im / w;
}

function seriesPair(dot2: DotEnd): GraphModel {
  return model(f, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
    { id: 'L1', kind: 'inductor', nodes: ['a', 'b'], henries: L1, dot: 'first' },
    { id: 'L2', kind: 'inductor', nodes: ['b', 'gnd'], henries: L2, dot: dot2 },
  ], [{ id: 'K1', windings: ['L1', 'L2'], k }]);
}

function parallelPair(dot2: DotEnd): GraphModel {
  return model(f, [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
    { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: L1, dot: 'first' },
    { id: 'L2', kind: 'inductor', nodes: ['a', 'gnd'], henries: L2, dot: dot2 },
  ], [{ id: 'K1', windings: ['L1', 'L2'], henries: M }]);
}

describe('coupled windings against closed forms', () => {
  it('series aiding and opposing give L1 + L2 ± 2M', () => {
    // Series connection: aiding L = L1 + L2 + 2M, opposing L1 + L2 − 2M (field notes; standard result, from memory)
    expectClose(effectiveL(seriesPair('first')), L1 + L2 + 2 * M, 1e-10);
    expectClose(effectiveL(seriesPair('second')), L1 + L2 - 2 * M, 1e-10);
    // the difference of the two series readings is 4M (bench practice: common practice)
    expectClose(effectiveL(seriesPair('first')) - effectiveL(seriesPair('second')), 4 * M, 1e-9);
  });

  it('parallel aiding and opposing give (L1·L2 − M²)/(L1 + L2 ∓ 2M)', () => {
    // Parallel connection (field notes; standard result, from memory)
    expectClose(effectiveL(parallelPair('first')), (L1 * L2 - M * M) / (L1 + L2 - 2 * M), 1e-10);
    expectClose(effectiveL(parallelPair('second')), (L1 * L2 - M * M) / (L1 + L2 + 2 * M), 1e-10);
  });

  const rs = 2;
  const r2 = 0.5;
  const rl = 8;
  const cl = 4.7e-6;
  function loaded(dot2: DotEnd, kk = k): GraphModel {
    return model(f, [
      { id: 'V1', kind: 'voltage-source', nodes: ['in', 'gnd'], magnitude: 10, phaseDeg: 30 },
      { id: 'Rs', kind: 'resistor', nodes: ['in', 'p'], ohms: rs },
      { id: 'L1', kind: 'inductor', nodes: ['p', 'gnd'], henries: L1, dot: 'first' },
      { id: 'L2', kind: 'inductor', nodes: ['s', 'ret'], henries: L2, dot: dot2 },
      { id: 'R2', kind: 'resistor', nodes: ['s', 'x'], ohms: r2 },
      { id: 'RL', kind: 'resistor', nodes: ['x', 'y'], ohms: rl },
      { id: 'CL', kind: 'capacitor', nodes: ['y', 'ret'], farads: cl },
    ], [{ id: 'K1', windings: ['L1', 'L2'], k: kk }]);
  }
  // Z22 = jωL2 + R2 + Z_L; Z_in = Z1 + (ωM)²/Z22 (field notes: reflected impedance, standard result, from memory)
  const zl = cadd(cx(rl), cdiv(cx(1), cx(0, w * cl)));
  const z22 = cadd(cx(r2, w * L2), zl);
  const zin = cadd(cx(rs, w * L1), cdiv(cx((w * M) ** 2), z22));
  const vs = cx(10 * Math.cos(Math.PI / 6), 10 * Math.sin(Math.PI / 6));

  it('primary current follows the reflected impedance Z1 + (ωM)²/Z22', () => {
    const r = solveGraph(loaded('first'));
    const i1 = cdiv(vs, zin);
    expectComplexClose(two(r, 'L1').current, i1, 1e-10);
    // secondary loop: 0 = jωM·I1 + Z22·I2 with both currents entering dots → I2 = −jωM·I1/Z22
    // (coupled-winding equations, field notes); L2's reference current enters its dot at "s"
    const i2 = cscale(cdiv(cmul(cx(0, w * M), i1), z22), -1);
    expectComplexClose(two(r, 'L2').current, i2, 1e-10);
    expectComplexClose(two(r, 'RL').current, cscale(i2, -1), 1e-10);
    // the analysis function gives the same reflected impedance
    const [refl] = reflectedImpedances(loaded('first'), 'L1');
    expectComplexClose(refl.reflected, cdiv(cx((w * M) ** 2), z22), 1e-10);
    expectComplexClose(refl.loopImpedance!, z22, 1e-10);
    // the source sees Z_in
    expectComplexClose(sourceImpedance(loaded('first'), 'V1').z!, zin, 1e-10);
  });

  it('flipping one dot keeps |I| (reflected impedance does not depend on the dots) and negates the secondary current', () => {
    // reflected impedance is independent of the dots (field notes); M → −M negates I2
    const a = solveGraph(loaded('first'));
    const b = solveGraph(loaded('second'));
    expectComplexClose(two(b, 'L1').current, two(a, 'L1').current, 1e-10);
    expectComplexClose(two(b, 'L2').current, cscale(two(a, 'L2').current, -1), 1e-10);
  });

  it('the T-equivalent gives the same port voltages and currents (shared terminal)', () => {
    // T-equivalent: arms L1 − M, L2 − M, shunt M (field notes; standard result, from memory)
    const m0 = model(f, [
      { id: 'V1', kind: 'voltage-source', nodes: ['in', 'gnd'], magnitude: 5, phaseDeg: 0 },
      { id: 'Rs', kind: 'resistor', nodes: ['in', 'p'], ohms: 3 },
      { id: 'L1', kind: 'inductor', nodes: ['p', 'gnd'], henries: 0.05 },
      { id: 'L2', kind: 'inductor', nodes: ['s', 'gnd'], henries: 0.08 },
      { id: 'RL', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 40 },
    ], [{ id: 'K1', windings: ['L1', 'L2'], k: 0.5 }]);
    const t = tEquivalent(m0, 'K1');
    const mm = 0.5 * Math.sqrt(0.05 * 0.08);
    expectClose(t.m, mm, 1e-12);
    expectClose(t.arm1, 0.05 - mm, 1e-12);
    expectClose(t.arm2, 0.08 - mm, 1e-12);
    expect(t.common).toBe('gnd');
    expect(t.negativeArms).toEqual([]);
    const sub = substituteTEquivalent(m0, 'K1');
    const a = solveGraph(m0);
    const b = solveGraph(sub.model);
    for (const id of ['L1', 'L2', 'RL', 'V1']) expectComplexClose(two(b, id).current, two(a, id).current, 1e-10);
    for (const node of ['p', 's']) expectComplexClose(b.nodes[node], a.nodes[node], 1e-10);
  });

  it('the T-equivalent without a shared terminal matches the port quantities and flags the lost isolation', () => {
    const m0 = model(f, [
      { id: 'V1', kind: 'voltage-source', nodes: ['in', 'gnd'], magnitude: 5, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['in', 'gnd'], henries: 0.05, dot: 'second' },
      { id: 'L2', kind: 'inductor', nodes: ['s', 't'], henries: 0.08, dot: 'second' },
      { id: 'RL', kind: 'resistor', nodes: ['s', 't'], ohms: 40 },
    ], [{ id: 'K1', windings: ['L1', 'L2'], k: 0.3 }]);
    const t = tEquivalent(m0, 'K1');
    expect(t.common).toBeNull();
    expect(t.notes.join(' ')).toMatch(/removing the isolation/);
    const a = solveGraph(m0);
    const b = solveGraph(substituteTEquivalent(m0, 'K1').model);
    expectComplexClose(two(b, 'RL').current, two(a, 'RL').current, 1e-10);
    expectComplexClose(two(b, 'RL').voltage, two(a, 'RL').voltage, 1e-10);
    expectComplexClose(two(b, 'V1').current, two(a, 'V1').current, 1e-10);
  });

  it('flags negative arms when M exceeds a self-inductance, and a negative shunt for opposing dots', () => {
    const m0 = model(f, [
      { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
      { id: 'L1', kind: 'inductor', nodes: ['a', 'gnd'], henries: 0.001 },
      { id: 'L2', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.1, dot: 'second' },
      { id: 'R', kind: 'resistor', nodes: ['b', 'gnd'], ohms: 1 },
    ], [{ id: 'K1', windings: ['L1', 'L2'], k: 0.9 }]);
    const t = tEquivalent(m0, 'K1');
    // M = 0.9·sqrt(1e-4) = 9 mH; opposing dots → −M: arms L1 + M, L2 + M, shunt −M
    expectClose(t.m, -0.009, 1e-12);
    expect(t.negativeArms).toEqual(['shunt']);
    expect(t.notes[0]).toMatch(/not a part you can buy/);
    // substituted with a negative shunt arm (an analysis-only inductance arm), the ports see the same currents
    const sub = substituteTEquivalent(m0, 'K1');
    expect(sub.model.elements.filter((e) => e.kind === 'inductance-arm').map((e) => e.id)).toEqual(['K1_M']);
    const a = solveGraph(m0);
    const b = solveGraph(sub.model);
    for (const id of ['V1', 'R']) expectComplexClose(two(b, id).current, two(a, id).current, 1e-10);
  });

  it('approaches the ideal transformer as k → 1 with large inductances', () => {
    // V1/V2 = N1/N2 = sqrt(L1/L2), I1/I2 = N2/N1 (field notes: ideal transformer as a limit, from memory)
    const n = 4;
    const lp = 400;
    const build = (kk: number) =>
      model(50, [
        { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 230, phaseDeg: 0 },
        { id: 'Lp', kind: 'inductor', nodes: ['a', 'gnd'], henries: lp },
        { id: 'Ls', kind: 'inductor', nodes: ['s', 'gnd'], henries: lp / (n * n) },
        { id: 'RL', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 10 },
      ], [{ id: 'K', windings: ['Lp', 'Ls'], k: kk }]);
    const ideal = solveGraph(
      model(50, [
        { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 230, phaseDeg: 0 },
        { id: 'T1', kind: 'ideal-transformer', nodes: ['a', 'gnd', 's', 'gnd'], ratio: n },
        { id: 'RL', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 10 },
      ]),
    );
    // ideal transformer: V_s = V_p / n = 57.5 V, load current 5.75 A
    expectComplexClose(ideal.nodes.s, cx(57.5), 1e-12);
    let previous = Infinity;
    for (const kk of [0.99, 0.9999, 0.999999, 1]) {
      const r = solveGraph(build(kk));
      const err = cabs(cadd(r.nodes.s, cscale(ideal.nodes.s, -1))) / 57.5;
      expect(err).toBeLessThan(previous);
      previous = err;
    }
    // at k = 1 only the finite magnetising inductance separates the two: error ~ R_L·n²/(ωL_p) in quadrature
    expect(previous).toBeLessThan(1e-3);
  });

  it('RMS and peak conventions: phasors scale by √2 and powers agree', () => {
    // S = V·I* (rms) vs S = ½·V·I* (peak) (field notes; standard)
    const base = loaded('first');
    const rms = solveGraph(base);
    const peak = solveGraph({
      ...base,
      amplitudes: 'peak',
      elements: base.elements.map((e) => (e.kind === 'voltage-source' ? { ...e, magnitude: e.magnitude * Math.SQRT2 } : e)),
    });
    expect(peak.amplitudes).toBe('peak');
    for (const id of Object.keys(rms.elements)) {
      expectComplexClose(two(peak, id).current, cscale(two(rms, id).current, Math.SQRT2), 1e-12);
      expectClose(two(peak, id).power.watts, two(rms, id).power.watts, 1e-10, 1e-12);
      expectClose(two(peak, id).power.vars, two(rms, id).power.vars, 1e-10, 1e-12);
    }
  });

  it('series RLC resonates at 1/(2π·sqrt(LC)): current V/R in phase with the source', () => {
    // ω0 = 1/sqrt(LC) (field notes; standard)
    const L = 120e-6;
    const C = 33e-9;
    const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
    const r = solveGraph(
      model(f0, [
        { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 2, phaseDeg: 0 },
        { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 4 },
        { id: 'L1', kind: 'inductor', nodes: ['b', 'c'], henries: L },
        { id: 'C1', kind: 'capacitor', nodes: ['c', 'gnd'], farads: C },
      ]),
    );
    expectComplexClose(two(r, 'R1').current, cx(0.5), 1e-9);
    // the reactive parts cancel: Q_L = −Q_C = |I|²·ω0·L
    expectClose(two(r, 'L1').power.vars, 0.25 * 2 * Math.PI * f0 * L, 1e-9);
    expectClose(two(r, 'C1').power.vars, -0.25 * 2 * Math.PI * f0 * L, 1e-9);
  });

  it('ideal transformer reflects the load as ratio² · R and balances power', () => {
    // V_p = n·V_s, n·I_p + I_s = 0 (graph-model contract); Z_in = n²·R_L (standard result, from memory)
    const r = solveGraph(
      model(60, [
        { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 120, phaseDeg: 0 },
        { id: 'T1', kind: 'ideal-transformer', nodes: ['a', 'gnd', 's', 'gnd'], ratio: 10 },
        { id: 'RL', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 2 },
      ]),
    );
    expectComplexClose(two(r, 'V1').current, cx(-120 / 200), 1e-12);
    const t = r.elements.T1 as { voltages: { re: number }[]; currents: { re: number }[]; power: { watts: number } };
    expectClose(t.voltages[1].re, 12, 1e-12);
    expectClose(t.currents[1].re, -6, 1e-12);
    expectClose(t.power.watts, 0, 0, 1e-9);
    expect(tellegenResidual(r).relative).toBeLessThan(1e-12);
  });

  it('solves at 0 Hz: inductors short, capacitors open, S = V·I', () => {
    const r = solveGraph(
      model(0, [
        { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 12, phaseDeg: 0 },
        { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 3 },
        { id: 'L1', kind: 'inductor', nodes: ['b', 'c'], henries: 1 },
        { id: 'R2', kind: 'resistor', nodes: ['c', 'gnd'], ohms: 1 },
        { id: 'C1', kind: 'capacitor', nodes: ['c', 'gnd'], farads: 1e-6 },
      ], [], { amplitudes: 'peak' }),
    );
    // Ohm's law: 12 V / 4 Ω = 3 A; P_R1 = 27 W even under "peak" (DC values, graph-model contract)
    expectComplexClose(two(r, 'R1').current, cx(3), 1e-12);
    expectClose(two(r, 'R1').power.watts, 27, 1e-12);
    expectComplexClose(two(r, 'C1').current, cx(0), 0, 1e-15);
    expectComplexClose(two(r, 'L1').voltage, cx(0), 0, 1e-12);
  });

  it('solves k = 1 exactly', () => {
    const r = solveGraph(
      model(50, [
        { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 0 },
        { id: 'Lp', kind: 'inductor', nodes: ['a', 'gnd'], henries: 1 },
        { id: 'Ls', kind: 'inductor', nodes: ['s', 'gnd'], henries: 0.25 },
        { id: 'RL', kind: 'resistor', nodes: ['s', 'gnd'], ohms: 5 },
      ], [{ id: 'K', windings: ['Lp', 'Ls'], k: 1 }]),
    );
    // k = 1: V_s/V_p = sqrt(Ls/Lp) = 0.5 exactly (perfect coupling, from memory)
    expectComplexClose(r.nodes.s, cx(5), 1e-12);
  });

  it('reads the contract example model', () => {
    const m = parseGraphModel({
      schema: 'coilwright.graph/1', frequencyHz: 50, amplitudes: 'rms', ground: 'gnd',
      elements: [
        { id: 'Vin', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 230, phaseDeg: 0 },
        { id: 'Rw', kind: 'resistor', nodes: ['a', 'b'], ohms: 0.4 },
        { id: 'Lp', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.8, dot: 'first' },
        { id: 'Ls', kind: 'inductor', nodes: ['c', 'gnd'], henries: 0.05, dot: 'first' },
        { id: 'Cs', kind: 'capacitor', nodes: ['c', 'd'], farads: 2.2e-6 },
        { id: 'Rl', kind: 'resistor', nodes: ['d', 'gnd'], ohms: 12 },
        { id: 'Iaux', kind: 'current-source', nodes: ['gnd', 'd'], magnitude: 0.1, phaseDeg: -30 },
        { id: 'Tx', kind: 'ideal-transformer', nodes: ['d', 'gnd', 'e', 'gnd'], ratio: 4 },
        { id: 'Re', kind: 'resistor', nodes: ['e', 'gnd'], ohms: 100 },
      ],
      couplings: [{ id: 'Kps', windings: ['Lp', 'Ls'], k: 0.92 }],
    });
    const r = solveGraph(m);
    expect(r.warnings).toEqual([]);
    expectComplexClose(r.nodes.a, cx(230), 1e-12);
    // Tellegen's theorem (Tellegen, 1952): powers sum to zero
    expect(tellegenResidual(r).relative).toBeLessThan(1e-12);
    expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity|null/);
  });
});
