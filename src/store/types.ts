/** The editor's state, in slices: document (undoable), view, solve results, sheet library. */
import type { StoreApi } from 'zustand/vanilla';
import type { TemporalState } from 'zundo';
import type { Fragment } from '../model/edits';
import type { Rect, QuarterTurns } from '../model/geometry';
import type { RefusalCulprit, SolveResult } from '../model/graph';
import type { PartKind, Sheet } from '../model/sheet';
import type { DerivedCircuit } from '../model/toGraph';
import type { UnreadableSheet } from './library';

export interface DocSlice {
  sheet: Sheet;
  sheetId: string;
}

export type ToolName = 'select' | 'wire' | 'place' | 'pan';

export interface View { x: number; y: number; zoom: number }

export interface Ghost { kind: PartKind; x: number; y: number; rot: QuarterTurns; mirror: boolean }

export interface ViewSlice {
  view: View;
  selection: string[];
  tool: ToolName;
  /** a sheet shown instead of `sheet` while a drag is under way (committed on release) */
  preview: Sheet | null;
  ghost: Ghost | null;
  wireDraft: number[] | null;
  /** the pin the keyboard points at while wiring */
  pinCursor: { x: number; y: number } | null;
  box: Rect | null;
  notice: { text: string; tone: 'info' | 'error' } | null;
  clipboard: Fragment | null;
  hoverNode: string | null;
  /** how phasors read: magnitude∠angle or rectangular */
  readout: 'polar' | 'rect';
  /** which standard the symbols are drawn to */
  symbols: 'iec' | 'ieee';
}

export interface Refusal {
  message: string;
  culprits: RefusalCulprit[];
  /** the circuit that was refused (to find the culprit on the sheet) */
  circuit: DerivedCircuit | null;
}

export interface SolveSlice {
  solve: {
    status: 'idle' | 'solved' | 'refused';
    /** the latest good result and the circuit it belongs to (kept, greyed, while refused); rounding noise shown as 0 */
    result: SolveResult | null;
    /** the same result exactly as solved (for the CSV files, which match the command line) */
    raw?: SolveResult | null;
    circuit: DerivedCircuit | null;
    refusal: Refusal | null;
    stale: boolean;
    /** sequence number of the edit the shown result belongs to */
    seq: number;
    solveMs: number;
    /** solve workers replaced in a row because one stopped answering (0 once one answers) */
    restarts?: number;
    /** the solver kept failing: it is no longer restarted on its own until the next edit or a retry */
    stuck?: boolean;
  };
  /** the circuit derived from the current sheet (may be newer than the result) */
  derived: DerivedCircuit | null;
}

export interface SheetEntry { id: string; title: string; updated: number }

export interface LibrarySlice {
  library: SheetEntry[];
}

/** A sheet opened from a shared link: shown and solved, but not written to browser storage until the user keeps it. */
export interface Visit {
  from: 'link';
  /** the sheet that was open before, brought back when the visit is dismissed */
  previousId: string;
  previousSheet: Sheet;
}

export interface ShareSlice {
  visit?: Visit | null;
}

export interface StoredCopy { id: string; sheet: Sheet; rev: string | null }

/** Why a tab shows its sheet without saving it: open in another tab first, taken over by another tab, or changed by another tab meanwhile. */
export type ReadOnlyReason = 'elsewhere' | 'taken' | 'changed';

/** What keeps work from being lost: the tab's hold on its sheet, and a stored sheet that could not be read. */
export interface GuardSlice {
  /** 'own': edits are made and saved; 'checking': edits are made, saving waits for the answer; 'read-only': edits are refused and nothing is saved */
  tab: { state: 'checking' | 'own' } | { state: 'read-only'; why: ReadOnlyReason };
  /** the copy in browser storage this tab knows of: the sheet it last wrote or read there, under which id, at which revision */
  stored: StoredCopy | null;
  /** a stored sheet that could not be read; its text is kept for download */
  unreadable: UnreadableSheet | null;
}

export type EditorState = DocSlice & ViewSlice & SolveSlice & LibrarySlice & ShareSlice & GuardSlice;

export type TrackedState = Pick<EditorState, 'sheet'>;

export type EditorStore = StoreApi<EditorState> & { temporal: StoreApi<TemporalState<TrackedState>> };
