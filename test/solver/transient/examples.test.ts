import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { worstDeviation } from '../../helpers';
import { parseGraphModel, solveGraph, transientGraph } from '../../../src/solver';
import type { GraphModel, TwoTerminalResult } from '../../../src/model/graph';

/**
 * The time-response scenarios of examples/graphs, each against closed forms
 * derived by hand beside it, at the accuracy the contract promises
 * (time-and-s-domain.md: every sample within 1e-3·P at the default tolerance).
 */

const load = (name: string): GraphModel =>
  parseGraphModel(JSON.parse(readFileSync(new URL(`../../../examples/graphs/${name}`, import.meta.url), 'utf8')));
const value = (m: GraphModel, id: string, key: string) => (m.elements.find((e) => e.id === id) as unknown as Record<string, number>)[key];
const W50 = 2 * Math.PI * 50;

/** The phasor's waveform at t (rms phasor: crest √2·|X|, cosine convention of the contract). */
const wave = (z: { re: number; im: number }, w: number) => (t: number) => Math.SQRT2 * (z.re * Math.cos(w * t) - z.im * Math.sin(w * t));

const worst = (r: { timesS: number[] }, got: number[], exact: (t: number) => number) => worstDeviation(r.timesS, got, exact);

describe('example: a transformer switched in at the crest and at the zero of the mains', () => {
  const m = load('transformer-switch-in-230v.json');
  const stop = 3;
  const r = transientGraph(m, { stopS: stop, stepS: 1e-4, tolerance: 1e-4, start: 'given' }, ['Lpcrest', 'Lpzero']);
  const ph = solveGraph(m);

  for (const [tag, t0] of [['crest', 0], ['zero', 0.005]] as const) {
    it(`switched in at the ${tag}: the magnetising current is its steady state less the steady state's value at the switching instant, decaying with τ = Lp/(Rp ∥ Rcore)`, () => {
      // unloaded secondary: the primary is Rp in series with Rcore ∥ Lp, a first-order circuit; its Thevenin
      // resistance seen by Lp is Rp ∥ Rcore, and i_L(t0) = 0 (RL switched onto a sine, from memory)
      const [rp, rc, lp] = [value(m, `Rp${tag}`, 'ohms'), value(m, `Rcore${tag}`, 'ohms'), value(m, `Lp${tag}`, 'henries')];
      const tau = lp / ((rp * rc) / (rp + rc));
      const ss = wave((ph.elements[`Lp${tag}`] as TwoTerminalResult).current, W50);
      const exact = (t: number) => (t < t0 ? 0 : ss(t) - ss(t0) * Math.exp(-(t - t0) / tau));
      const { err, peak } = worst(r, r.elements[`Lp${tag}`].current!, exact);
      expect(err).toBeLessThan(1e-3 * peak);
    });
  }

  it('at the zero the first peak is about twice the steady-state peak (offset equal to it); at the crest, none', () => {
    // steady-state peak √2·|I| of the phasor solve, about √2·230/(ω·Lp) (Rp is small beside ωLp); switched in at
    // the voltage zero the offset equals that peak (standard result, from memory), less the decay over the first
    // half period; at the crest the current lags by a little less than 90°, so a small offset of cos φ remains
    const i = (ph.elements.Lpzero as TwoTerminalResult).current;
    const ssPeak = Math.SQRT2 * Math.hypot(i.re, i.im);
    expect(ssPeak).toBeCloseTo((Math.SQRT2 * 230) / (W50 * 4), 3);
    const first = (id: string) => Math.max(...r.elements[id].current!.slice(0, 300).map(Math.abs));
    expect(first('Lpzero') / ssPeak).toBeGreaterThan(1.98);
    expect(first('Lpzero') / ssPeak).toBeLessThan(2);
    expect(Math.abs(first('Lpcrest') / ssPeak - 1)).toBeLessThan(Math.abs(Math.cos(Math.atan2(i.im, i.re))) + 1e-3);
    // after three seconds (three τ) the offset is e^(−3) of what it was
    const end = r.elements.Lpzero.current!.slice(-200);
    const offset = (Math.max(...end) + Math.min(...end)) / 2;
    expect(Math.abs(offset) / ssPeak).toBeCloseTo(Math.exp(-(stop - 0.005) / 1.000133), 2);
  });
});

