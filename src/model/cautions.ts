/**
 * Safety cautions from a solve (field notes, "Cautions"): voltages above
 * extra-low voltage (50 V AC RMS, IEC 61140 / IEC 60364, from memory), and a
 * winding coupled to a current-carrying winding that feeds an open or very
 * high-impedance load (an open current-transformer secondary; common practice).
 */
import type { GraphModel, SolveResult } from './graph';
import { mag } from './phasor';

export const ELV_AC_RMS = 50;
/** above this, a winding's load counts as open */
export const OPEN_LOAD_OHMS = 1e5;

export interface Caution { kind: 'elv' | 'open-winding'; text: string }

export function cautionsFor(model: GraphModel, result: SolveResult): Caution[] {
  const out: Caution[] = [];
  // at 0 Hz the values are DC and the limit differs (120 V ripple-free); only AC is checked here
  const toRms = result.amplitudes === 'peak' ? 1 / Math.SQRT2 : 1;
  let worst = 0;
  let where = '';
  const nodeNames = Object.keys(result.nodes);
  for (const n of nodeNames) {
    const v = mag(result.nodes[n]) * toRms;
    if (v > worst) { worst = v; where = `node ${n}`; }
  }
  for (const [id, r] of Object.entries(result.elements)) {
    const vs = 'voltage' in r ? [r.voltage] : r.voltages;
    for (const z of vs) {
      const v = mag(z) * toRms;
      if (v > worst) { worst = v; where = id; }
    }
  }
  const limit = model.frequencyHz === 0 ? 120 : ELV_AC_RMS;
  if (worst > limit) {
    out.push({
      kind: 'elv',
      text: `${where} reaches ${worst.toPrecision(3)} V ${model.frequencyHz === 0 ? 'DC' : 'RMS'}, above extra-low voltage (${limit} V ${model.frequencyHz === 0 ? 'ripple-free DC' : 'AC RMS'}). This model is linear and idealised: insulation, creepage, fusing and protective earth are not checked. Building or testing it must follow local electrical codes and licensed practice.`,
    });
  }
  for (const c of model.couplings ?? []) {
    const currents = c.windings.map((w) => {
      const r = result.elements[w];
      return r && 'current' in r ? { id: w, i: mag(r.current), v: mag(r.voltage) } : null;
    });
    const carrying = currents.filter((x) => x && x.i > 1e-6);
    for (const w of currents) {
      if (!w || w.v === 0) continue;
      const open = w.i === 0 || w.v / w.i > OPEN_LOAD_OHMS;
      if (open && carrying.some((x) => x && x.id !== w.id)) {
        out.push({
          kind: 'open-winding',
          text: `Winding ${w.id} is coupled to a current-carrying winding but feeds an open or very high-impedance load (${(w.v * toRms).toPrecision(3)} V across it). An open current-transformer secondary can develop dangerous voltage: keep a burden connected or the winding shorted, following local codes and licensed practice.`,
        });
      }
    }
  }
  return out;
}
