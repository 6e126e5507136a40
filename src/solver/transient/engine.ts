/**
 * The time response of the descriptor system G·x + C·dx/dt = B·u(t) (full
 * branch form: every winding's current is an unknown, the inductance matrix
 * with its dot signs sits in C), by TR-BDF2 (R. E. Bank, W. M. Coughran, W.
 * Fichtner, E. H. Grosse, D. J. Rose and R. K. Smith, "Transient simulation
 * of silicon devices and circuits", IEEE Trans. CAD 4(4), 1985): a
 * trapezoidal stage to t + γh, then BDF2 over t, t + γh, t + h, with
 * γ = 2 − √2 so that both stages solve with one matrix, G + C/(κh),
 * κ = 1 − 1/√2. Second order and L-stable: no ringing after a jump.
 *
 * Steps are controlled by the embedded estimate of the local error k·h³·x'''
 * from the step's own three stages (M. E. Hosea and L. F. Shampine,
 * "Analysis and implementation of TR-BDF2", Applied Numerical Mathematics 20,
 * 1996): 2k·h·(f_n/γ − f_γ/(γ(1−γ)) + f_{n+1}/(1−γ)) with f = C·dx/dt, taken
 * through the step's matrix so that stiff components are not overestimated.
 * It is held per unit step, so that the error at every sample stays within
 * the tolerance of each quantity's largest magnitude over a whole run. Steps land on every
 * output time and every breakpoint. Where the step size fits an output step
 * as a power of two it stays fixed for long stretches, so the matrix is
 * factored again only when it changes (a small cache keeps recent ones).
 *
 * At t = 0 and at every breakpoint a backward-Euler step of infinitesimal
 * length ε carries the state across any jump as the circuit would: charge
 * and flux linkage are conserved (C·x keeps its value where nothing forces
 * it) while the algebraic constraints take their new values; a second ε step
 * gives the derivatives just after. Then the stepping restarts with small,
 * damped backward-Euler steps.
 */
import type { GraphModel } from '../../model/graph';
import { ModelRefusal } from '../errors';
import { buildTopology, type Topology } from '../core/topology';
import { checkSolvable } from '../core/checks';
import { collectMutuals, type Mutual } from '../core/windings';
import { buildDescriptor, type Descriptor } from '../core/descriptor';
import { defOf, type SwitchEl } from '../elements/registry';
import { analyze, RealSparseLU, type LuSymbolic } from '../lu-backend';
import { SingularMatrixError } from '../sparse/types';
import { SolverSession } from '../phasor/session';
import { sourceTimeline, type Timeline } from './sources';

export interface TransientOptions {
  /** end of the run, seconds */
  stopS: number;
  /** output step H, seconds */
  stepS: number;
  /** accuracy asked for, relative to each quantity's largest magnitude (default 1e-4) */
  tolerance: number;
  /** initial values from the model, or the DC operating point of the sources at t = 0 */
  start: 'given' | 'dc';
}

const GAMMA = 2 - Math.SQRT2;
const KAPPA = 1 - 1 / Math.SQRT2;
const A2 = 1 / (GAMMA * (2 - GAMMA));
const B2 = ((1 - GAMMA) * (1 - GAMMA)) / (GAMMA * (2 - GAMMA));
/** TR-BDF2's local error constant (Bank et al. 1985): LTE = K·h³·x''' */
const K_LTE = (-3 * GAMMA * GAMMA + 4 * GAMMA - 2) / (12 * (2 - GAMMA));
/** the weight of f's rounding in the embedded error estimate */
const F_WEIGHT = Math.abs((2 * K_LTE) / KAPPA) * (1 / GAMMA + 1 / (GAMMA * (1 - GAMMA)) + 1 / (1 - GAMMA));

/** the local error asked per unit step, as a fraction of the tolerance (the rest is margin for the sum over a run) */
const SAFETY = 3;

interface Factored { alpha: number; state: number; lu: RealSparseLU; w: Float64Array }

/** What the engine hands out at each output time. */
export interface Sample {
  t: number;
  /** the unknowns (node voltages, branch currents) and their time derivatives */
  x: Float64Array;
  dx: Float64Array;
  /** each switch's state (by element index; 1 closed) */
  closed: Uint8Array;
}

