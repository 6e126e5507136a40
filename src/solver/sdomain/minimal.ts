/**
 * The minimal transfer function's roots. The system matrix gives every zero
 * of det([[G + sC, −b], [cᵀ, d]]) and the pencil every natural frequency; a
 * mode the input does not reach or the output does not see is in both lists
 * and cancels. Rather than matching the two lists by distance alone (a weakly
 * observable mode leaves a genuine pole–zero pair 1e-9 apart; a multiple root
 * spreads by eps^(1/m)), the roots are gathered into locations, and the order
 * of H at each location is read from H itself: |H(q + δ)| ∝ δ^ν for small δ,
 * so ν = log10(|H(q + δ)|/|H(q + δ/10)|) rounded, positive for a zero of order
 * ν and negative for a pole (direct solves at two points beside q).
 */
import type { Roots } from './pencil';
import type { C } from './polynomial';

/** Roots within this fraction of the largest root's magnitude from 0 are printed as 0 (contract). */
export const ZERO_ROOT = 1e-9;

/** Rounds roots within ZERO_ROOT·largest of 0 to 0, and real or imaginary parts at rounding level of their root. */
export function cleanRoots(r: Roots, largest: number): Roots {
  const out: Roots = { re: [], im: [], polished: r.re.map((_, i) => r.polished?.[i] ?? false) };
  for (let i = 0; i < r.re.length; i++) {
    let re = r.re[i];
    let im = r.im[i];
    const m = Math.hypot(re, im);
    if (m <= ZERO_ROOT * largest) re = im = 0;
    if (Math.abs(im) <= 1e-14 * m) im = 0;
    if (Math.abs(re) <= 1e-14 * m) re = 0;
    out.re.push(re + 0);
    out.im.push(im + 0);
  }
  return out;
}

/**
 * A root of multiplicity m at s = 0 (series capacitors and a mutual
 * inductance each put a zero there) comes out of an eigensolver as m roots on
 * a small circle about 0, of radius about eps^(1/m) of the shift, while their
 * mean stays within rounding of 0 (the mean of a cluster is well conditioned).
 * Sets the largest such cluster among the small roots to exact 0.
 */
export function settleZeroCluster(r: Roots, largest: number): Roots {
  const order = r.re.map((_, i) => i).sort((i, j) => Math.hypot(r.re[i], r.im[i]) - Math.hypot(r.re[j], r.im[j]));
  const small = order.filter((i) => Math.hypot(r.re[i], r.im[i]) <= 1e-3 * largest);
  let sr = 0;
  let si = 0;
  let best = 0;
  for (let m = 1; m <= small.length; m++) {
    sr += r.re[small[m - 1]];
    si += r.im[small[m - 1]];
    if (m >= 2 && Math.hypot(sr, si) / m <= ZERO_ROOT * largest) best = m;
  }
  const out: Roots = { re: [...r.re], im: [...r.im], polished: r.re.map((_, i) => r.polished?.[i] ?? false) };
  for (let t = 0; t < best; t++) {
    out.re[small[t]] = out.im[small[t]] = 0;
    out.polished![small[t]] = true;
  }
  return out;
}

/** H at s by a direct solve, with Σ|c_i|·max|x| (the size rounding is measured against); null at a pole. */
export type Probe = (s: C) => { h: C; size: number } | null;

interface Place {
  at: C;
  /** on the real axis (conjugate pairs counted as two there) */
  real: boolean;
  np: number;
  nz: number;
  /** the zero members' own locations (for those that turn out not to be here) */
  zeros: C[];
}

/**
 * `h(s)` evaluates H directly with the size of the terms it sums (null where
 * the solve fails, at a pole). Returns
 * the zeros and poles of the minimal H, conjugate pairs both listed.
 *
 * Circuits' natural frequencies are semisimple and come out accurate, but the
 * system matrix has chains at a pole that identical sections share (a zero
 * there of high multiplicity spreads by eps^(1/m)). So poles give the places:
 * natural frequencies within 1e-8 of each other are one place, and zeros
 * within 1e-4 of a place are taken to it; H's order there says how many of
 * them are really there and whether a pole is left. Zeros away from every
 * pole are read one by one, and neighbours that each show nothing are read
 * again at their centre, where a multiple zero they spread from sits.
 */
