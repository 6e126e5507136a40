export { analyze, ComplexSparseLU, RealSparseLU, type LuSymbolic, type LuOptions, type LuScaling } from './sparse/lu';
