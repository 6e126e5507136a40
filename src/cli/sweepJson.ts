/**
 * The `coilwright.sweep/1` JSON of a spooled sweep, written piece by piece
 * and byte for byte as `formatJson(sweepGraph(…))` writes it (one array per
 * quantity, phasors on one line each), without the sweep in memory.
 */
import { SWEEP_SCHEMA, type Amplitudes } from '../model/graph';
import type { SweepLayout } from '../solver';
import type { ColumnSpool } from './sweepSpool';

// finite numbers only (the solver refuses anything else), where String(v) is JSON.stringify(v), −0 included
const num = (v: number) => String(v);
const phasor = (re: number, im: number) => `{ "re": ${num(re)}, "im": ${num(im)} }`;

/** Points joined into one piece per this many, so that pieces stay small and few. */
const PIECE = 2048;

/** Lines of one phasor array at `indent` (its items one level deeper). */
function* phasorArray(spool: ColumnSpool, k: number, indent: string): Generator<string> {
  const inner = `${indent}  `;
  yield '[\n';
  let first = true;
  for (const chunk of spool.column(k)) {
    for (let i = 0; i < chunk.length; i += 2 * PIECE) {
      let s = '';
      const end = Math.min(chunk.length, i + 2 * PIECE);
      for (let j = i; j < end; j += 2) {
        s += `${first ? '' : ',\n'}${inner}${phasor(chunk[j], chunk[j + 1])}`;
        first = false;
      }
      yield s;
    }
  }
  yield `\n${indent}]`;
}

/** Lines of an array of [primary, secondary] phasor pairs, from two columns. */
function* pairArray(spool: ColumnSpool, k: number, indent: string): Generator<string> {
  const inner = `${indent}  `;
  const item = `${inner}  `;
  yield '[\n';
  const second = spool.column(k + 1);
  let first = true;
  for (const a of spool.column(k)) {
    const b = second.next().value as Float64Array;
    for (let i = 0; i < a.length; i += 2 * PIECE) {
      let s = '';
      const end = Math.min(a.length, i + 2 * PIECE);
      for (let j = i; j < end; j += 2) {
        s += `${first ? '' : ',\n'}${inner}[\n${item}${phasor(a[j], a[j + 1])},\n${item}${phasor(b[j], b[j + 1])}\n${inner}]`;
        first = false;
      }
      yield s;
    }
  }
  yield `\n${indent}]`;
}

export interface SpooledSweep {
  amplitudes: Amplitudes;
  frequenciesHz: ArrayLike<number>;
  layout: SweepLayout;
  warnings: string[];
  spool: ColumnSpool;
}

export function* sweepJsonPieces(s: SpooledSweep): Generator<string> {
  const { layout, spool } = s;
  yield `{\n  "schema": ${JSON.stringify(SWEEP_SCHEMA)},\n  "amplitudes": ${JSON.stringify(s.amplitudes)},\n  "frequenciesHz": [`;
  const f = s.frequenciesHz;
  for (let i = 0; i < f.length; i += PIECE) {
    let piece = '';
    for (let j = i; j < Math.min(f.length, i + PIECE); j++) piece += `${j ? ', ' : ''}${num(f[j])}`;
    yield piece;
  }
  yield '],\n  "nodes": ';
  let k = 0;
  if (layout.nodes.length === 0) yield '{}';
  else {
    yield '{\n';
    for (let n = 0; n < layout.nodes.length; n++) {
      yield `    ${JSON.stringify(layout.nodes[n])}: `;
      yield* phasorArray(spool, k++, '    ');
      yield n + 1 < layout.nodes.length ? ',\n' : '\n';
    }
    yield '  }';
  }
  yield ',\n  "elements": ';
  if (layout.elements.length === 0) yield '{}';
  else {
    yield '{\n';
    for (let n = 0; n < layout.elements.length; n++) {
      const e = layout.elements[n];
      yield `    ${JSON.stringify(e.id)}: {\n`;
      if (e.transformer) {
        yield '      "voltages": ';
        yield* pairArray(spool, k, '      ');
        yield ',\n      "currents": ';
        yield* pairArray(spool, k + 2, '      ');
        k += 4;
      } else {
        yield '      "voltage": ';
        yield* phasorArray(spool, k++, '      ');
        yield ',\n      "current": ';
        yield* phasorArray(spool, k++, '      ');
      }
      yield `\n    }${n + 1 < layout.elements.length ? ',\n' : '\n'}`;
    }
    yield '  }';
  }
  yield `,\n  "warnings": ${s.warnings.length ? `[${s.warnings.map((w) => JSON.stringify(w)).join(', ')}]` : '[]'}\n}`;
}
