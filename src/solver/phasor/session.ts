import {
  RESULT_SCHEMA,
  type ComplexJson,
  type ElementResult,
  type GraphModel,
  type SolveResult,
} from '../../model/graph';
import { nameTable } from '../../model/names';
import { ModelRefusal } from '../errors';
import { buildTopology, type Topology } from '../core/topology';
import { checkSolvable } from '../core/checks';
import { collectMutuals, reciprocalInductances } from '../core/windings';
import { buildDescriptor, rightHandSide, smallResistors, type Descriptor } from '../core/descriptor';
import { defOf, isWinding, sourceRole } from '../elements/registry';
import { exactResonance, perfectCouplings, quotedList } from './singularHints';
import { analyze, ComplexSparseLU, type LuOptions, type LuSymbolic } from '../lu-backend';
import { SingularMatrixError, type CscPattern } from '../sparse/types';

/**
 * 'ac': every winding keeps its branch current (row V − jωL·I = 0), small resistors get one too; 'dc': the
 * full branch form, which 0 Hz needs (an inductance is a short there); 'admittance': windings stamped through
 * the reciprocal inductance matrix Γ/(jω) where that is well conditioned (fewer unknowns, but digits lost when
 * ωL is small beside its surroundings), kept as the independent second writing that tests and the benchmark
 * compare the branch form with.
 */
export type MnaForm = 'ac' | 'dc' | 'admittance';

/**
 * Rows and columns equilibrated before pivoting and before the singular test (sparse/scaling.ts), so that
 * a spread of impedances across many decades is judged by scaled pivots, not absolute ones.
 */
const LU_OPTIONS: LuOptions = { scale: 'rows-cols' };

/** Condition number above which a solve warns: 1e10 leaves about six of sixteen digits (common practice). */
const PRECISION_KAPPA = 1e10;
/**
 * Beyond this condition number (about 1/(100·ε), ε = 2.2e-16 the double precision's unit roundoff) a model
 * with a k = 1 coupling or an exact LC resonance is taken as singular: rounding alone kept its LU from a zero pivot.
 */
const SINGULAR_KAPPA = 4e13;

/** Raw solution at one frequency: node voltages and branch currents as typed arrays. */
export interface RawSolution {
  frequencyHz: number;
  /** the system the unknowns belong to */
  mna: Descriptor;
  /** per node index */
  vRe: Float64Array;
  vIm: Float64Array;
  /** the unknown vector */
  xRe: Float64Array;
  xIm: Float64Array;
  /** the sources' values this solution was driven by, per element index (absent: each source's own phasor) */
  sources?: SourceValues;
}

/** A value for every source, per element index (elements that are no source are skipped). */
export interface SourceValues { re: Float64Array; im: Float64Array }

/**
 * Owns one circuit structure: topology, MNA pattern and the symbolic analysis
 * of its sparse LU. Solving at another frequency (a sweep point) only
 * re-evaluates the matrix values and refactors numerically with the kept
 * pivot order (the approach of KLU, Davis and Palamadai Natarajan, ACM TOMS 2010).
 */
export class SolverSession {
  readonly model: GraphModel;
  readonly topo: Topology;
  readonly mna: Descriptor;
  readonly form: MnaForm;
  private readonly rhsRe: Float64Array;
  private readonly rhsIm: Float64Array;
  private readonly symbolic: LuSymbolic;
  /** this session's own LU (null once a later session has taken it over) */
  private lu: ComplexSparseLU | null;
  private re: Float64Array;
  private im: Float64Array;
  private checked = new Set<boolean>();
  private factored = false;
  private dcTwin?: SolverSession;
  private readonly port = { vr: 0, vi: 0, ir: 0, ii: 0 };

