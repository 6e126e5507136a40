/** Which node the pointer is over: its tag spot, or else one of its pins, within `tol` sheet units. */
import type { Point } from '../model/geometry';
import { pinPositions } from '../model/parts/registry';
import type { EditorState } from '../store/types';

export function nodeNear(s: EditorState, at: Point, tol: number): string | null {
  const topo = s.derived?.topology;
  if (!topo) return null;
  let best: string | null = null;
  let bestD = tol;
  for (const [name, a] of topo.anchors) {
    const d = Math.hypot(a.x - at.x, a.y - at.y);
    if (d < bestD) {
      bestD = d;
      best = name;
    }
  }
  if (best !== null) return best;
  for (let k = 0; k < s.sheet.parts.length; k++) {
    const pins = pinPositions(s.sheet.parts[k]);
    for (let j = 0; j < pins.length; j++) {
      const d = Math.hypot(pins[j].x - at.x, pins[j].y - at.y);
      if (d < bestD) {
        bestD = d;
        best = topo.pinNodes[k]?.[j] ?? null;
      }
    }
  }
  return best;
}
