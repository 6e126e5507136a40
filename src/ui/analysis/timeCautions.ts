/**
 * Hazard readouts of a time response (field notes, "Cautions"): the peak
 * voltage a coupled winding and its switch reach while a switch in the
 * winding's circuit is open (an opened current-transformer burden, common
 * practice: never open a CT secondary under load), and the largest peak of a
 * winding's energising current against its steady-state peak (inrush).
 */
import type { GraphModel, SolveResult } from '../../model/graph';
import { ELV_AC_RMS, galvanicSections } from '../../model/cautions';
import { formatSI } from '../../model/quantity';
import type { TransientAnswer } from '../../worker/protocol';

/** `hazard`: shown as a caution; else a plain readout (an energising peak within 1.5 times the steady state's) */
export interface TimeCaution { kind: 'open-burden' | 'inrush'; hazard: boolean; head: string; text: string; element: string; peak: number; atS: number }

/** Each switch's state at sample times: closed at t when `closed` flipped by the toggles at or before t. */
export function closedAt(closed: boolean, togglesS: readonly number[], t: number): boolean {
  let flips = 0;
  for (const x of togglesS) if (x <= t) flips++;
  return flips % 2 === 0 ? closed : !closed;
}

const peakOver = (t: Float64Array, y: Float64Array, keep: (t: number) => boolean) => {
  let peak = 0, at = 0;
  for (let i = 0; i < y.length; i++) if (keep(t[i]) && Math.abs(y[i]) > Math.abs(peak)) { peak = y[i]; at = t[i]; }
  return { peak, at };
};

const CODES = 'Building or testing it must follow local electrical codes and licensed practice.';

export function timeCautions(model: GraphModel, a: TransientAnswer, steady: SolveResult | null): TimeCaution[] {
  const out: TimeCaution[] = [];
  const coupled = new Set((model.couplings ?? []).flatMap((c) => c.windings));
  const section = galvanicSections(model);
  const series = (id: string) => a.elements.find((e) => e.id === id);
  // the ELV limit as a peak: 50 V RMS AC (√2·50 V peak) or 120 V ripple-free DC (IEC 61140, from memory)
  const limit = model.frequencyHz > 0 ? ELV_AC_RMS * Math.SQRT2 : 120;
  // windings whose circuit is opened: their current after the opening is the ring of that caution, not an inrush
  const opened = new Set<string>();
  for (const sw of model.elements) {
    if (sw.kind !== 'switch') continue;
    const toggles = sw.togglesS ?? [];
    const open = (t: number) => !closedAt(sw.closed, toggles, t);
    if (!a.timesS.some((t) => open(t))) continue;
    // one caution per switch, naming the winding in its circuit that rises highest while it is open (a winding
    // sharing the ground with it on the other side of the core is in the same section, but sees little)
    const sv = series(sw.id);
    if (!sv) continue;
    let worst: { id: string; winding: { peak: number; at: number }; closedPeak: { peak: number; at: number } } | null = null;
    for (const w of model.elements) {
      if (w.kind !== 'inductor' || !coupled.has(w.id) || section(w.nodes[0]) !== section(sw.nodes[0])) continue;
      const wv = series(w.id);
      if (!wv) continue;
      const winding = peakOver(a.timesS, wv.voltage[0], open);
      if (!worst || Math.abs(winding.peak) > Math.abs(worst.winding.peak)) worst = { id: w.id, winding, closedPeak: peakOver(a.timesS, wv.voltage[0], (t) => !open(t)) };
    }
    if (!worst) continue;
    const { id, winding, closedPeak } = worst;
    opened.add(id);
    const across = peakOver(a.timesS, sv.voltage[0], open);
    if (Math.abs(across.peak) <= limit && Math.abs(winding.peak) <= limit) continue;
    const ratio = Math.abs(closedPeak.peak) > 0 ? ` (${(Math.abs(winding.peak) / Math.abs(closedPeak.peak)).toPrecision(3)}× its peak while ${sw.id} is closed)` : '';
    out.push({
      kind: 'open-burden', hazard: true, element: sw.id, peak: across.peak, atS: across.at,
      head: 'Open winding circuit',
      text: `While ${sw.id} is open, ${sw.id} sees a peak of ${formatSI(Math.abs(across.peak), 'V', 4)} at ${formatSI(across.at, 's', 4)} and winding ${id} ${formatSI(Math.abs(winding.peak), 'V', 4)} at ${formatSI(winding.at, 's', 4)}${ratio}, above extra-low voltage. An opened current-transformer secondary develops dangerous voltage: keep the burden connected or the winding shorted. This model is linear: a real core saturates and the spike is sharper. ${CODES}`,
    });
  }
  if (steady) {
    const k = steady.amplitudes === 'rms' ? Math.SQRT2 : 1;
    for (const w of model.elements) {
      if (w.kind !== 'inductor' || !coupled.has(w.id) || opened.has(w.id)) continue;
      const r = steady.elements[w.id];
      const s = series(w.id);
      if (!r || !('current' in r) || !s) continue;
      const ssPeak = k * Math.hypot(r.current.re, r.current.im);
      const largest = peakOver(a.timesS, s.current[0], () => true);
      if (!(ssPeak > 0) || !(Math.abs(largest.peak) > 0)) continue;
      // a notable inrush: half as large again as the steady-state peak (a winding switched in at the voltage zero reaches twice it)
      const ratio = Math.abs(largest.peak) / ssPeak;
      const reading = `Winding ${w.id} peaks at ${formatSI(Math.abs(largest.peak), 'A', 4)} at ${formatSI(largest.at, 's', 4)}, ${ratio.toPrecision(3)}× its steady-state peak of ${formatSI(ssPeak, 'A', 4)}.`;
      out.push(ratio >= 1.5
        ? { kind: 'inrush', hazard: true, element: w.id, peak: largest.peak, atS: largest.at, head: 'Energising current', text: `${reading} This model is linear: a real core saturates and its inrush can be many times larger. Protection must ride through it: rate fuses and breakers following local codes and licensed practice.` }
        : { kind: 'inrush', hazard: false, element: w.id, peak: largest.peak, atS: largest.at, head: 'Energising current', text: reading });
    }
  }
  return out;
}
