import { describe, expect, it } from 'vitest';
import { seedIds } from '../../src/model/ids';
import { isolationTransformerSheet } from '../../src/model/examples/isolation';
import type { SolveResult } from '../../src/model/graph';
import { commit } from '../../src/store/actions';
import { createEditorStore } from '../../src/store/createEditorStore';
import { attachSolver, type WorkerLike } from '../../src/store/solveBridge';
import type { SolveReply, SolveRequest } from '../../src/model/solveMessages';

class FakeWorker implements WorkerLike {
  posted: SolveRequest[] = [];
  onmessage: ((ev: MessageEvent<SolveReply>) => void) | null = null;
  onerror: ((ev: ErrorEvent) => void) | null = null;
  terminated = false;
  postMessage(msg: SolveRequest) { this.posted.push(msg); }
  terminate() { this.terminated = true; }
  answer(seq: number, tag: number) {
    const result = { schema: 'coilwright.result/1', frequencyHz: tag, amplitudes: 'rms', nodes: {}, elements: {}, warnings: [] } as SolveResult;
    this.onmessage!({ data: { seq, ok: true, result, ms: 1, at: 0 } } as MessageEvent<SolveReply>);
  }
}

describe('solve bridge', () => {
  it('posts only the newest edit while a solve is in flight and drops superseded replies', () => {
    seedIds(31);
    const store = createEditorStore(isolationTransformerSheet(), 'sheet:t');
    const workers: FakeWorker[] = [];
    attachSolver(store, () => { const w = new FakeWorker(); workers.push(w); return w; });
    const w = workers[0];
    expect(w.posted.map((r) => r.seq)).toEqual([1]); // the sheet as loaded
    const edit = (f: number) => commit(store, { ...store.getState().sheet, frequencyHz: f });
    edit(60);
    edit(70);
    edit(80);
    expect(w.posted.map((r) => r.seq)).toEqual([1]); // nothing queued behind the solve in flight
    w.answer(1, 50);
    expect(store.getState().solve.result).toBeNull(); // seq 1 was superseded: its answer is dropped
    expect(w.posted.map((r) => [r.seq, r.model.frequencyHz])).toEqual([[1, 50], [4, 80]]); // only the newest edit follows
    w.answer(4, 80);
    expect(store.getState().solve).toMatchObject({ status: 'solved', seq: 4 });
    expect(store.getState().solve.result?.frequencyHz).toBe(80);
  });

  it('replaces a crashed worker and posts the latest model again', () => {
    const store = createEditorStore(isolationTransformerSheet(), 'sheet:t');
    const workers: FakeWorker[] = [];
    attachSolver(store, () => { const w = new FakeWorker(); workers.push(w); return w; });
    workers[0].onerror!({} as ErrorEvent);
    expect(workers[0].terminated).toBe(true);
    expect(workers[1].posted.map((r) => r.seq)).toEqual([1]);
  });

  it('reports a refusal and keeps the last good result, greyed', () => {
    const store = createEditorStore(isolationTransformerSheet(), 'sheet:t');
    const workers: FakeWorker[] = [];
    attachSolver(store, () => { const w = new FakeWorker(); workers.push(w); return w; });
    workers[0].answer(1, 50);
    commit(store, { ...store.getState().sheet, frequencyHz: 60 });
    workers[0].onmessage!({ data: { seq: 2, ok: false, message: 'coupling "Lp~Ls": M too large', culprits: [{ kind: 'coupling', id: 'Lp~Ls' }], ms: 1, at: 0 } } as MessageEvent<SolveReply>);
    const s = store.getState().solve;
    expect(s).toMatchObject({ status: 'refused', stale: true });
    expect(s.result?.frequencyHz).toBe(50);
    expect(s.refusal?.message).toBe('coupling "Lp~Ls": M too large');
    expect(s.refusal?.circuit?.couplingOfId.get('Lp~Ls')).toBe(store.getState().sheet.couplings[0].id);
  });
});
