export { analyze, ComplexSparseLU, type LuSymbolic } from './dense-lu-temp';
