/**
 * √(L1·L2) computed as √L1·√L2, so that windings of absurd inductances (each within the graph reader's
 * 1e-150 … 1e150) never overflow or underflow the product before the root. M = k·mutualLimit(L1, L2).
 */
export function mutualLimit(l1: number, l2: number): number {
  return Math.sqrt(l1) * Math.sqrt(l2);
}
