/**
 * Windings and their couplings: the signed mutual terms the dots give, the
 * check that the inductance matrix is positive semidefinite, and the
 * reciprocal inductance matrix Γ = L⁻¹ of each group of coupled windings, by
 * which the phasor engine may stamp windings without branch currents.
 */
import type { GraphModel, InductorEl } from '../../model/graph';
import { ModelRefusal } from '../errors';
import { defOf, dotSign } from '../elements/registry';
import { mutualLimit } from '../../model/mutual';

/** A mutual term between two inductors, signed by their dots: M·d_i·d_j. */
export interface Mutual {
  a: number; // element index
  b: number; // element index
  /** signed mutual inductance in henries */
  m: number;
  /** unsigned mutual inductance */
  magnitude: number;
  coupling: string;
}

/**
 * Mutual terms of all couplings, and the check that the inductance matrix
 * they make together is positive semidefinite (physically realisable: the
 * stored energy ½·iᵀLi can never be negative). Checked per group of windings
 * linked by couplings, on the matrix scaled to unit diagonal (entries are the
 * coupling coefficients), by a Cholesky factorisation that tolerates the
 * exactly singular k = 1 case.
 */
export function collectMutuals(model: GraphModel): Mutual[] {
  const mutuals: Mutual[] = [];
  if (!model.couplings?.length) return mutuals;
  const wanted = new Set<string>();
  for (const c of model.couplings) for (const w of c.windings) wanted.add(w);
  const index = new Map<string, number>();
  model.elements.forEach((e, i) => {
    if (wanted.has(e.id)) index.set(e.id, i);
  });
  for (const c of model.couplings ?? []) {
    const ids = c.windings;
    for (let i = 0; i < ids.length; i++) {
      for (let j = i + 1; j < ids.length; j++) {
        const a = index.get(ids[i])!;
        const b = index.get(ids[j])!;
        const ea = model.elements[a] as InductorEl;
        const eb = model.elements[b] as InductorEl;
        const magnitude = c.henries !== undefined ? c.henries : c.k! * mutualLimit(ea.henries, eb.henries);
        mutuals.push({ a, b, m: magnitude * dotSign(ea) * dotSign(eb), magnitude, coupling: c.id });
      }
    }
  }
  checkPositiveSemidefinite(model, mutuals);
  return mutuals;
}

function checkPositiveSemidefinite(model: GraphModel, mutuals: Mutual[]): void {
  if (mutuals.length === 0) return;
  // Group windings linked by couplings.
  const groups = new Map<number, Set<number>>();
  const groupOf = new Map<number, number>();
  let next = 0;
  for (const mu of mutuals) {
    const ga = groupOf.get(mu.a);
    const gb = groupOf.get(mu.b);
    if (ga === undefined && gb === undefined) {
      groups.set(next, new Set([mu.a, mu.b]));
      groupOf.set(mu.a, next).set(mu.b, next);
      next++;
    } else if (ga !== undefined && gb === undefined) {
      groups.get(ga)!.add(mu.b);
      groupOf.set(mu.b, ga);
    } else if (ga === undefined && gb !== undefined) {
      groups.get(gb)!.add(mu.a);
      groupOf.set(mu.a, gb);
    } else if (ga !== gb) {
      for (const w of groups.get(gb!)!) {
        groups.get(ga!)!.add(w);
        groupOf.set(w, ga!);
      }
      groups.delete(gb!);
    }
  }
  const mutualsOf = new Map<number, Mutual[]>();
  for (const mu of mutuals) {
    const g = groupOf.get(mu.a)!;
    if (!mutualsOf.has(g)) mutualsOf.set(g, []);
    mutualsOf.get(g)!.push(mu);
  }
  for (const [g, members] of groups) {
    if (members.size < 3) continue; // two windings: k <= 1 was checked per coupling
    const w = [...members];
    const pos = new Map(w.map((e, i) => [e, i]));
    const n = w.length;
    const a = new Float64Array(n * n);
    for (let i = 0; i < n; i++) a[i * n + i] = 1;
    const couplingsInGroup = new Set<string>();
    for (const mu of mutualsOf.get(g)!) {
      const i = pos.get(mu.a)!;
      const j = pos.get(mu.b)!;
      const la = (model.elements[mu.a] as InductorEl).henries;
      const lb = (model.elements[mu.b] as InductorEl).henries;
      const kk = mu.m / mutualLimit(la, lb);
      a[i * n + j] += kk;
      a[j * n + i] += kk;
      couplingsInGroup.add(mu.coupling);
    }
    if (diagonallyDominant(a, n)) continue; // Gershgorin: every eigenvalue >= 0
    const bad = choleskyFailure(a, n);
    if (bad >= 0) {
      const names = w.map((e) => `"${model.elements[e].id}"`).join(', ');
      const culprits = [...couplingsInGroup];
      throw new ModelRefusal(
        `coupling "${culprits[culprits.length - 1]}": the inductance matrix of windings ${names} is not positive semidefinite (no physical set of windings has these couplings; ` +
          `the stored energy could go negative near winding "${model.elements[w[bad]].id}"); lower one of the coupling coefficients of ${culprits.map((c) => `"${c}"`).join(', ')}`,
        culprits.map((id) => ({ kind: 'coupling' as const, id })),
      );
    }
  }
}

