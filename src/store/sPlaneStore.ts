/**
 * The s-domain view's choices and last answer, kept outside the view so that they survive switching views
 * and so that the sweep can mark the poles of the pair last shown (while it belongs to the sheet as it is).
 */
import { createStore } from 'zustand/vanilla';
import type { GraphModel } from '../model/graph';
import type { TransferAnswer } from '../worker/protocol';

export interface SPlaneState {
  /** the input source's graph id ('' for the first source) */
  input: string;
  /** node:N, voltage:E or current:E ('' for the default) */
  output: string;
  /** picking the input or the output on the sheet: the next part or wire selected answers it */
  picking: 'input' | 'output' | null;
  /** what the last pick could not use, said in the view */
  pickNote: string;
  answer: TransferAnswer | null;
  /** the model `answer` was worked out for */
  model: GraphModel | null;
  /** mark the poles on the sweep's magnitude plot */
  markOnSweep: boolean;
}

export const sPlaneStore = createStore<SPlaneState>()(() => ({ input: '', output: '', picking: null, pickNote: '', answer: null, model: null, markOnSweep: true }));
