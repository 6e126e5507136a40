/// <reference lib="webworker" />
/** The Worker that owns a solver session (see ./solveTask.ts). */
import { SolveTask } from './solveTask';
import type { SolveRequest } from '../model/solveMessages';

declare const self: DedicatedWorkerGlobalScope;

const task = new SolveTask();

self.onmessage = (ev: MessageEvent<SolveRequest>) => {
  self.postMessage(task.run(ev.data, () => performance.now(), performance.timeOrigin));
};
