/** Starts, restarts and cancels sweeps in the analysis worker; the latest start wins. */
import type { GraphModel } from '../../model/graph';
import { withSweptValue } from '../../model/elementFacts';
import type { SweepQuantity } from '../../worker/protocol';
import { CancelledError } from '../../store/analysisBridge';
import { analysisStore, type SliderTarget, type SweepTrace } from '../../store/analysisStore';
import { analysisClient } from './client';
import { withValue } from '../../model/valueTarget';

let running: { cancel: () => void } | null = null;

/** For browser tests: sweeps started while this is set wait after their first chunk until cancelled (they cannot finish before a cancel). */
export const sweepTestHold = { on: false };

const setSweep = (patch: Partial<ReturnType<typeof analysisStore.getState>['sweep']>) =>
  analysisStore.setState({ sweep: { ...analysisStore.getState().sweep, ...patch } });

/** The model with the slider's value put in. */
export function withSlider(model: GraphModel, target: SliderTarget, value: number): GraphModel {
  return withValue(model, target, value);
}

export function runSweep(model: GraphModel): void {
  const { settings, slider } = analysisStore.getState().sweep;
  if (!settings.traces.length) return setSweep({ status: 'failed', message: 'Add a quantity to plot first' });
  running?.cancel();
  const m = slider ? withSlider(model, slider.target, slider.value) : model;
  const quantities: SweepQuantity[] = settings.traces.map((t) => t.quantity);
  setSweep({ status: 'running', progress: 0, message: '' });
  const over = settings.over;
  const range = over ? { from: over.from, to: over.to, over: { target: over.target, frequencyHz: model.frequencyHz } } : { from: settings.from, to: settings.to };
  const job = analysisClient().sweep(m, { ...range, points: settings.points, log: settings.log, quantities, chunk: over ? 10 : 50, hold: sweepTestHold.on }, (done, total) => {
    if (running === job) setSweep({ progress: done / total });
  });
  running = job;
  const shown = settings.traces;
  job.promise.then(
    (answer) => {
      if (running !== job) return;
      running = null;
      // another sheet opened meanwhile (its settings replaced these): the answer is not its
      if (analysisStore.getState().sweep.status !== 'running') return;
      setSweep({ status: 'done', progress: 1, answer, shown, shownOver: over, message: '' });
    },
    (e: Error) => {
      if (running !== job) return;
      running = null;
      if (analysisStore.getState().sweep.status !== 'running') return;
      if (e instanceof CancelledError) setSweep({ status: 'cancelled', message: 'Sweep cancelled; the last complete plot stays' });
      else setSweep({ status: 'failed', message: e.message });
    },
  );
}

export function cancelSweep(): void {
  running?.cancel();
}

/** Unit of a quantity, for axis and legend. */
export function unitOf(q: SweepQuantity): string {
  switch (q.kind) {
    case 'node': case 'voltage': return 'V';
    case 'current': return 'A';
    case 'zin': return 'Ω';
    case 'power': return 'VA';
    case 'ratio': {
      const a = unitOf(q.num);
      const b = unitOf(q.den);
      return a === b ? '' : `${a}/${b}`;
    }
  }
}

export function labelOf(q: SweepQuantity): string {
  switch (q.kind) {
    case 'node': return `V(${q.node})`;
    case 'voltage': return `V(${q.element})`;
    case 'current': return `I(${q.element})`;
    case 'zin': return `Z seen by ${q.source}`;
    case 'power': return `S into ${q.element}`;
    case 'ratio': return `${labelOf(q.num)} / ${labelOf(q.den)}`;
  }
}

export function traceOf(q: SweepQuantity): SweepTrace {
  return { label: labelOf(q), quantity: q, unit: unitOf(q) };
}

/** A quantity as a select value and back: a JSON array, so any name (with ":" or "|" in it) survives. */
type Encoded = [string, string] | ['ratio', Encoded, Encoded];

function toArray(q: SweepQuantity): Encoded {
  switch (q.kind) {
    case 'node': return ['node', q.node];
    case 'zin': return ['zin', q.source];
    case 'ratio': return ['ratio', toArray(q.num), toArray(q.den)];
    default: return [q.kind, q.element];
  }
}

function fromArray(a: Encoded): SweepQuantity {
  if (a[0] === 'ratio') return { kind: 'ratio', num: fromArray(a[1] as Encoded), den: fromArray(a[2] as Encoded) };
  const [kind, name] = a as [string, string];
  if (kind === 'node') return { kind: 'node', node: name };
  if (kind === 'zin') return { kind: 'zin', source: name };
  return { kind: kind as 'current' | 'voltage' | 'power', element: name };
}

export function encodeQ(q: SweepQuantity): string {
  return JSON.stringify(toArray(q));
}

export function decodeQ(s: string): SweepQuantity {
  return fromArray(JSON.parse(s) as Encoded);
}
