import { describe, expect, it, vi } from 'vitest';
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

describe('solve watchdog', () => {
  const options = { staleAfterMs: 1000, restartAfterMs: 5000, maxRestarts: 3 };
  const setUp = () => {
    const store = createEditorStore(isolationTransformerSheet(), 'sheet:t');
    const workers: FakeWorker[] = [];
    const bridge = attachSolver(store, () => { const w = new FakeWorker(); workers.push(w); return w; }, { ...options });
    workers[0].answer(1, 50);
    return { store, workers, bridge, edit: (f: number) => commit(store, { ...store.getState().sheet, frequencyHz: f }) };
  };

  it('greys the readings of an edit that gets no answer, then replaces the worker and asks again', () => {
    vi.useFakeTimers();
    try {
      const { store, workers, edit } = setUp();
      edit(60); // a worker that has died silently: no answer, no error
      vi.advanceTimersByTime(999);
      expect(store.getState().solve.stale).toBe(false);
      vi.advanceTimersByTime(1);
      expect(store.getState().solve).toMatchObject({ stale: true, status: 'solved' }); // the old values, greyed
      vi.advanceTimersByTime(4000);
      expect(workers[0].terminated).toBe(true);
      expect(workers[1].posted.map((r) => r.model.frequencyHz)).toEqual([60]); // the latest edit, again
      expect(store.getState().solve.restarts).toBe(1);
      workers[1].answer(2, 60);
      expect(store.getState().solve).toMatchObject({ stale: false, restarts: 0, stuck: false });
      expect(store.getState().solve.result?.frequencyHz).toBe(60);
    } finally {
      vi.useRealTimers();
    }
  });

  it('stops after three replacements in a row and says so; the next edit or a retry starts afresh', () => {
    vi.useFakeTimers();
    try {
      const { store, workers, bridge, edit } = setUp();
      edit(60);
      for (let i = 0; i < 4; i++) vi.advanceTimersByTime(5000);
      expect(workers).toHaveLength(4); // the first and three replacements
      expect(workers.every((w) => w.terminated)).toBe(true);
      expect(store.getState().solve).toMatchObject({ stuck: true, stale: true, restarts: 3 });
      vi.advanceTimersByTime(60_000);
      expect(workers).toHaveLength(4); // no more tries on its own
      bridge.retry();
      expect(workers).toHaveLength(5);
      expect(workers[4].posted.map((r) => r.model.frequencyHz)).toEqual([60]);
      expect(store.getState().solve.stuck).toBe(false);
      for (let i = 0; i < 4; i++) vi.advanceTimersByTime(5000);
      expect(store.getState().solve.stuck).toBe(true);
      edit(70); // an edit tries again too
      expect(workers).toHaveLength(9);
      workers[8].answer(3, 70);
      expect(store.getState().solve).toMatchObject({ status: 'solved', stale: false, stuck: false, restarts: 0 });
    } finally {
      vi.useRealTimers();
    }
  });
});
