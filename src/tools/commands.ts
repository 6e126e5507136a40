/** Commands as data: name, label, key, tooltip, when available, what it does. */
import * as A from '../store/actions';
import { ANALYSIS_COMMANDS } from './analysisCommands';
import type { EditorState, EditorStore } from '../store/types';
import { PART_DEFS, SHELF_KINDS, isCouplable } from '../model/parts/registry';
import type { PartKind } from '../model/sheet';
import type { ToolController } from './controller';
import type { KeyInput } from './machine';

export interface CommandHost {
  store: EditorStore;
  tools: ToolController;
  /** canvas size, for fitting */
  viewport: () => { width: number; height: number };
  openFile: () => void;
  saveFile: () => void;
  savePicture: () => void;
  newSheet: () => void;
  copyReadings: () => void;
  /** put the keyboard into the selected item's main value (the sheet's frequency when nothing is selected) */
  editValue?: () => void;
  /** the searchable list of every command */
  openCommandList?: () => void;
  /** sharing and other outputs (src/ui/share): the Share panel, a link, CSV, a canvas picture, print */
  output?: (what: 'panel' | 'link' | 'csv' | 'copy-png' | 'print') => void;
}

export interface Command {
  id: string;
  label: string;
  /** key chords, like "mod+z" or "r"; the first one is shown in tooltips */
  keys: string[];
  hint: string;
  enabled?: (s: EditorState) => boolean;
  run: (h: CommandHost) => void;
}

const hasSelection = (s: EditorState) => s.selection.length > 0;
const windingsSelected = (n: number) => (s: EditorState) => s.sheet.parts.filter((p) => isCouplable(p) && s.selection.includes(p.id)).length >= n;

/** Placing a part of the shelf: its name and key come from its definition. */
const place = (kind: PartKind): Command => {
  const { label, shelfKey } = PART_DEFS[kind];
  const name = label.replace(/^[A-Z][a-z]/, (m) => m.toLowerCase());
  return {
    id: `place-${kind}`, label, keys: [shelfKey],
    hint: `Place ${/^[aeiou]/i.test(label) ? 'an' : 'a'} ${name}; click on the sheet to drop it, or Enter to drop it at a free spot (shift-click keeps placing, R turns, M mirrors)`,
    run: (h) => h.tools.startPlacing(kind),
  };
};