export class TransientEngine {
  readonly model: GraphModel;
  readonly topo: Topology;
  readonly warnings: string[];
  readonly timeline: Timeline;
  private d: Descriptor;
  private readonly mutuals: Mutual[];
  private readonly symbolic: LuSymbolic;
  private readonly opts: TransientOptions;
  readonly closed: Uint8Array;
  private stateVersion = 0;
  private readonly toggleTimes: Float64Array;
  private readonly toggleOwner: Int32Array;
  private readonly cache: Factored[] = [];
  private readonly values: Float64Array;
  private readonly n: number;
  // work vectors
  private readonly rhs: Float64Array;
  private readonly tmp: Float64Array;
  private readonly u0: Float64Array;
  private readonly ug: Float64Array;
  private readonly u1: Float64Array;
  private readonly uProbe: Float64Array;
  private readonly probes: Float64Array[];
  private readonly peak: Float64Array;
  private peakV = 0;
  private peakI = 0;
  /** steps taken by the last run (benchmarks) */
  steps = 0;
  /** factorisations of G + α·C made since the engine was built (benchmarks; the cache keeps the others) */
  factorCount = 0;
  private jumpNotes: string[] = [];
  private readonly drift: Float64Array;
  private readonly noise: Float64Array;
  private jumpTimesMore = 0;

  constructor(model: GraphModel, opts: TransientOptions) {
    this.model = model;
    this.opts = opts;
    this.topo = buildTopology(model);
    checkSolvable(model, this.topo, 1); // the structural refusals of any frequency above 0 Hz
    this.mutuals = collectMutuals(model);
    this.warnings = [...this.topo.warnings];
    const els = model.elements;
    this.closed = new Uint8Array(els.length);
    const toggles: { t: number; i: number }[] = [];
    els.forEach((el, i) => {
      if (el.kind !== 'switch') return;
      const sw = el as SwitchEl;
      this.closed[i] = sw.closed ? 1 : 0;
      for (const t of sw.togglesS ?? []) if (t <= opts.stopS * (1 + 1e-12)) toggles.push({ t, i });
    });
    toggles.sort((a, b) => a.t - b.t);
    this.toggleTimes = Float64Array.from(toggles.map((x) => x.t));
    this.toggleOwner = Int32Array.from(toggles.map((x) => x.i));
    this.timeline = sourceTimeline(model, opts.stopS, toggles.map((x) => x.t));
    this.d = this.describe();
    this.n = this.d.n;
    this.symbolic = analyze(this.d.pattern);
    this.values = new Float64Array(this.d.pattern.rowIdx.length);
    const n = this.n;
    this.rhs = new Float64Array(n);
    this.tmp = new Float64Array(n);
    this.u0 = new Float64Array(els.length);
    this.ug = new Float64Array(els.length);
    this.u1 = new Float64Array(els.length);
    this.uProbe = new Float64Array(els.length);
    this.probes = [0, 1, 2].map(() => new Float64Array(n));
    this.peak = new Float64Array(n);
    this.drift = new Float64Array(els.length);
    this.noise = new Float64Array(n);
  }

  private describe(): Descriptor {
    const closed = this.closed;
    return buildDescriptor(this.model, this.topo, this.mutuals, { state: (i) => ({ closed: closed[i] === 1 }) });
  }

  get descriptor(): Descriptor {
    return this.d;
  }

  /**
   * The α of a kept factorisation (present switch states) within a relative 1e-9 of `alpha` and not below
   * `atLeast` (a floor on α is a ceiling on the step), else `alpha` itself.
   */
  private keptAlpha(alpha: number, atLeast: number): number {
    for (const f of this.cache)
      if (f.state === this.stateVersion && f.alpha >= atLeast && Math.abs(f.alpha - alpha) <= 1e-9 * alpha) return f.alpha;
    return alpha;
  }

  /** The factorisation of G + α·C for the present switch states (cached), and W = α·C − G beside it. */
  private factored(alpha: number): Factored {
    const cache = this.cache;
    for (let i = 0; i < cache.length; i++) {
      const f = cache[i];
      if (f.alpha === alpha && f.state === this.stateVersion) {
        if (i > 0) {
          cache.splice(i, 1);
          cache.unshift(f);
        }
        return f;
      }
    }
    this.factorCount++;
    const { g, c } = this.d;
    const vals = this.values;
    for (let s = 0; s < vals.length; s++) vals[s] = g[s] + alpha * c[s];
    // reuse the oldest entry's buffers when the cache is full
    let f: Factored;
    if (cache.length >= 4) {
      f = cache.pop()!;
      f.alpha = alpha;
      f.state = this.stateVersion;
      try {
        f.lu.refactor(vals);
      } catch (e) {
        throw this.singular(e);
      }
    } else {
      const lu = new RealSparseLU(this.symbolic, { scale: 'rows-cols' });
      try {
        lu.factor(vals);
      } catch (e) {
        throw this.singular(e);
      }
      f = { alpha, state: this.stateVersion, lu, w: new Float64Array(vals.length) };
    }
    const w = f.w;
    for (let s = 0; s < w.length; s++) w[s] = alpha * c[s] - g[s];
    cache.unshift(f);
    return f;
  }

