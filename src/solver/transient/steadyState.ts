/**
 * How far a sine-driven run's last period is from the phasor steady state:
 * a sine-driven linear circuit converges to the phasor solution (standard
 * circuit theory), and this measures how much of the transient is left.
 *
 * A run is sine-driven when every source follows a cosine at the model's
 * frequency from before the last period on (no waveform: its phasor; a
 * `sine` waveform at that frequency with no offset: its amplitude and phase;
 * a `constant` 0: off) and no switch toggles within the last period. The
 * steady state is then the phasor solve of the same circuit with those
 * phasors and the switches as they stand at the end. Over the last full
 * period of printed samples, each printed voltage and current is compared
 * with its steady-state waveform (the phasor read as a cosine, as the
 * contract reads it); the gap is the largest deviation relative to the
 * larger of the quantity's own steady-state crest and 1e-6 of the largest
 * crest of its unit. Powers are left out: they follow from v and i.
 *
 * Printed as the added field `coilwright.steadyState` of the
 * `coilwright.transient/1` output (an extension in our own namespace; every
 * field the contract defines is unchanged).
 */
import type { GraphElement, GraphModel, SolveResult } from '../../model/graph';
import type { SwitchEl, VoltageSourceEl } from '../elements/registry';
import { ModelRefusal } from '../errors';
import { solveGraph } from '../phasor/session';
import type { TransientLayout } from './result';

export const STEADY_STATE_FIELD = 'coilwright.steadyState';

export type SteadyStateReport =
  | {
      sineDriven: true;
      frequencyHz: number;
      /** the last full period of printed samples */
      fromS: number;
      toS: number;
      /** largest deviation from the phasor steady state, relative (see above) */
      gap: number;
      /** the quantity where it is largest, e.g. `current of "L1"` */
      worst: string;
    }
  | { sineDriven: false; reason: string };

interface Quantity { name: string; unit: 0 | 1; re: number; im: number }

/** The phasor steady state a run converges to, or why there is none. */
function steadyModel(model: GraphModel, stopS: number, fromS: number): GraphModel | string {
  const f = model.frequencyHz;
  if (!(f > 0)) return 'the model\'s frequencyHz is 0: no sine to converge to';
  const crest = model.amplitudes === 'rms' ? Math.SQRT2 : 1;
  const elements: GraphElement[] = [];
  for (const el of model.elements) {
    if (el.kind === 'voltage-source' || el.kind === 'current-source') {
      const w = (el as VoltageSourceEl).waveform;
      if (!w) { elements.push(el); continue; }
      if (w.shape === 'constant' && w.value === 0) { elements.push({ ...el, waveform: undefined, magnitude: 0, phaseDeg: 0 } as GraphElement); continue; }
      if (w.shape !== 'sine') return `source "${el.id}" has a ${w.shape} waveform`;
      if (Math.abs(w.frequencyHz - f) > 1e-12 * f) return `source "${el.id}" runs at ${w.frequencyHz} Hz, not the model's ${f} Hz`;
      if ((w.offset ?? 0) !== 0) return `source "${el.id}" has an offset`;
      if ((w.startS ?? 0) > fromS) return `source "${el.id}" starts within the last period`;
      elements.push({ ...el, waveform: undefined, magnitude: w.amplitude / crest, phaseDeg: w.phaseDeg ?? 0 } as GraphElement);
    } else if (el.kind === 'switch') {
      const sw = el as SwitchEl;
      const toggles = (sw.togglesS ?? []).filter((t) => t <= stopS * (1 + 1e-12));
      if (toggles.some((t) => t > fromS)) return `switch "${el.id}" toggles within the last period`;
      elements.push({ ...sw, closed: toggles.length % 2 === 0 ? sw.closed : !sw.closed, togglesS: undefined } as GraphElement);
    } else elements.push(el);
  }
  return { ...model, elements };
}

