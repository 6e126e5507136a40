/** The one analysis worker client of the page, started on first use. */
import { AnalysisClient, type AnalysisWorkerLike } from '../../store/analysisBridge';

let client: AnalysisClient | null = null;

export function analysisClient(): AnalysisClient {
  client ??= new AnalysisClient(() => new Worker(new URL('../../worker/analysis.worker.ts', import.meta.url), { type: 'module' }) as unknown as AnalysisWorkerLike);
  return client;
}
