/** Why a k or an M is refused (field notes: M² ≤ L1·L2, i.e. 0 ≤ k ≤ 1, or the pair would deliver energy it never stored). */
import { formatSI } from '../../model/quantity';
import { mutualLimit } from '../../model/mutual';

export function kRangeProblem(k: number): string | null {
  if (k >= 0 && k <= 1) return null;
  return `k must lie between 0 and 1: with k > 1 the pair could deliver energy it never stored (½L1·i1² + ½L2·i2² ± M·i1·i2 would go below zero)`;
}

export function mRangeProblem(m: number, l1: number, l2: number): string | null {
  const max = mutualLimit(l1, l2);
  if (m >= 0 && m <= max * (1 + 1e-12)) return null;
  if (m < 0) return 'M must be zero or more; the sign of the coupling comes from the dots';
  return `M must lie between 0 and √(L1·L2) = ${formatSI(max, 'H', 4)}: a larger M means k > 1, and the pair could deliver energy it never stored`;
}