/** The printed voltages and currents of a layout, with their steady-state phasors. */
function quantities(layout: TransientLayout, r: SolveResult): Quantity[] {
  const out: Quantity[] = [];
  for (const n of layout.nodes) out.push({ name: `node "${n}"`, unit: 0, ...(r.nodes[n] ?? { re: 0, im: 0 }) });
  for (const e of layout.elements) {
    const res = r.elements[e.id];
    if ('voltage' in res) {
      out.push({ name: `voltage of "${e.id}"`, unit: 0, ...res.voltage });
      out.push({ name: `current of "${e.id}"`, unit: 1, ...res.current });
    } else {
      res.voltages.forEach((v, p) => out.push({ name: `voltage ${p + 1} of "${e.id}"`, unit: 0, ...v }));
      res.currents.forEach((c, p) => out.push({ name: `current ${p + 1} of "${e.id}"`, unit: 1, ...c }));
    }
  }
  return out;
}

/** The positions of the printed voltages and currents within a sample (layout order; powers skipped). */
function positions(layout: TransientLayout): Int32Array {
  const pos: number[] = [];
  let k = 0;
  for (let i = 0; i < layout.nodes.length; i++) pos.push(k++);
  for (const e of layout.elements) {
    const values = e.ports === 1 ? 2 : 4;
    for (let j = 0; j < values; j++) pos.push(k + j);
    k += values + 1;
  }
  return Int32Array.from(pos);
}

/**
 * Watches the printed samples of a run and reports its steady-state gap at the end.
 * `lastS` is the last output time.
 */
export class SteadyStateWatch {
  private readonly fromS: number;
  private readonly toS: number;
  private readonly w: number;
  private readonly crest: number;
  private readonly q: Quantity[] = [];
  private readonly pos: Int32Array = new Int32Array(0);
  private readonly dev = new Float64Array(0);
  private readonly size = new Float64Array(0);
  private readonly reason: string | null = null;
  private seen = 0;

  constructor(model: GraphModel, layout: TransientLayout, stopS: number, lastS: number) {
    const f = model.frequencyHz;
    this.toS = lastS;
    this.fromS = f > 0 ? lastS - 1 / f : 0;
    this.w = 2 * Math.PI * f;
    this.crest = model.amplitudes === 'rms' ? Math.SQRT2 : 1;
    if (f > 0 && this.fromS < -1e-12 * lastS) {
      this.reason = 'the run is shorter than one period';
      return;
    }
    const m = steadyModel(model, stopS, this.fromS);
    if (typeof m === 'string') {
      this.reason = m;
      return;
    }
    let r: SolveResult;
    try {
      r = solveGraph(m);
    } catch (e) {
      if (!(e instanceof ModelRefusal)) throw e;
      this.reason = `the phasor solve refuses it: ${e.message}`;
      return;
    }
    this.q = quantities(layout, r);
    this.pos = positions(layout);
    this.dev = new Float64Array(this.q.length);
    this.size = new Float64Array(this.q.length);
  }

  /** One printed sample (the values in layout order). */
  observe(t: number, values: Float64Array): void {
    if (this.reason !== null || t < this.fromS - 1e-9 * (this.toS - this.fromS)) return;
    this.seen++;
    const { w, crest } = this;
    const c = Math.cos(w * t);
    const s = Math.sin(w * t);
    for (let i = 0; i < this.q.length; i++) {
      const qi = this.q[i];
      const ss = crest * (qi.re * c - qi.im * s);
      const d = Math.abs(values[this.pos[i]] - ss);
      if (d > this.dev[i]) this.dev[i] = d;
      if (Math.abs(ss) > this.size[i]) this.size[i] = Math.abs(ss);
    }
  }

  report(): SteadyStateReport {
    if (this.reason !== null) return { sineDriven: false, reason: this.reason };
    if (this.seen < 2) return { sineDriven: false, reason: 'fewer than two printed samples in the last period' };
    const largest = [0, 0];
    this.q.forEach((qi, i) => { largest[qi.unit] = Math.max(largest[qi.unit], this.size[i]); });
    let gap = 0;
    let worst = this.q.length ? this.q[0].name : 'nothing printed';
    this.q.forEach((qi, i) => {
      const scale = Math.max(this.size[i], 1e-6 * largest[qi.unit]);
      // a quantity whose steady state is zero everywhere of its unit: any deviation is all of it
      const g = scale > 0 ? this.dev[i] / scale : this.dev[i] > 0 ? 1 : 0;
      if (g > gap) { gap = g; worst = qi.name; }
    });
    return { sineDriven: true, frequencyHz: this.w / (2 * Math.PI), fromS: this.fromS, toS: this.toS, gap, worst };
  }
}
