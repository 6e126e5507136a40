/** A toolbar button bound to a command: label, key in the tooltip, disabled when unavailable. */
import type { ReactNode } from 'react';
import { useStore } from 'zustand';
import { useEditor } from './editorContext';
import { commandById, keyLabel } from '../tools/commands';
import { useCommandHost } from './commandHost';
import { useEditorState } from './editorContext';

export function CommandButton({ id, children, pressed, className }: { id: string; children?: ReactNode; pressed?: boolean; className?: string }) {
  const cmd = commandById.get(id)!;
  const host = useCommandHost();
  const { store } = useEditor();
  const available = useEditorState((s) => (cmd.enabled ? cmd.enabled(s) : true));
  // undo and redo also depend on the history itself
  const history = useStore(store.temporal, (t) => (id === 'undo' ? t.pastStates.length > 0 : id === 'redo' ? t.futureStates.length > 0 : true));
  const enabled = available && history;
  const keys = cmd.keys.map(keyLabel).join(' or ');
  return (
    <button
      type="button"
      className={`cmd ${className ?? ''}`}
      title={`${cmd.hint} (${keys})`}
      aria-label={`${cmd.label} (${keys})`}
      aria-pressed={pressed}
      aria-keyshortcuts={cmd.keys[0].replace('mod', 'Control')}
      disabled={!enabled}
      data-command={id}
      onClick={() => cmd.run(host)}
    >
      {children ?? cmd.label}
    </button>
  );
}
