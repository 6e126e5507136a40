export { parseGraphModel } from './validate';
export { ModelRefusal } from './errors';
export { SolverSession, createSession, solveGraph, type RawSolution } from './phasor/session';
export { sweepGraph, sweepStream, frequencyGrid, frequencyAt, ProbeError, type SweepLayout, type SweepStream } from './phasor/sweep';
export * from './analysis';
export { pairState, connectionOf, mutualOf, type PairState, type Connection } from './coupling-state';
export { compareDotFlip, diffResults, flipDot, type Change, type DotComparison } from './compare';
export { powerSummary, efficiency, type PowerRow, type PowerSummary } from './power';
export { transferFunction, TransferUsageError } from './sdomain/transfer';