  private singular(e: unknown): unknown {
    if (!(e instanceof SingularMatrixError)) return e;
    // the phasor engine names the culprit of a structurally singular circuit
    try {
      new SolverSession({ ...this.model, frequencyHz: 1 }).solveAt(1);
    } catch (r) {
      if (r instanceof ModelRefusal) return r;
    }
    const what = e.column >= 0 ? this.d.unknownLabel(e.column) : null;
    return new ModelRefusal(
      what
        ? `${what.kind} "${what.id}": its ${what.kind === 'node' ? 'voltage' : 'current'} is undetermined in the time domain; add a resistor from it to the circuit`
        : 'model: its equations are singular in the time domain',
      what ? [what] : [{ kind: 'model' }],
    );
  }

  /** Source value of element i at t; `side` −1 takes the value just before a jump at t, +1 just after. */
  sourceValue(i: number, t: number, side: -1 | 0 | 1): number {
    const eta = side === 0 ? 0 : side * 1e-12 * (Math.abs(t) + this.opts.stopS);
    return this.timeline.value(i, t + eta);
  }

  /** u of every source at t; `side` −1 takes the value just before a jump at t, +1 just after. */
  private sources(t: number, side: -1 | 0 | 1, out: Float64Array): void {
    const tl = this.timeline;
    const eta = side === 0 ? 0 : side * 1e-12 * (Math.abs(t) + this.opts.stopS);
    for (let k = 0; k < tl.sources.length; k++) {
      const i = tl.sources[k];
      out[i] = tl.value(i, t + eta);
    }
  }

  /** rhs += B·u */
  private addB(u: Float64Array): void {
    const { srcPtr, srcRow, srcCoef } = this.d;
    const rhs = this.rhs;
    const src = this.timeline.sources;
    for (let k = 0; k < src.length; k++) {
      const i = src[k];
      const v = u[i];
      if (v === 0) continue;
      for (let p = srcPtr[i]; p < srcPtr[i + 1]; p++) rhs[srcRow[p]] += srcCoef[p] * v;
    }
  }

  /** out = A·v over the descriptor's pattern, A given per slot. */
  private mul(a: Float64Array, v: Float64Array, out: Float64Array, scale = 1): void {
    const { colPtr, rowIdx } = this.d.pattern;
    out.fill(0);
    const n = this.n;
    for (let j = 0; j < n; j++) {
      const vj = v[j] * scale;
      if (vj === 0) continue;
      for (let s = colPtr[j]; s < colPtr[j + 1]; s++) out[rowIdx[s]] += a[s] * vj;
    }
  }

  /**
   * About the rounding each unknown of a solve with f carries: 64·eps·|M⁻¹·(|M|·|x| + |B·u|)|, a
   * componentwise estimate (N. J. Higham, "Accuracy and Stability of Numerical Algorithms", 2nd ed.,
   * 2002, section 7.2) with the positive vector through the factors once.
   */
  /**
   * The rounding level of a step's solution and of its error estimate: |M|·|x| for the solve, and the
   * rounding of f = B·u − G·x, which the estimate weighs by 2k/κ·(1/γ + 1/(γ(1−γ)) + 1/(1−γ)).
   */
  private roundingLevel(f: Factored, x: Float64Array, u: Float64Array, alpha: number): Float64Array {
    const { colPtr, rowIdx } = this.d.pattern;
    const { g, c, srcPtr, srcRow, srcCoef } = this.d;
    const size = this.noise;
    size.fill(0);
    for (let j = 0; j < this.n; j++) {
      const v = Math.abs(x[j]);
      if (v === 0) continue;
      for (let s = colPtr[j]; s < colPtr[j + 1]; s++) size[rowIdx[s]] += (Math.abs(g[s] + alpha * c[s]) + F_WEIGHT * Math.abs(g[s])) * v;
    }
    for (const i of this.timeline.sources) {
      for (let p = srcPtr[i]; p < srcPtr[i + 1]; p++) size[srcRow[p]] += (1 + F_WEIGHT) * Math.abs(srcCoef[p] * u[i]);
    }
    // through M⁻¹ twice, with all signs equal and with fixed pseudo-random signs: one solve alone can
    // cancel what the rounding of the rows does not (a node held between two sources)
    const a = this.rhs;
    const b = this.tmp;
    let seed = 0x2545f491;
    for (let i = 0; i < this.n; i++) {
      a[i] = size[i];
      seed = (Math.imul(seed, 1103515245) + 12345) | 0;
      b[i] = seed & 0x10000 ? size[i] : -size[i];
    }
    f.lu.solve(a);
    f.lu.solve(b);
    for (let i = 0; i < this.n; i++) size[i] = 64 * 2.220446049250313e-16 * Math.max(Math.abs(a[i]), Math.abs(b[i]));
    return size;
  }


