import type { GraphModel } from '../model/graph';
import { parseSheetJson, sheetToGraph } from '../model';
import type { Sheet } from '../model/sheet';
import { ModelRefusal, parseGraphModel } from '../solver';

/** Derives the graph model of a sheet saved by the editor, refusing a damaged or foreign sheet in one line. */
export async function sheetFileToGraph(json: unknown, name: string): Promise<{ model: GraphModel; sheet: Sheet }> {
  let sheet: Sheet;
  try {
    sheet = parseSheetJson(json);
  } catch (e) {
    throw new ModelRefusal(`${name}: ${(e as Error).message}`, [{ kind: 'file' }]);
  }
  return { model: parseGraphModel(sheetToGraph(sheet)), sheet };
}
