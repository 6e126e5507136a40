/**
 * The time response for the editor's time view, as a plain function of a
 * graph model (testable without a Worker): the run into typed columns, with
 * progress reports, and the phasor steady state a sine-driven run settles
 * into (each switch in the state it ends the run in).
 */
import type { GraphModel, SolveResult, Waveform } from '../model/graph';
import { parseGraphModel, solveGraph, transientStream } from '../solver';
import type { TransientAnswer, TransientSpec } from './protocol';

/** The most values a run keeps for the view (8 M doubles, 64 MB). */
export const TRANSIENT_MAX_VALUES = 8_000_000;
export const TRANSIENT_MAX_SAMPLES = 200_000;

/**
 * The model whose phasor solve is the steady state the run settles into, or
 * null: every source follows its phasor or is a sine at the sheet's
 * frequency without offset (which becomes its phasor), and each switch takes
 * the state it has after its last toggle before the stop time.
 */
export function steadyModel(model: GraphModel, stopS: number): GraphModel | null {
  if (!(model.frequencyHz > 0)) return null;
  const toAmplitude = model.amplitudes === 'rms' ? Math.SQRT1_2 : 1;
  const elements: GraphModel['elements'] = [];
  for (const el of model.elements) {
    if (el.kind === 'voltage-source' || el.kind === 'current-source') {
      const w = (el as { waveform?: Waveform }).waveform;
      if (!w) { elements.push(el); continue; }
      if (w.shape !== 'sine' || (w.offset ?? 0) !== 0 || Math.abs(w.frequencyHz - model.frequencyHz) > 1e-9 * model.frequencyHz) return null;
      const { waveform: _w, ...rest } = el as typeof el & { waveform?: Waveform };
      elements.push({ ...rest, magnitude: w.amplitude * toAmplitude, phaseDeg: w.phaseDeg ?? 0 } as typeof el);
    } else if (el.kind === 'switch') {
      const flips = (el.togglesS ?? []).filter((t) => t <= stopS).length;
      elements.push({ ...el, closed: flips % 2 === 1 ? !el.closed : el.closed });
    } else elements.push(el);
  }
  return { ...model, elements };
}

export function transientRun(raw: GraphModel, spec: TransientSpec, progress: (done: number, total: number) => void = () => {}): TransientAnswer {
  const t0 = performance.now();
  const model = parseGraphModel(raw);
  const samples = Math.round(spec.samples);
  if (!(spec.stopS > 0) || !Number.isFinite(spec.stopS)) throw new Error('Stop time: must be a time above 0 s');
  if (!(samples >= 1 && samples <= TRANSIENT_MAX_SAMPLES)) throw new Error(`Resolution: must be between 1 and ${TRANSIENT_MAX_SAMPLES.toLocaleString('en')} samples`);
  const stepS = spec.stopS / samples;
  const stream = transientStream(model, { stopS: spec.stopS, stepS, tolerance: spec.tolerance ?? 1e-4, start: spec.start ?? 'given' });
  const { layout } = stream;
  const count = Math.floor((spec.stopS / stepS) * (1 + 1e-12) + 1e-9) + 1;
  const width = layout.width;
  if ((width + 1) * count > TRANSIENT_MAX_VALUES) {
    const most = Math.floor(TRANSIENT_MAX_VALUES / (width + 1)) - 1;
    throw new Error(`Resolution: ${count.toLocaleString('en')} samples of ${width} quantities is more than the view keeps; choose at most ${most.toLocaleString('en')} samples`);
  }
  const timesS = new Float64Array(count);
  const columns = Array.from({ length: width }, () => new Float64Array(count));
  let k = 0;
  // a report at every hundredth of the samples (at most 100 messages, whatever the run's length)
  const every = Math.max(1, Math.ceil(count / 100));
  let next = every;
  const warnings = stream.run((t, values) => {
    if (k >= count) return;
    timesS[k] = t;
    for (let q = 0; q < width; q++) columns[q][k] = values[q];
    k++;
    if (k >= next || k === count) { next += every; progress(k, count); }
  });
  const used = <T extends Float64Array>(a: T) => (k === count ? a : (a.subarray(0, k) as T));
  let q = 0;
  const nodes = layout.nodes.map((name) => ({ name, values: used(columns[q++]) }));
  const elements = layout.elements.map((e) => {
    const ports = e.ports;
    const voltage = columns.slice(q, q + ports).map(used);
    const current = columns.slice(q + ports, q + 2 * ports).map(used);
    const power = used(columns[q + 2 * ports]);
    q += 2 * ports + 1;
    return { id: e.id, voltage, current, power };
  });
  let steady: SolveResult | null = null;
  const sm = steadyModel(model, spec.stopS);
  if (sm) {
    try {
      steady = solveGraph(sm);
    } catch {
      steady = null; // no steady state to draw (the phasor solve refuses this circuit)
    }
  }
  return { timesS: used(timesS), nodes, elements, steady, warnings, ms: performance.now() - t0 };
}

/** The buffers of an answer, to hand over without copying. */
export function transferables(a: TransientAnswer): ArrayBuffer[] {
  const out = new Set<ArrayBuffer>();
  const add = (x: Float64Array) => out.add(x.buffer as ArrayBuffer);
  add(a.timesS);
  for (const n of a.nodes) add(n.values);
  for (const e of a.elements) { e.voltage.forEach(add); e.current.forEach(add); add(e.power); }
  return [...out];
}
