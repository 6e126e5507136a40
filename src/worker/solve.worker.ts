/// <reference lib="webworker" />
/**
 * The Worker that owns a solver session. Each request is validated and
 * solved; when only the frequency changed since the last model, the kept
 * session answers at the new frequency without being built again.
 */
import { createSession, ModelRefusal, parseGraphModel } from '../solver';
import type { SolveReply, SolveRequest } from '../model/solveMessages';

declare const self: DedicatedWorkerGlobalScope;

let kept: { key: string; session: ReturnType<typeof createSession> } | null = null;

self.onmessage = (ev: MessageEvent<SolveRequest>) => {
  const { seq, model } = ev.data;
  const t0 = performance.now();
  const at = performance.timeOrigin + t0;
  let reply: SolveReply;
  try {
    const key = JSON.stringify({ ...model, frequencyHz: 0 });
    if (!kept || kept.key !== key) kept = { key, session: createSession(parseGraphModel(model)) };
    const result = kept.session.solveAt(model.frequencyHz);
    reply = { seq, ok: true, result, ms: performance.now() - t0, at };
  } catch (e) {
    kept = null;
    const culprits = e instanceof ModelRefusal ? e.culprits : [];
    const message = e instanceof Error ? e.message : String(e);
    reply = { seq, ok: false, message: message.split('\n')[0], culprits, ms: performance.now() - t0, at };
  }
  self.postMessage(reply);
};