  /**
   * `previous`: the session of the model before an edit. When the edit kept
   * the matrix pattern (a value changed, not the wiring), its symbolic
   * analysis and LU are taken over and the next solve only refactors.
   */
  constructor(model: GraphModel, previous?: SolverSession, form: MnaForm = model.frequencyHz === 0 ? 'dc' : 'ac') {
    this.model = model;
    this.topo = buildTopology(model);
    const mutuals = collectMutuals(model);
    this.form = form;
    // every winding keeps its branch current at every frequency: rebuilding it from node voltages through
    // 1/(jωL) (the reciprocal form, core/windings.ts) cancels digits when ωL is small beside its surroundings
    // (error ~ 1e-16·|Z around|/|ωL|), while the branch row V − jωL·I = 0 yields I exactly
    this.mna = buildDescriptor(model, this.topo, mutuals, {
      branchResistors: smallResistors(model, this.topo),
      reduced: form === 'admittance' ? reciprocalInductances(model, mutuals) : undefined,
    });
    const n = this.mna.n;
    const srcRe = new Float64Array(model.elements.length);
    const srcIm = new Float64Array(model.elements.length);
    model.elements.forEach((el, i) => {
      const p = defOf(el).phasor?.(el as never);
      if (p) {
        srcRe[i] = p.re;
        srcIm[i] = p.im;
      }
    });
    this.rhsRe = new Float64Array(n);
    this.rhsIm = new Float64Array(n);
    rightHandSide(this.mna, srcRe, srcIm, this.rhsRe, this.rhsIm);
    if (previous && samePattern(previous.mna.pattern, this.mna.pattern)) {
      // the LU and its value buffers move to this session: sessions never share mutable buffers
      this.symbolic = previous.symbolic;
      this.lu = previous.lu;
      this.factored = previous.factored && previous.lu !== null;
      this.re = previous.re;
      this.im = previous.im;
      previous.lu = null;
      previous.factored = false;
      previous.re = new Float64Array(0);
      previous.im = new Float64Array(0);
    } else {
      this.symbolic = analyze(this.mna.pattern, { branchFrom: this.mna.nodeCount });
      this.lu = new ComplexSparseLU(this.symbolic, LU_OPTIONS);
      this.re = new Float64Array(this.mna.pattern.rowIdx.length);
      this.im = new Float64Array(this.mna.pattern.rowIdx.length);
    }
  }

  /** True when this session took over the symbolic analysis of the one before. */
  reuses(previous: SolverSession): boolean {
    return this.symbolic === previous.symbolic;
  }

  get warnings(): string[] {
    return this.topo.warnings;
  }

  /**
   * Solves at one frequency; throws ModelRefusal naming the culprit when it cannot. `sources` drives the
   * circuit by other source values than the model's phasors (a harmonic of a periodic source), on the same
   * structure and the same symbolic analysis.
   */
  solveRaw(frequencyHz: number, sources?: SourceValues): RawSolution {
    if (!(frequencyHz >= 0) || !Number.isFinite(frequencyHz)) {
      throw new ModelRefusal(`model: frequency ${frequencyHz} Hz is not a finite number >= 0`, [{ kind: 'model' }]);
    }
    const dc = frequencyHz === 0;
    if (!this.checked.has(dc)) {
      checkSolvable(this.model, this.topo, frequencyHz);
      this.checked.add(dc);
    }
    if (dc && this.form !== 'dc') {
      this.dcTwin ??= new SolverSession(this.model, undefined, 'dc');
      return this.dcTwin.solveRaw(0, sources);
    }
    if (!this.lu) {
      // taken over by a later session: this one gets buffers of its own again
      this.lu = new ComplexSparseLU(this.symbolic, LU_OPTIONS);
      this.re = new Float64Array(this.mna.pattern.rowIdx.length);
      this.im = new Float64Array(this.mna.pattern.rowIdx.length);
    }
    const { mna, re, im, lu } = this;
    const omega = 2 * Math.PI * frequencyHz;
    const { g, c, inv } = mna;
    re.set(g);
    if (this.form !== 'dc') {
      const invOmega = 1 / omega;
      for (let s = 0; s < im.length; s++) im[s] = omega * c[s] - inv[s] * invOmega;
    } else {
      for (let s = 0; s < im.length; s++) im[s] = omega * c[s];
    }
    try {
      if (this.factored) lu.refactor({ re, im });
      else lu.factor({ re, im });
      this.factored = true;
    } catch (e) {
      this.factored = false;
      if (e instanceof SingularMatrixError) throw this.singularRefusal(e.column, frequencyHz);
      throw e;
    }
    let xRe: Float64Array;
    let xIm: Float64Array;
    if (sources) {
      xRe = new Float64Array(mna.n);
      xIm = new Float64Array(mna.n);
      rightHandSide(mna, sources.re, sources.im, xRe, xIm);
    } else {
      xRe = this.rhsRe.slice();
      xIm = this.rhsIm.slice();
    }
    lu.solve(xRe, xIm);
    const nNodes = this.topo.nodeNames.length;
    const vRe = new Float64Array(nNodes);
    const vIm = new Float64Array(nNodes);
    for (let v = 0; v < nNodes; v++) {
      const u = mna.nodeUnknown[v];
      if (u >= 0) {
        vRe[v] = xRe[u];
        vIm[v] = xIm[u];
      }
    }
    for (let u = 0; u < xRe.length; u++) {
      if (!Number.isFinite(xRe[u]) || !Number.isFinite(xIm[u])) {
        const what = mna.unknownLabel(u);
        throw new ModelRefusal(
          `${what.kind} "${what.id}": its ${what.kind === 'node' ? 'voltage' : 'current'} overflows at ${frequencyHz} Hz (the model is at or near a singular point, e.g. an exact resonance of lossless parts); add some resistance or change the frequency`,
          [what],
        );
      }
    }
    return { frequencyHz, mna, vRe, vIm, xRe, xIm, ...(sources ? { sources } : {}) };
  }

