/**
 * Instantaneous voltages and currents against time on one SVG, sized to its
 * pane: volts on the left scale (solid), amperes on the right (dashed), each
 * scale ±its own maximum, margins laid out from the tick labels. Shared by the
 * phasor view's waveforms and the harmonic view's rebuilt period.
 */
import { scaleLinear } from 'd3-scale';
import { line } from 'd3-shape';
import { formatSI } from '../../model/quantity';
import { textWidth, usePaneWidth } from './Plot';

export interface TimeTrace { key: string; label: string; unit: 'V' | 'A'; colour: string; t: ArrayLike<number>; y: ArrayLike<number> }

export function VoltsAmpsPlot({ traces, spanS, vMax, iMax, label, testId, children }: {
  traces: TimeTrace[]; spanS: number; vMax: number; iMax: number; label: string; testId: string; children?: React.ReactNode;
}) {
  const [pane, W] = usePaneWidth();
  const H = 180;
  const m = { l: 60, r: 60, t: 10, b: 26 };
  const yV = scaleLinear().domain([-(vMax || 1), vMax || 1]).range([H - m.b, m.t]);
  const yI = scaleLinear().domain([-(iMax || 1), iMax || 1]).range([H - m.b, m.t]);
  const vt = yV.ticks(4).map((t) => ({ t, s: formatSI(t, 'V', 3) }));
  const it = yI.ticks(4).map((t) => ({ t, s: formatSI(t, 'A', 3) }));
  // margins from the labels drawn in them
  m.l = Math.ceil(Math.max(...vt.map((v) => textWidth(v.s))) + 8);
  m.r = Math.ceil(Math.max(...it.map((v) => textWidth(v.s))) + 8);
  const x = scaleLinear().domain([0, spanS]).range([m.l, W - m.r]);
  return (
    <div className="plot" data-testid={testId} ref={pane}>
      {children}
      <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} role="img" aria-label={label}>
        <line x1={m.l} x2={W - m.r} y1={yV(0)} y2={yV(0)} stroke="#ccc" />
        <g className="axis">
          {vt.map(({ t, s }) => <text key={`v${t}`} x={m.l - 4} y={yV(t) + 3} textAnchor="end" fontSize={10}>{s}</text>)}
          {it.map(({ t, s }) => <text key={`i${t}`} x={W - m.r + 4} y={yI(t) + 3} fontSize={10}>{s}</text>)}
          {x.ticks(4).map((t) => <text key={`t${t}`} x={x(t)} y={H - 8} textAnchor={t === 0 ? 'start' : x(t) > W - m.r - 20 ? 'end' : 'middle'} fontSize={10}>{formatSI(t, 's', 3)}</text>)}
        </g>
        {traces.map((tr) => {
          const y = tr.unit === 'V' ? yV : yI;
          const d = line<number>().x((j) => x(tr.t[j])).y((j) => y(tr.y[j]))(Array.from({ length: tr.t.length }, (_, j) => j)) ?? '';
          return <path key={tr.key} d={d} fill="none" stroke={tr.colour} strokeWidth={1.5} strokeDasharray={tr.unit === 'A' ? '5 3' : undefined} data-label={tr.label} />;
        })}
      </svg>
    </div>
  );
}
