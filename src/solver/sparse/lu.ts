/**
 * The sparse LU of the MNA solver: P A Q = L U with Q a fill-reducing order from AMD on A + A^T and P from
 * threshold partial pivoting that prefers the diagonal, after KLU (T. A. Davis, E. Palamadai Natarajan,
 * "Algorithm 907: KLU", ACM TOMS 37(3), 2010). One symbolic analysis serves both arithmetics:
 *
 *   symbolic.ts      analyze(): the checked pattern and its column order
 *   structure.ts     reach, pivot bookkeeping, supernodes, pruning, storage (shared)
 *   lu-base.ts       factor / refactor column loops, growth, scaling and refinement (shared)
 *   complex-lu.ts    ComplexSparseLU, with complex-kernels.ts and complex-solve.ts
 *   real-lu.ts       RealSparseLU, with real-kernels.ts and real-solve.ts
 *   scaling.ts       row and column equilibration by powers of two
 *   condition.ts     1-norm condition estimate (Hager, Higham)
 *   sort.ts          run-aware merge sort of index lists
 */
export { analyze, type LuSymbolic } from './symbolic';
export type { LuOptions, LuScaling } from './options';
export { ComplexSparseLU } from './complex-lu';
export { RealSparseLU } from './real-lu';
