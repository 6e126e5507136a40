/**
 * One x–y plot (SVG) sized to its pane: log or linear x axis with engineering
 * ticks, traces, a layer of marks and a cursor line. The plot measures the
 * width its container gives it and lays out its margins from the tick labels
 * it draws, so every tick, label and mark stays inside the picture.
 *
 * Marks are a layer of their own (`marks`): any view can add points or
 * vertical rules with a label (peaks, half-power points, resonances, poles…)
 * without touching the traces.
 */
import { useLayoutEffect, useRef, useState } from 'react';
import { scaleLinear, scaleLog } from 'd3-scale';
import { line } from 'd3-shape';
import { engLabel, logTicks } from './plotMath';

export interface PlotSeries { label: string; color: string; y: ArrayLike<number>; dashed?: boolean }

/** A point on a trace (`y` in the plot's units) or, without `y`, a flag along the top edge; `rule` draws a dotted vertical line through it. */
export interface PlotMark { x: number; y?: number; label: string; color: string; kind: string; shape?: 'dot' | 'ring' | 'cross'; rule?: boolean }

const FONT_PX = 10;
const M = { t: 10, b: 24 };
const MIN_WIDTH = 240;

let measurer: CanvasRenderingContext2D | null | undefined;
/** Width of a label at the plots' text size (the canvas' measure where there is one, else an estimate). */
export function textWidth(text: string, px = FONT_PX): number {
  if (measurer === undefined) {
    try {
      measurer = typeof document !== 'undefined' ? document.createElement('canvas').getContext('2d') : null;
    } catch {
      measurer = null;
    }
  }
  if (measurer) {
    measurer.font = `${px}px system-ui, sans-serif`;
    return measurer.measureText(text).width;
  }
  return text.length * px * 0.6;
}

