/** A coupled pair's equations in three domains (contract time-and-s-domain.md, the three-domain law of a coupled pair). */
import { describe, expect, it } from 'vitest';
import { pairEquations } from '../../src/model/pairEquations';

const base = { names: ['L1', 'L2'] as [string, string], henries: [3e-3, 12e-3] as [number, number], mutual: 4.8e-3, frequencyHz: 1000, initialAmps: [0.5, -0.25] as [number, number] };

describe('pair equations', () => {
  it('take the sign d1·d2 from the dots', () => {
    expect(pairEquations({ ...base, dots: ['first', 'first'] }).sign).toBe(1);
    expect(pairEquations({ ...base, dots: ['first', 'second'] }).sign).toBe(-1);
    expect(pairEquations({ ...base, dots: ['second', 'second'] }).sign).toBe(1);
  });

  it('carry the initial-condition terms −L_i·i_i(0) − d1·d2·M·i_j(0) of the s-domain law', () => {
    // contract: V_i(s) = s·L_i·I_i(s) − L_i·i_i(0) + Σ M·d_i·d_j·(s·I_j(s) − i_j(0))
    const aiding = pairEquations({ ...base, dots: ['first', 'first'] });
    expect(aiding.initialTerms[0]).toBeCloseTo(-3e-3 * 0.5 - 4.8e-3 * -0.25, 15);
    expect(aiding.initialTerms[1]).toBeCloseTo(-12e-3 * -0.25 - 4.8e-3 * 0.5, 15);
    const opposing = pairEquations({ ...base, dots: ['first', 'second'] });
    expect(opposing.initialTerms[0]).toBeCloseTo(-3e-3 * 0.5 + 4.8e-3 * -0.25, 15);
    expect(opposing.s[0].symbols).toBe('V_L1(s) = sL_L1·I_L1(s) − L_L1·i_L1(0) − M·(s·I_L2(s) − i_L2(0))');
  });

  it('write the phasor law with ωL and ωM at the sheet frequency', () => {
    const e = pairEquations({ ...base, dots: ['first', 'first'] });
    // ω·L1 = 2π·1000·3 mH = 18.85 Ω, ω·M = 30.16 Ω (arithmetic)
    expect(e.phasor[0].values).toContain('j18.85 Ω·I_L1 + j30.16 Ω·I_L2');
    expect(e.time[1].values).toBe('v_L2 = 12 mH·di_L2/dt + 4.8 mH·di_L1/dt');
  });
});
