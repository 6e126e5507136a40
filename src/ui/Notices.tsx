/** Refusals, warnings, cautions and short messages, under the sheet. */
import { useMemo } from 'react';
import { cautionsFor } from '../model/cautions';
import { useEditor, useEditorState } from './editorContext';

export function Notices() {
  const { store } = useEditor();
  const solve = useEditorState((s) => s.solve);
  const notice = useEditorState((s) => s.notice);
  const cautions = useMemo(() => (solve.result && solve.circuit ? cautionsFor(solve.circuit.model, solve.result) : []), [solve.result, solve.circuit]);
  const notes = useEditorState((s) => s.derived?.notes) ?? [];
  return (
    <div className="notices" aria-live="polite">
      {notice && (
        <div className={`notice notice-${notice.tone}`} role={notice.tone === 'error' ? 'alert' : 'status'}>
          {notice.text}
          <button className="notice-x" aria-label="Dismiss message" onClick={() => store.setState({ notice: null })}>×</button>
        </div>
      )}
      {solve.status === 'refused' && solve.refusal && (
        <div className="notice notice-error" role="alert" data-testid="refusal">
          <strong>Not solved:</strong> {solve.refusal.message}{solve.result ? ' (the last good values are shown in grey)' : ''}
        </div>
      )}
      {notes.map((n) => <div key={n} className="notice notice-info">{n}</div>)}
      {solve.status !== 'refused' && solve.result?.warnings.map((w) => (
        <div key={w} className="notice notice-info" data-testid="warning"><strong>Floating part:</strong> {w}</div>
      ))}
      {cautions.map((c) => (
        <div key={c.kind + c.text} className="notice notice-caution" data-testid={`caution-${c.kind}`}>
          <strong>Caution:</strong> {c.text}
        </div>
      ))}
    </div>
  );
}
