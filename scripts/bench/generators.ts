/**
 * Deterministic, seeded generators of benchmark circuits in the graph-model
 * interchange (`coilwright.graph/1`). Pure functions: the same size and seed
 * always give the same model, element for element.
 *
 * Values are chosen well conditioned over 10 Hz .. 100 kHz: every inductor of
 * the ladder sits in series with a resistor, every ladder node has a shunt
 * resistor to ground, and every interior mesh node touches a resistor, so no
 * lossless resonance can make the matrix singular at a sweep frequency.
 */
import type { Coupling, GraphElement, GraphModel } from '../../src/model/graph';

/** Small, fast 32-bit PRNG (mulberry32); returns floats in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Log-uniform value in [lo, hi], rounded to 4 significant digits. */
function logUniform(rand: () => number, lo: number, hi: number): number {
  const v = lo * Math.pow(hi / lo, rand());
  return Number(v.toPrecision(4));
}

function uniform(rand: () => number, lo: number, hi: number): number {
  return Number((lo + (hi - lo) * rand()).toPrecision(3));
}

export interface GeneratorOptions {
  /** PRNG seed; default 1 */
  seed?: number;
  /** the model's frequencyHz; default per generator */
  frequencyHz?: number;
}

/** Every distinct node name an element of the model touches. */
export function nodeNames(model: GraphModel): Set<string> {
  const names = new Set<string>();
  for (const el of model.elements) for (const n of el.nodes) names.add(n);
  names.add(model.ground);
  return names;
}

/**
 * RLC ladder: a voltage source feeds a chain of sections; section i is a
 * series resistor (a_i -> m_i) and inductor (m_i -> a_{i+1}) with a shunt
 * capacitor and a shunt resistor from a_{i+1} to ground. Every tenth section's
 * inductor (i % 10 == 5) is coupled to the next section's inductor with
 * k in 0.3 .. 0.9 and a random dot arrangement.
 *
 * Node count is exactly `nodes` for even `nodes` >= 4 (ground, a_0, then two per
 * section); an odd count is rounded down.
 */
export function rlcLadder(nodes: number, options: GeneratorOptions = {}): GraphModel {
  if (!Number.isInteger(nodes) || nodes < 4) throw new RangeError('rlcLadder needs at least 4 nodes');
  const rand = mulberry32(options.seed ?? 1);
  const sections = Math.floor((nodes - 2) / 2);
  const elements: GraphElement[] = [];
  const couplings: Coupling[] = [];
  elements.push({ id: 'Vin', kind: 'voltage-source', nodes: ['a0', 'gnd'], magnitude: 230, phaseDeg: 0 });
  for (let i = 0; i < sections; i++) {
    const a = `a${i}`;
    const m = `m${i}`;
    const next = `a${i + 1}`;
    elements.push({ id: `R${i}`, kind: 'resistor', nodes: [a, m], ohms: logUniform(rand, 0.05, 2) });
    elements.push({
      id: `L${i}`,
      kind: 'inductor',
      nodes: [m, next],
      henries: logUniform(rand, 10e-6, 1e-3),
      dot: rand() < 0.5 ? 'first' : 'second',
    });
    elements.push({ id: `C${i}`, kind: 'capacitor', nodes: [next, 'gnd'], farads: logUniform(rand, 1e-9, 100e-9) });
    elements.push({ id: `Rsh${i}`, kind: 'resistor', nodes: [next, 'gnd'], ohms: logUniform(rand, 1e3, 100e3) });
    if (i % 10 === 5 && i + 1 < sections) {
      couplings.push({ id: `K${i}`, windings: [`L${i}`, `L${i + 1}`], k: uniform(rand, 0.3, 0.9) });
    }
  }
  return {
    schema: 'coilwright.graph/1',
    frequencyHz: options.frequencyHz ?? 1000,
    amplitudes: 'rms',
    ground: 'gnd',
    elements,
    couplings,
  };
}

/** rows x cols with rows * cols === n and rows the largest divisor <= sqrt(n). */
export function gridShape(n: number): { rows: number; cols: number } {
  let rows = Math.floor(Math.sqrt(n));
  while (rows > 1 && n % rows !== 0) rows--;
  return { rows, cols: n / rows };
}

/**
 * 2-D mesh: a grid of exactly `nodes` nodes (near-square, see gridShape),
 * ground at the corner n0_0. Horizontal and vertical edges join neighbours;
 * edge kinds cycle resistor / inductor / capacitor so that every interior node
 * touches one of each. About one inductor in ten is coupled to the next
 * inductor of the element list (a nearby edge) with k in 0.3 .. 0.9. Three
 * voltage sources and three current sources drive interior nodes against
 * ground.
 */
