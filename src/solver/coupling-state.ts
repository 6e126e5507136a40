import type { GraphModel, InductorEl, SolveResult, TwoTerminalResult, Coupling } from '../model/graph';
import { ModelRefusal } from './errors';
import { dotSign } from './elements/registry';
import type { Cx } from './analysis';
import { mutualLimit } from '../model/mutual';

/**
 * What a coupled pair is doing at the solved currents: flux linkages, stored
 * energy, and whether the two currents aid or oppose each other's flux.
 */
export interface PairState {
  windings: [string, string];
  coupling: string;
  l1: number;
  l2: number;
  /** unsigned mutual inductance */
  m: number;
  k: number;
  /** flux linkage of each winding, λ = L·I + M·d1·d2·I_other (Wb-turns, same convention as the currents) */
  flux: [Cx, Cx];
  /** time-averaged stored magnetic energy of the pair in joules */
  energyJ: number;
  /** 'aiding' when the mutual term adds to the stored energy, 'opposing' when it subtracts, 'none' when either current is zero */
  interaction: 'aiding' | 'opposing' | 'none';
  /** M·d1·d2·Re(I1·conj(I2)): the mutual share of the energy before scaling */
  mutualTerm: number;
}

export function mutualOf(c: Coupling, l1: number, l2: number): number {
  return c.henries ?? c.k! * mutualLimit(l1, l2);
}

/**
 * Flux linkage λ_i = L_i·I_i + Σ M_ij·d_i·d_j·I_j (the coupled-winding
 * equations divided by jω; field notes). Time-averaged energy
 * W = ½·Re(Iᴴ·L·I) for RMS phasors and ¼·Re(Iᴴ·L·I) for peak phasors
 * (½·L·i² averaged over a period).
 */
export function pairState(model: GraphModel, result: SolveResult, couplingId: string, pair?: [string, string]): PairState {
  const c = (model.couplings ?? []).find((x) => x.id === couplingId);
  if (!c) throw new ModelRefusal(`coupling "${couplingId}" is not in this model`, [{ kind: 'coupling', id: couplingId }]);
  const [id1, id2] = pair ?? [c.windings[0], c.windings[1]];
  const w1 = model.elements.find((e) => e.id === id1) as InductorEl | undefined;
  const w2 = model.elements.find((e) => e.id === id2) as InductorEl | undefined;
  if (!w1 || !w2) throw new ModelRefusal(`coupling "${couplingId}" does not name "${id1}" and "${id2}"`, [{ kind: 'coupling', id: couplingId }]);
  const i1 = (result.elements[id1] as TwoTerminalResult).current;
  const i2 = (result.elements[id2] as TwoTerminalResult).current;
  const m = mutualOf(c, w1.henries, w2.henries);
  const ms = m * dotSign(w1) * dotSign(w2);
  const flux: [Cx, Cx] = [
    { re: w1.henries * i1.re + ms * i2.re, im: w1.henries * i1.im + ms * i2.im },
    { re: w2.henries * i2.re + ms * i1.re, im: w2.henries * i2.im + ms * i1.im },
  ];
  const scale = result.frequencyHz === 0 || result.amplitudes === 'rms' ? 0.5 : 0.25;
  const self = w1.henries * (i1.re ** 2 + i1.im ** 2) + w2.henries * (i2.re ** 2 + i2.im ** 2);
  const cross = ms * (i1.re * i2.re + i1.im * i2.im); // M·d1·d2·Re(I1·conj(I2))
  const energyJ = scale * (self + 2 * cross);
  const tiny = 1e-12 * Math.max(self, 1e-300);
  const interaction = m === 0 || Math.abs(cross) <= tiny ? 'none' : cross > 0 ? 'aiding' : 'opposing';
  return {
    windings: [id1, id2],
    coupling: couplingId,
    l1: w1.henries,
    l2: w2.henries,
    m,
    k: m / mutualLimit(w1.henries, w2.henries),
    flux,
    energyJ,
    interaction,
    mutualTerm: cross,
  };
}

/** How two coupled windings are wired to each other, if simply. */
export interface Connection {
  kind: 'series' | 'parallel';
  /** how the dots sit in that connection */
  sense: 'aiding' | 'opposing';
  /** L1 + L2 ± 2M (series) or (L1·L2 − M²)/(L1 + L2 ∓ 2M) (parallel), for the sense as wired */
  inductance: number;
  /** the same for the other sense (one dot flipped) */
  otherSense: number;
}

/**
 * Series: the windings share exactly one node that nothing else touches.
 * Parallel: they share both nodes. Aiding when a current through the
 * combination enters both dots (series) or both dotted ends are on one node
 * (parallel). (Series and parallel connection formulas: field notes, standard
 * results from memory.)
 */
export function connectionOf(model: GraphModel, couplingId: string, pair?: [string, string]): Connection | null {
  const c = (model.couplings ?? []).find((x) => x.id === couplingId);
  if (!c) return null;
  const [id1, id2] = pair ?? [c.windings[0], c.windings[1]];
  const w1 = model.elements.find((e) => e.id === id1) as InductorEl;
  const w2 = model.elements.find((e) => e.id === id2) as InductorEl;
  const m = mutualOf(c, w1.henries, w2.henries);
  const l1 = w1.henries;
  const l2 = w2.henries;
  const dot1 = w1.nodes[w1.dot === 'second' ? 1 : 0];
  const dot2 = w2.nodes[w2.dot === 'second' ? 1 : 0];
  const shared = w1.nodes.filter((n) => w2.nodes.includes(n));
  const par = (s: number) => (l1 * l2 - m * m) / (l1 + l2 - 2 * s * m);
  const ser = (s: number) => l1 + l2 + 2 * s * m;
  if (shared.length === 2) {
    const sense = dot1 === dot2 ? 'aiding' : 'opposing';
    const s = sense === 'aiding' ? 1 : -1;
    return { kind: 'parallel', sense, inductance: par(s), otherSense: par(-s) };
  }
  if (shared.length === 1) {
    const mid = shared[0];
    const touching = model.elements.filter((e) => e.nodes.includes(mid));
    if (touching.length !== 2) return null;
    // a current through the chain enters one winding at its outer end and the other at the middle node:
    // aiding when exactly one of the dots sits on the middle node
    const sense = (dot1 === mid) !== (dot2 === mid) ? 'aiding' : 'opposing';
    const s = sense === 'aiding' ? 1 : -1;
    return { kind: 'series', sense, inductance: ser(s), otherSense: ser(-s) };
  }
  return null;
}