  /** out = B·u − G·x (that is C·dx/dt where x solves the equations) */
  private residual(x: Float64Array, u: Float64Array, out: Float64Array): void {
    const rhs = this.rhs;
    const keep = this.tmp;
    keep.set(rhs);
    rhs.fill(0);
    this.addB(u);
    this.mul(this.d.g, x, out);
    for (let i = 0; i < this.n; i++) out[i] = rhs[i] - out[i];
    rhs.set(keep);
  }

  /** The charge and flux vector C·x(0) that the model's initial values give (capacitors' C·v(0), windings' L·i(0) with the mutual terms). */
  private initialCharge(out: Float64Array): void {
    const d = this.d;
    const xi = this.tmp;
    xi.fill(0);
    const terminals = this.topo.terminals;
    this.model.elements.forEach((el, i) => {
      const def = defOf(el);
      if (def.initialCurrent && d.branchUnknown[i] >= 0) xi[d.branchUnknown[i]] = def.initialCurrent(el as never);
    });
    this.mul(d.c, xi, out);
    this.model.elements.forEach((el, i) => {
      const def = defOf(el);
      if (!def.initialCharge) return;
      def.initialCharge(el as never, (t) => d.nodeUnknown[terminals[4 * i + t]], (row, v) => {
        if (row >= 0) out[row] += v;
      });
    });
  }

  /** The state values (capacitor voltages, winding currents) of x, per element, for the jump check. */
  private states(x: Float64Array | null, out: Float64Array): void {
    const d = this.d;
    const terminals = this.topo.terminals;
    this.model.elements.forEach((el, i) => {
      const def = defOf(el);
      if (def.roles.state === 'voltage') {
        if (!x) {
          out[i] = (el as { initialVolts?: number }).initialVolts ?? 0;
          return;
        }
        const a = d.nodeUnknown[terminals[4 * i]];
        const b = d.nodeUnknown[terminals[4 * i + 1]];
        out[i] = (a >= 0 ? x[a] : 0) - (b >= 0 ? x[b] : 0);
      } else if (def.roles.state === 'current') {
        out[i] = x ? x[d.branchUnknown[i]] : def.initialCurrent!(el as never);
      }
    });
  }

  /** The move of each state over the two ε steps that its own derivative explains (no jump). */
  private stateRates(dx: Float64Array, out: Float64Array): void {
    this.states(dx, out);
  }

  private noteJumps(before: Float64Array, after: Float64Array, t: number, drift?: Float64Array): void {
    const jumped: string[] = [];
    this.model.elements.forEach((el, i) => {
      const role = defOf(el).roles.state;
      if (!role) return;
      const unit = role === 'voltage' ? this.peakV : this.peakI;
      const a = before[i];
      const b = after[i];
      const moved = drift ? Math.abs(drift[i]) : 0;
      if (Math.abs(b - a) > 1e-6 * Math.max(Math.abs(a), Math.abs(b)) + 1e-9 * unit + 20 * moved + 1e-300) {
        jumped.push(`"${el.id}" (${role === 'voltage' ? `voltage ${fmt(a)} V → ${fmt(b)} V` : `current ${fmt(a)} A → ${fmt(b)} A`})`);
      }
    });
    if (!jumped.length) return;
    if (this.jumpNotes.length >= 20) {
      this.jumpTimesMore++;
      return;
    }
    this.jumpNotes.push(
      `state jump at ${fmt(t)} s: ${jumped.join(', ')} jumped (a loop of capacitors and voltage sources, or a cut set of inductors and current sources, forces it; charge and flux linkage are conserved across it)`,
    );
  }