export function mesh2d(nodes: number, options: GeneratorOptions = {}): GraphModel {
  if (!Number.isInteger(nodes) || nodes < 16) throw new RangeError('mesh2d needs at least 16 nodes');
  const rand = mulberry32(options.seed ?? 2);
  const { rows, cols } = gridShape(nodes);
  if (rows < 3) throw new RangeError(`mesh2d: ${nodes} nodes make a ${rows} x ${cols} strip; pick a size with a divisor >= 3`);
  const name = (r: number, c: number) => `n${r}_${c}`;
  const elements: GraphElement[] = [];
  const inductors: string[] = [];
  let edge = 0;
  const addEdge = (kindIndex: number, a: string, b: string) => {
    edge++;
    switch (kindIndex % 3) {
      case 0:
        elements.push({ id: `R${edge}`, kind: 'resistor', nodes: [a, b], ohms: logUniform(rand, 1, 100) });
        break;
      case 1:
        elements.push({
          id: `L${edge}`,
          kind: 'inductor',
          nodes: [a, b],
          henries: logUniform(rand, 10e-6, 1e-3),
          dot: rand() < 0.5 ? 'first' : 'second',
        });
        inductors.push(`L${edge}`);
        break;
      default:
        elements.push({ id: `C${edge}`, kind: 'capacitor', nodes: [a, b], farads: logUniform(rand, 1e-9, 100e-9) });
    }
  };
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      if (c + 1 < cols) addEdge(r + c, name(r, c), name(r, c + 1));
      if (r + 1 < rows) addEdge(r + c + 1, name(r, c), name(r + 1, c));
    }
  }
  const couplings: Coupling[] = [];
  for (let i = 5; i + 1 < inductors.length; i += 10) {
    couplings.push({ id: `K${couplings.length + 1}`, windings: [inductors[i], inductors[i + 1]], k: uniform(rand, 0.3, 0.9) });
  }
  // Sources on interior nodes (never on ground or its neighbours), spread over the grid.
  const interior = (fr: number, fc: number) =>
    name(Math.min(rows - 2, Math.max(1, Math.round(fr * (rows - 1)))), Math.min(cols - 2, Math.max(2, Math.round(fc * (cols - 1)))));
  const vSites = [interior(0.25, 0.75), interior(0.5, 0.5), interior(0.75, 0.25)];
  const iSites = [interior(0.25, 0.25), interior(0.75, 0.75), interior(0.9, 0.5)];
  const used = new Set<string>();
  vSites.forEach((node, i) => {
    if (used.has(node)) return;
    used.add(node);
    elements.push({ id: `V${i + 1}`, kind: 'voltage-source', nodes: [node, name(0, 0)], magnitude: 10 * (i + 1), phaseDeg: 40 * i });
  });
  iSites.forEach((node, i) => {
    if (used.has(node)) return;
    used.add(node);
    elements.push({ id: `I${i + 1}`, kind: 'current-source', nodes: [name(0, 0), node], magnitude: 0.05 * (i + 1), phaseDeg: -30 * i });
  });
  return {
    schema: 'coilwright.graph/1',
    frequencyHz: options.frequencyHz ?? 20000,
    amplitudes: 'rms',
    ground: name(0, 0),
    elements,
    couplings,
  };
}

/**
 * Star: one hub node joined to every other node, the degenerate pattern of a bus or a supply rail. A
 * voltage source drives the hub against ground; resistor i joins the hub to leaf s_i, and each leaf is
 * loaded to ground by a resistor, so every leaf voltage is the divider V * Rg_i / (R_i + Rg_i).
 *
 * Node count is exactly `nodes` (ground, the hub, nodes - 2 leaves).
 */
export function star(nodes: number, options: GeneratorOptions = {}): GraphModel {
  if (!Number.isInteger(nodes) || nodes < 3) throw new RangeError('star needs at least 3 nodes');
  const rand = mulberry32(options.seed ?? 3);
  const elements: GraphElement[] = [{ id: 'Vin', kind: 'voltage-source', nodes: ['hub', 'gnd'], magnitude: 10, phaseDeg: 0 }];
  for (let i = 0; i < nodes - 2; i++) {
    elements.push({ id: `R${i}`, kind: 'resistor', nodes: ['hub', `s${i}`], ohms: logUniform(rand, 1, 1000) });
    elements.push({ id: `Rg${i}`, kind: 'resistor', nodes: [`s${i}`, 'gnd'], ohms: logUniform(rand, 1e3, 1e5) });
  }
  return {
    schema: 'coilwright.graph/1',
    frequencyHz: options.frequencyHz ?? 50,
    amplitudes: 'rms',
    ground: 'gnd',
    elements,
    couplings: [],
  };
}

/** A node a sweep can probe: the far end of the ladder, the centre of the mesh. */
export function probeNode(generator: GeneratorName, model: GraphModel): string {
  if (generator === 'star') return 's0';
  if (generator === 'ladder') {
    let last = 0;
    for (const el of model.elements) if (el.kind === 'capacitor') last++;
    return `a${last}`;
  }
  let rows = 0;
  let cols = 0;
  for (const el of model.elements) {
    for (const n of el.nodes) {
      const m = /^n(\d+)_(\d+)$/.exec(n);
      if (m) {
        rows = Math.max(rows, Number(m[1]) + 1);
        cols = Math.max(cols, Number(m[2]) + 1);
      }
    }
  }
  return `n${Math.floor(rows / 2)}_${Math.floor(cols / 2) + 1}`;
}

export const GENERATORS = {
  ladder: rlcLadder,
  mesh: mesh2d,
  star,
} as const;

export type GeneratorName = keyof typeof GENERATORS;
