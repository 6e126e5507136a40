/**
 * Exact references for small systems: every double is converted to its exact decimal value (a double is
 * m * 2^e, which has a finite decimal expansion) and the system is solved by mathjs `lusolve` in BigNumber
 * arithmetic at 100 significant digits (mathjs, a general-purpose library; decimal.js underneath). The
 * result is the solution of the floating-point matrix as given, to far beyond double precision.
 */
import { bignumberDependencies, create, lusolveDependencies, type BigNumber } from 'mathjs';

const big = create({ bignumberDependencies, lusolveDependencies }, { precision: 100 });

/** The exact decimal value of a finite double, e.g. 0.1 -> "0.1000000000000000055511151231257827...". */
export function exactDecimal(x: number): string {
  if (!Number.isFinite(x)) throw new RangeError(`${x} has no decimal value`);
  if (x === 0) return '0';
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const bits = view.getBigUint64(0);
  const sign = bits >> 63n ? '-' : '';
  const biased = Number((bits >> 52n) & 0x7ffn);
  let m = bits & ((1n << 52n) - 1n);
  let e: number;
  if (biased === 0) e = -1074;
  else {
    m |= 1n << 52n;
    e = biased - 1075;
  }
  if (e >= 0) return sign + (m << BigInt(e)).toString();
  const k = -e; // m / 2^k = m 5^k / 10^k
  const digits = (m * 5n ** BigInt(k)).toString().padStart(k + 1, '0');
  return `${sign}${digits.slice(0, -k)}.${digits.slice(-k)}`;
}

/** Exact solution of the real system A x = b (A dense, rows), rounded to doubles at the end. */
export function exactSolveReal(A: number[][], b: number[]): number[] {
  const M = A.map((row) => row.map((v) => big.bignumber(exactDecimal(v))));
  const rhs = b.map((v) => [big.bignumber(exactDecimal(v))]);
  const x = big.lusolve(M, rhs) as unknown as BigNumber[][];
  return x.map((r) => Number(r[0].toString())); // an entry can come back as a plain 0
}

/** Exact solution of the complex system (A = Are + i Aim), through the real form [[Re, -Im], [Im, Re]]. */
export function exactSolveComplex(Are: number[][], Aim: number[][], bRe: number[], bIm: number[]): { re: number[]; im: number[] } {
  const n = Are.length;
  const A: number[][] = [];
  for (let i = 0; i < n; i++) A.push([...Are[i], ...Aim[i].map((v) => -v)]);
  for (let i = 0; i < n; i++) A.push([...Aim[i], ...Are[i]]);
  const x = exactSolveReal(A, [...bRe, ...bIm]);
  return { re: x.slice(0, n), im: x.slice(n) };
}