  solveAt(frequencyHz: number): SolveResult {
    const raw = this.solveRaw(frequencyHz);
    const warnings = this.warningsAt(frequencyHz);
    const result = this.toResult(raw);
    result.warnings = warnings;
    return result;
  }

  /**
   * After a solve: a warning naming the unknown the estimate points at when the condition number of the
   * system (Hager–Higham 1-norm estimate from the LU, sparse/condition.ts) exceeds 1e10, so that the
   * answer may have lost more than six of double precision's sixteen digits; null otherwise.
   */
  private precisionWarning(frequencyHz: number): string | null {
    if (!this.lu || !this.factored) return null;
    const { kappa, column } = this.lu.conditionEstimate();
    if (!(kappa > PRECISION_KAPPA)) return null;
    const at = this.mna.unknownLabel(column);
    return `${at.kind} "${at.id}": the circuit's values span so many decades at ${frequencyHz} Hz that the results may have lost more than six digits (condition number about ${Number(kappa.toPrecision(2))}); check the values of the parts at it`;
  }

  /**
   * A k = 1 coupling under contradicting ideal voltages, or an exact resonance, is singular; rounding can still
   * give its LU nonzero pivots and an answer of 1e15 A. Such a model whose condition number is beyond
   * SINGULAR_KAPPA is refused as the zero pivot would have been.
   */
  private refuseRoundedSingular(frequencyHz: number): void {
    if (!this.lu || !this.factored) return;
    if (!perfectCouplings(this.model).length && !exactResonance(this.model, frequencyHz)) return;
    const { kappa, column } = this.lu.conditionEstimate();
    if (kappa > SINGULAR_KAPPA) throw this.singularRefusal(column, frequencyHz);
  }

