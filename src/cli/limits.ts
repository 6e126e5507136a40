/**
 * What the command line takes on, so that every input it accepts fits in
 * memory and ends in reasonable time, and everything beyond is refused in one
 * line that says the limit. (The numbers are this tool's choice: a model of a
 * million elements solves in seconds on a laptop; a sweep writes at most
 * about a gigabyte of JSON.)
 */

/** Largest input file: well below the longest string the JavaScript engine holds (2^29 − 24 characters), with room to parse it. */
export const MAX_FILE_BYTES = 256 * 1024 * 1024;
/** Objects and arrays in one file: two per element (the element and its node list) for the largest model, and room for couplings. */
export const MAX_JSON_CONTAINERS = 4_000_000;
/** Values in one file (members of objects, items of arrays): about eight per element for the largest model, twice over. */
export const MAX_JSON_VALUES = 20_000_000;
/** Nesting of objects and arrays: a model or a sheet nests four deep. */
export const MAX_JSON_DEPTH = 64;
/** 2^20 elements: one source and a million resistors on one node take about 1.3 GB of memory to solve (measured). */
export const MAX_ELEMENTS = 1_048_576;
/** Complex values a sweep prints: points × probed quantities (about 45 bytes of JSON each). */
export const MAX_SWEEP_VALUES = 25_000_000;
/** Points × elements: the solving work of a sweep. */
export const MAX_SWEEP_WORK = 100_000_000;

/** 1000000 → "1 000 000" */
const count = (n: number) => String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');

/**
 * Why a file's text cannot be read as JSON within the limits (too many
 * objects and arrays, nested too deep), found by one pass over the text
 * before it is parsed; null when it can.
 */
export function jsonShapeProblem(text: string): string | null {
  let depth = 0;
  let containers = 0;
  let values = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 0x5c) i++; // backslash: skip the escaped character
      else if (c === 0x22) inString = false;
      continue;
    }
    if (c === 0x22) inString = true;
    else if (c === 0x7b || c === 0x5b) {
      depth++;
      containers++;
      if (depth > MAX_JSON_DEPTH) return `it nests objects and arrays more than ${MAX_JSON_DEPTH} deep; a model or sheet nests 4 deep`;
      if (containers > MAX_JSON_CONTAINERS) return `it holds more than ${count(MAX_JSON_CONTAINERS)} objects and arrays; this tool reads models of up to ${count(MAX_ELEMENTS)} elements`;
    } else if (c === 0x7d || c === 0x5d) depth--;
    else if (c === 0x2c && ++values > MAX_JSON_VALUES) {
      return `it holds more than ${count(MAX_JSON_VALUES)} values; this tool reads models of up to ${count(MAX_ELEMENTS)} elements`;
    }
  }
  return null;
}

export function modelSizeProblem(elements: number): string | null {
  return elements > MAX_ELEMENTS ? `the model has ${count(elements)} elements; this tool solves models of up to ${count(MAX_ELEMENTS)} elements` : null;
}

/** Why a sweep of `points` points is refused (`values` complex values per point, `elements` in the model), or null. */
export function sweepSizeProblem(points: number, values: number, elements: number): string | null {
  if (points * values > MAX_SWEEP_VALUES) {
    return `${count(points)} points × ${count(values)} probed values = ${count(points * values)}, more than the ${count(MAX_SWEEP_VALUES)} values a sweep prints; name fewer nodes and elements with --probe or use fewer --points`;
  }
  if (points * elements > MAX_SWEEP_WORK) {
    return `${count(points)} points × ${count(elements)} elements = ${count(points * elements)} element solves, more than the ${count(MAX_SWEEP_WORK)} a sweep takes on; use fewer --points`;
  }
  return null;
}

/** Complex values `harmonics` holds and prints: orders × probed quantities (the run is held in memory). */
export const MAX_HARMONIC_VALUES = 4_000_000;

/**
 * Why a harmonic run of up to `orders` orders is refused (`quantities`: an upper bound on the complex
 * series it prints, `elements` in the model), or null.
 */
export function harmonicsSizeProblem(orders: number, quantities: number, elements: number): string | null {
  if (orders * quantities > MAX_HARMONIC_VALUES) {
    return `up to ${count(orders)} orders × ${count(quantities)} probed values = ${count(orders * quantities)}, more than the ${count(MAX_HARMONIC_VALUES)} values a harmonic run holds; name fewer nodes and elements with --probe or use a lower --count`;
  }
  if (orders * elements > MAX_SWEEP_WORK) {
    return `up to ${count(orders)} orders × ${count(elements)} elements = ${count(orders * elements)} element solves, more than the ${count(MAX_SWEEP_WORK)} a run takes on; use a lower --count`;
  }
  return null;
}