function diagonallyDominant(a: Float64Array, n: number): boolean {
  for (let i = 0; i < n; i++) {
    let off = 0;
    for (let j = 0; j < n; j++) if (j !== i) off += Math.abs(a[i * n + j]);
    if (off > a[i * n + i]) return false;
  }
  return true;
}

/** Index of the first pivot that shows the matrix is not PSD, or −1. */
function choleskyFailure(a: Float64Array, n: number): number {
  const tol = 1e-10;
  const l = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    let d = a[j * n + j];
    for (let k = 0; k < j; k++) d -= l[j * n + k] * l[j * n + k];
    if (d < -tol) return j;
    if (d <= tol) {
      // Zero pivot: the rest of this column must vanish too.
      for (let i = j + 1; i < n; i++) {
        let s = a[i * n + j];
        for (let k = 0; k < j; k++) s -= l[i * n + k] * l[j * n + k];
        if (Math.abs(s) > 1e-7) return j;
      }
      continue;
    }
    const root = Math.sqrt(d);
    l[j * n + j] = root;
    for (let i = j + 1; i < n; i++) {
      let s = a[i * n + j];
      for (let k = 0; k < j; k++) s -= l[i * n + k] * l[j * n + k];
      l[i * n + j] = s / root;
    }
  }
  return -1;
}

/** One row of Γ = L⁻¹: the partner windings (element indices, itself included) and their entries. */
export interface GammaRow {
  others: number[];
  gamma: number[];
}

/**
 * In the 'ac' form, inductors need no branch current when their (dot-signed)
 * inductance matrix can be inverted safely: the nodal approach stamps
 * Γ = L⁻¹ as the admittance Γ/(jω). An uncoupled inductor is the 1×1 case
 * (Γ = 1/L). A group of coupled windings whose matrix is near singular (k
 * close to 1, where Γ would lose precision) keeps its branch currents.
 * Equivalence of the two forms: V = jωL·I ⇔ I = L⁻¹·V/(jω) (standard).
 */
export function reciprocalInductances(model: GraphModel, mutuals: Mutual[]): Map<number, GammaRow> {
  const out = new Map<number, GammaRow>();
  const partners = new Map<number, Mutual[]>();
  for (const mu of mutuals) {
    if (!partners.has(mu.a)) partners.set(mu.a, []);
    if (!partners.has(mu.b)) partners.set(mu.b, []);
    partners.get(mu.a)!.push(mu);
    partners.get(mu.b)!.push(mu);
  }
  const seen = new Set<number>();
  model.elements.forEach((el, i) => {
    if (!defOf(el).roles.winding) return;
    if (!partners.has(i)) {
      out.set(i, { others: [i], gamma: [1 / (el as InductorEl).henries] });
      return;
    }
    if (seen.has(i)) return;
    // the group of windings linked to i through couplings
    const group: number[] = [];
    const stack = [i];
    seen.add(i);
    while (stack.length) {
      const w = stack.pop()!;
      group.push(w);
      for (const mu of partners.get(w)!) {
        const o = mu.a === w ? mu.b : mu.a;
        if (!seen.has(o)) {
          seen.add(o);
          stack.push(o);
        }
      }
    }
    const n = group.length;
    if (n > 64) return; // large groups keep branch currents (dense inverse not worth it)
    const pos = new Map(group.map((e, t) => [e, t]));
    const l = new Float64Array(n * n);
    group.forEach((e, t) => (l[t * n + t] = (model.elements[e] as InductorEl).henries));
    for (const w of group) {
      for (const mu of partners.get(w)!) {
        if (mu.a !== w) continue;
        const a = pos.get(mu.a)!;
        const b = pos.get(mu.b)!;
        l[a * n + b] += mu.m;
        l[b * n + a] += mu.m;
      }
    }
    const gamma = invertWellConditioned(l, n);
    if (!gamma) return;
    group.forEach((e, t) => out.set(e, { others: group, gamma: Array.from(gamma.subarray(t * n, t * n + n)) }));
  });
  return out;
}

/**
 * Inverse of a symmetric positive definite matrix, or null when its
 * unit-diagonal scaling has a Cholesky pivot below 0.05 (for a pair: k above
 * about 0.975), where the inverse would lose too many digits.
 */
function invertWellConditioned(l: Float64Array, n: number): Float64Array | null {
  const d = new Float64Array(n);
  for (let t = 0; t < n; t++) d[t] = Math.sqrt(l[t * n + t]);
  const a = new Float64Array(n * n);
  for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) a[r * n + c] = l[r * n + c] / (d[r] * d[c]);
  // Gauss-Jordan on the scaled matrix (SPD: no pivoting needed), checking pivots
  const inv = new Float64Array(n * n);
  for (let t = 0; t < n; t++) inv[t * n + t] = 1;
  for (let p = 0; p < n; p++) {
    const piv = a[p * n + p];
    if (!(piv > 0.05)) return null;
    for (let c = 0; c < n; c++) {
      a[p * n + c] /= piv;
      inv[p * n + c] /= piv;
    }
    for (let r = 0; r < n; r++) {
      if (r === p) continue;
      const f = a[r * n + p];
      if (f === 0) continue;
      for (let c = 0; c < n; c++) {
        a[r * n + c] -= f * a[p * n + c];
        inv[r * n + c] -= f * inv[p * n + c];
      }
    }
  }
  // undo the scaling: L⁻¹ = D⁻¹·A⁻¹·D⁻¹
  for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) inv[r * n + c] /= d[r] * d[c];
  return inv;
}

