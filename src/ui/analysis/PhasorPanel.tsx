/** Phasor diagram of chosen voltages and currents to scale (separate scales for V and A), and their waveforms over two periods. */
import { sourceKindOf } from '../../model/elementFacts';
import { useMemo, useState } from 'react';
import type { ComplexJson, SolveResult } from '../../model/graph';
import { formatAngle, formatSI } from '../../model/quantity';
import { cabs, cdeg } from './format';
import { niceCeil, waveform } from './plotMath';
import { TRACE_COLOURS } from './sweepPlots';
import { useSolved } from './useSolved';
import { layoutPhasors } from './phasorLayout';
import { textWidth } from './Plot';
import { VoltsAmpsPlot } from './VoltsAmpsPlot';

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
/** room beside the circle for labels */
const SIDE = 120;
/** shortest arrow drawn: a shaft clearly longer than its head */
const MIN_ARROW = 30;

function PhasorDiagram({ picks, vMax, iMax }: { picks: Pick[]; vMax: number; iMax: number }) {
  const labels = picks.map((p) => `${p.label} ∠${formatAngle(cdeg(p.z))}`);
  const items = picks.map((p, i) => {
    const s = (p.unit === 'V' ? vMax : iMax) || 1;
    return { x: (p.z.re / s) * R, y: (-p.z.im / s) * R, label: labels[i], width: textWidth(labels[i]) };
  });
  const reLabel = { x0: R + 12, y0: -14, x1: R + 30, y1: -2 };
  const imLabel = { x0: 4, y0: -R - 18, x1: 22, y1: -R - 6 };
  const placed = layoutPhasors(items, { minLength: MIN_ARROW, axis: R + 10, bounds: { x0: -R - SIDE + 2, y0: -R - 22, x1: R + SIDE - 2, y1: R + 22 }, reserved: [reLabel, imLabel] });
  return (
    <svg width={2 * R + 2 * SIDE} height={2 * R + 48} viewBox={`${-R - SIDE} ${-R - 24} ${2 * R + 2 * SIDE} ${2 * R + 48}`} role="img" aria-label="Phasor diagram" data-testid="phasor-diagram">
      <circle r={R} fill="none" stroke="#ddd" />
      <circle r={R / 2} fill="none" stroke="#eee" />
      <line x1={-R - 10} x2={R + 10} y1={0} y2={0} stroke="#ccc" data-axis="re" />
      <line y1={-R - 10} y2={R + 10} x1={0} x2={0} stroke="#ccc" data-axis="im" />
      <text x={reLabel.x0} y={reLabel.y1 - 2} fontSize={10} fill="#888">Re</text>
      <text x={imLabel.x0} y={imLabel.y1 - 2} fontSize={10} fill="#888">Im</text>
      <defs>
        {picks.map((p, i) => (
          <marker key={p.key} id={`ph-head-${i}`} viewBox="0 0 10 10" refX="9" refY="5" markerWidth="5" markerHeight="5" orient="auto-start-reverse">
            <path d="M0,0 L10,5 L0,10 z" fill={TRACE_COLOURS[i % TRACE_COLOURS.length]} />
          </marker>
        ))}
      </defs>
      {picks.map((p, i) => {
        const c = TRACE_COLOURS[i % TRACE_COLOURS.length];
        const ang = cdeg(p.z);
        const { tip, trueTip, lengthened, label, at } = placed[i];
        // the angle, marked by an arc from the real axis (counter-clockwise positive)
        const ar = 16 + 7 * i;
        const a = (ang * Math.PI) / 180;
        const arc = Math.abs(ang) < 0.5 || (tip.x === 0 && tip.y === 0) ? '' : `M${ar},0 A${ar},${ar} 0 0 ${ang > 0 ? 0 : 1} ${ar * Math.cos(a)},${-ar * Math.sin(a)}`;
        const dash = p.unit === 'A' ? '5 3' : undefined;
        return (
          <g key={p.key} data-label={p.label} data-angle={ang} data-lengthened={lengthened || undefined}>
            {arc && <path d={arc} fill="none" stroke={c} strokeWidth={1} opacity={0.7} />}
            {lengthened ? <>
              <line x1={0} y1={0} x2={trueTip.x} y2={trueTip.y} stroke={c} strokeWidth={2} />
              <line x1={trueTip.x} y1={trueTip.y} x2={tip.x} y2={tip.y} stroke={c} strokeWidth={1.2} strokeDasharray="1.5 2.5" markerEnd={`url(#ph-head-${i})`} />
            </> : (tip.x !== 0 || tip.y !== 0) && <line x1={0} y1={0} x2={tip.x} y2={tip.y} stroke={c} strokeWidth={2} strokeDasharray={dash} markerEnd={`url(#ph-head-${i})`} />}
            {label && at && <text className="phasor-label" x={at.x} y={at.y} fontSize={10} fill={c} data-box={`${label.x0} ${label.y0} ${label.x1} ${label.y1}`}>{labels[i]}</text>}
          </g>
        );
      })}
    </svg>
  );
}

export function PhasorPanel() {
  const solved = useSolved();
  const all = useMemo(() => (solved ? candidates(solved.result) : []), [solved]);
  const windings = solved?.model.elements.filter((e) => (solved.model.couplings ?? []).some((c) => c.windings.includes(e.id))).map((e) => e.id) ?? [];
  const firstSource = solved?.model.elements.find((e) => sourceKindOf(e))?.id;
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
        <PhasorDiagram picks={picks} vMax={vMax} iMax={iMax} />
        <div>
          <p><strong>Scales</strong> (outer ring): voltages {formatSI(vMax, 'V', 3)} (solid), currents {formatSI(iMax, 'A', 3)} (dashed)</p>
          <ul className="trace-list" aria-label="Legend" data-testid="phasor-legend">
            {picks.map((p, i) => (
              <li key={p.key}>
                <span className="swatch" style={{ background: TRACE_COLOURS[i % TRACE_COLOURS.length] }} />
                {p.label} = {formatSI(cabs(p.z), p.unit, 4)} ∠{formatAngle(cdeg(p.z))}
                {cabs(p.z) > 0 && cabs(p.z) / ((p.unit === 'V' ? vMax : iMax) || 1) * R < MIN_ARROW && <span className="muted"> (short: drawn longer, the added part dotted)</span>}
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
  const k = amplitudes === 'rms' ? Math.SQRT2 : 1;
  const traces = picks.map((p, i) => {
    const w = waveform(p.z.re, p.z.im, f, amplitudes, 240);
    return { key: p.key, label: p.label, unit: p.unit, colour: TRACE_COLOURS[i % TRACE_COLOURS.length], t: w.t, y: w.y };
  });
  return (
    <VoltsAmpsPlot traces={traces} spanS={f > 0 ? 2 / f : 1} vMax={(vMax || 1) * k} iMax={(iMax || 1) * k} label="Waveforms over two periods" testId="waveforms">
      <p className="muted">Instantaneous values over two periods: x(t) = {amplitudes === 'rms' ? '√2·|X|' : '|X|'}·cos(ωt + φ) ({amplitudes === 'rms' ? 'RMS' : 'peak'} phasors). Voltages on the left scale, currents on the right.</p>
    </VoltsAmpsPlot>
  );
}
