import type { GraphModel } from '../model/graph';
import { ModelRefusal } from '../solver';

/** Derives the graph model of a sheet saved by the editor. */
export async function sheetFileToGraph(json: unknown, name: string): Promise<{ model: GraphModel; sheet: unknown }> {
  throw new ModelRefusal(`${name}: sheet files are not readable by this build yet`, [{ kind: 'file' }]);
}
