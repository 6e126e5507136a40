/** Phasor diagram of chosen voltages and currents to scale (separate scales for V and A), and their waveforms over two periods. */
import { useMemo, useState } from 'react';
import { scaleLinear } from 'd3-scale';
import { line } from 'd3-shape';
import type { ComplexJson, SolveResult } from '../../model/graph';
import { formatAngle, formatSI } from '../../model/quantity';
import { cabs, cdeg } from './format';
import { niceCeil, waveform } from './plotMath';
import { TRACE_COLOURS } from './sweepPlots';
import { useSolved } from './useSolved';

interface Pick { key: string; label: string; unit: 'V' | 'A'; z: ComplexJson }

function candidates(result: SolveResult): Pick[] {
  const out: Pick[] = [];
  for (const [id, r] of Object.entries(result.elements)) {
    if ('voltage' in r) {
      out.push({ key: `v:${id}`, label: `V(${id})`, unit: 'V', z: r.voltage }, { key: `i:${id}`, label: `I(${id})`, unit: 'A', z: r.current });
    } else {
      ['primary', 'secondary'].forEach((side, s) => out.push(
        { key: `v:${id}:${s}`, label: `V(${id} ${side})`, unit: 'V', z: r.voltages[s] },
        { key: `i:${id}:${s}`, label: `I(${id} ${side})`, unit: 'A', z: r.currents[s] },
      ));
    }
  }
  for (const [n, v] of Object.entries(result.nodes)) out.push({ key: `n:${n}`, label: `V(${n})`, unit: 'V', z: v });
  return out;
}

const R = 130;

export function PhasorPanel() {
  const solved = useSolved();
  const all = useMemo(() => (solved ? candidates(solved.result) : []), [solved]);
  const windings = solved?.model.elements.filter((e) => e.kind === 'inductor' && (solved.model.couplings ?? []).some((c) => c.windings.includes(e.id))).map((e) => e.id) ?? [];
  const firstSource = solved?.model.elements.find((e) => e.kind === 'voltage-source' || e.kind === 'current-source')?.id;
  const defaults = windings.length ? windings.slice(0, 2).flatMap((w) => [`v:${w}`, `i:${w}`]) : firstSource ? [`v:${firstSource}`, `i:${firstSource}`] : [];
  const [chosen, setChosen] = useState<string[] | null>(null);
  const keys = chosen ?? defaults;
  if (!solved) return <p className="muted">Waiting for a solved circuit…</p>;
  const picks = keys.map((k) => all.find((p) => p.key === k)).filter((p): p is Pick => !!p);
  const vMax = niceCeil(Math.max(0, ...picks.filter((p) => p.unit === 'V').map((p) => cabs(p.z))));
  const iMax = niceCeil(Math.max(0, ...picks.filter((p) => p.unit === 'A').map((p) => cabs(p.z))));
  const amp = solved.result.amplitudes;
  const f = solved.result.frequencyHz;
  const toggle = (k: string) => setChosen(keys.includes(k) ? keys.filter((x) => x !== k) : [...keys, k]);
  return (
    <div className="phasors" data-testid="phasor-panel">
      <div className="row-controls">
        <label>Add <select aria-label="Quantity to draw" value="" onChange={(e) => e.target.value && toggle(e.target.value)}>
          <option value="">choose…</option>
          {all.filter((p) => !keys.includes(p.key)).map((p) => <option key={p.key} value={p.key}>{p.label}</option>)}
        </select></label>
        <span className="muted">{amp === 'rms' ? 'RMS' : 'peak'} phasors at {formatSI(f, 'Hz', 4)}; angles from the positive real axis, counter-clockwise</span>
      </div>
      <div className="phasor-wrap">
        <svg width={2 * R + 60} height={2 * R + 40} viewBox={`${-R - 30} ${-R - 20} ${2 * R + 60} ${2 * R + 40}`} role="img" aria-label="Phasor diagram" data-testid="phasor-diagram">
          <circle r={R} fill="none" stroke="#ddd" />
          <circle r={R / 2} fill="none" stroke="#eee" />
          <line x1={-R - 10} x2={R + 10} y1={0} y2={0} stroke="#ccc" />
          <line y1={-R - 10} y2={R + 10} x1={0} x2={0} stroke="#ccc" />
          <text x={R + 4} y={-4} fontSize={10} fill="#888">Re</text>
          <text x={4} y={-R - 6} fontSize={10} fill="#888">Im</text>
          <defs>
            {picks.map((p, i) => (
              <marker key={p.key} id={`ph-head-${i}`} viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" markerHeight="7" orient="auto-start-reverse">
                <path d="M0,0 L10,5 L0,10 z" fill={TRACE_COLOURS[i % TRACE_COLOURS.length]} />
              </marker>
            ))}
          </defs>
          {picks.map((p, i) => {
            const s = (p.unit === 'V' ? vMax : iMax) || 1;
            const x = (p.z.re / s) * R;
            const y = (-p.z.im / s) * R;
            const c = TRACE_COLOURS[i % TRACE_COLOURS.length];
            const ang = cdeg(p.z);
            // the angle, marked by an arc from the real axis (counter-clockwise positive)
            const ar = 16 + 7 * i;
            const a = (ang * Math.PI) / 180;
            const arc = Math.abs(ang) < 0.5 ? '' : `M${ar},0 A${ar},${ar} 0 0 ${ang > 0 ? 0 : 1} ${ar * Math.cos(a)},${-ar * Math.sin(a)}`;
            return (
              <g key={p.key} data-label={p.label} data-angle={ang}>
                {arc && <path d={arc} fill="none" stroke={c} strokeWidth={1} opacity={0.7} />}
                <line x1={0} y1={0} x2={x} y2={y} stroke={c} strokeWidth={2} strokeDasharray={p.unit === 'A' ? '5 3' : undefined} markerEnd={`url(#ph-head-${i})`} />
                <text x={x * 1.06} y={y * 1.06} fontSize={10} fill={c} textAnchor={x < 0 ? 'end' : 'start'}>{p.label} ∠{formatAngle(ang)}</text>
              </g>
            );
          })}
        </svg>
        <div>
          <p><strong>Scales</strong> (outer ring): voltages {formatSI(vMax, 'V', 3)} (solid), currents {formatSI(iMax, 'A', 3)} (dashed)</p>
          <ul className="trace-list" aria-label="Legend" data-testid="phasor-legend">
            {picks.map((p, i) => (
              <li key={p.key}>
                <span className="swatch" style={{ background: TRACE_COLOURS[i % TRACE_COLOURS.length] }} />
                {p.label} = {formatSI(cabs(p.z), p.unit, 4)} ∠{formatAngle(cdeg(p.z))}
                <button type="button" className="cmd" aria-label={`Remove ${p.label}`} title="Remove from the diagram" onClick={() => toggle(p.key)}>×</button>
              </li>
            ))}
          </ul>
        </div>
      </div>
      <Waves picks={picks} f={f} amplitudes={amp} vMax={vMax} iMax={iMax} />
    </div>
  );
}