export function minimalRoots(zerosAll: Roots, natural: Roots, largest: number, h: Probe): { zeros: Roots; poles: Roots } {
  const z = cleanRoots(settleZeroCluster(zerosAll, largest), largest);
  const p = cleanRoots(settleZeroCluster(natural, largest), largest);
  const floor = ZERO_ROOT * largest;
  const size = (c: C) => Math.max(Math.hypot(c.re, c.im), floor);
  const dist = (a: C, b: C) => Math.hypot(a.re - b.re, a.im - b.im);
  const axisNear = (c: C) => c.im === 0 || Math.abs(c.im) <= 1e-5 * size(c);

  const places: Place[] = [];
  p.re.forEach((re, i) => {
    const c = { re, im: p.im[i] };
    if (c.im < 0) return;
    const real = axisNear(c);
    const at = real ? { re, im: 0 } : c;
    const weight = real && c.im !== 0 ? 2 : 1;
    const same = places.find((pl) => pl.real === real && dist(pl.at, at) <= 1e-8 * size(at));
    if (same) same.np += weight;
    else places.push({ at, real, np: weight, nz: 0, zeros: [] });
  });
  const free: C[] = [];
  z.re.forEach((re, i) => {
    const c = { re, im: z.im[i] };
    if (c.im < 0) return;
    let best: Place | null = null;
    for (const pl of places) {
      const d = pl.real ? Math.hypot(c.re - pl.at.re, c.im) : dist(c, pl.at);
      if (d <= 1e-4 * size(pl.at) && (!best || d < dist(c, best.at))) best = pl;
    }
    if (best) {
      const weight = best.real && c.im !== 0 ? 2 : 1;
      best.nz += weight;
      for (let w = 0; w < weight; w++) best.zeros.push(c);
    } else free.push(c);
  });

  const zeros: Roots = { re: [], im: [] };
  const poles: Roots = { re: [], im: [] };
  const add = (r: Roots, c: C, n: number) => {
    for (let t = 0; t < n; t++) {
      r.re.push(c.re);
      r.im.push(c.im);
      if (c.im !== 0) {
        r.re.push(c.re);
        r.im.push(-c.im);
      }
    }
  };
  const locations = () => [...places.map((pl) => pl.at), ...free];
  const nearest = (q: C) => {
    let d = q.im !== 0 ? 2 * Math.abs(q.im) : Infinity; // its own conjugate
    for (const o of locations()) {
      const dd = Math.min(dist(o, q), Math.hypot(o.re - q.re, o.im + q.im));
      if (dd > 0) d = Math.min(d, dd);
    }
    return d;
  };
  // δ: small beside the nearest other root and beside the root itself (at 0, beside the circuit's scale)
  const probe = (q: C, spread = 0) => {
    const own = Math.hypot(q.re, q.im) > floor ? 1e-6 * Math.hypot(q.re, q.im) : 1e-6 * largest;
    return orderAt(h, q, Math.max(1e-9 * size(q), 1e-3 * spread, Math.min(own, 1e-3 * nearest(q))));
  };

  for (const pl of places) {
    // a natural frequency is accurate to rounding: H is read right beside it, closer than any zero
    // that is merely near (a genuine pole–zero pair can be 1e-7 apart)
    const m = Math.hypot(pl.at.re, pl.at.im);
    const order = orderAt(h, pl.at, m > floor ? 1e-9 * m : 1e-6 * Math.min(nearest(pl.at), largest));
    const nu = order === null ? pl.nz - pl.np : Math.max(-pl.np, Math.min(pl.nz, order));
    if (nu < 0) add(poles, pl.at, -nu);
    // of the zeros taken here, ν + np are here; the others (farthest first) are elsewhere
    const here = Math.max(0, Math.min(pl.nz, nu + pl.np));
    if (nu > 0) add(zeros, pl.at, nu);
    const away = pl.zeros
      .map((c) => ({ c, d: dist(c, pl.at) }))
      .sort((x, y) => y.d - x.d)
      .slice(0, pl.nz - here);
    const seen = new Set<C>();
    for (const { c } of away) {
      if (!seen.has(c) && c.im >= 0) free.push(c);
      seen.add(c);
    }
  }

  // free zeros: those at one point counted together, each point read where it is; neighbours that
  // show nothing are read again at their centre
  const points: { c: C; n: number }[] = [];
  for (const c of free) {
    const real = axisNear(c);
    const w = real && c.im !== 0 ? 2 : 1;
    const at = real ? { re: c.re, im: 0 } : c;
    const same = points.find((pt) => axisNear(pt.c) === real && dist(pt.c, at) <= 1e-8 * size(at));
    if (same) same.n += w;
    else points.push({ c: at, n: w });
  }
  free.length = 0;
  const counts: number[] = [];
  for (const pt of points) {
    free.push(pt.c);
    counts.push(pt.n);
  }
  const orders = free.map((c) => probe(c));
  const used = free.map(() => false);
  for (let i = 0; i < free.length; i++) {
    if (used[i]) continue;
    const c = free[i];
    const real = axisNear(c);
    const o = orders[i];
    if (o !== null && o > 0) {
      used[i] = true;
      add(zeros, c, Math.min(o, counts[i]));
      continue;
    }
    // a zero the eigensolver placed only roughly (beside a crowd of poles): Newton's method on H itself
    if (counts[i] === 1) {
      const found = newtonZero(h, c, nearest(c));
      if (found) {
        const at = axisNear(found) ? { re: found.re, im: 0 } : found;
        const ord = probe(at);
        if (ord !== null && ord > 0) {
          used[i] = true;
          add(zeros, at, 1);
          continue;
        }
      }
    }
    const members = free.map((_, j) => j).filter((j) => !used[j] && (orders[j] === 0 || orders[j] === null) && axisNear(free[j]) === real && dist(free[j], c) <= 1e-3 * size(c));
    if (members.length < 2) continue;
    const at = { re: members.reduce((x, m) => x + free[m].re, 0) / members.length, im: real ? 0 : members.reduce((x, m) => x + free[m].im, 0) / members.length };
    const spread = Math.max(...members.map((m) => dist(free[m], at)));
    const count = members.reduce((x, m) => x + counts[m], 0);
    const order = orderAt(h, at, Math.max(1e-9 * size(at), 1e-3 * spread));
    if (order !== null && order > 0) {
      add(zeros, at, Math.min(order, count));
      for (const m of members) used[m] = true;
    }
  }
  return { zeros, poles };
}