  private singularRefusal(column: number, frequencyHz: number): ModelRefusal {
    const extreme = this.extremeEntry();
    if (extreme) {
      const at = this.mna.unknownLabel(extreme.column);
      return new ModelRefusal(
        `${at.kind} "${at.id}": the values of the parts at it reach ${Number(extreme.size.toPrecision(3))} (siemens or ohms) at ${frequencyHz} Hz, too far from the circuit's other values for the solver's double precision; check the values of the parts at it (a resistance or inductance near zero, a capacitance far too large) or change the frequency`,
        [at],
      );
    }
    let what = this.mna.unknownLabel(column);
    const resonance = exactResonance(this.model, frequencyHz);
    if (resonance) {
      const { inductor: l, capacitor: cap } = resonance;
      const el = what.kind === 'element' ? this.model.elements.find((e) => e.id === what.id) : undefined;
      const subject = what.kind === 'node' ? `node "${what.id}": its voltage` : `element "${what.id}" (${el!.kind}): its current`;
      // the source the resonant pair sits across (both its nodes among theirs), whichever unknown the LU's
      // order met the zero pivot at
      const pairNodes = new Set(this.model.elements.filter((e) => e.id === l || e.id === cap).flatMap((e) => e.nodes));
      const source = el && sourceRole(el) ? el : this.model.elements.find((e) => sourceRole(e) && e.nodes.every((n) => pairNodes.has(n)));
      const role = source ? sourceRole(source) : undefined;
      const across = role === 'voltage' ? ` across the ideal voltage source "${source!.id}"` : role === 'current' ? ` driven by the ideal current source "${source!.id}"` : '';
      return new ModelRefusal(
        `${subject} is undetermined at ${frequencyHz} Hz because "${l}" and "${cap}" are in exact resonance there (ω²·L·C = 1)${across}, and lossless parts in exact resonance have a defined answer only if a resistance breaks it; add a resistance to "${l}" or "${cap}" (in series or across), or change the frequency`,
        [what, { kind: 'element', id: l }, { kind: 'element', id: cap }],
      );
    }
    // a k = 1 coupling whose windings touch the culprit (a node of theirs, or a part on one of their nodes)
    const touched = new Set(what.kind === 'node' ? [what.id] : this.model.elements.find((e) => e.id === what.id)!.nodes);
    const byId = new Map(this.model.elements.map((e) => [e.id, e]));
    const perfect = perfectCouplings(this.model).filter((c) => c.windings.some((w) => byId.get(w)!.nodes.some((n) => touched.has(n))));
    // a winding of such a coupling (where the LU's order met the zero pivot) under an ideal voltage on its own
    // nodes: the refusal names that source, the contradicting drive, instead
    if (what.kind === 'element' && isWinding(byId.get(what.id)!) && perfect.some((c) => c.windings.includes(what.id))) {
      const own = byId.get(what.id)!.nodes.filter((n) => n !== this.model.ground);
      const source = this.model.elements.find((e) => sourceRole(e) === 'voltage' && e.nodes.some((n) => own.includes(n)));
      if (source) what = { kind: 'element', id: source.id };
    }
    if (perfect.length && !(what.kind === 'element' && isWinding(byId.get(what.id)!))) {
      const named = perfect.map((c) => `"${c.id}" (windings ${quotedList(c.windings)}, k = 1)`).join(', ');
      const subject = what.kind === 'node' ? `node "${what.id}": its voltage` : `element "${what.id}" (${byId.get(what.id)!.kind}): its current`;
      return new ModelRefusal(
        `${subject} is undetermined at ${frequencyHz} Hz; the coupling ${named} ties the windings' voltages to their turns ratio, so ideal voltages driving them that contradict it have no answer; lower k below 1 or add a series resistance`,
        [what, ...perfect.map((c) => ({ kind: 'coupling' as const, id: c.id }))],
      );
    }
    if (what.kind === 'node') {
      return new ModelRefusal(
        `node "${what.id}": its voltage is undetermined at ${frequencyHz} Hz (nothing fixes it relative to the rest of the circuit, or an exact resonance of lossless parts shorts or opens it); add a resistor from it to the circuit or change the frequency`,
        [what],
      );
    }
    const el = this.model.elements.find((e) => e.id === what.id)!;
    const coupled = (this.model.couplings ?? []).filter((c) => c.windings.includes(what.id));
    const hint = coupled.length
      ? `; its windings are tightly coupled (${coupled.map((c) => `"${c.id}"`).join(', ')}), so check that coupled windings are not driven by ideal voltages that contradict each other, or lower k below 1`
      : '; check for ideal voltages that contradict each other or add a series resistance';
    return new ModelRefusal(`element "${what.id}" (${el.kind}): its current is undetermined at ${frequencyHz} Hz${hint}`, [what]);
  }

  /**
   * After a failed factorisation: the largest matrix entry, with its column,
   * when it is beyond what the factorisation's squared magnitudes hold (above
   * 1e150, as validate.ts bounds values) or more than 1e30 times the
   * smallest, so far apart that double precision (16 digits) loses the
   * smaller entirely; null when the values are ordinary.
   */
  private extremeEntry(): { column: number; size: number } | null {
    const { re, im } = this;
    const { colPtr, n } = this.mna.pattern;
    let largest = 0;
    let smallest = Infinity;
    let column = -1;
    for (let j = 0; j < n; j++) {
      for (let s = colPtr[j]; s < colPtr[j + 1]; s++) {
        const size = Math.max(Math.abs(re[s]), Math.abs(im[s]));
        if (!(size <= largest)) {
          largest = size;
          column = j;
        }
        if (size > 0 && size < smallest) smallest = size;
      }
    }
    return column >= 0 && (!(largest <= 1e150) || largest > 1e30 * smallest) ? { column, size: largest } : null;
  }