export const COMMANDS: Command[] = [
  { id: 'command-list', label: 'Find a command', keys: ['/'], hint: 'A list of every command: type to narrow it, Enter runs the one marked', run: (h) => h.openCommandList?.() },
  { id: 'tool-pick', label: 'Pick', keys: ['p', 'escape'], hint: 'Pick, move and box-select items', run: (h) => h.tools.use('select') },
  { id: 'tool-wire', label: 'Wire', keys: ['j'], hint: 'Join pins with a wire: click from pin to pin (a click bends it, double-click or Enter stops); from the keyboard, arrows or [ ] pick a pin and Enter starts and ends the wire', run: (h) => h.tools.use('wire') },
  { id: 'tool-hand', label: 'Hand', keys: ['h'], hint: 'Drag to move the view (or hold Space, or use the middle button)', run: (h) => h.tools.use('pan') },
  ...SHELF_KINDS.map(place),
  { id: 'select-next', label: 'Next item', keys: [']'], hint: 'Select the next part or link on the sheet (Shift adds it to the selection)', run: (h) => A.selectNext(h.store, 1, false) },
  { id: 'select-prev', label: 'Previous item', keys: ['['], hint: 'Select the previous part or link on the sheet', run: (h) => A.selectNext(h.store, -1, false) },
  { id: 'select-next-add', label: 'Add next item', keys: ['}'], hint: 'Add the next part or link to the selection', run: (h) => A.selectNext(h.store, 1, true) },
  { id: 'nudge-left', label: 'Nudge left', keys: ['shift+arrowleft'], hint: 'Move the selection one grid step left', enabled: hasSelection, run: (h) => A.nudgeSelection(h.store, -1, 0) },
  { id: 'nudge-right', label: 'Nudge right', keys: ['shift+arrowright'], hint: 'Move the selection one grid step right', enabled: hasSelection, run: (h) => A.nudgeSelection(h.store, 1, 0) },
  { id: 'nudge-up', label: 'Nudge up', keys: ['shift+arrowup'], hint: 'Move the selection one grid step up', enabled: hasSelection, run: (h) => A.nudgeSelection(h.store, 0, -1) },
  { id: 'nudge-down', label: 'Nudge down', keys: ['shift+arrowdown'], hint: 'Move the selection one grid step down', enabled: hasSelection, run: (h) => A.nudgeSelection(h.store, 0, 1) },
  { id: 'edit-value', label: 'Edit value', keys: ['v', 'enter'], hint: "Type the selected part's main value (the sheet's frequency when nothing is selected)", run: (h) => h.editValue?.() },
  { id: 'turn', label: 'Turn', keys: ['.'], hint: 'Turn the selection a quarter clockwise', enabled: hasSelection, run: (h) => A.rotateSelection(h.store) },
  { id: 'turn-back', label: 'Turn back', keys: [','], hint: 'Turn the selection a quarter anticlockwise', enabled: hasSelection, run: (h) => A.rotateSelection(h.store, 3) },
  { id: 'mirror', label: 'Flip', keys: ['f'], hint: 'Flip the selection left to right (a mirror image)', enabled: hasSelection, run: (h) => A.mirrorSelection(h.store) },
  { id: 'swap-dot', label: 'Swap dot', keys: ['d'], hint: 'Move the polarity dot of the selected windings to their other end', enabled: windingsSelected(1), run: (h) => A.flipDotsOfSelection(h.store) },
  { id: 'link', label: 'Couple windings', keys: ['c'], hint: 'Couple the selected windings magnetically (k = 0.9 to start)', enabled: windingsSelected(2), run: (h) => A.coupleSelection(h.store) },
  { id: 'remove', label: 'Remove', keys: ['delete', 'backspace'], hint: 'Remove the selection', enabled: hasSelection, run: (h) => A.deleteSelection(h.store) },
  { id: 'copy', label: 'Copy', keys: ['mod+c'], hint: 'Copy the selection', enabled: hasSelection, run: (h) => A.copySelection(h.store) },
  { id: 'cut', label: 'Cut', keys: ['mod+x'], hint: 'Copy the selection and remove it', enabled: hasSelection, run: (h) => { A.copySelection(h.store); A.deleteSelection(h.store); } },
  { id: 'paste', label: 'Paste', keys: ['mod+v'], hint: 'Paste what was copied, offset from the original', run: (h) => A.pasteClipboard(h.store) },
  { id: 'duplicate', label: 'Duplicate', keys: ['mod+d'], hint: 'Copy and paste the selection in one go', enabled: hasSelection, run: (h) => A.duplicateSelection(h.store) },
  { id: 'select-all', label: 'Select all', keys: ['mod+a'], hint: 'Select every item on the sheet', run: (h) => A.selectAll(h.store) },
  { id: 'undo', label: 'Undo', keys: ['mod+z'], hint: 'Take back the last edit', enabled: (s) => s.preview === null, run: (h) => A.undo(h.store) },
  { id: 'redo', label: 'Redo', keys: ['mod+shift+z', 'mod+y'], hint: 'Put back the edit just taken back', run: (h) => A.redo(h.store) },
  { id: 'zoom-in', label: 'Closer', keys: ['=', '+'], hint: 'Zoom in about the middle of the view (the drawing stays in view)', run: (h) => { const v = h.viewport(); A.zoomView(h.store, 1.25, v.width, v.height); } },
  { id: 'zoom-out', label: 'Farther', keys: ['-'], hint: 'Zoom out about the middle of the view', run: (h) => { const v = h.viewport(); A.zoomView(h.store, 0.8, v.width, v.height); } },
  { id: 'fit', label: 'Show all', keys: ['0'], hint: 'Fit the whole sheet in view', run: (h) => { const v = h.viewport(); A.fitView(h.store, v.width, v.height); } },
  { id: 'pan-left', label: 'Look left', keys: ['arrowleft'], hint: 'Move the view left', run: (h) => A.panBy(h.store, 60, 0) },
  { id: 'pan-right', label: 'Look right', keys: ['arrowright'], hint: 'Move the view right', run: (h) => A.panBy(h.store, -60, 0) },
  { id: 'pan-up', label: 'Look up', keys: ['arrowup'], hint: 'Move the view up', run: (h) => A.panBy(h.store, 0, 60) },
  { id: 'pan-down', label: 'Look down', keys: ['arrowdown'], hint: 'Move the view down', run: (h) => A.panBy(h.store, 0, -60) },
  { id: 'new-sheet', label: 'New sheet', keys: ['alt+n'], hint: 'Start an empty sheet (the current one stays in the sheet list)', run: (h) => h.newSheet() },
  { id: 'open', label: 'Open file…', keys: ['mod+o'], hint: 'Open a sheet file or a graph model file', run: (h) => h.openFile() },
  { id: 'save', label: 'Save file', keys: ['mod+s'], hint: 'Save this sheet as a file', run: (h) => h.saveFile() },
  { id: 'save-picture', label: 'Save picture', keys: ['mod+shift+s'], hint: 'Save the sheet with its readings, title block and cautions as an SVG picture (it opens again as a sheet)', run: (h) => h.savePicture() },
  { id: 'copy-readings', label: 'Copy readings', keys: ['mod+shift+c'], hint: 'Copy the readings table as CSV', run: (h) => h.copyReadings() },
  { id: 'share-panel', label: 'Share and export', keys: ['alt+e'], hint: 'Paper, notes and plots for the SVG sheet; results and sweep CSV; PNG; print; a link that carries the sheet', run: (h) => h.output?.('panel') },
  { id: 'copy-link', label: 'Copy link', keys: ['alt+l'], hint: 'Copy a link that carries this sheet: whoever opens it sees it solved', run: (h) => h.output?.('link') },
  { id: 'save-results-csv', label: 'Save results CSV', keys: ['alt+c'], hint: 'Save every solved value (unrounded) as CSV', enabled: (s) => s.solve.status === 'solved', run: (h) => h.output?.('csv') },
  { id: 'copy-canvas-png', label: 'Copy canvas picture', keys: ['alt+i'], hint: 'Copy the drawing as shown as a PNG picture, for quick pasting', run: (h) => h.output?.('copy-png') },
  { id: 'print-sheet', label: 'Print sheet', keys: ['mod+p'], hint: 'Print the SVG sheet on the paper chosen under Share (the editor itself is not printed)', run: (h) => h.output?.('print') },
  {
    id: 'symbols', label: 'Symbol standard', keys: ['alt+s'], hint: 'Draw the symbols to IEC 60617 or to IEEE 315',
    run: (h) => h.store.setState({ symbols: h.store.getState().symbols === 'iec' ? 'ieee' : 'iec' }),
  },
  {
    id: 'readout', label: 'Polar / rectangular', keys: ['alt+r'], hint: 'Read phasors as magnitude∠angle or as real and imaginary parts',
    run: (h) => h.store.setState({ readout: h.store.getState().readout === 'polar' ? 'rect' : 'polar' }),
  },
  {
    id: 'amplitudes', label: 'RMS / peak', keys: ['alt+p'], hint: 'Switch the sheet between RMS and peak amplitudes',
    run: (h) => { const s = h.store.getState().sheet; A.commit(h.store, { ...s, amplitudes: s.amplitudes === 'rms' ? 'peak' : 'rms' }); },
  },
  ...ANALYSIS_COMMANDS,
];

