export { SingularMatrixError, type CscPattern, type ComplexValues } from './types';
export { amdOrder, amdAnalyze, type AmdOptions } from './amd';
export { analyze, ComplexSparseLU, RealSparseLU, type LuSymbolic, type LuOptions, type LuScaling } from './lu';
