// Timing helpers shared by scripts/bench.mjs and its child processes.
import v8 from 'node:v8';
import vm from 'node:vm';

v8.setFlagsFromString('--expose-gc');
export const gc = globalThis.gc ?? vm.runInNewContext('gc');

export const now = () => performance.now();

export function median(xs) {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/**
 * Median of up to `runs` timed calls after `warm` untimed ones, with a
 * garbage collection before each. Stops early once the timed calls have used
 * `budgetMs`, and takes a single run when the warm-up alone was slow, so a slow
 * build cannot stretch the benchmark past its budget.
 */
export function timeMedian(fn, runs, { warm = 1, budgetMs = 15000 } = {}) {
  const times = [];
  for (let i = 0; i < warm; i++) {
    const t = now();
    fn();
    if (now() - t > budgetMs / 3) runs = 1;
  }
  for (let i = 0; i < runs; i++) {
    if (i > 0 && times.reduce((a, b) => a + b, 0) > budgetMs) break;
    gc();
    const t = now();
    fn();
    times.push(now() - t);
  }
  return median(times);
}

/** Repetitions for a model of n nodes. */
export const runsFor = (n) => (n <= 100 ? 21 : n <= 1000 ? 11 : n <= 10000 ? 7 : 5);

/** 50 log-spaced frequencies from 10 Hz to 100 kHz, the sweep the command line is timed on. */
export const SWEEP_POINTS = 50;
export const logGrid = () => Array.from({ length: SWEEP_POINTS }, (_, i) => 10 * Math.pow(1e5 / 10, i / (SWEEP_POINTS - 1)));
