export { parseGraphModel } from './validate';
export { ModelRefusal } from './errors';
export { SolverSession, createSession, solveGraph, type RawSolution } from './session';
export { sweepGraph, frequencyGrid, ProbeError } from './sweep';
export * from './analysis';
