import { describe, expect, it } from 'vitest';
import { SolveTask } from '../../src/worker/solveTask';
import type { GraphModel } from '../../src/model/graph';

const model = (ohms: number, frequencyHz = 50): GraphModel => ({
  schema: 'coilwright.graph/1', frequencyHz, amplitudes: 'rms', ground: 'gnd',
  elements: [
    { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 0 },
    { id: 'R1', kind: 'resistor', nodes: ['a', 'b'], ohms },
    { id: 'L1', kind: 'inductor', nodes: ['b', 'gnd'], henries: 0.1 },
  ],
});

describe('the solve worker keeps its symbolic analysis across edits', () => {
  it('a value edit reuses the pattern and answers the edited circuit', () => {
    const task = new SolveTask();
    const first = task.run({ seq: 1, model: model(10) });
    expect(first.ok).toBe(true);
    const before = task.session!;
    const second = task.run({ seq: 2, model: model(20) });
    expect(second.ok).toBe(true);
    const after = task.session!;
    expect(after).not.toBe(before);
    expect(after.reuses(before)).toBe(true);
    // series RL: I = V / (R + jωL) (closed form)
    const w = 2 * Math.PI * 50;
    const d = 20 * 20 + (w * 0.1) ** 2;
    const i = second.ok ? (second.result.elements.R1 as { current: { re: number; im: number } }).current : null;
    expect(i!.re).toBeCloseTo((10 * 20) / d, 12);
    expect(i!.im).toBeCloseTo((-10 * w * 0.1) / d, 12);
  });

  it('a frequency change keeps the session itself; a refusal drops it', () => {
    const task = new SolveTask();
    task.run({ seq: 1, model: model(10) });
    const s = task.session;
    task.run({ seq: 2, model: model(10, 60) });
    expect(task.session).toBe(s);
    const bad = task.run({ seq: 3, model: model(-1) });
    expect(bad.ok).toBe(false);
    expect(task.session).toBeNull();
  });

  it('the session that gave up its buffers still solves on its own', () => {
    const task = new SolveTask();
    task.run({ seq: 1, model: model(10) });
    const old = task.session!;
    task.run({ seq: 2, model: model(30) });
    // the old circuit's answer is unchanged by the new session's factorisation
    const r = old.solveAt(50);
    const w = 2 * Math.PI * 50;
    const d = 100 + (w * 0.1) ** 2;
    expect((r.elements.R1 as { current: { re: number } }).current.re).toBeCloseTo(100 / d, 12);
  });
});
