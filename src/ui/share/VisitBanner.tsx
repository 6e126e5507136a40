/**
 * Opening a shared link: the sheet in the page's hash is read and shown
 * solved, without touching the sheets kept in this browser, under a banner
 * that offers to keep it or let it go. A damaged link is refused with the
 * reason and the current sheet stays.
 */
import { useEffect } from 'react';
import { decodeSheetPayload, linkPayload } from '../../model/link';
import { fitView, notify } from '../../store/actions';
import { dismissVisit, keepVisit, startVisit } from '../../store/visit';
import { useEditor, useEditorState } from '../editorContext';
import { useCommandHost } from '../commandHost';

function clearHash(): void {
  if (location.hash) history.replaceState(history.state, '', `${location.pathname}${location.search}`);
}

export function VisitBanner() {
  const { store } = useEditor();
  const host = useCommandHost();
  const visit = useEditorState((s) => s.visit);
  const title = useEditorState((s) => s.sheet.title);

  useEffect(() => {
    const open = async () => {
      const payload = linkPayload(location.hash);
      if (payload === null) return;
      try {
        const sheet = await decodeSheetPayload(payload);
        startVisit(store, sheet);
        const v = host.viewport();
        fitView(store, v.width, v.height);
      } catch (e) {
        clearHash();
        notify(store, `Could not open the shared link. ${e instanceof Error ? e.message : String(e)}. The current sheet is unchanged.`, 'error');
      }
    };
    void open();
    window.addEventListener('hashchange', open);
    return () => window.removeEventListener('hashchange', open);
  }, [store, host]);

  if (!visit) return null;
  return (
    <div className="visit-banner" role="region" aria-label="Shared sheet" data-testid="visit-banner">
      <span>
        <strong>Shared sheet:</strong> <span className="visit-title" data-testid="visit-title">{title}</span>
        <small>Shown and solved from the link; not kept in this browser until you keep it.</small>
      </span>
      <button
        type="button" className="cmd cmd-strong" data-testid="visit-keep"
        onClick={() => { keepVisit(store); clearHash(); notify(store, 'Kept: the shared sheet is now among the sheets of this browser'); }}
      >
        Keep it
      </button>
      <button
        type="button" className="cmd" data-testid="visit-dismiss"
        onClick={() => { dismissVisit(store); clearHash(); const v = host.viewport(); fitView(store, v.width, v.height); notify(store, 'Shared sheet dismissed; your sheet is back as it was'); }}
      >
        Dismiss
      </button>
    </div>
  );
}
