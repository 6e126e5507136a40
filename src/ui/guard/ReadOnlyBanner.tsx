/** A sheet this tab shows read-only (another tab edits it): why, and the two ways on. */
import { useEditorState } from '../editorContext';
import type { TabGuard } from '../../store/tabGuard';

const WHY = {
  elsewhere: 'This sheet is open in another tab, which edits it. Here it is read-only and follows what that tab saves.',
  taken: 'Another tab took this sheet over. Here it is read-only and follows what that tab saves.',
  changed: 'Another tab saved this sheet after this tab read it, so this tab saved nothing over it. What this tab shows is not saved.',
} as const;

export function ReadOnlyBanner({ guard }: { guard: TabGuard }) {
  const tab = useEditorState((s) => s.tab);
  if (tab.state !== 'read-only') return null;
  return (
    <div className="guard-banner" role="region" aria-label="Read-only sheet" data-testid="read-only-banner" data-why={tab.why}>
      <span>
        <strong>Read-only here.</strong> {WHY[tab.why]}
      </span>
      <button type="button" className="cmd cmd-strong" data-testid="take-over" onClick={() => void guard.takeOver()}
        title={tab.why === 'changed' ? 'Load the version the other tab saved and edit it here' : 'Edit the sheet in this tab; the other tab then shows it read-only'}>
        Take over here
      </button>
      <button type="button" className="cmd" data-testid="keep-copy" onClick={() => guard.keepCopy()} title="Keep what this tab shows as a sheet of its own, and edit that">
        Keep a copy
      </button>
    </div>
  );
}
