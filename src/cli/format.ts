/**
 * JSON for people and scripts alike: indented, but objects whose values are
 * all plain numbers or strings (a phasor, a power) stay on one line. Written
 * as a stream of pieces so that a large result never becomes one huge string.
 */
export function* jsonPieces(value: unknown, indent = ''): Generator<string> {
  if (value === null || typeof value !== 'object') {
    yield JSON.stringify(value);
    return;
  }
  const inner = indent + '  ';
  if (Array.isArray(value)) {
    if (value.length === 0) {
      yield '[]';
      return;
    }
    if (value.every((v) => v === null || typeof v !== 'object')) {
      yield `[${value.map((v) => JSON.stringify(v)).join(', ')}]`;
      return;
    }
    yield '[\n';
    for (let i = 0; i < value.length; i++) {
      yield inner;
      yield* jsonPieces(value[i], inner);
      yield i + 1 < value.length ? ',\n' : '\n';
    }
    yield `${indent}]`;
    return;
  }
  const keys = Object.keys(value);
  const obj = value as Record<string, unknown>;
  if (keys.length === 0) {
    yield '{}';
    return;
  }
  if (keys.every((k) => obj[k] === null || typeof obj[k] !== 'object')) {
    yield `{ ${keys.map((k) => `${JSON.stringify(k)}: ${JSON.stringify(obj[k])}`).join(', ')} }`;
    return;
  }
  yield '{\n';
  for (let i = 0; i < keys.length; i++) {
    yield `${inner}${JSON.stringify(keys[i])}: `;
    yield* jsonPieces(obj[keys[i]], inner);
    yield i + 1 < keys.length ? ',\n' : '\n';
  }
  yield `${indent}}`;
}

export function formatJson(value: unknown): string {
  return [...jsonPieces(value)].join('');
}
