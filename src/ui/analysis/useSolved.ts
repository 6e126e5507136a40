/** The solved circuit that belongs to the sheet as it is now (null while an edit is being solved or was refused). */
import { useStore } from 'zustand';
import { isCouplable } from '../../model/parts/registry';
import { useEditorState } from '../editorContext';
import type { EditorState } from '../../store/types';
import { analysisStore, type AnalysisState } from '../../store/analysisStore';

export function solvedNow(s: EditorState) {
  const { solve } = s;
  if (solve.status !== 'solved' || !solve.result || !solve.circuit || solve.circuit.source !== s.sheet) return null;
  return { result: solve.result, circuit: solve.circuit, model: solve.circuit.model };
}

export function useSolved() {
  const result = useEditorState((s) => (solvedNow(s) ? s.solve.result : null));
  const circuit = useEditorState((s) => (solvedNow(s) ? s.solve.circuit : null));
  return result && circuit ? { result, circuit, model: circuit.model } : null;
}

export function useAnalysis<T>(pick: (s: AnalysisState) => T): T {
  return useStore(analysisStore, pick);
}

/** Graph coupling id of a sheet coupling. */
export function graphCouplingId(couplingOfId: Map<string, string>, sheetId: string): string | null {
  for (const [g, s] of couplingOfId) if (s === sheetId) return g;
  return null;
}

/** The sheet coupling the selection points at: a link, or two windings linked to each other. */
export function selectedCoupling(s: EditorState): string | null {
  const sel = s.selection;
  if (sel.length === 1) return s.sheet.couplings.find((c) => c.id === sel[0])?.id ?? null;
  const windings = s.sheet.parts.filter((p) => isCouplable(p) && sel.includes(p.id)).map((p) => p.id);
  if (windings.length !== 2) return null;
  return s.sheet.couplings.find((c) => windings.every((w) => c.windings.includes(w)))?.id ?? null;
}
