import { ModelRefusal } from '../solver';

export async function renderSheetSvg(_text: string, name: string): Promise<string> {
  throw new ModelRefusal(`${name}: SVG export is not available in this build yet`, [{ kind: 'file' }]);
}
