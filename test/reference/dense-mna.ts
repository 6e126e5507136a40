import { create, all, type Complex as MComplex } from 'mathjs';
import type { GraphModel, InductorEl } from '../../src/model/graph';

/**
 * An independent reference: a dense MNA written straight from the contract's
 * equations, solved with mathjs `lusolve` (a general-purpose library). It
 * shares no code with the solver. Only for connected models (one part).
 * `mutualSign` lets a test negate every mutual term directly.
 */
const math = create(all);

export interface ReferenceSolution {
  nodes: Map<string, { re: number; im: number }>;
  branch: Map<string, { re: number; im: number }>;
}

export function referenceSolve(model: GraphModel, mutualSign = 1): ReferenceSolution {
  const names: string[] = [];
  for (const e of model.elements) for (const n of e.nodes) if (n !== model.ground && !names.includes(n)) names.push(n);
  const idx = new Map(names.map((n, i) => [n, i]));
  const branchIds = model.elements.filter((e) => e.kind === 'inductor' || e.kind === 'voltage-source' || e.kind === 'ideal-transformer').map((e) => e.id);
  const size = names.length + branchIds.length;
  const bIdx = new Map(branchIds.map((id, i) => [id, names.length + i]));
  const w = 2 * Math.PI * model.frequencyHz;
  const A: MComplex[][] = Array.from({ length: size }, () => Array.from({ length: size }, () => math.complex(0, 0)));
  const b: MComplex[] = Array.from({ length: size }, () => math.complex(0, 0));
  const add = (r: number | undefined, c: number | undefined, v: MComplex) => {
    if (r === undefined || c === undefined) return;
    A[r][c] = math.add(A[r][c], v) as MComplex;
  };
  const node = (n: string) => idx.get(n);
  for (const e of model.elements) {
    const [p, q] = [node(e.nodes[0]), node(e.nodes[1])];
    if (e.kind === 'resistor' || e.kind === 'capacitor') {
      const y = e.kind === 'resistor' ? math.complex(1 / e.ohms, 0) : math.complex(0, w * e.farads);
      add(p, p, y);
      add(q, q, y);
      add(p, q, math.unaryMinus(y) as MComplex);
      add(q, p, math.unaryMinus(y) as MComplex);
    } else if (e.kind === 'inductor' || e.kind === 'voltage-source') {
      const k = bIdx.get(e.id)!;
      add(p, k, math.complex(1, 0));
      add(q, k, math.complex(-1, 0));
      add(k, p, math.complex(1, 0));
      add(k, q, math.complex(-1, 0));
      if (e.kind === 'inductor') add(k, k, math.complex(0, -w * e.henries));
      else b[k] = math.complex({ r: e.magnitude, phi: (e.phaseDeg * Math.PI) / 180 });
    } else if (e.kind === 'current-source') {
      const i = math.complex({ r: e.magnitude, phi: (e.phaseDeg * Math.PI) / 180 });
      if (p !== undefined) b[p] = math.subtract(b[p], i) as MComplex;
      if (q !== undefined) b[q] = math.add(b[q], i) as MComplex;
    } else if (e.kind === 'ideal-transformer') {
      const k = bIdx.get(e.id)!;
      const [s1, s2] = [node(e.nodes[2]), node(e.nodes[3])];
      // I_p enters the primary dot; I_s = −n·I_p enters the secondary dot; V_p − n·V_s = 0
      add(p, k, math.complex(1, 0));
      add(q, k, math.complex(-1, 0));
      add(s1, k, math.complex(-e.ratio, 0));
      add(s2, k, math.complex(e.ratio, 0));
      add(k, p, math.complex(1, 0));
      add(k, q, math.complex(-1, 0));
      add(k, s1, math.complex(-e.ratio, 0));
      add(k, s2, math.complex(e.ratio, 0));
    }
  }
  const byId = new Map(model.elements.map((e) => [e.id, e]));
  for (const c of model.couplings ?? []) {
    for (let i = 0; i < c.windings.length; i++) {
      for (let j = i + 1; j < c.windings.length; j++) {
        const a = byId.get(c.windings[i]) as InductorEl;
        const bb = byId.get(c.windings[j]) as InductorEl;
        const m = c.henries ?? c.k! * Math.sqrt(a.henries * bb.henries);
        const d = (a.dot === 'second' ? -1 : 1) * (bb.dot === 'second' ? -1 : 1);
        const v = math.complex(0, -w * m * d * mutualSign);
        add(bIdx.get(a.id), bIdx.get(bb.id), v);
        add(bIdx.get(bb.id), bIdx.get(a.id), v);
      }
    }
  }
  const x = math.lusolve(A as unknown as number[][], b.map((v) => [v]) as unknown as number[][]) as unknown as MComplex[][];
  const get = (r: number) => {
    const v = math.complex(x[r][0] as unknown as MComplex);
    return { re: v.re, im: v.im };
  };
  return {
    nodes: new Map(names.map((n, i) => [n, get(i)])),
    branch: new Map(branchIds.map((id) => [id, get(bIdx.get(id)!)])),
  };
}