/**
 * A zero of H near `start` by Newton's method on H itself, H' from a central
 * difference; null when it does not settle within `reach` of the start.
 */
export function newtonZero(h: Probe, start: C, reach: number): C | null {
  let s = { ...start };
  const scale = Math.max(Math.hypot(start.re, start.im), reach);
  for (let it = 0; it < 12; it++) {
    const step = 1e-7 * scale;
    const f = h(s);
    const fp = h({ re: s.re + step, im: s.im });
    const fm = h({ re: s.re - step, im: s.im });
    if (!f || !fp || !fm) return null;
    const dr = (fp.h.re - fm.h.re) / (2 * step);
    const di = (fp.h.im - fm.h.im) / (2 * step);
    const d2 = dr * dr + di * di;
    if (!(d2 > 0)) return null;
    // Δ = f / f'
    const xr = (f.h.re * dr + f.h.im * di) / d2;
    const xi = (f.h.im * dr - f.h.re * di) / d2;
    s = { re: s.re - xr, im: s.im - xi };
    if (!(Math.hypot(s.re - start.re, s.im - start.im) <= reach)) return null;
    if (Math.hypot(xr, xi) <= 1e-13 * scale) return s;
  }
  return s;
}

/**
 * ν with |H(q + δ·u)| ∝ δ^ν, read over two decades (δ, δ/10, δ/100) along a
 * direction off both axes: both slopes must be within 0.1 of one whole number.
 * Where they are not, H has
 * sunk into rounding below δ (near a zero) or feels another root, so δ grows
 * tenfold, at most a thousandfold. Null when H cannot be read there.
 */
function orderAt(h: Probe, q: C, delta: number): number | null {
  const u = { re: Math.cos(1.1), im: Math.sin(1.1) };
  let floor = 0;
  const at = (d: number) => {
    const v = h({ re: q.re + d * u.re, im: q.im + d * u.im });
    const m = v ? Math.hypot(v.h.re, v.h.im) : NaN;
    if (v) floor = Math.max(floor, 1e-9 * v.size);
    return m > 0 && Number.isFinite(m) ? m : NaN;
  };
  let small = at(delta / 100);
  let mid = at(delta / 10);
  for (let tries = 0; tries < 4; tries++, delta *= 10) {
    const big = at(delta);
    const o1 = Math.log10(big / mid);
    const o2 = Math.log10(mid / small);
    const n = Math.round(o1);
    // both slopes within 0.1 of one whole number: rounding noise is rarely so steady
    // a level H at rounding size is a floor, not an order 0
    const level = n === 0 && Math.max(big, mid, small) <= floor;
    if (Number.isFinite(o1) && Number.isFinite(o2) && Math.abs(o1 - n) < 0.1 && Math.abs(o2 - n) < 0.1 && !level) return n;
    small = mid;
    mid = big;
  }
  return null;
}