export const commandById = new Map(COMMANDS.map((c) => [c.id, c]));

export function chordOf(k: KeyInput): string {
  const key = k.key.length === 1 ? k.key.toLowerCase() : k.key.toLowerCase();
  const parts: string[] = [];
  if (k.mod) parts.push('mod');
  if (k.alt) parts.push('alt');
  // shift matters with named keys (arrows, Delete …) and with Ctrl; with a character it is part of the character
  if (k.shift && (key.length > 1 || k.mod)) parts.push('shift');
  parts.push(key === ' ' ? 'space' : key);
  return parts.join('+');
}

export function findCommand(k: KeyInput): Command | undefined {
  const chord = chordOf(k);
  return COMMANDS.find((c) => c.keys.includes(chord));
}

/** "mod+shift+z" → "Ctrl+Shift+Z" for tooltips. */
export function keyLabel(chord: string): string {
  if (chord === '+') return '+';
  return chord.split('+').map((p) => (p === 'mod' ? 'Ctrl' : p === 'alt' ? 'Alt' : p === 'shift' ? 'Shift' : p.startsWith('arrow') ? `${p.slice(5)[0].toUpperCase()}${p.slice(6)} arrow` : p.length === 1 ? p.toUpperCase() : p[0].toUpperCase() + p.slice(1))).join('+');
}
