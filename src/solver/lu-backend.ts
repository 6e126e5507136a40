export { analyze, ComplexSparseLU, type LuSymbolic } from './sparse/lu';