  /**
   * Port p of element i in a raw solution: its voltage and current (reference directions of graph-model.md),
   * into `out`, without building the result JSON (for analyses that read many solutions).
   */
  readPort(sol: RawSolution, i: number, p: number, out: { vr: number; vi: number; ir: number; ii: number }): void {
    readPort(this, sol, i, p, out);
  }

  /**
   * Every element's port values from a raw solution, PORT_STRIDE numbers per element (see `portsInto`);
   * `portCount` 1 or 2 per element. Throws ModelRefusal when a power overflows.
   */
  portTable(sol: RawSolution): { values: Float64Array; portCount: Uint8Array } {
    const count = this.model.elements.length;
    const values = new Float64Array(PORT_STRIDE * count);
    const portCount = new Uint8Array(count);
    for (let i = 0; i < count; i++) portCount[i] = this.portsInto(sol, i, values, PORT_STRIDE * i);
    return { values, portCount };
  }

  /**
   * Element i's port values into out[o ..]: voltage re, im and current re, im of port 0, then of port 1,
   * then watts and vars (S = V·conj(I) in rms or DC, ½·V·conj(I) in peak), each −0 made 0; returns the
   * number of ports. Throws ModelRefusal when the power overflows, so that nothing is printed or drawn as
   * Infinity.
   */
  private portsInto(sol: RawSolution, i: number, out: Float64Array, o: number): number {
    const el = this.model.elements[i];
    const ports = defOf(el).ports.length;
    const scale = sol.frequencyHz === 0 || this.model.amplitudes === 'rms' ? 1 : 0.5;
    const port = this.port;
    let watts = 0;
    let vars = 0;
    for (let p = 0; p < ports; p++) {
      readPort(this, sol, i, p, port);
      const { vr, vi, ir, ii } = port;
      out[o + 4 * p] = z(vr);
      out[o + 4 * p + 1] = z(vi);
      out[o + 4 * p + 2] = z(ir);
      out[o + 4 * p + 3] = z(ii);
      // summed left to right as V·conj(I) over the ports, so the figures are the same to the last bit
      watts = watts + vr * ir + vi * ii;
      vars = vars + vi * ir - vr * ii;
    }
    watts *= scale;
    vars *= scale;
    if (!Number.isFinite(watts) || !Number.isFinite(vars)) {
      throw new ModelRefusal(`element "${el.id}": its power overflows at ${sol.frequencyHz} Hz (more than 1.8e308 W or var); bring the circuit's voltages, currents and values nearer to everyday sizes`, [{ kind: 'element', id: el.id }]);
    }
    out[o + 8] = z(watts);
    out[o + 9] = z(vars);
    return ports;
  }

  /**
   * The warnings of a solve at this frequency: the topology's, then the precision warning if any; refuses a
   * model that only rounding made solvable (refuseRoundedSingular).
   */
  warningsAt(frequencyHz: number): string[] {
    const twin = frequencyHz === 0 && this.dcTwin ? this.dcTwin : this;
    twin.refuseRoundedSingular(frequencyHz);
    const warnings = [...this.topo.warnings];
    const warning = twin.precisionWarning(frequencyHz);
    if (warning) warnings.push(warning);
    return warnings;
  }

  /** Builds the contract's result JSON from a raw solution. */
  toResult(sol: RawSolution, only?: { nodes?: Set<string>; elements?: Set<string> }): SolveResult {
    const { model, topo } = this;
    // no prototype: a node or element named "__proto__" or "constructor" is an entry like any other
    const nodes = nameTable<ComplexJson>();
    topo.nodeNames.forEach((name, v) => {
      if (!only?.nodes || only.nodes.has(name)) nodes[name] = c(sol.vRe[v], sol.vIm[v]);
    });
    const elements = nameTable<ElementResult>();
    const t = new Float64Array(PORT_STRIDE);
    model.elements.forEach((el, i) => {
      if (only?.elements && !only.elements.has(el.id)) return;
      const ports = this.portsInto(sol, i, t, 0);
      const power = { watts: t[8], vars: t[9] };
      elements[el.id] =
        ports === 1
          ? { voltage: { re: t[0], im: t[1] }, current: { re: t[2], im: t[3] }, power }
          : { voltages: [{ re: t[0], im: t[1] }, { re: t[4], im: t[5] }], currents: [{ re: t[2], im: t[3] }, { re: t[6], im: t[7] }], power };
    });
    return {
      schema: RESULT_SCHEMA,
      frequencyHz: sol.frequencyHz,
      amplitudes: model.amplitudes,
      nodes,
      elements,
      warnings: [...topo.warnings],
    };
  }
}