  /** Two ε steps at t from C·x = q (just before): the state just after any jump, and its derivatives. */
  private crossJump(t: number, q: Float64Array | null, x: Float64Array, dx: Float64Array, eps: number): void {
    const alpha = 1 / eps;
    const f = this.factored(alpha);
    const rhs = this.rhs;
    this.sources(t, 1, this.u1);
    // first: (G + C/ε)·x1 = C·x/ε + B·u(t+), with C·x given as q (at t = 0, from the initial values)
    if (q) for (let i = 0; i < this.n; i++) rhs[i] = q[i] * alpha;
    else this.mul(this.d.c, x, rhs, alpha);
    this.addB(this.u1);
    f.lu.solve(rhs);
    x.set(rhs);
    // x now holds the jumped charges and fluxes, but its algebraic unknowns (a source's current) still
    // carry the impulse. Three backward-Euler probes of δ, 2δ, 3δ from it (they depend on C·x only, so
    // not on the impulse) trace y(δ) = x(0+) + δ·x'(0+) + O(δ²); the quadratic through them gives the
    // consistent state and its derivative just after, without advancing. (A single ε step would lose
    // every digit of the derivative to rounding, |x|·1e-16/ε.)
    const delta = 300 * eps;
    const ys = this.probes;
    const ux = this.uProbe;
    try {
      for (let k = 0; k < 3; k++) {
        const a = 1 / ((k + 1) * delta);
        const g = this.factored(a);
        this.sources(t + (k + 1) * delta, 1, ux);
        this.mul(this.d.c, x, rhs, a);
        this.addB(ux);
        g.lu.solve(rhs);
        ys[k].set(rhs);
      }
    } catch (e) {
      if (!(e instanceof ModelRefusal)) throw e;
      // a probe's matrix judged singular where the jump's was not: one more ε step gives a derivative of
      // lower precision, as a fallback that refuses nothing the jump itself solved
      this.mul(this.d.c, x, rhs, alpha);
      this.addB(this.u1);
      this.factored(alpha).lu.solve(rhs);
      for (let i = 0; i < this.n; i++) {
        dx[i] = (rhs[i] - x[i]) * alpha;
        x[i] = rhs[i];
      }
      return;
    }
    const [y1, y2, y3] = ys;
    for (let i = 0; i < this.n; i++) {
      x[i] = 3 * y1[i] - 3 * y2[i] + y3[i];
      dx[i] = (-5 * y1[i] + 8 * y2[i] - 3 * y3[i]) / (2 * delta);
    }
  }

  private track(x: Float64Array): void {
    const nodeCount = this.d.nodeCount;
    const peak = this.peak;
    for (let i = 0; i < this.n; i++) {
      const a = Math.abs(x[i]);
      if (a > peak[i]) peak[i] = a;
      if (i < nodeCount) {
        if (a > this.peakV) this.peakV = a;
      } else if (a > this.peakI) this.peakI = a;
    }
  }

  /** The initial state at t = 0: from the DC operating point, or from the model's initial values across any jump. */
  private initial(x: Float64Array, dx: Float64Array, eps: number): void {
    const n = this.n;
    if (this.opts.start === 'dc') {
      this.sources(0, 1, this.u0);
      // every source held at its value at t = 0, solved at 0 Hz (graph-model rules, refusals included)
      const dcModel: GraphModel = {
        ...this.model,
        frequencyHz: 0,
        elements: this.model.elements.map((el, i) =>
          defOf(el).roles.source ? ({ ...el, waveform: undefined, magnitude: Math.abs(this.u0[i]), phaseDeg: this.u0[i] < 0 ? 180 : 0 } as typeof el) : el,
        ),
      };
      const raw = new SolverSession(dcModel, undefined, 'dc').solveRaw(0);
      if (raw.xRe.length !== n) throw new Error('the DC operating point has another set of unknowns');
      x.set(raw.xRe);
      dx.fill(0);
      this.track(x);
      return;
    }
    const q = new Float64Array(n);
    this.initialCharge(q);
    const before = new Float64Array(this.model.elements.length);
    const after = new Float64Array(this.model.elements.length);
    this.states(null, before);
    this.crossJump(0, q, x, dx, eps);
    this.track(x);
    this.states(x, after);
    const drift = new Float64Array(this.model.elements.length);
    this.stateRates(dx, drift);
    for (let i = 0; i < drift.length; i++) drift[i] *= 2 * eps;
    this.noteJumps(before, after, 0, drift);
  }

