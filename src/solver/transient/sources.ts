/**
 * The sources' values over time (contract: time-and-s-domain.md): a source
 * with a `waveform` follows it; one without follows its phasor,
 * A·cos(2π·f·t + φ) with A = √2·magnitude for rms and magnitude for peak, the
 * constant magnitude·cos φ at 0 Hz. And the breakpoints a step must land on:
 * every corner of every waveform and every switch toggle.
 */
import type { GraphModel } from '../../model/graph';
import { defOf, waveformAt, waveformCorners, type Waveform } from '../elements/registry';

export interface Timeline {
  /** per element: its source's value at t (0 for elements that are no source) */
  value(element: number, t: number): number;
  /** breakpoints in (0, stop], ascending, each once */
  corners: Float64Array;
  /** the elements that are independent sources */
  sources: Int32Array;
}

export function sourceTimeline(model: GraphModel, stopS: number, toggles: number[]): Timeline {
  const omega = 2 * Math.PI * model.frequencyHz;
  const peak = model.amplitudes === 'rms' ? Math.SQRT2 : 1;
  const fns: ((t: number) => number)[] = [];
  const sources: number[] = [];
  const corners: number[] = [...toggles];
  model.elements.forEach((el, i) => {
    if (!defOf(el).roles.source) {
      fns.push(() => 0);
      return;
    }
    sources.push(i);
    const src = el as { magnitude: number; phaseDeg: number; waveform?: Waveform };
    if (src.waveform) {
      const w = src.waveform;
      fns.push((t) => waveformAt(w, t));
      corners.push(...waveformCorners(w, stopS));
    } else if (model.frequencyHz === 0) {
      const v = src.magnitude * Math.cos((src.phaseDeg * Math.PI) / 180);
      fns.push(() => v);
    } else {
      const a = peak * src.magnitude;
      const ph = (src.phaseDeg * Math.PI) / 180;
      fns.push((t) => a * Math.cos(omega * t + ph));
    }
  });
  corners.sort((a, b) => a - b);
  const unique: number[] = [];
  const near = 1e-12 * stopS;
  for (const t of corners) {
    if (!(t > 0 && t <= stopS * (1 + 1e-12))) continue;
    if (unique.length && t - unique[unique.length - 1] <= near) continue;
    unique.push(t);
  }
  return { value: (i, t) => fns[i](t), corners: Float64Array.from(unique), sources: Int32Array.from(sources) };
}
