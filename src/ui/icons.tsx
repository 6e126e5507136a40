/** Small SVG pictures of parts for the shelf, drawn from the same primitives and marks as the canvas. */
import { PART_DEFS, partMarks } from '../model/parts/registry';
import type { Prim, SymbolStyle } from '../model/parts/types';
import type { Part, PartKind } from '../model/sheet';

function primToSvg(p: Prim, i: number) {
  switch (p.t) {
    case 'line': return <polyline key={i} points={p.p.join(' ')} fill="none" />;
    case 'poly': return <polygon key={i} points={p.p.join(' ')} fill={p.fill ? 'currentColor' : 'none'} />;
    case 'rect': return <rect key={i} x={p.x} y={p.y} width={p.w} height={p.h} fill="none" />;
    case 'circle': return <circle key={i} cx={p.x} cy={p.y} r={p.r} fill={p.fill ? 'currentColor' : 'none'} />;
    case 'arc': {
      const x0 = p.x + p.r * Math.cos(p.a0), y0 = p.y + p.r * Math.sin(p.a0);
      const x1 = p.x + p.r * Math.cos(p.a1), y1 = p.y + p.r * Math.sin(p.a1);
      const large = Math.abs(p.a1 - p.a0) > Math.PI ? 1 : 0;
      return <path key={i} d={`M ${x0} ${y0} A ${p.r} ${p.r} 0 ${large} 1 ${x1} ${y1}`} fill="none" />;
    }
    default: return null;
  }
}

export function PartIcon({ kind, style }: { kind: PartKind; style?: SymbolStyle }) {
  const def = PART_DEFS[kind];
  // a node label's icon carries no name: its flag alone says what it is
  const part: Part = { id: '', kind, x: 0, y: 0, rot: 0, mirror: false, ref: '', ...def.defaults, name: '' };
  const { x0, y0, x1, y1 } = def.icon.box;
  return (
    <svg viewBox={`${x0} ${y0} ${x1 - x0} ${y1 - y0}`} width="34" height="22" aria-hidden="true" stroke="currentColor" strokeWidth={def.icon.stroke} strokeLinecap="round" strokeLinejoin="round">
      {def.draw(part, style).map(primToSvg)}
      {partMarks(part).map((m, i) => (m.t === 'dot' ? <circle key={`m${i}`} cx={m.x} cy={m.y} r={m.r} fill="currentColor" stroke="none" /> : null))}
    </svg>
  );
}
