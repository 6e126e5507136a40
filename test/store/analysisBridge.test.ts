import { describe, expect, it } from 'vitest';
import type { AnalysisReply, AnalysisRequest } from '../../src/worker/protocol';
import { AnalysisClient, CancelledError, RefusedError, type AnalysisWorkerLike } from '../../src/store/analysisBridge';
import { chunkRanges, prepareSweep } from '../../src/worker/analysisTasks';
import { model } from '../helpers';

/** A worker stand-in that runs sweeps chunk by chunk on demand, like the real one between its pauses. */
class FakeWorker implements AnalysisWorkerLike {
  onmessage: ((ev: MessageEvent<AnalysisReply>) => void) | null = null;
  onerror: ((ev: ErrorEvent) => void) | null = null;
  sent: AnalysisRequest[] = [];
  cancelled = new Set<number>();
  postMessage(msg: AnalysisRequest) {
    this.sent.push(msg);
    if (msg.kind === 'cancel') this.cancelled.add(msg.target);
  }
  reply(r: AnalysisReply) { this.onmessage?.({ data: r } as MessageEvent<AnalysisReply>); }
  terminated = 0;
  terminate() { this.terminated++; }
}

const rc = model(1000, [
  { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 1, phaseDeg: 0 },
  { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms: 1000 },
  { id: 'C1', kind: 'capacitor', nodes: ['b', 'gnd'], farads: 1e-6 },
]);

describe('analysis client', () => {
  it('reports progress, then the answer', async () => {
    const w = new FakeWorker();
    const client = new AnalysisClient(() => w);
    const seen: number[] = [];
    const job = client.sweep(rc, { from: 10, to: 1e4, points: 30, log: true, quantities: [{ kind: 'node', node: 'b' }] }, (d, t) => seen.push(d / t));
    const req = w.sent[0] as Extract<AnalysisRequest, { kind: 'sweep' }>;
    const p = prepareSweep(req.model, req.spec);
    for (const [a, b] of chunkRanges(30, 10)) {
      p.run(a, b);
      w.reply({ id: req.id, type: 'progress', done: b, total: 30 });
    }
    w.reply({ id: req.id, type: 'done', value: { frequenciesHz: p.frequencies, traces: p.traces.map((t) => Array.from(t)), ms: 1 } });
    const ans = await job.promise;
    expect(seen).toEqual([1 / 3, 2 / 3, 1]); // three chunks of ten (arithmetic)
    // RC low-pass: |V(b)| = 1/√(1 + (ωRC)²) (closed form) at the first point
    const w0 = 2 * Math.PI * ans.frequenciesHz[0];
    expect(Math.hypot(ans.traces[0][0], ans.traces[0][1])).toBeCloseTo(1 / Math.sqrt(1 + (w0 * 1e-3) ** 2), 12);
  });

  it('cancels: the cancel names the sweep, and its promise rejects as cancelled', async () => {
    const w = new FakeWorker();
    const client = new AnalysisClient(() => w);
    const job = client.sweep(rc, { from: 10, to: 1e4, points: 30, log: true, quantities: [{ kind: 'node', node: 'b' }] });
    const id = w.sent[0].id;
    job.cancel();
    expect(w.cancelled.has(id)).toBe(true);
    w.reply({ id, type: 'cancelled' });
    await expect(job.promise).rejects.toBeInstanceOf(CancelledError);
  });

  it('passes a refusal on as an error and a crash to every open question', async () => {
    const w = new FakeWorker();
    const client = new AnalysisClient(() => w);
    const a = client.tCheck(rc, 'K9');
    w.reply({ id: w.sent[0].id, type: 'failed', message: 'coupling "K9" is not in this model' });
    await expect(a).rejects.toThrow('K9');
    const b = client.power(rc, {} as never);
    w.onerror?.({} as ErrorEvent);
    await expect(b).rejects.toThrow(/stopped unexpectedly/);
  });

  it('a time response: Cancel stops its worker and only it; a refusal keeps what it names', async () => {
    const made: FakeWorker[] = [];
    const client = new AnalysisClient(() => { const w = new FakeWorker(); made.push(w); return w; });
    const job = client.transient(rc, { stopS: 1e-3, samples: 100 });
    job.cancel();
    await expect(job.promise).rejects.toBeInstanceOf(CancelledError);
    // a run cannot read a cancel message while it steps: the worker itself is stopped
    expect(made[0].terminated).toBe(1);
    const next = client.transient(rc, { stopS: 1e-3, samples: 100 });
    // a fresh worker takes the next run
    expect(made).toHaveLength(2);
    const req = made[1].sent[0];
    made[1].reply({ id: req.id, type: 'failed', message: 'element "R1": something to change', culprits: [{ kind: 'element', id: 'R1' }] });
    const err = await next.promise.catch((e: unknown) => e);
    expect(err).toBeInstanceOf(RefusedError);
    expect((err as RefusedError).culprits).toEqual([{ kind: 'element', id: 'R1' }]);
    expect((err as RefusedError).message).toBe('element "R1": something to change');
  });
});
