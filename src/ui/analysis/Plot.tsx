/** One frequency plot (SVG): log or linear frequency axis with engineering ticks, traces, markers and a cursor line. */
import { scaleLinear, scaleLog } from 'd3-scale';
import { line } from 'd3-shape';
import type { Marker } from './plotMath';
import { engLabel, logTicks } from './plotMath';

export interface PlotSeries { label: string; color: string; y: ArrayLike<number>; markers?: Marker[] }

const W = 760;
const M = { l: 62, r: 14, t: 8, b: 24 };

export function Plot({ f, series, log, height, yLabel, yUnit, cursor, onCursor, testId, yDomain }: {
  f: number[]; series: PlotSeries[]; log: boolean; height: number; yLabel: string; yUnit: string;
  cursor: number | null; onCursor: (i: number | null) => void; testId: string; yDomain?: [number, number];
}) {
  const H = height;
  const x = (log ? scaleLog() : scaleLinear()).domain([f[0], f[f.length - 1]]).range([M.l, W - M.r]);
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of series) for (let i = 0; i < s.y.length; i++) {
    const v = s.y[i];
    if (Number.isFinite(v)) { lo = Math.min(lo, v); hi = Math.max(hi, v); }
  }
  if (!Number.isFinite(lo)) { lo = 0; hi = 1; }
  if (hi - lo < 1e-12 * Math.max(1, Math.abs(hi))) { lo -= 1; hi += 1; }
  const y = scaleLinear().domain(yDomain ?? [lo, hi]).nice().range([H - M.b, M.t]);
  const xt = log ? logTicks(f[0], f[f.length - 1]) : x.ticks(8);
  const yt = y.ticks(5);
  const path = (ys: ArrayLike<number>) => line<number>().defined((i) => Number.isFinite(ys[i])).x((i) => x(f[i])).y((i) => y(ys[i]))(Array.from({ length: f.length }, (_, i) => i)) ?? '';
  const onMove = (e: React.PointerEvent<SVGSVGElement>) => {
    const r = e.currentTarget.getBoundingClientRect();
    const px = ((e.clientX - r.left) * W) / r.width;
    if (px < M.l || px > W - M.r) return onCursor(null);
    const fx = x.invert(px);
    let best = 0;
    for (let i = 1; i < f.length; i++) if (Math.abs(f[i] - fx) < Math.abs(f[best] - fx)) best = i;
    onCursor(best);
  };
  return (
    <div className="plot" data-testid={testId}>
      <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`${yLabel} against frequency`} onPointerMove={onMove} onPointerLeave={() => onCursor(null)}>
        <g className="grid">
          {xt.map((t) => <line key={`x${t}`} x1={x(t)} x2={x(t)} y1={M.t} y2={H - M.b} />)}
          {yt.map((t) => <line key={`y${t}`} x1={M.l} x2={W - M.r} y1={y(t)} y2={y(t)} />)}
        </g>
        <g className="axis">
          <line x1={M.l} x2={W - M.r} y1={H - M.b} y2={H - M.b} />
          <line x1={M.l} x2={M.l} y1={M.t} y2={H - M.b} />
          {xt.map((t) => <text key={`xl${t}`} x={x(t)} y={H - M.b + 13} textAnchor="middle">{engLabel(t, 'Hz')}</text>)}
          {yt.map((t) => <text key={`yl${t}`} x={M.l - 4} y={y(t) + 3} textAnchor="end">{engLabel(t, '')}</text>)}
          <text x={12} y={(H - M.b + M.t) / 2} transform={`rotate(-90 12 ${(H - M.b + M.t) / 2})`} textAnchor="middle">{yLabel}{yUnit ? ` (${yUnit})` : ''}</text>
        </g>
        {series.map((s) => <path key={s.label} d={path(s.y)} fill="none" stroke={s.color} strokeWidth={1.6} />)}
        {series.flatMap((s) => (s.markers ?? []).map((mk, j) => {
          const cy = mk.kind === 'peak' ? y(mk.value) : y.range()[1] + 6;
          return (
            <g key={`${s.label}-${j}`} className="marker">
              <circle cx={x(mk.frequency)} cy={cy} r={3.5} fill={mk.kind === 'peak' ? s.color : '#fff'} stroke={s.color} />
              <text x={x(mk.frequency) + 5} y={cy - 4} fontSize={10} fill={s.color}>{engLabel(mk.frequency, 'Hz')}</text>
            </g>
          );
        }))}
        {cursor !== null && <line x1={x(f[cursor])} x2={x(f[cursor])} y1={M.t} y2={H - M.b} stroke="#888" strokeDasharray="3 3" />}
      </svg>
    </div>
  );
}
