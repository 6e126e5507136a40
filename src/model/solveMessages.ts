/** Messages between the editor and the solve worker (plain data, so both sides read them from the model room). */
import type { GraphModel, RefusalCulprit, SolveResult } from './graph';

export interface SolveRequest { seq: number; model: GraphModel }

/** `ms` is the solve time; `at` the wall-clock time (ms since the epoch) the worker received the request */
export type SolveReply =
  | { seq: number; ok: true; result: SolveResult; ms: number; at: number }
  | { seq: number; ok: false; message: string; culprits: RefusalCulprit[]; ms: number; at: number };
