export { analyze, ComplexSparseLU, RealSparseLU, type LuSymbolic, type LuOptions } from './sparse/lu';
