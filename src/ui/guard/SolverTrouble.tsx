/** The solver has stopped answering: the readings are greyed, and the editor says whether it is still trying. */
import { useEditorState } from '../editorContext';
import type { SolveBridge } from '../../store/solveBridge';

export function SolverTrouble({ solver }: { solver: SolveBridge }) {
  const stuck = useEditorState((s) => !!s.solve.stuck);
  const restarts = useEditorState((s) => s.solve.restarts ?? 0);
  if (stuck) {
    return (
      <div className="guard-notice" role="alert" data-testid="solver-stuck">
        <span>
          <strong>The solver stopped answering</strong> (restarted {restarts} times without an answer). The readings shown are from before your
          latest edits, greyed. It tries again on your next edit.
        </span>
        <button type="button" className="cmd" data-testid="solver-retry" onClick={() => solver.retry()}>Try again now</button>
      </div>
    );
  }
  if (restarts > 0) {
    return (
      <div className="guard-notice guard-quiet" role="status" data-testid="solver-restarting">
        The solver did not answer; it was restarted ({restarts}) and is solving the latest edit. The readings are greyed until it answers.
      </div>
    );
  }
  return null;
}
