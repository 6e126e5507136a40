/// <reference lib="webworker" />
/**
 * The Worker for analyses of a solved circuit and for frequency sweeps. A
 * sweep runs in chunks; between chunks it reports progress and yields, so a
 * cancel message can arrive and stop it.
 */
import type { RefusalCulprit } from '../model/graph';
import type { AnalysisReply, AnalysisRequest } from './protocol';
import { transferables, transientRun } from './transientTask';
import { chunkRanges, compare, harmonics, inspect, power, prepareSweep, tCheck, transfer } from './analysisTasks';

declare const self: DedicatedWorkerGlobalScope;

const cancelled = new Set<number>();
/** sweeps held (spec.hold) until their cancel arrives */
const held = new Map<number, () => void>();
const post = (r: AnalysisReply) => self.postMessage(r);
const pause = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

async function sweep(req: Extract<AnalysisRequest, { kind: 'sweep' }>) {
  const t0 = performance.now();
  const prepared = prepareSweep(req.model, req.spec);
  const total = prepared.frequencies.length;
  let lastPause = performance.now();
  for (const [a, b] of chunkRanges(total, req.spec.chunk ?? 100)) {
    prepared.run(a, b);
    post({ id: req.id, type: 'progress', done: b, total });
    if (req.spec.hold) {
      if (!cancelled.has(req.id)) await new Promise<void>((resolve) => held.set(req.id, resolve));
      if (cancelled.delete(req.id)) return post({ id: req.id, type: 'cancelled' });
    }
    // let a cancel message in every 25 ms or so (a pause per chunk would cost the timer's clamp each time)
    if (performance.now() - lastPause > 25) {
      await pause();
      lastPause = performance.now();
      if (cancelled.delete(req.id)) return post({ id: req.id, type: 'cancelled' });
    }
  }
  if (cancelled.delete(req.id)) return post({ id: req.id, type: 'cancelled' });
  post({ id: req.id, type: 'done', value: { frequenciesHz: prepared.frequencies, ...(prepared.values ? { values: prepared.values } : {}), traces: prepared.traces.map((t) => Array.from(t)), ms: performance.now() - t0 } });
}

/**
 * A time response: one synchronous run that posts progress as it goes. A run
 * cannot read a cancel message while it steps, so the editor cancels one by
 * stopping the worker it runs in (the time view has a worker of its own).
 */
async function transient(req: Extract<AnalysisRequest, { kind: 'transient' }>) {
  if (req.spec.hold) {
    if (!cancelled.has(req.id)) await new Promise<void>((resolve) => held.set(req.id, resolve));
    if (cancelled.delete(req.id)) return post({ id: req.id, type: 'cancelled' });
  }
  const answer = transientRun(req.model, req.spec, (done, total) => post({ id: req.id, type: 'progress', done, total }));
  self.postMessage({ id: req.id, type: 'done', value: answer } satisfies AnalysisReply, transferables(answer));
}

self.onmessage = async (ev: MessageEvent<AnalysisRequest>) => {
  const req = ev.data;
  try {
    switch (req.kind) {
      case 'cancel':
        cancelled.add(req.target);
        held.get(req.target)?.();
        held.delete(req.target);
        return;
      case 'inspect': return post({ id: req.id, type: 'done', value: inspect(req.model, req.result, req.coupling, req.pair) });
      case 'compare': return post({ id: req.id, type: 'done', value: compare(req.model, req.winding, req.coupling) });
      case 'tcheck': return post({ id: req.id, type: 'done', value: tCheck(req.model, req.coupling) });
      case 'power': return post({ id: req.id, type: 'done', value: power(req.model, req.result) });
      case 'sweep': return await sweep(req);
      case 'transient': return await transient(req);
      case 'transfer': return post({ id: req.id, type: 'done', value: transfer(req.model, req.input, req.output) });
      case 'harmonics': return post({ id: req.id, type: 'done', value: harmonics(req.model, req.count) });
    }
  } catch (e) {
    // a refusal names its culprits too, for the editor to point at
    const culprits = e instanceof Error && Array.isArray((e as { culprits?: unknown }).culprits) ? (e as unknown as { culprits: RefusalCulprit[] }).culprits : undefined;
    post({ id: req.id, type: 'failed', message: (e instanceof Error ? e.message : String(e)).split('\n')[0], ...(culprits?.length ? { culprits } : {}) });
  }
};
