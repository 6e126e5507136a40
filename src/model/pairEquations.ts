/**
 * A coupled pair's law in the three domains (contract time-and-s-domain.md,
 * standard circuit analysis), written out with the present values:
 *
 *   time:    v_1 = L1·di_1/dt ± M·di_2/dt
 *   phasor:  V_1 = jωL1·I_1 ± jωM·I_2
 *   s:       V_1(s) = sL1·I_1(s) − L1·i_1(0) ± M·(s·I_2(s) − i_2(0))
 *
 * The sign is d_1·d_2 with d = +1 for a dot on the winding's first terminal
 * (its nodes[0]) and −1 on the second.
 */
import type { DotEnd } from './graph';
import { formatSI } from './quantity';

export interface PairValues {
  names: [string, string];
  henries: [number, number];
  mutual: number;
  dots: [DotEnd, DotEnd];
  /** the sheet's frequency, Hz */
  frequencyHz: number;
  /** each winding's current at t = 0, A */
  initialAmps: [number, number];
}

export interface PairEquation {
  /** the law in symbols */
  symbols: string;
  /** the same with the present values */
  values: string;
}

export interface PairEquations {
  sign: 1 | -1;
  time: [PairEquation, PairEquation];
  phasor: [PairEquation, PairEquation];
  s: [PairEquation, PairEquation];
  /** the initial-condition term of each s-domain equation, −L_i·i_i(0) ∓ M·i_j(0), in Wb (V·s) */
  initialTerms: [number, number];
}

const q = (v: number, unit: string) => formatSI(v, unit, 4);

export function pairEquations(p: PairValues): PairEquations {
  const d = (e: DotEnd) => (e === 'second' ? -1 : 1);
  const sign = (d(p.dots[0]) * d(p.dots[1])) as 1 | -1;
  const pm = sign > 0 ? '+' : '−';
  const omega = 2 * Math.PI * p.frequencyHz;
  const m = p.mutual;
  const one = (i: 0 | 1) => {
    const j = (1 - i) as 0 | 1;
    const [a, b] = [p.names[i], p.names[j]];
    const li = p.henries[i];
    const term = -li * p.initialAmps[i] - sign * m * p.initialAmps[j];
    return {
      time: {
        symbols: `v_${a} = L_${a}·di_${a}/dt ${pm} M·di_${b}/dt`,
        values: `v_${a} = ${q(li, 'H')}·di_${a}/dt ${pm} ${q(m, 'H')}·di_${b}/dt`,
      },
      phasor: {
        symbols: `V_${a} = jωL_${a}·I_${a} ${pm} jωM·I_${b}`,
        values: `V_${a} = j${q(omega * li, 'Ω')}·I_${a} ${pm} j${q(omega * m, 'Ω')}·I_${b}   (ω = ${q(omega, 'rad/s')})`,
      },
      s: {
        symbols: `V_${a}(s) = sL_${a}·I_${a}(s) − L_${a}·i_${a}(0) ${pm} M·(s·I_${b}(s) − i_${b}(0))`,
        values: `V_${a}(s) = s·${q(li, 'H')}·I_${a}(s) − ${q(li, 'H')}·${q(p.initialAmps[i], 'A')} ${pm} ${q(m, 'H')}·(s·I_${b}(s) − ${q(p.initialAmps[j], 'A')})`
          + `   initial-condition term ${q(term, 'Wb')}`,
      },
      term,
    };
  };
  const [e0, e1] = [one(0), one(1)];
  return {
    sign,
    time: [e0.time, e1.time],
    phasor: [e0.phasor, e1.phasor],
    s: [e0.s, e1.s],
    initialTerms: [e0.term, e1.term],
  };
}
