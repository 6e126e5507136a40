/**
 * Connects the store to the solve worker, outside React. Every change of the
 * sheet is derived into a graph model and posted; while a solve is in flight
 * only the newest model waits (older ones are dropped), and a reply for an
 * edit that has since been superseded is ignored. A crashed worker is replaced
 * and the latest model posted again.
 */
import { deriveCircuit, type DerivedCircuit } from '../model/toGraph';
import type { EditorStore } from './types';
import type { SolveReply, SolveRequest } from '../model/solveMessages';
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
}

export function attachSolver(store: EditorStore, makeWorker: () => WorkerLike): SolveBridge {
  let worker = makeWorker();
  let seq = store.getState().solve.seq;
  let inFlight: number | null = null;
  let waiting: SolveRequest | null = null;
  const circuits = new Map<number, DerivedCircuit>();

  const post = (req: SolveRequest) => {
    overlayProbe.postedAt = performance.now();
    inFlight = req.seq;
    worker.postMessage(req);
  };

  const onReply = (ev: MessageEvent<SolveReply>) => {
    const r = ev.data;
    overlayProbe.replyAt = performance.now();
    overlayProbe.solveMs = r.ms;
    overlayProbe.receivedAt = r.at - performance.timeOrigin;
    inFlight = null;
    if (waiting) {
      const next = waiting;
      waiting = null;
      post(next);
    }
    const circuit = circuits.get(r.seq);
    for (const k of [...circuits.keys()]) if (k <= r.seq) circuits.delete(k);
    if (r.seq !== seq || !circuit) return; // superseded by a newer edit
    const prev = store.getState().solve;
    if (r.ok) {
      store.setState({ solve: { ...prev, status: 'solved', result: floorResult(r.result), raw: r.result, circuit, refusal: null, stale: false, seq: r.seq, solveMs: r.ms } });
    } else {
      store.setState({ solve: { ...prev, status: 'refused', refusal: { message: r.message, culprits: r.culprits, circuit }, stale: prev.result !== null, seq: r.seq, solveMs: r.ms } });
    }
  };

  const wire = () => {
    worker.onmessage = onReply;
    worker.onerror = () => {
      worker.terminate();
      worker = makeWorker();
      wire();
      inFlight = null;
      const circuit = circuits.get(seq);
      if (circuit) post({ seq, model: circuit.model });
    };
  };
  wire();

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
    if (inFlight === null) post(req);
    else waiting = req;
  };

  const unsubscribe = store.subscribe((s, p) => {
    if (s.sheet !== p.sheet) send();
  });
  send();
  return {
    stop: () => {
      unsubscribe();
      worker.terminate();
    },
    latest: () => seq,
  };
}
