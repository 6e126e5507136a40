/**
 * √(L1·L2), the largest mutual inductance of two windings (M = k·mutualLimit(L1, L2)), safe for absurd
 * inductances: where the product L1·L2 would overflow or underflow double precision (beyond about 1e±290)
 * it is √L1·√L2; elsewhere √(L1·L2) itself, which is correctly rounded and keeps every answer as it was.
 */
export function mutualLimit(l1: number, l2: number): number {
  const product = l1 * l2;
  return product > 1e-290 && product < 1e290 ? Math.sqrt(product) : Math.sqrt(l1) * Math.sqrt(l2);
}