  /**
   * Runs from 0 to stop and calls `emit` at every output time k·H with the state there (the same
   * arrays each time: copy what is kept).
   */
  run(emit: (s: Sample) => void): void {
    const { stopS: T, stepS: H, tolerance } = this.opts;
    const n = this.n;
    const nodeCount = this.d.nodeCount;
    const outputs = Math.floor((T / H) * (1 + 1e-12) + 1e-9);
    const x = new Float64Array(n);
    const dx = new Float64Array(n);
    const x0 = new Float64Array(n);
    const xg = new Float64Array(n);
    const fq = new Float64Array(n); // C·dx/dt at t (f of the stages)
    const fg = new Float64Array(n);
    const f1 = new Float64Array(n);
    const err = new Float64Array(n);
    const x1 = new Float64Array(n);
    const dx1 = new Float64Array(n);
    const before = new Float64Array(this.model.elements.length);
    const after = new Float64Array(this.model.elements.length);
    const rhs = this.rhs;
    const tmp = this.tmp;
    const corners = this.timeline.corners;
    const sample: Sample = { t: 0, x, dx, closed: this.closed };
    const epsOf = (room: number) => Math.min(1e-9 * H, 1e-3 * room);

    this.initial(x, dx, epsOf(Math.min(H, corners.length ? corners[0] : H)));
    sample.t = 0;
    emit(sample);

    let t = 0;
    let k = 1; // next output index
    let c = 0; // next corner
    let nextToggle = 0;
    let h = 0; // the controlled TR-BDF2 step; 0: restart
    let fresh = false; // fq holds f at the present point
    let restart = 0; // backward-Euler steps still to take
    let hRestart = 0;
    restart = 2;
    hRestart = 1e-4 * Math.min(H, corners.length ? corners[0] : H);
    const hMin = 1e-15 * T;
    let steps = 0;
    let rejectedAt = -1; // the time of the last rejected step, and its error ratio
    let rejectedRatio = 0;
    let rejectedStep = 0; // the step that was rejected there
    // per unknown, the rounding its error estimate has shown: |estimate|·h at a step whose estimate did not
    // fall when the step was cut (rounding through the matrix grows as 1/h, the truncation error falls as h³)
    const noiseC = new Float64Array(n);
    while (k <= outputs) {
      const tOut = k * H;
      const tCorner = c < corners.length ? corners[c] : Infinity;
      const target = Math.min(tOut, tCorner);
      const room = target - t;
      if (!(room > 0)) {
        // at an event already (two events within rounding)
        this.event(t, tOut, tCorner, x, dx, before, after, epsOf(H));
        fresh = false;
        if (Math.abs(tCorner - t) <= 1e-9 * H) c++;
        if (Math.abs(tOut - t) <= 1e-9 * H) {
          this.checkFinite(x, tOut);
          sample.t = tOut;
          emit(sample);
          k++;
        }
        continue;
      }
      if (++steps > 50_000_000) throw new ModelRefusal('model: the time response needs more than 50,000,000 steps; shorten --stop or loosen --tolerance', [{ kind: 'model' }]);
      let t1: number;
      if (restart > 0) {
        // damped restart: backward Euler, (G + C/h)·x1 = C·x/h + B·u(t + h)
        let hb = hRestart;
        if (hb >= room * (1 - 1e-9)) hb = room;
        else if (hb > room / 2) hb = room / 2;
        t1 = hb === room ? target : t + hb;
        const f = this.factored(1 / hb);
        this.sources(t1, hb === room && target === tCorner ? -1 : 0, this.u1);
        this.mul(this.d.c, x, rhs, 1 / hb);
        this.addB(this.u1);
        f.lu.solve(rhs);
        for (let i = 0; i < n; i++) dx1[i] = (rhs[i] - x[i]) / hb;
        x.set(rhs);
        dx.set(dx1);
        fresh = false;
        t = t1;
        restart--;
        if (restart === 0) h = 2 * hb;
      } else {
        // TR-BDF2 with the controlled step, landing on the target: a power-of-two part of the output step
        let hs = h;
        if (hs < room) {
          const m = Math.ceil(room / hs - 1e-9);
          hs = room / m;
        } else hs = room;
        const landing = hs === room;
        // the value just before a jump only where the step ends on a breakpoint; elsewhere the value at the time
        const endSide = landing && target === tCorner ? -1 : 0;
        let alpha = 1 / (KAPPA * hs);
        // a step that differs from a kept one by the rounding of t alone takes that one's matrix (the cache compares
        // exactly); a landing step still ends on its target, so its kept step may be shorter than the room left
        // but not longer, beyond the few ulps that t itself cannot resolve
        const kept = this.keptAlpha(alpha, landing ? 1 / (KAPPA * (room + 4 * ulp(target))) : 0);
        if (kept !== alpha) {
          alpha = kept;
          hs = 1 / (KAPPA * alpha);
        }
        const f = this.factored(alpha);
        const tg = t + GAMMA * hs;
        t1 = landing ? target : t + hs;
        // (a step never starts on a breakpoint: the backward-Euler restart takes the first steps after one)
        this.sources(t, 0, this.u0);
        this.sources(tg, 0, this.ug);
        this.sources(t1, endSide, this.u1);
        // stage 1 (trapezoid to t + γh): (G + C/(κh))·xg = (C/(κh) − G)·x + B·(u(t) + u(t + γh))
        this.mul(f.w, x, rhs);
        this.addB(this.u0);
        this.addB(this.ug);
        f.lu.solve(rhs);
        xg.set(rhs);
        // stage 2 (BDF2): (G + C/(κh))·x1 = C·(a·xg − b·x)/(κh) + B·u(t + h)
        for (let i = 0; i < n; i++) tmp[i] = A2 * xg[i] - B2 * x[i];
        this.mul(this.d.c, tmp, rhs, alpha);
        this.addB(this.u1);
        f.lu.solve(rhs);
        x1.set(rhs);
        // f = C·dx/dt = B·u − G·x at the three points (the equations themselves, exact for each stage's x)
        if (!fresh) this.residual(x, this.u0, fq); // else: the last step's f at its end
        this.residual(xg, this.ug, fg);
        this.residual(x1, this.u1, f1);
        // the embedded estimate 2k·h·(f_n/γ − f_γ/(γ(1−γ)) + f_{n+1}/(1−γ)), through the step's matrix
        const ce = 2 * K_LTE * hs;
        for (let i = 0; i < n; i++) rhs[i] = alpha * ce * (fq[i] / GAMMA - fg[i] / (GAMMA * (1 - GAMMA)) + f1[i] / (1 - GAMMA));
        f.lu.solve(rhs);
        err.set(rhs);
        // a quantity that never rises above 1e-30 V or A is rounding, not signal (and keeps the ratio finite)
        const floorV = Math.max(1e-6 * this.peakV, 1e-30);
        const floorI = Math.max(1e-6 * this.peakI, 1e-30);
        const share = SAFETY * tolerance * (hs / T);
        const ratioOf = (noise: Float64Array | null) => {
          let worst = 0;
          for (let i = 0; i < n; i++) {
            const scale = Math.max(this.peak[i], Math.abs(x1[i]), i < nodeCount ? floorV : floorI);
            const e = Math.max(0, Math.abs(err[i]) - Math.max(noise ? noise[i] : 0, noiseC[i] / hs));
            const r = e / (share * scale);
            if (r > worst) worst = r;
          }
          return worst;
        };
        let ratio = ratioOf(null);
        // before a step is given up, the part of the estimate that is only rounding is taken out:
        // a smaller step would not shrink it (a current that is the difference of two nearly equal voltages)
        if (ratio > 1) ratio = ratioOf(this.roundingLevel(f, x1, this.u1, alpha));
        // a shorter step from the same point that did not even halve the estimate (it should fall as h²
        // per unit step) shows that what is left is rounding: the step is taken
        const noiseOnly = ratio > 1 && rejectedAt === t && ratio > 0.5 * rejectedRatio;
        if (ratio > 1 && hs > hMin && !noiseOnly) {
          // rejected: a smaller step from the same point (error ∝ h² per unit step)
          rejectedAt = t;
          rejectedRatio = ratio;
          rejectedStep = hs;
          h = Math.max(hMin, hs * Math.max(0.2, 0.9 / Math.sqrt(ratio)));
          continue;
        }
        rejectedAt = -1;
        if (noiseOnly) for (let i = 0; i < n; i++) noiseC[i] = Math.max(noiseC[i], Math.abs(err[i]) * hs);
        for (let i = 0; i < n; i++) dx[i] = (x1[i] - A2 * xg[i] + B2 * x[i]) * alpha;
        x.set(x1);
        fq.set(f1);
        fresh = true;
        t = t1;
        // the next step: grow or shrink by the error, in powers of two of the output step so that it stays fixed
        // (measured from the nominal step: the landed step is a little shorter and must not pull it down)
        // after a rejection that proved to be rounding, from the rejected step: rounding shrinks as the step
        // grows (it is |x|·eps/h through the matrix), so shrinking again would only feed it
        const base = noiseOnly ? Math.max(h, hs, rejectedStep) : Math.max(h, hs);
        const want = noiseOnly ? 2 * base : ratio > 0 ? base * Math.min(2, Math.max(0.2, 0.9 / Math.sqrt(ratio * (hs / base) ** 2))) : 2 * base;
        h = powerOfTwoStep(want * (1 + 1e-9), H);
        while (h < hMin) h *= 2;
      }
      this.track(x);
      if (t >= target * (1 - 1e-15) && (t === target || Math.abs(t - target) <= 1e-12 * T)) {
        t = target;
        const atCorner = Math.abs(tCorner - t) <= 1e-9 * H;
        if (atCorner) {
          this.event(t, tOut, tCorner, x, dx, before, after, epsOf(Math.min(H, (c + 1 < corners.length ? corners[c + 1] : Infinity) - t, T - t > 0 ? T - t : H)));
          c++;
          fresh = false;
          restart = 2;
          hRestart = 1e-4 * Math.min(H, h || H);
        }
        if (Math.abs(tOut - t) <= 1e-9 * H) {
          this.checkFinite(x, tOut);
          sample.t = tOut;
          emit(sample);
          k++;
        }
      }
      // toggles that fell on this time are applied in event(); guard against a toggle list out of step
      while (nextToggle < this.toggleTimes.length && this.toggleTimes[nextToggle] <= t + 1e-9 * H) nextToggle++;
    }
    this.steps = steps;
    if (this.jumpTimesMore) this.jumpNotes.push(`state jumps at ${this.jumpTimesMore} more times`);
    this.warnings.push(...this.jumpNotes);
  }

