/**
 * Graph model → sheet, laid out simply: the elements stand in rows of
 * ROW_LENGTH, each pin runs a short wire to a node label carrying its node's
 * name (a ground symbol for the ground node), so equal names join the nodes.
 */
import type { GraphElement, GraphModel } from './graph';
import { newId } from './ids';
import { PART_DEFS, PART_OF_ELEMENT, pinPositions } from './parts/registry';
import { emptySheet, type Part, type Sheet } from './sheet';



/** Elements in one row; rows stack downwards so that a large model stays within the sheet's bounds. */
export const ROW_LENGTH = 40;
const ROW_HEIGHT = 260;

export function graphToSheet(model: GraphModel, title = 'Imported graph model'): Sheet {
  const parts: Part[] = [];
  const wires: Sheet['wires'] = [];
  const idOf = new Map<string, string>();
  let x = 100;
  let y = 220;
  model.elements.forEach((el, index) => {
    if (index > 0 && index % ROW_LENGTH === 0) {
      x = 100;
      y += ROW_HEIGHT;
    }
    const kind = PART_OF_ELEMENT[el.kind];
    const def = PART_DEFS[kind];
    const wide = def.pins.length > 2;
    if (wide) x += 30;
    const part: Part = { id: newId('part'), kind, x, y, rot: wide ? 0 : 1, mirror: false, ref: el.id, ...def.defaults, ...def.fromElement!.values(el) };
    parts.push(part);
    idOf.set(el.id, part.id);
    pinPositions(part).forEach((pin, i) => {
      const up = pin.y < y;
      const end = { x: pin.x, y: up ? pin.y - 40 : pin.y + 40 };
      wires.push({ id: newId('wire'), pts: [pin.x, pin.y, end.x, end.y] });
      const node = el.nodes[i];
      if (node === model.ground) {
        parts.push({ id: newId('part'), kind: 'ground', x: end.x, y: end.y, rot: up ? 2 : 0, mirror: false, ref: '' });
      } else {
        parts.push({ id: newId('part'), kind: 'label', x: end.x, y: end.y, rot: 0, mirror: false, ref: '', name: node });
      }
    });
    x += wide ? 190 : 150;
  });
  const couplings = (model.couplings ?? []).map((c) => ({
    id: newId('coupling'),
    windings: c.windings.map((w) => idOf.get(w) ?? w),
    by: (c.henries !== undefined && c.k === undefined ? 'M' : 'k') as 'k' | 'M',
    value: c.henries !== undefined && c.k === undefined ? c.henries : (c.k ?? 0),
  }));
  return { ...emptySheet(title), frequencyHz: model.frequencyHz, amplitudes: model.amplitudes, parts, wires, couplings };
}
