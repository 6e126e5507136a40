import type { GraphModel } from '../model/graph';
import { ModelRefusal, parseGraphModel } from '../solver';
import { jsonShapeProblem, modelSizeProblem } from './limits';

/**
 * Reads a file's text as a graph model: either a `coilwright.graph/1` model
 * or a sheet saved by the editor, whose graph model is derived first.
 */
export async function loadModelText(text: string, name: string): Promise<{ model: GraphModel; sheet?: unknown }> {
  const shape = jsonShapeProblem(text);
  if (shape) throw new ModelRefusal(`${name}: ${shape}`, [{ kind: 'file' }]);
  let json: unknown;
  try {
    json = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    const why = (e as Error).message.replace(/\s+/g, ' ').replace(/[^\x20-\x7e]/g, '?');
    throw new ModelRefusal(`${name}: not a JSON file (${why.length > 100 ? why.slice(0, 100) + '…' : why}); open a coilwright.graph/1 model or a saved sheet`, [{ kind: 'file' }]);
  }
  const elements = (json as { elements?: unknown } | null)?.elements;
  const tooMany = Array.isArray(elements) ? modelSizeProblem(elements.length) : null;
  if (tooMany) throw new ModelRefusal(`${name}: ${tooMany}`, [{ kind: 'model' }]);
  const schema = (json as { schema?: unknown } | null)?.schema;
  if (typeof schema === 'string' && schema.startsWith('coilwright.sheet/')) {
    const { sheetFileToGraph } = await import('./sheet-file');
    return sheetFileToGraph(json, name);
  }
  try {
    return { model: parseGraphModel(json) };
  } catch (e) {
    if (e instanceof ModelRefusal && e.culprits[0]?.kind === 'file') {
      throw new ModelRefusal(`${name}: ${e.message.replace(/^file: /, '')}`, e.culprits);
    }
    throw e;
  }
}