  /** An output is never NaN or Infinity: a value out of range is refused naming its unknown. */
  private checkFinite(x: Float64Array, t: number): void {
    for (let i = 0; i < this.n; i++)
      if (!Number.isFinite(x[i])) {
        const what = this.d.unknownLabel(i);
        throw new ModelRefusal(
          `${what.kind} "${what.id}": its ${what.kind === 'node' ? 'voltage' : 'current'} left the range of numbers by t = ${fmt(t)} s; check the values around it`,
          [{ kind: what.kind, id: what.id }],
        );
      }
  }

  /** At a breakpoint: switches toggle, then the state crosses any jump. */
  private event(t: number, _tOut: number, _tCorner: number, x: Float64Array, dx: Float64Array, before: Float64Array, after: Float64Array, eps: number): void {
    let toggled = false;
    for (let j = 0; j < this.toggleTimes.length; j++) {
      if (Math.abs(this.toggleTimes[j] - t) <= 1e-12 * this.opts.stopS + 1e-300) {
        const i = this.toggleOwner[j];
        this.closed[i] ^= 1;
        toggled = true;
      }
    }
    if (toggled) {
      this.stateVersion++;
      this.d = this.describe();
    }
    this.states(x, before);
    this.crossJump(t, null, x, dx, eps);
    this.states(x, after);
    const drift = this.drift;
    this.stateRates(dx, drift);
    for (let i = 0; i < drift.length; i++) drift[i] *= 2 * eps;
    this.noteJumps(before, after, t, drift);
    this.track(x);
  }
}

/** The spacing of doubles at |v| (one unit in the last place). */
function ulp(v: number): number {
  const a = Math.abs(v);
  if (!(a > 0)) return Number.MIN_VALUE;
  return Math.pow(2, Math.floor(Math.log2(a)) - 52);
}

/** The largest H·2^j (j an integer, possibly negative) not above `want`. */
function powerOfTwoStep(want: number, H: number): number {
  if (!(want > 0)) return H;
  const j = Math.floor(Math.log2(want / H));
  return H * Math.pow(2, j);
}

function fmt(v: number): string {
  return Number(v.toPrecision(4)).toString();
}
