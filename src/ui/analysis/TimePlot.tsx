/**
 * The time view's plot (SVG of our own): one shared time axis, volts on the
 * left scale and amperes on the right, each trace drawn from its min/max
 * envelope per pixel column (so a long run stays smooth and cheap), the
 * phasor steady state faint and dashed beside a sine-driven trace, the
 * measuring window shaded, and a cursor.
 *
 * Pointer: moving sets the cursor; dragging marks the measuring window; the
 * wheel zooms about the pointer, with Shift it pans. Keys (plot focused):
 * ← → move the cursor a sample (with Shift a fiftieth of the span), + − zoom,
 * Home and End go to the run's ends, [ and ] start and end the measuring
 * window at the cursor.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import { scaleLinear } from 'd3-scale';
import { engLabel } from './plotMath';
import { textWidth, usePaneWidth } from './Plot';
import { envelope, nearestIndex } from './timeMath';

export interface TimeSeries { key: string; label: string; color: string; unit: 'V' | 'A'; y: ArrayLike<number>; steady?: (t: number) => number }

const FONT_PX = 10;
const M = { t: 10, b: 24 };

export function TimePlot({ t, series, span, stopS, cursorS, window, height, onCursor, onWindow, onSpan }: {
  t: ArrayLike<number>; series: TimeSeries[]; span: [number, number]; stopS: number; cursorS: number | null; window: [number, number] | null; height: number;
  onCursor: (t: number | null) => void; onWindow: (w: [number, number]) => void; onSpan: (s: [number, number] | null) => void;
}) {
  const [pane, W] = usePaneWidth();
  const H = height;
  const drag = useRef<{ x: number; t: number } | null>(null);
  const [dragging, setDragging] = useState<[number, number] | null>(null);
  const [t0, t1] = span;
  const volts = series.filter((s) => s.unit === 'V');
  const amps = series.filter((s) => s.unit === 'A');
  const columnsGuess = Math.max(100, W - 120);
  // the envelopes change with the data, the span and the width, not with the cursor: kept across cursor moves
  const envs = useMemo(() => series.map((s) => envelope(t, s.y, t0, t1, columnsGuess)), [t, series, t0, t1, columnsGuess]);
  const steadies = useMemo(() => series.map((s) => {
    if (!s.steady) return null;
    const n = Math.min(4 * columnsGuess, 4000);
    const x = new Float64Array(n);
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) { x[i] = t0 + ((t1 - t0) * i) / (n - 1); y[i] = s.steady(x[i]); }
    return { x, y };
  }), [series, t0, t1, columnsGuess]);
  const rangeOf = (list: TimeSeries[]) => {
    let lo = Infinity, hi = -Infinity;
    series.forEach((s, k) => {
      if (!list.includes(s)) return;
      for (const e of [envs[k], steadies[k]]) if (e) for (let i = 0; i < e.y.length; i++) { const v = e.y[i]; if (Number.isFinite(v)) { lo = Math.min(lo, v); hi = Math.max(hi, v); } }
    });
    if (!Number.isFinite(lo)) { lo = -1; hi = 1; }
    if (hi - lo < 1e-12 * Math.max(1e-30, Math.abs(hi))) { const d = Math.abs(hi) * 0.1 || 1; lo -= d; hi += d; }
    return [lo, hi] as [number, number];
  };
  const yV = scaleLinear().domain(rangeOf(volts)).nice().range([H - M.b, M.t]);
  const yA = scaleLinear().domain(rangeOf(amps)).nice().range([H - M.b, M.t]);
  const ticks = (s: typeof yV) => s.ticks(Math.max(2, Math.min(6, Math.floor((H - M.t - M.b) / 28))));
  const vt = volts.length ? ticks(yV) : [];
  const at = amps.length ? ticks(yA) : [];
  const vLabels = vt.map((v) => engLabel(v, 'V'));
  const aLabels = at.map((v) => engLabel(v, 'A'));
  const left = Math.ceil(Math.max(24, ...vLabels.map((s) => textWidth(s))) + 10);
  const right = Math.ceil(Math.max(24, ...aLabels.map((s) => textWidth(s))) + 10);
  const x = scaleLinear().domain([t0, t1]).range([left, W - right]);
  let xt = x.ticks(8);
  while (xt.length > 2 && xt.reduce((w, v) => w + textWidth(engLabel(v, 's')) + 14, 0) > W - left - right) xt = xt.filter((_, i) => i % 2 === 0);
  const pathOf = (e: { x: Float64Array; y: Float64Array }, y: typeof yV) => {
    let d = '';
    let pen = false;
    for (let i = 0; i < e.x.length; i++) {
      const v = e.y[i];
      if (!Number.isFinite(v)) { pen = false; continue; }
      d += `${pen ? 'L' : 'M'}${x(e.x[i]).toFixed(1)},${y(v).toFixed(1)}`;
      pen = true;
    }
    return d;
  };
  const timeAt = (e: React.PointerEvent) => {
    const r = (e.currentTarget as SVGSVGElement).getBoundingClientRect();
    const px = ((e.clientX - r.left) * W) / r.width;
    return { px, time: x.invert(Math.max(left, Math.min(W - right, px))) };
  };
  const snap = (time: number) => {
    const i = nearestIndex(t, time);
    return i >= 0 ? t[i] : null;
  };
  const zoom = (factor: number, about: number) => {
    const a = about - (about - t0) * factor;
    const b = about + (t1 - about) * factor;
    const lo = Math.max(0, a);
    const hi = Math.min(stopS, b);
    if (hi - lo >= stopS * (1 - 1e-9)) return onSpan(null);
    // no closer than ten samples across
    const dt = t.length > 1 ? t[1] - t[0] : stopS;
    if (hi - lo < 10 * dt) return;
    onSpan([lo, hi]);
  };
  const pan = (frac: number) => {
    const w = t1 - t0;
    let a = t0 + frac * w;
    a = Math.max(0, Math.min(stopS - w, a));
    if (w >= stopS * (1 - 1e-9)) return;
    onSpan([a, a + w]);
  };
  const onKey = (e: React.KeyboardEvent) => {
    const n = t.length;
    if (!n) return;
    const i = cursorS === null ? -1 : nearestIndex(t, cursorS);
    const stepBy = (k: number) => onCursor(t[Math.max(0, Math.min(n - 1, (i < 0 ? nearestIndex(t, t0) : i) + k))]);
    const fiftieth = Math.max(1, Math.round(((t1 - t0) / 50) / (n > 1 ? t[1] - t[0] : 1)));
    let done = true;
    switch (e.key) {
      case 'ArrowRight': stepBy(e.shiftKey ? fiftieth : 1); break;
      case 'ArrowLeft': stepBy(e.shiftKey ? -fiftieth : -1); break;
      case 'Home': onCursor(t[0]); break;
      case 'End': onCursor(t[n - 1]); break;
      case '[': if (cursorS !== null) onWindow([cursorS, Math.max(cursorS, window?.[1] ?? stopS)]); break;
      case ']': if (cursorS !== null) onWindow([Math.min(cursorS, window?.[0] ?? 0), cursorS]); break;
      case '+': case '=': zoom(0.5, cursorS ?? (t0 + t1) / 2); break;
      case '-': zoom(2, cursorS ?? (t0 + t1) / 2); break;
      default: done = false;
    }
    if (done) { e.preventDefault(); e.stopPropagation(); }
    else if (e.key !== 'Escape' && e.key !== 'Tab') e.stopPropagation();
  };
  // the wheel zooms (Shift: pans) the plot and not the page: a listener that may prevent the scroll
  const svgRef = useRef<SVGSVGElement>(null);
  const wheel = useRef<(e: WheelEvent) => void>(() => {});
  wheel.current = (e: WheelEvent) => {
    e.preventDefault();
    const r = svgRef.current!.getBoundingClientRect();
    const time = x.invert(Math.max(left, Math.min(W - right, ((e.clientX - r.left) * W) / r.width)));
    if (e.shiftKey || Math.abs(e.deltaX) > Math.abs(e.deltaY)) pan(Math.sign(e.deltaX || e.deltaY) * 0.1);
    else zoom(e.deltaY < 0 ? 0.8 : 1.25, time);
  };
  useEffect(() => {
    const el = svgRef.current;
    if (!el) return;
    const f = (e: WheelEvent) => wheel.current(e);
    el.addEventListener('wheel', f, { passive: false });
    return () => el.removeEventListener('wheel', f);
  }, []);
  const shaded = dragging ?? window;
  const cx = cursorS !== null && cursorS >= t0 && cursorS <= t1 ? x(cursorS) : null;
  return (
    <div className="plot time-plot" data-testid="time-plot" ref={pane}>
      <svg
        ref={svgRef}
        width={W} height={H} viewBox={`0 0 ${W} ${H}`} role="img" tabIndex={0}
        aria-label={`Time response: ${series.map((x) => x.label).join(', ')}`}
        aria-description="Volts on the left scale, amperes on the right. Arrow keys move the cursor, + and − zoom; drag, or [ and ] at the cursor, to choose the measuring window"
        data-span={`${t0} ${t1}`}
        onKeyDown={onKey}
        onPointerDown={(e) => {
          if (e.button !== 0) return;
          e.currentTarget.setPointerCapture?.(e.pointerId);
          drag.current = { x: timeAt(e).px, t: timeAt(e).time };
        }}
        onPointerMove={(e) => {
          const { px, time } = timeAt(e);
          if (drag.current && Math.abs(px - drag.current.x) > 3) setDragging([Math.min(drag.current.t, time), Math.max(drag.current.t, time)]);
          if (px < left || px > W - right) return;
          onCursor(snap(time));
        }}
        onPointerUp={() => {
          if (dragging) onWindow(dragging);
          drag.current = null;
          setDragging(null);
        }}
      >
        <g className="grid">
          {xt.map((v) => <line key={`x${v}`} x1={x(v)} x2={x(v)} y1={M.t} y2={H - M.b} />)}
          {(vt.length ? vt : []).map((v) => <line key={`v${v}`} x1={left} x2={W - right} y1={yV(v)} y2={yV(v)} />)}
        </g>
        {shaded && <rect className="time-window" data-testid="time-window" x={x(Math.max(t0, shaded[0]))} width={Math.max(1, x(Math.min(t1, shaded[1])) - x(Math.max(t0, shaded[0])))} y={M.t} height={H - M.t - M.b} fill="#2563a8" opacity={0.08} />}
        <g className="axis">
          <line x1={left} x2={W - right} y1={H - M.b} y2={H - M.b} />
          {volts.length > 0 && <line x1={left} x2={left} y1={M.t} y2={H - M.b} />}
          {amps.length > 0 && <line x1={W - right} x2={W - right} y1={M.t} y2={H - M.b} />}
          {xt.map((v) => <text key={`xl${v}`} x={x(v)} y={H - M.b + 13} textAnchor="middle">{engLabel(v, 's')}</text>)}
          {vt.map((v, i) => <text key={`vl${v}`} x={left - 4} y={yV(v) + 3} textAnchor="end">{vLabels[i]}</text>)}
          {at.map((v, i) => <text key={`al${v}`} x={W - right + 4} y={yA(v) + 3} textAnchor="start">{aLabels[i]}</text>)}
        </g>
        {series.map((s, k) => {
          const st = steadies[k];
          return st ? <path key={`ss-${s.key}`} data-testid="time-steady" d={pathOf(st, s.unit === 'V' ? yV : yA)} fill="none" stroke={s.color} strokeWidth={1.2} strokeDasharray="4 3" opacity={0.35} /> : null;
        })}
        {series.map((s, k) => <path key={s.key} data-testid="time-trace" data-label={s.label} d={pathOf(envs[k], s.unit === 'V' ? yV : yA)} fill="none" stroke={s.color} strokeWidth={1.5} />)}
        {cx !== null && <line data-testid="time-cursor" x1={cx} x2={cx} y1={M.t} y2={H - M.b} stroke="#555" strokeDasharray="3 3" />}
        <text x={4} y={M.t + FONT_PX} className="axis-unit">{volts.length ? 'V' : ''}</text>
        <text x={W - 4} y={M.t + FONT_PX} textAnchor="end" className="axis-unit">{amps.length ? 'A' : ''}</text>
      </svg>
    </div>
  );
}
