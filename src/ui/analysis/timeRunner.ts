/**
 * Starts and cancels time responses in the time view's worker (the latest
 * start wins), and reads an answer: a trace's samples, its label and unit,
 * its phasor steady state, and the whole circuit at one instant for the
 * sheet's overlay.
 */
import type { ComplexJson, ElementResult, GraphModel, SolveResult } from '../../model/graph';
import { RESULT_SCHEMA } from '../../model/graph';
import { nameTable } from '../../model/names';
import { CancelledError, RefusedError } from '../../store/analysisBridge';
import { analysisStore, type TimeQuantity, type TimeState } from '../../store/analysisStore';
import type { TransientAnswer } from '../../worker/protocol';
import { transientClient } from './client';

let running: { cancel: () => void } | null = null;

/** For browser tests: runs started while this is set wait before their first step until cancelled. */
export const timeTestHold = { on: false };

export const setTime = (patch: Partial<TimeState>) => analysisStore.setState({ time: { ...analysisStore.getState().time, ...patch } });

export function runTime(model: GraphModel): void {
  const { settings } = analysisStore.getState().time;
  running?.cancel();
  setTime({ status: 'running', progress: 0, message: '', culprits: [] });
  const job = transientClient().transient(model, { stopS: settings.stopS, samples: settings.samples, start: settings.start, hold: timeTestHold.on }, (done, total) => {
    if (running === job) setTime({ progress: done / total });
  });
  running = job;
  job.promise.then(
    (answer) => {
      if (running !== job) return;
      running = null;
      const prev = analysisStore.getState().time;
      // the cursor and window stay where they were when they still fall in the new run
      const stop = answer.timesS[answer.timesS.length - 1] ?? 0;
      const inside = (t: number | null) => t !== null && t >= 0 && t <= stop;
      setTime({
        status: 'done', progress: 1, answer, sheetOf: model, message: '',
        cursorS: inside(prev.cursorS) ? prev.cursorS : null,
        window: prev.window && inside(prev.window[0]) && inside(prev.window[1]) ? prev.window : null,
        span: prev.span && inside(prev.span[0]) && inside(prev.span[1]) ? prev.span : null,
      });
    },
    (e: Error) => {
      if (running !== job) return;
      running = null;
      if (e instanceof CancelledError) setTime({ status: 'cancelled', message: 'Run cancelled; the last complete run stays' });
      else setTime({ status: 'failed', message: e.message, culprits: e instanceof RefusedError ? e.culprits : [] });
    },
  );
}

export function cancelTime(): void {
  running?.cancel();
}

export function timeLabel(q: TimeQuantity): string {
  if (q.kind === 'node') return `v(${q.node})`;
  const side = q.side === undefined ? '' : q.side === 0 ? ' primary' : ' secondary';
  return `${q.kind === 'voltage' ? 'v' : 'i'}(${q.element}${side})`;
}

export const timeUnit = (q: TimeQuantity) => (q.kind === 'current' ? 'A' : 'V');

export const timeKey = (q: TimeQuantity) => JSON.stringify(q.kind === 'node' ? ['node', q.node] : [q.kind, q.element, q.side ?? -1]);

/** The samples of a trace, or null when the run has no such quantity. */
export function traceValues(a: TransientAnswer, q: TimeQuantity): Float64Array | null {
  if (q.kind === 'node') return a.nodes.find((n) => n.name === q.node)?.values ?? null;
  const e = a.elements.find((x) => x.id === q.element);
  if (!e) return null;
  const list = q.kind === 'voltage' ? e.voltage : e.current;
  return list[q.side ?? 0] ?? null;
}

/** The phasor of a trace in the steady state, or null. */
export function steadyPhasor(steady: SolveResult | null, q: TimeQuantity): ComplexJson | null {
  if (!steady) return null;
  if (q.kind === 'node') return steady.nodes[q.node] ?? null;
  const r = steady.elements[q.element];
  if (!r) return null;
  if ('current' in r) return q.kind === 'voltage' ? r.voltage : r.current;
  return (q.kind === 'voltage' ? r.voltages : r.currents)[q.side ?? 0];
}

/** Every trace a model offers, nodes first, then each element's voltage and current. */
export function timeOptions(a: TransientAnswer, ground: string): TimeQuantity[] {
  const out: TimeQuantity[] = [];
  for (const n of a.nodes) if (n.name !== ground) out.push({ kind: 'node', node: n.name });
  for (const e of a.elements) {
    if (e.voltage.length === 1) out.push({ kind: 'current', element: e.id }, { kind: 'voltage', element: e.id });
    else for (const side of [0, 1] as const) out.push({ kind: 'current', element: e.id, side }, { kind: 'voltage', element: e.id, side });
  }
  return out;
}

/** The largest current magnitude of the whole run (the scale of the sheet's arrows while the cursor moves). */
export function largestCurrent(a: TransientAnswer): number {
  let m = 0;
  for (const e of a.elements) for (const c of e.current) for (let i = 0; i < c.length; i++) m = Math.max(m, Math.abs(c[i]));
  return m;
}

/** The circuit at sample k as a result the overlay reads: every value real (im 0), power the instantaneous v·i. */
export function instantResult(a: TransientAnswer, k: number, frequencyHz: number): SolveResult {
  const re = (v: number): ComplexJson => ({ re: Number.isFinite(v) ? v + 0 : 0, im: 0 });
  const nodes = nameTable<ComplexJson>();
  for (const n of a.nodes) nodes[n.name] = re(n.values[k]);
  const elements = nameTable<ElementResult>();
  for (const e of a.elements) {
    const power = { watts: re(e.power[k]).re, vars: 0 };
    if (e.voltage.length === 1) elements[e.id] = { voltage: re(e.voltage[0][k]), current: re(e.current[0][k]), power };
    else elements[e.id] = { voltages: [re(e.voltage[0][k]), re(e.voltage[1][k])], currents: [re(e.current[0][k]), re(e.current[1][k])], power };
  }
  return { schema: RESULT_SCHEMA, frequencyHz, amplitudes: 'peak', nodes, elements, warnings: [] };
}
