/** The one analysis worker client of the page, started on first use. */
import { AnalysisClient, type AnalysisWorkerLike } from '../../store/analysisBridge';

let client: AnalysisClient | null = null;

export function analysisClient(): AnalysisClient {
  client ??= new AnalysisClient(() => new Worker(new URL('../../worker/analysis.worker.ts', import.meta.url), { type: 'module' }) as unknown as AnalysisWorkerLike);
  return client;
}

let timeClient: AnalysisClient | null = null;

/** The time view's own analysis worker: cancelling a run stops it, and nothing else runs there. */
export function transientClient(): AnalysisClient {
  timeClient ??= new AnalysisClient(() => new Worker(new URL('../../worker/analysis.worker.ts', import.meta.url), { type: 'module' }) as unknown as AnalysisWorkerLike);
  return timeClient;
}