describe('example: a current transformer whose burden is opened under load', () => {
  const m = load('current-transformer-burden-opens.json');
  const t0 = value(m, 'Sburden', 'togglesS') as unknown as number[];
  const tOpen = t0[0];
  const r = transientGraph(m, { stopS: 0.06, stepS: 1e-5, tolerance: 1e-4, start: 'given' }, ['terminal', 'Lsec']);
  const k0 = r.timesS.findIndex((t) => Math.abs(t - tOpen) < 1e-12);
  const [ls, c, rsec, rb, off] = [value(m, 'Lsec', 'henries'), value(m, 'Cstray', 'farads'), value(m, 'Rsec', 'ohms'), value(m, 'Rburden', 'ohms'), value(m, 'Sburden', 'offOhms')];

  it('carries the burden current up to the opening, as the phasor solve of the closed circuit gives', () => {
    // the bus current starts at zero, so the start adds only the magnetising offset of the first-order secondary,
    // ss(0)·e^(−t/τ) with τ = Ls/R (see closed-forms.test.ts), well under 1e-3 of the current here
    const closed = wave((solveGraph(m).elements.Lsec as TwoTerminalResult).current, W50);
    const tauS = ls / (rsec + rb + value(m, 'Sburden', 'onOhms'));
    const exact = (t: number) => closed(t) - closed(0) * Math.exp(-t / tauS);
    const upTo = { ...r, timesS: r.timesS.slice(0, k0) };
    const { err, peak } = worst(upTo, r.elements.Lsec.current!.slice(0, k0), exact);
    expect(err).toBeLessThan(1e-3 * peak);
  });

  it('once open, the secondary rings with its stray capacitance: forced part plus the free LC response, derived by hand', () => {
    // after the opening the secondary loop is Lsec (its primary a current source: an open circuit to the free
    // response), Rsec and Cstray ∥ (offOhms + Rburden). In v (terminal voltage) and j (current from the
    // winding's top through Rsec): C·v' = j − v/Rp, Ls·j' = −v − Rsec·j. The free response is e^(A·s) of the
    // state less the forced one at the opening; e^(A·s) = e^(μs)·(cos νs·I + sin νs/ν·(A − μI)) for a 2×2 A with
    // eigenvalues μ ± jν (standard linear algebra, from memory). The forced part is the phasor solve with the switch open.
    const rp = off + rb;
    const A = [[-1 / (rp * c), 1 / c], [-1 / ls, -rsec / ls]];
    const mu = (A[0][0] + A[1][1]) / 2;
    const nu = Math.sqrt(-(((A[0][0] - A[1][1]) ** 2) / 4 + A[0][1] * A[1][0]));
    const open = solveGraph(parseGraphModel({ ...m, elements: m.elements.map((e) => (e.id === 'Sburden' ? { ...e, closed: false } : e)) }));
    const vf = wave(open.nodes.terminal, W50);
    const jf = wave((open.elements.Lsec as TwoTerminalResult).current, W50);
    // j is the winding's current reversed (its reference runs from its top pin through it to ground)
    const dv = r.nodes.terminal[k0] - vf(tOpen);
    const dj = -r.elements.Lsec.current![k0] + jf(tOpen);
    const exact = (t: number) => {
      const s = t - tOpen;
      const e = Math.exp(mu * s);
      const cs = Math.cos(nu * s);
      const sn = Math.sin(nu * s) / nu;
      return vf(t) + e * (cs * dv + sn * ((A[0][0] - mu) * dv + A[0][1] * dj));
    };
    const after = { ...r, timesS: r.timesS.slice(k0) };
    const { err, peak } = worst(after, r.nodes.terminal.slice(k0), exact);
    expect(err).toBeLessThan(1e-3 * peak);
    // the figures: about 519 Hz, 1/(2π·√(Ls·C)); a crest near |i|·√(Ls/C) on top of the open-circuit voltage
    // (energy ½·Ls·i² handed to ½·C·v², derived by hand)
    expect(nu / (2 * Math.PI)).toBeCloseTo(1 / (2 * Math.PI * Math.sqrt(ls * c)), 0);
    const crest = Math.max(...r.nodes.terminal.map(Math.abs));
    const iOpen = Math.abs(r.elements.Lsec.current![k0]);
    const free = Math.hypot(dv, ((A[0][0] - mu) * dv + A[0][1] * dj) / nu);
    const forced = Math.SQRT2 * Math.hypot(open.nodes.terminal.re, open.nodes.terminal.im);
    expect(Math.abs(free / (iOpen * Math.sqrt(ls / c)) - 1)).toBeLessThan(0.1);
    expect(crest).toBeGreaterThan(free - forced);
    expect(crest).toBeLessThan(free + forced);
  });
});

