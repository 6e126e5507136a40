/**
 * The `coilwright.transient/1` JSON of a spooled run, written piece by piece
 * as `formatJson(transientGraph(…))` writes it (one array of numbers per
 * quantity, on one line), without the run in memory. The spool holds complex
 * slots; two real quantities share one (quantity q in slot ⌊q/2⌋, part q mod 2).
 */
import { TRANSIENT_SCHEMA } from '../model/graph';
import { STEADY_STATE_FIELD, type SteadyStateReport, type TransientLayout } from '../solver';
import { formatJson } from './format';
import type { ColumnSpool } from './sweepSpool';

const PIECE = 4096;

/** JSON's text of a finite number ("-0" printed as 0, as JSON.stringify does). */
const num = (v: number) => JSON.stringify(v);

function* numbers(spool: ColumnSpool, q: number): Generator<string> {
  yield '[';
  let first = true;
  const part = q % 2;
  for (const chunk of spool.column(q >> 1)) {
    for (let i = part; i < chunk.length; i += 2 * PIECE) {
      let s = '';
      const end = Math.min(chunk.length, i + 2 * PIECE);
      for (let j = i; j < end; j += 2) {
        s += first ? num(chunk[j]) : `, ${num(chunk[j])}`;
        first = false;
      }
      yield s;
    }
  }
  yield ']';
}

export interface SpooledRun {
  timesS: ArrayLike<number>;
  layout: TransientLayout;
  warnings: string[];
  spool: ColumnSpool;
  /** the added field `coilwright.steadyState` */
  steadyState: SteadyStateReport;
}

export function* transientJsonPieces(r: SpooledRun): Generator<string> {
  const { layout, spool } = r;
  yield `{\n  "schema": ${JSON.stringify(TRANSIENT_SCHEMA)},\n  "timesS": [`;
  for (let i = 0; i < r.timesS.length; i += PIECE) {
    let piece = '';
    for (let j = i; j < Math.min(r.timesS.length, i + PIECE); j++) piece += `${j ? ', ' : ''}${num(r.timesS[j])}`;
    yield piece;
  }
  yield '],\n  "nodes": ';
  let q = 0;
  if (layout.nodes.length === 0) yield '{}';
  else {
    yield '{\n';
    for (let n = 0; n < layout.nodes.length; n++) {
      yield `    ${JSON.stringify(layout.nodes[n])}: `;
      yield* numbers(spool, q++);
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
      if (e.ports === 2) {
        for (const [name, a] of [['voltages', q], ['currents', q + 2]] as const) {
          yield `      "${name}": [\n        `;
          yield* numbers(spool, a);
          yield ',\n        ';
          yield* numbers(spool, a + 1);
          yield '\n      ],\n';
        }
        yield '      "power": ';
        yield* numbers(spool, q + 4);
        q += 5;
      } else {
        yield '      "voltage": ';
        yield* numbers(spool, q++);
        yield ',\n      "current": ';
        yield* numbers(spool, q++);
        yield ',\n      "power": ';
        yield* numbers(spool, q++);
      }
      yield `\n    }${n + 1 < layout.elements.length ? ',\n' : '\n'}`;
    }
    yield '  }';
  }
  yield `,\n  "warnings": ${r.warnings.length ? `[${r.warnings.map((w) => JSON.stringify(w)).join(', ')}]` : '[]'}`;
  yield `,\n  ${JSON.stringify(STEADY_STATE_FIELD)}: ${formatJson(r.steadyState).replace(/\n/g, '\n  ')}\n}`;
}
