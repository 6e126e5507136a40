/**
 * Connects the store to the solve worker, outside React. Every change of the
 * sheet is derived into a graph model and posted; while a solve is in flight
 * only the newest model waits (older ones are dropped), and a reply for an
 * edit that has since been superseded is ignored.
 *
 * A watchdog keeps the readings honest: a solve that has not answered after
 * `staleAfterMs` marks the readings stale (greyed), and one that has not
 * answered after `restartAfterMs` (or that crashed the worker) gets the worker
 * replaced and the latest model posted again. After `maxRestarts`
 * replacements in a row without an answer the bridge stops trying on its own
 * (`solve.stuck`, which the editor reports) until the next edit or `retry()`.
 */
import { deriveCircuit, type DerivedCircuit } from '../model/toGraph';
import type { EditorStore } from './types';
import type { SolveReply, SolveRequest } from '../model/solveMessages';
import { withNameTables } from '../model/names';
import { overlayProbe } from './probe';
import { floorResult } from '../model/resultFloor';

export interface WorkerLike {
  postMessage(msg: SolveRequest): void;
  onmessage: ((ev: MessageEvent<SolveReply>) => void) | null;
  onerror: ((ev: ErrorEvent) => void) | null;
  terminate(): void;
}

export interface SolveBridge {
  stop(): void;
  /** sequence number of the latest edit sent (or waiting) */
  latest(): number;
  /** A fresh worker for the latest model (after the solver kept failing). */
  retry(): void;
}

/** Read at each solve, so they may be changed while the bridge runs. */
export interface WatchdogOptions {
  staleAfterMs: number;
  /** at least this long, and at least ten times the longest solve seen */
  restartAfterMs: number;
  maxRestarts: number;
}

export const DEFAULT_WATCHDOG: WatchdogOptions = { staleAfterMs: 1500, restartAfterMs: 8000, maxRestarts: 3 };

export function attachSolver(store: EditorStore, makeWorker: () => WorkerLike, watchdog: WatchdogOptions = { ...DEFAULT_WATCHDOG }): SolveBridge {
  let worker = makeWorker();
  let seq = store.getState().solve.seq;
  let inFlight: SolveRequest | null = null;
  let waiting: SolveRequest | null = null;
  const circuits = new Map<number, DerivedCircuit>();
  let timers: ReturnType<typeof setTimeout>[] = [];
  let restarts = 0;
  let stuck = false;
  let longestMs = 0;

  const clearTimers = () => {
    for (const t of timers) clearTimeout(t);
    timers = [];
  };
  const patchSolve = (patch: Partial<ReturnType<EditorStore['getState']>['solve']>) => store.setState({ solve: { ...store.getState().solve, ...patch } });

  const post = (req: SolveRequest) => {
    overlayProbe.postedAt = performance.now();
    inFlight = req;
    clearTimers();
    timers.push(setTimeout(() => {
      // the readings belong to an older sheet and no answer is near: grey them
      if (inFlight === req && store.getState().solve.result) patchSolve({ stale: true });
    }, watchdog.staleAfterMs));
    timers.push(setTimeout(() => inFlight === req && replace(), Math.max(watchdog.restartAfterMs, 10 * longestMs)));
    worker.postMessage(req);
  };

  /** The worker is dead or stuck: a new one gets the latest model, unless it has failed too often in a row. */
  const replace = () => {
    clearTimers();
    const latest = waiting ?? inFlight;
    waiting = latest;
    inFlight = null;
    worker.onmessage = null;
    worker.onerror = null;
    worker.terminate();
    restarts += 1;
    if (restarts > watchdog.maxRestarts) {
      stuck = true;
      patchSolve({ stale: store.getState().solve.result !== null, restarts: restarts - 1, stuck: true });
      return;
    }
    patchSolve({ stale: store.getState().solve.result !== null, restarts, stuck: false });
    worker = makeWorker();
    wire();
    if (latest) {
      waiting = null;
      post(latest);
    }
  };

  const onReply = (ev: MessageEvent<SolveReply>) => {
    const r = ev.data;
    overlayProbe.replyAt = performance.now();
    overlayProbe.solveMs = r.ms;
    overlayProbe.receivedAt = r.at - performance.timeOrigin;
    clearTimers();
    inFlight = null;
    restarts = 0;
    longestMs = Math.max(longestMs, r.ms);
    if (waiting) {
      const next = waiting;
      waiting = null;
      post(next);
    }
    const circuit = circuits.get(r.seq);
    for (const k of [...circuits.keys()]) if (k <= r.seq) circuits.delete(k);
    const prev = store.getState().solve;
    if (r.seq !== seq || !circuit) {
      // superseded by a newer edit; the solver is alive again all the same
      if (prev.restarts || prev.stuck) patchSolve({ restarts: 0, stuck: false });
      return;
    }
    if (r.ok) {
      store.setState({ solve: { ...prev, status: 'solved', result: floorResult(withNameTables(r.result)), raw: withNameTables(r.result), circuit, refusal: null, stale: false, seq: r.seq, solveMs: r.ms, restarts: 0, stuck: false } });
    } else {
      store.setState({ solve: { ...prev, status: 'refused', refusal: { message: r.message, culprits: r.culprits, circuit }, stale: prev.result !== null, seq: r.seq, solveMs: r.ms, restarts: 0, stuck: false } });
    }
  };

  const wire = () => {
    worker.onmessage = onReply;
    worker.onerror = () => replace();
  };
  wire();

  /** After the solver kept failing: start afresh with a new worker. */
  const revive = () => {
    if (!stuck) return;
    stuck = false;
    restarts = 0;
    worker = makeWorker();
    wire();
    patchSolve({ stuck: false, restarts: 0 });
  };

  const send = () => {
    overlayProbe.committedAt = performance.now();
    const sheet = store.getState().sheet;
    seq += 1;
    let circuit: DerivedCircuit;
    try {
      circuit = deriveCircuit(sheet);
    } catch (e) {
      const prev = store.getState().solve;
      store.setState({ solve: { ...prev, status: 'refused', refusal: { message: e instanceof Error ? e.message : String(e), culprits: [], circuit: null }, stale: prev.result !== null, seq } });
      return;
    }
    circuits.set(seq, circuit);
    store.setState({ derived: circuit });
    if (circuit.model.elements.length === 0) {
      const prev = store.getState().solve;
      store.setState({ solve: { ...prev, status: 'idle', result: null, circuit: null, refusal: null, stale: false, seq } });
      return;
    }
    const req = { seq, model: circuit.model };
    revive();
    if (inFlight === null) {
      waiting = null;
      post(req);
    } else waiting = req;
  };

  const unsubscribe = store.subscribe((s, p) => {
    if (s.sheet !== p.sheet) send();
  });
  send();
  return {
    stop: () => {
      unsubscribe();
      clearTimers();
      worker.terminate();
    },
    latest: () => seq,
    retry: () => {
      if (!stuck) return;
      const latest = waiting;
      waiting = null;
      revive();
      if (latest) post(latest);
    },
  };
}
