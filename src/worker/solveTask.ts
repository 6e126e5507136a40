/**
 * The solve worker's work as a plain function (testable without a Worker):
 * each request is validated and solved. When only the frequency changed since
 * the last model, the kept session answers at the new frequency without being
 * built again; when a value changed but not the wiring, the new session takes
 * over the kept one's symbolic analysis and only refactors.
 */
import { ModelRefusal, parseGraphModel, SolverSession } from '../solver';
import type { SolveReply, SolveRequest } from '../model/solveMessages';

export class SolveTask {
  private kept: { key: string; session: SolverSession } | null = null;

  /** The session that answered the last request, if it solved. */
  get session(): SolverSession | null {
    return this.kept?.session ?? null;
  }

  run({ seq, model }: SolveRequest, now: () => number = () => performance.now(), origin = 0): SolveReply {
    const t0 = now();
    const at = origin + t0;
    try {
      const key = JSON.stringify({ ...model, frequencyHz: 0 });
      if (!this.kept || this.kept.key !== key) {
        this.kept = { key, session: new SolverSession(parseGraphModel(model), this.kept?.session) };
      }
      const result = this.kept.session.solveAt(model.frequencyHz);
      return { seq, ok: true, result, ms: now() - t0, at };
    } catch (e) {
      // a refused model leaves no session behind; the next edit starts afresh
      this.kept = null;
      const culprits = e instanceof ModelRefusal ? e.culprits : [];
      const message = e instanceof Error ? e.message : String(e);
      return { seq, ok: false, message: message.split('\n')[0], culprits, ms: now() - t0, at };
    }
  }
}
