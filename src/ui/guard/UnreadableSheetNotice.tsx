/** A kept sheet that could not be read: the reason, and its stored text to download (nothing of it is lost or overwritten). */
import { useEditor, useEditorState } from '../editorContext';
import { download } from '../files';

export function UnreadableSheetNotice() {
  const { store } = useEditor();
  const u = useEditorState((s) => s.unreadable);
  if (!u) return null;
  const file = `${u.title.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'sheet'}-as-stored.json`;
  return (
    <div className="guard-notice" role="alert" data-testid="unreadable-sheet">
      <span>
        <strong>A kept sheet could not be opened:</strong> “{u.title}” — {u.reason}. Its text stays stored as it is; download it to repair it or
        keep it elsewhere.
      </span>
      <button type="button" className="cmd" data-testid="unreadable-download" onClick={() => download(file, u.text, 'application/json')}>
        Download its text
      </button>
      <button type="button" className="notice-x" aria-label="Dismiss message" onClick={() => store.setState({ unreadable: null })}>×</button>
    </div>
  );
}