/** The width the element's container gives it, followed as it changes. */
export function usePaneWidth(fallback = 640): [React.RefObject<HTMLDivElement | null>, number] {
  const ref = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(fallback);
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    const read = () => {
      const w = Math.floor(el.clientWidth);
      if (w > 0) setWidth((old) => (old === w ? old : w));
    };
    read();
    if (typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver(read);
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  return [ref, Math.max(MIN_WIDTH, width)];
}

/** Ticks of the x axis whose labels fit side by side in `span` pixels. */
function xTicks(lo: number, hi: number, log: boolean, span: number, unit: string, linear: (n: number) => number[]): number[] {
  const fits = (ts: number[]) => ts.reduce((w, t) => w + textWidth(engLabel(t, unit)) + 12, 0) <= span;
  if (log) {
    let ts = logTicks(lo, hi);
    if (fits(ts)) return ts;
    ts = ts.filter((t) => Math.abs(Math.log10(t) - Math.round(Math.log10(t))) < 1e-9);
    while (ts.length > 2 && !fits(ts)) ts = ts.filter((_, i) => i % 2 === 0);
    return ts.length ? ts : [lo, hi];
  }
  for (let n = 8; n >= 2; n--) {
    const ts = linear(n);
    if (fits(ts)) return ts;
  }
  return linear(2);
}

export function Plot({ x: xs, xUnit = 'Hz', xLabel = 'frequency', series, log, height, yLabel, yUnit, cursor, onCursor, testId, yDomain, marks = [] }: {
  x: ArrayLike<number>; xUnit?: string; xLabel?: string; series: PlotSeries[]; log: boolean; height: number; yLabel: string; yUnit: string;
  cursor: number | null; onCursor: (i: number | null) => void; testId: string; yDomain?: [number, number]; marks?: PlotMark[];
}) {
  const [pane, W] = usePaneWidth();
  const H = height;
  const n = xs.length;
  const x0 = xs[0];
  const x1 = xs[n - 1];
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of series) for (let i = 0; i < s.y.length; i++) {
    const v = s.y[i];
    if (Number.isFinite(v)) { lo = Math.min(lo, v); hi = Math.max(hi, v); }
  }
  if (!Number.isFinite(lo)) { lo = 0; hi = 1; }
  if (hi - lo < 1e-12 * Math.max(1, Math.abs(hi))) { lo -= 1; hi += 1; }
  const y = scaleLinear().domain(yDomain ?? [lo, hi]).nice().range([H - M.b, M.t]);
  const yt = y.ticks(Math.max(2, Math.min(6, Math.floor((H - M.t - M.b) / 28))));
  const yLabels = yt.map((t) => engLabel(t, ''));
  // margins from what is drawn in them: the widest y label, the rotated axis title, half the last x label
  const left = Math.ceil(Math.max(...yLabels.map((t) => textWidth(t)), 8) + 8 + FONT_PX + 10);
  const lastLabel = engLabel(x1, xUnit);
  const right = Math.ceil(Math.max(14, textWidth(lastLabel) / 2 + 4));
  const x = (log ? scaleLog() : scaleLinear()).domain([x0, x1]).range([left, W - right]);
  const xt = xTicks(x0, x1, log, W - left - right, xUnit, (k) => (x as ReturnType<typeof scaleLinear>).ticks(k));
  const path = (ys: ArrayLike<number>) => line<number>().defined((i) => Number.isFinite(ys[i])).x((i) => x(xs[i])).y((i) => y(ys[i]))(Array.from({ length: n }, (_, i) => i)) ?? '';
  const onMove = (e: React.PointerEvent<SVGSVGElement>) => {
    const r = e.currentTarget.getBoundingClientRect();
    const px = ((e.clientX - r.left) * W) / r.width;
    if (px < left || px > W - right) return onCursor(null);
    const fx = x.invert(px);
    let best = 0;
    for (let i = 1; i < n; i++) if (Math.abs(xs[i] - fx) < Math.abs(xs[best] - fx)) best = i;
    onCursor(best);
  };
  const placed = placeMarkLabels(marks, (m) => x(m.x), (m) => (m.y === undefined || !Number.isFinite(m.y) ? M.t + 4 : Math.max(M.t, Math.min(H - M.b, y(m.y)))), left, W - right, M.t, H - M.b);
  const clampX = (px: number, w: number) => Math.max(2, Math.min(W - w - 2, px));
  return (
    <div className="plot" data-testid={testId} ref={pane}>
      <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`${yLabel} against ${xLabel}`} onPointerMove={onMove} onPointerLeave={() => onCursor(null)}>
        <g className="grid">
          {xt.map((t) => <line key={`x${t}`} x1={x(t)} x2={x(t)} y1={M.t} y2={H - M.b} />)}
          {yt.map((t) => <line key={`y${t}`} x1={left} x2={W - right} y1={y(t)} y2={y(t)} />)}
        </g>
        <g className="axis">
          <line x1={left} x2={W - right} y1={H - M.b} y2={H - M.b} />
          <line x1={left} x2={left} y1={M.t} y2={H - M.b} />
          {xt.map((t) => {
            const label = engLabel(t, xUnit);
            const w = textWidth(label);
            return <text key={`xl${t}`} data-tick={t} x={clampX(x(t) - w / 2, w) + w / 2} y={H - M.b + 13} textAnchor="middle">{label}</text>;
          })}
          {yt.map((t, i) => <text key={`yl${t}`} x={left - 4} y={y(t) + 3} textAnchor="end">{yLabels[i]}</text>)}
          <text x={FONT_PX + 2} y={(H - M.b + M.t) / 2} transform={`rotate(-90 ${FONT_PX + 2} ${(H - M.b + M.t) / 2})`} textAnchor="middle">{yLabel}{yUnit ? ` (${yUnit})` : ''}</text>
        </g>
        {series.map((s) => <path key={s.label} d={path(s.y)} fill="none" stroke={s.color} strokeWidth={1.6} strokeDasharray={s.dashed ? '5 3' : undefined} />)}
        <g className="marks">
          {placed.map(({ m, px, py, lx, ly, w, shown }, j) => (
            <g key={`${m.kind}-${j}`} className="mark" data-kind={m.kind} data-x={m.x}>
              {m.rule && <line x1={px} x2={px} y1={M.t} y2={H - M.b} stroke={m.color} strokeDasharray="2 3" opacity={0.7} />}
              {m.shape === 'cross'
                ? <path d={`M${px - 3.5},${py - 3.5}L${px + 3.5},${py + 3.5}M${px - 3.5},${py + 3.5}L${px + 3.5},${py - 3.5}`} stroke={m.color} strokeWidth={1.6} />
                : <circle cx={px} cy={py} r={3.5} fill={m.shape === 'ring' ? '#fff' : m.color} stroke={m.color} />}
              {shown ? <text x={lx} y={ly} fontSize={FONT_PX} fill={m.color} data-width={w}>{m.label}</text> : <title>{m.label}</title>}
            </g>
          ))}
        </g>
        {cursor !== null && cursor < n && <line x1={x(xs[cursor])} x2={x(xs[cursor])} y1={M.t} y2={H - M.b} stroke="#888" strokeDasharray="3 3" />}
      </svg>
    </div>
  );
}

/**
 * Labels of the marks, each beside its point and inside the plot area, moved
 * up or down in steps until it overlaps no label placed before it (dropped
 * when there is no free row: the list under the plot still names it).
 */
export function placeMarkLabels<T extends { label: string }>(marks: T[], px: (m: T) => number, py: (m: T) => number, xMin: number, xMax: number, yMin: number, yMax: number) {
  const out: { m: T; px: number; py: number; lx: number; ly: number; w: number; shown: boolean }[] = [];
  const boxes: { x0: number; x1: number; y0: number; y1: number }[] = [];
  const free = (b: { x0: number; x1: number; y0: number; y1: number }) => boxes.every((o) => b.x1 <= o.x0 || b.x0 >= o.x1 || b.y1 <= o.y0 || b.y0 >= o.y1);
  for (const m of marks) {
    const x = px(m);
    const y = py(m);
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    const w = textWidth(m.label);
    const h = FONT_PX + 2;
    // right of the point, or left of it when it would run out of the plot
    const lx = x + 6 + w <= xMax ? x + 6 : Math.max(xMin, x - 6 - w);
    let done = false;
    for (let k = 0; k < 12 && !done; k++) {
      const dy = (k % 2 === 0 ? -1 : 1) * Math.ceil(k / 2) * h;
      const ly = y - 5 + dy;
      const b = { x0: lx, x1: lx + w, y0: ly - FONT_PX, y1: ly + 2 };
      if (b.y0 < yMin || b.y1 > yMax || !free(b)) continue;
      boxes.push(b);
      out.push({ m, px: x, py: y, lx, ly, w, shown: true });
      done = true;
    }
    if (!done) out.push({ m, px: x, py: y, lx, ly: y, w, shown: false });
  }
  return out;
}