function Waves({ picks, f, amplitudes, vMax, iMax }: { picks: Pick[]; f: number; amplitudes: 'rms' | 'peak'; vMax: number; iMax: number }) {
  const W = 760, H = 180, m = { l: 60, r: 60, t: 10, b: 26 };
  const k = amplitudes === 'rms' ? Math.SQRT2 : 1;
  const T = f > 0 ? 2 / f : 1;
  const x = scaleLinear().domain([0, T]).range([m.l, W - m.r]);
  const yV = scaleLinear().domain([-(vMax || 1) * k, (vMax || 1) * k]).range([H - m.b, m.t]);
  const yI = scaleLinear().domain([-(iMax || 1) * k, (iMax || 1) * k]).range([H - m.b, m.t]);
  return (
    <div className="plot" data-testid="waveforms">
      <p className="muted">Instantaneous values over two periods: x(t) = {amplitudes === 'rms' ? '√2·|X|' : '|X|'}·cos(ωt + φ) ({amplitudes === 'rms' ? 'RMS' : 'peak'} phasors). Voltages on the left scale, currents on the right.</p>
      <svg width={W} height={H} role="img" aria-label="Waveforms over two periods">
        <line x1={m.l} x2={W - m.r} y1={yV(0)} y2={yV(0)} stroke="#ccc" />
        <g className="axis">
          {yV.ticks(4).map((t) => <text key={`v${t}`} x={m.l - 4} y={yV(t) + 3} textAnchor="end" fontSize={10}>{formatSI(t, 'V', 3)}</text>)}
          {yI.ticks(4).map((t) => <text key={`i${t}`} x={W - m.r + 4} y={yI(t) + 3} fontSize={10}>{formatSI(t, 'A', 3)}</text>)}
          {x.ticks(4).map((t) => <text key={`t${t}`} x={x(t)} y={H - 8} textAnchor="middle" fontSize={10}>{formatSI(t, 's', 3)}</text>)}
        </g>
        {picks.map((p, i) => {
          const w = waveform(p.z.re, p.z.im, f, amplitudes, 240);
          const y = p.unit === 'V' ? yV : yI;
          const d = line<number>().x((j) => x(w.t[j])).y((j) => y(w.y[j]))(Array.from({ length: w.t.length }, (_, j) => j)) ?? '';
          return <path key={p.key} d={d} fill="none" stroke={TRACE_COLOURS[i % TRACE_COLOURS.length]} strokeWidth={1.5} strokeDasharray={p.unit === 'A' ? '5 3' : undefined} />;
        })}
      </svg>
    </div>
  );
}
