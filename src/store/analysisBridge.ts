/**
 * Client of the analysis worker: each question is a promise; a sweep is a
 * promise with progress reports and a cancel. A crashed worker is replaced
 * and every open question is refused with a message.
 */
import type { AnalysisReply, AnalysisRequest, CompareAnswer, HarmonicAnswer, InspectAnswer, PowerAnswer, SweepAnswer, SweepSpec, TAnswer, TransferAnswer, TransientAnswer, TransientSpec } from '../worker/protocol';
import type { GraphModel, RefusalCulprit, SolveResult } from '../model/graph';

export interface AnalysisWorkerLike {
  postMessage(msg: AnalysisRequest): void;
  onmessage: ((ev: MessageEvent<AnalysisReply>) => void) | null;
  onerror: ((ev: ErrorEvent) => void) | null;
  terminate(): void;
}

interface Open { resolve: (v: unknown) => void; reject: (e: Error) => void; progress?: (done: number, total: number) => void }

/** A question the worker refused, with what the refusal names (elements, couplings, nodes). */
export class RefusedError extends Error {
  constructor(message: string, readonly culprits: RefusalCulprit[]) { super(message); }
}

export class CancelledError extends Error {
  constructor() { super('cancelled'); }
}

/** Omit over each member of a union. */
type Ask<T> = T extends unknown ? Omit<T, 'id'> : never;

export class AnalysisClient {
  private worker: AnalysisWorkerLike | null = null;
  private next = 1;
  private open = new Map<number, Open>();

  constructor(private readonly make: () => AnalysisWorkerLike) {}

  private get w(): AnalysisWorkerLike {
    if (!this.worker) {
      const w = this.make();
      w.onmessage = (ev) => this.reply(ev.data);
      w.onerror = () => {
        w.terminate();
        this.worker = null;
        for (const o of this.open.values()) o.reject(new Error('the analysis stopped unexpectedly; try again'));
        this.open.clear();
      };
      this.worker = w;
    }
    return this.worker;
  }

  private reply(r: AnalysisReply) {
    const o = this.open.get(r.id);
    if (!o) return;
    if (r.type === 'progress') return o.progress?.(r.done, r.total);
    this.open.delete(r.id);
    if (r.type === 'done') o.resolve(r.value);
    else if (r.type === 'cancelled') o.reject(new CancelledError());
    else o.reject(r.culprits?.length ? new RefusedError(r.message, r.culprits) : new Error(r.message));
  }

  private ask<T>(req: Ask<AnalysisRequest>, progress?: Open['progress']): { id: number; promise: Promise<T> } {
    const id = this.next++;
    const promise = new Promise<T>((resolve, reject) => {
      this.open.set(id, { resolve: resolve as (v: unknown) => void, reject, progress });
    });
    this.w.postMessage({ ...req, id } as AnalysisRequest);
    return { id, promise };
  }

  inspect(model: GraphModel, result: SolveResult, coupling: string, pair?: [string, string]) {
    return this.ask<InspectAnswer>({ kind: 'inspect', model, result, coupling, pair }).promise;
  }
  compare(model: GraphModel, winding: string, coupling?: string) {
    return this.ask<CompareAnswer>({ kind: 'compare', model, winding, coupling }).promise;
  }
  tCheck(model: GraphModel, coupling: string) {
    return this.ask<TAnswer>({ kind: 'tcheck', model, coupling }).promise;
  }
  power(model: GraphModel, result: SolveResult) {
    return this.ask<PowerAnswer>({ kind: 'power', model, result }).promise;
  }
  transfer(model: GraphModel, input: string, output: string) {
    return this.ask<TransferAnswer>({ kind: 'transfer', model, input, output }).promise;
  }
  harmonics(model: GraphModel, count: number) {
    return this.ask<HarmonicAnswer>({ kind: 'harmonics', model, count }).promise;
  }
  /** A sweep that reports progress; `cancel()` stops it between chunks (its promise then rejects with CancelledError). */
  sweep(model: GraphModel, spec: SweepSpec, progress?: (done: number, total: number) => void): { promise: Promise<SweepAnswer>; cancel: () => void } {
    const { id, promise } = this.ask<SweepAnswer>({ kind: 'sweep', model, spec }, progress);
    return { promise, cancel: () => this.worker?.postMessage({ id: this.next++, kind: 'cancel', target: id }) };
  }

  /**
   * A time response with progress; `cancel()` stops the worker it runs in (a
   * run cannot read messages while it steps), so give time responses a client
   * of their own. A held run (spec.hold) is cancelled by message instead.
   */
  transient(model: GraphModel, spec: TransientSpec, progress?: (done: number, total: number) => void): { promise: Promise<TransientAnswer>; cancel: () => void } {
    const { id, promise } = this.ask<TransientAnswer>({ kind: 'transient', model, spec }, progress);
    return {
      promise,
      cancel: () => {
        const o = this.open.get(id);
        if (!o) return;
        if (spec.hold) return this.worker?.postMessage({ id: this.next++, kind: 'cancel', target: id });
        this.open.delete(id);
        this.stop();
        for (const other of this.open.values()) other.reject(new Error('the analysis was stopped; try again'));
        this.open.clear();
        o.reject(new CancelledError());
      },
    };
  }

  stop() {
    this.worker?.terminate();
    this.worker = null;
  }
}
