/**
 * What the sheet's overlay shows while the time view's cursor is on a run of
 * the sheet as it is: the circuit at that instant (every value real), with
 * arrows scaled by the largest current of the whole run. Null otherwise, and
 * the overlay shows the phasors.
 */
import type { SolveResult } from '../../model/graph';
import type { DerivedCircuit } from '../../model/toGraph';
import { analysisStore, type AnalysisState } from '../../store/analysisStore';
import type { EditorState } from '../../store/types';
import type { TransientAnswer } from '../../worker/protocol';
import { nearestIndex } from './timeMath';
import { instantResult, largestCurrent } from './timeRunner';

export interface InstantOverlay { result: SolveResult; circuit: DerivedCircuit; maxAmps: number; timeS: number }

let cache: { answer: TransientAnswer; index: number; value: InstantOverlay } | null = null;
let scale: { answer: TransientAnswer; maxAmps: number } | null = null;

export function instantOverlay(s: Pick<EditorState, 'derived'>, a: AnalysisState = analysisStore.getState()): InstantOverlay | null {
  const { time } = a;
  const answer = time.answer;
  if (a.view !== 'time' || !answer || time.cursorS === null || !s.derived || time.sheetOf !== s.derived.model) return null;
  const index = nearestIndex(answer.timesS, time.cursorS);
  if (index < 0) return null;
  if (cache && cache.answer === answer && cache.index === index && cache.value.circuit === s.derived) return cache.value;
  if (!scale || scale.answer !== answer) scale = { answer, maxAmps: largestCurrent(answer) };
  const value = { result: instantResult(answer, index, s.derived.model.frequencyHz), circuit: s.derived, maxAmps: scale.maxAmps, timeS: answer.timesS[index] };
  cache = { answer, index, value };
  return value;
}

/** Whether a change of the analysis state changes what the overlay shows. */
export function instantChanged(a: AnalysisState, b: AnalysisState): boolean {
  return a.view !== b.view || a.time.cursorS !== b.time.cursorS || a.time.answer !== b.time.answer || a.time.sheetOf !== b.time.sheetOf;
}
