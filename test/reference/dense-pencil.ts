import { create, all, type Complex as MComplex } from 'mathjs';
import type { GraphModel, InductorEl } from '../../src/model/graph';

/**
 * An independent reference for the s-domain: the dense MNA pencil G + s·C
 * written straight from the contract's equations (no code shared with the
 * solver), and a test of whether G + s·C is singular at a given s by one
 * solve with mathjs `lusolve` (a near-singular matrix answers a unit
 * right-hand side with a huge solution). Only for connected models.
 */
const math = create(all);

export interface DensePencil {
  n: number;
  g: number[][];
  c: number[][];
}

export function densePencil(model: GraphModel): DensePencil {
  const names: string[] = [];
  for (const e of model.elements) for (const n of e.nodes) if (n !== model.ground && !names.includes(n)) names.push(n);
  const idx = new Map(names.map((n, i) => [n, i]));
  const branchIds = model.elements.filter((e) => e.kind === 'inductor' || e.kind === 'voltage-source' || e.kind === 'ideal-transformer').map((e) => e.id);
  const n = names.length + branchIds.length;
  const bIdx = new Map(branchIds.map((id, i) => [id, names.length + i]));
  const g = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const c = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const add = (m: number[][], r: number | undefined, col: number | undefined, v: number) => {
    if (r !== undefined && col !== undefined) m[r][col] += v;
  };
  for (const e of model.elements) {
    const [p, q] = [idx.get(e.nodes[0]), idx.get(e.nodes[1])];
    if (e.kind === 'resistor' || e.kind === 'capacitor') {
      const m = e.kind === 'resistor' ? g : c;
      const y = e.kind === 'resistor' ? 1 / e.ohms : e.farads;
      add(m, p, p, y);
      add(m, q, q, y);
      add(m, p, q, -y);
      add(m, q, p, -y);
    } else if (e.kind === 'inductor' || e.kind === 'voltage-source') {
      const k = bIdx.get(e.id)!;
      add(g, p, k, 1);
      add(g, q, k, -1);
      add(g, k, p, 1);
      add(g, k, q, -1);
      if (e.kind === 'inductor') add(c, k, k, -e.henries); // v − L·di/dt = 0
    } else if (e.kind === 'ideal-transformer') {
      const k = bIdx.get(e.id)!;
      const [s1, s2] = [idx.get(e.nodes[2]), idx.get(e.nodes[3])];
      for (const [r, v] of [[p, 1], [q, -1], [s1, -e.ratio], [s2, e.ratio]] as [number | undefined, number][]) {
        add(g, r, k, v);
        add(g, k, r, v);
      }
    }
  }
  const byId = new Map(model.elements.map((e) => [e.id, e]));
  for (const cp of model.couplings ?? []) {
    for (let i = 0; i < cp.windings.length; i++) {
      for (let j = i + 1; j < cp.windings.length; j++) {
        const a = byId.get(cp.windings[i]) as InductorEl;
        const b = byId.get(cp.windings[j]) as InductorEl;
        const m = cp.henries ?? cp.k! * Math.sqrt(a.henries * b.henries);
        const d = (a.dot === 'second' ? -1 : 1) * (b.dot === 'second' ? -1 : 1);
        add(c, bIdx.get(a.id), bIdx.get(b.id), -m * d);
        add(c, bIdx.get(b.id), bIdx.get(a.id), -m * d);
      }
    }
  }
  return { n, g, c };
}

/**
 * How singular G + s·C is: ‖x‖·‖G + s·C‖ for the solution x of (G + s·C)·x = b
 * with a fixed unit-size b (about the condition number for a near-singular
 * matrix, of order 1 to 1e3 for a regular one).
 */
export function singularity(p: DensePencil, s: { re: number; im: number }): number {
  const m: MComplex[][] = p.g.map((row, i) => row.map((gv, j) => math.complex(gv + s.re * p.c[i][j], s.im * p.c[i][j])));
  let norm = 0;
  for (const row of m) norm = Math.max(norm, row.reduce((acc, v) => acc + Math.hypot(v.re, v.im), 0));
  const b = m.map((_, i) => [math.complex(Math.cos(i * 1.7 + 0.3), Math.sin(i * 0.9))]);
  let x: MComplex[][];
  try {
    x = math.lusolve(m as unknown as number[][], b as unknown as number[][]) as unknown as MComplex[][];
  } catch {
    return Infinity; // exactly singular
  }
  let xn = 0;
  for (const row of x) {
    const v = math.complex(row[0] as unknown as MComplex);
    xn = Math.max(xn, Math.hypot(v.re, v.im));
  }
  return xn * norm;
}