/** Numbers per element in `SolverSession.portTable`: two ports of (v re, v im, i re, i im), then watts, vars. */
export const PORT_STRIDE = 10;

/**
 * Voltage across port p of element i and the current through it, by the
 * port's current rule (element definitions): v/R, jωC·v, a branch unknown (or,
 * for a winding stamped through Γ, Σ_j Γ_ij·V_j/(jω)), or the source's value.
 */
function readPort(session: SolverSession, sol: RawSolution, i: number, p: number, out: { vr: number; vi: number; ir: number; ii: number }): void {
  const el = session.model.elements[i];
  const rule = defOf(el).ports[p];
  const nd = session.topo.terminals;
  const o = 4 * i;
  const a = nd[o + rule.terminals[0]];
  const b = nd[o + rule.terminals[1]];
  const vr = sol.vRe[a] - sol.vRe[b];
  const vi = sol.vIm[a] - sol.vIm[b];
  out.vr = vr;
  out.vi = vi;
  const omega = 2 * Math.PI * sol.frequencyHz;
  const cur = rule.current;
  switch (cur.kind) {
    case 'resistance': {
      const ohms = cur.ohms(el as never, {});
      const k = sol.mna.branchUnknown[i];
      if (k >= 0) {
        // a small resistance with a branch current (core/descriptor.ts): I exact, and V = R·I
        out.ir = sol.xRe[k];
        out.ii = sol.xIm[k];
        out.vr = ohms * out.ir;
        out.vi = ohms * out.ii;
        return;
      }
      out.ir = vr / ohms;
      out.ii = vi / ohms;
      return;
    }
    case 'capacitance': {
      const farads = cur.farads(el as never);
      out.ir = -omega * farads * vi;
      out.ii = omega * farads * vr;
      return;
    }
    case 'branch': {
      const k = sol.mna.branchUnknown[i];
      if (k < 0) {
        // stamped through Γ: I_i = Σ_j Γ_ij·V_j / (jω)
        const row = sol.mna.reduced.get(i)!;
        let sr = 0;
        let si = 0;
        for (let t = 0; t < row.others.length; t++) {
          const o2 = 4 * row.others[t];
          sr += row.gamma[t] * (sol.vRe[nd[o2]] - sol.vRe[nd[o2 + 1]]);
          si += row.gamma[t] * (sol.vIm[nd[o2]] - sol.vIm[nd[o2 + 1]]);
        }
        out.ir = si / omega;
        out.ii = -sr / omega;
        return;
      }
      const gain = cur.gain(el as never);
      out.ir = gain * sol.xRe[k + cur.branch];
      out.ii = gain * sol.xIm[k + cur.branch];
      return;
    }
    case 'source': {
      if (sol.sources) {
        out.ir = sol.sources.re[i];
        out.ii = sol.sources.im[i];
        return;
      }
      const ph = defOf(el).phasor!(el as never);
      out.ir = ph.re;
      out.ii = ph.im;
      return;
    }
  }
}

function samePattern(a: CscPattern, b: CscPattern): boolean {
  if (a.n !== b.n || a.rowIdx.length !== b.rowIdx.length) return false;
  for (let i = 0; i <= a.n; i++) if (a.colPtr[i] !== b.colPtr[i]) return false;
  for (let i = 0; i < a.rowIdx.length; i++) if (a.rowIdx[i] !== b.rowIdx[i]) return false;
  return true;
}

/** Normalises −0 to 0 so that JSON output never shows "-0". */
function z(v: number): number {
  return v === 0 ? 0 : v;
}
function c(re: number, im: number): ComplexJson {
  return { re: z(re), im: z(im) };
}

export function createSession(model: GraphModel): SolverSession {
  return new SolverSession(model);
}

export function solveGraph(model: GraphModel): SolveResult {
  return new SolverSession(model).solveAt(model.frequencyHz);
}
