/** Small SVG pictures of parts for the shelf, drawn from the same primitives as the canvas. */
import { PART_DEFS } from '../model/parts/registry';
import type { Prim, SymbolStyle } from '../model/parts/types';
import type { PartKind } from '../model/sheet';

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
  const prims = def.draw({ id: '', kind, x: 0, y: 0, rot: 0, mirror: false, ref: '', ...def.defaults, name: 'a' }, style);
  const vb = kind === 'transformer' ? '-44 -36 88 72' : kind === 'ground' ? '-16 -4 32 26' : kind === 'label' ? '-4 -14 40 28' : '-32 -20 64 40';
  return (
    <svg viewBox={vb} width="34" height="22" aria-hidden="true" stroke="currentColor" strokeWidth={kind === 'transformer' ? 3 : 2.2} strokeLinecap="round" strokeLinejoin="round">
      {prims.map(primToSvg)}
      {kind === 'winding' && <circle cx={-24} cy={-9} r={2.6} fill="currentColor" />}
    </svg>
  );
}