describe('example: the 85 kHz wireless pair driven from rest by a square wave', () => {
  const m = load('wireless-square-drive-85khz.json');
  const f = 85e3;
  const period = 1 / f;
  const r = transientGraph(m, { stopS: 400 * period, stepS: period / 64, tolerance: 1e-4, start: 'given' }, ['Rbat']);
  const i = r.elements.Rbat.current!;
  const [l1, l2, r1, r2] = [value(m, 'Lpad', 'henries'), value(m, 'Lveh', 'henries'), value(m, 'Rcp', 'ohms'), value(m, 'Rcs', 'ohms') + value(m, 'Rbat', 'ohms')];

  it('settles into the Fourier sum of phasor solves, at the rate of the coupled envelopes', () => {
    // both sides tuned to f, so near f each side's envelope obeys a' = −α·a + coupling with α = R/(2L); for
    // k·ω0/2 above |α2 − α1|/2 (here) the two eigenvalues share the real part −(α1 + α2)/2 (coupled-mode
    // theory, derived by hand), so the envelope's distance from its end value falls as e^(−(α1+α2)t/2)
    const decay = (r1 / (2 * l1) + r2 / (2 * l2)) / 2;
    // the steady state: the square wave's Fourier series, (4/π)·50 V·Σ sin(nωt)/n over odd n (standard result),
    // each harmonic through the phasor solve at n·f; by superposition their sum is the periodic response
    const harmonics = Array.from({ length: 100 }, (_, q) => 2 * q + 1).map((n) => {
      const mn = parseGraphModel({ ...m, frequencyHz: n * f, elements: m.elements.map((e) => (e.id === 'Vinv' ? { ...e, magnitude: (e as { magnitude: number }).magnitude / n } : e)) });
      return wave((solveGraph(mn).elements.Rbat as TwoTerminalResult).current, 2 * Math.PI * n * f);
    });
    const steady = (t: number) => harmonics.reduce((sum, h) => sum + h(t), 0);
    const window = (from: number, to: number) => {
      const ks = r.timesS.map((t, k) => [t, k] as const).filter(([t]) => t >= from && t <= to).map(([, k]) => k);
      return worst({ ...r, timesS: ks.map((k) => r.timesS[k]) }, ks.map((k) => i[k]), steady);
    };
    // the last twenty periods are that steady state, to the contract's accuracy
    const end = window(380 * period, 400 * period);
    expect(end.err).toBeLessThan(1e-3 * end.peak);
    // after 10/α the envelope's distance is e^(−10) of the start: within 1e-3 as well
    const settled = window(10 / decay, 10 / decay + 5 * period);
    expect(settled.err).toBeLessThan(1e-3 * settled.peak);
    // after 1/α it is still far from it: e^(−1) of the way left, give or take the beat of the two modes
    const early = window(1 / decay, 1 / decay + 2 * period);
    expect(early.err).toBeGreaterThan(0.1 * early.peak);
    expect(r.warnings.filter((w) => w.startsWith('state jump'))).toEqual([]);
  });
});
