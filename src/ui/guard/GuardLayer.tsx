/** What the editor shows to keep work from being lost: a read-only sheet, a stored sheet that cannot be read, a solver that stopped answering. */
import type { SolveBridge } from '../../store/solveBridge';
import type { TabGuard } from '../../store/tabGuard';
import { ReadOnlyBanner } from './ReadOnlyBanner';
import { SolverTrouble } from './SolverTrouble';
import { UnreadableSheetNotice } from './UnreadableSheetNotice';
import './guard.css';

export function GuardLayer({ guard, solver }: { guard?: TabGuard; solver?: SolveBridge }) {
  return (
    <div className="guard-layer">
      {guard && <ReadOnlyBanner guard={guard} />}
      <UnreadableSheetNotice />
      {solver && <SolverTrouble solver={solver} />}
    </div>
  );
}
