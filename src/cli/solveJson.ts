import { RESULT_SCHEMA } from '../model/graph';
import { PORT_STRIDE, type RawSolution, type SolverSession } from '../solver';

/** Size of the pieces the writer hands out (characters). */
const CHUNK = 1 << 20;

/** Index names (canonical integers below 2³² − 1): an object lists them first, in numeric order. */
function isIndexName(name: string): boolean {
  const n = name.length;
  if (n === 0 || n > 10) return false;
  const c0 = name.charCodeAt(0);
  if (c0 < 48 || c0 > 57 || (c0 === 48 && n > 1)) return false;
  for (let i = 1; i < n; i++) {
    const c = name.charCodeAt(i);
    if (c < 48 || c > 57) return false;
  }
  return Number(name) < 4294967295;
}

/**
 * The order in which `Object.keys` lists a table of these (distinct) names, as the result document has
 * always shown them: index names first in numeric order, then the others in the order they came.
 */
export function keyOrder(names: readonly string[]): Int32Array {
  const order = new Int32Array(names.length);
  const indexNames: number[] = [];
  for (let i = 0; i < names.length; i++) if (isIndexName(names[i])) indexNames.push(i);
  indexNames.sort((a, b) => Number(names[a]) - Number(names[b]));
  let k = 0;
  for (const i of indexNames) order[k++] = i;
  if (indexNames.length === 0) for (let i = 0; i < names.length; i++) order[k++] = i;
  else {
    const isIndex = new Uint8Array(names.length);
    for (const i of indexNames) isIndex[i] = 1;
    for (let i = 0; i < names.length; i++) if (!isIndex[i]) order[k++] = i;
  }
  return order;
}

const complex = (re: number, im: number) => `{ "re": ${re}, "im": ${im} }`;

/**
 * The `solve` result document (`coilwright.result/1`) written straight from the solution arrays in pieces
 * of about a megabyte: the same text, byte for byte, as `jsonPieces(session.solveAt(f))` (format.ts), with
 * no result object per node or element. Every value is computed (and an overflow refused) before the
 * first piece is handed out, so a refusal never leaves half a document behind.
 */
export function solveJsonPieces(session: SolverSession, sol: RawSolution): Generator<string> {
  const warnings = session.warningsAt(sol.frequencyHz);
  const { values, portCount } = session.portTable(sol);
  return pieces(session, sol, values, portCount, warnings);
}

function* pieces(session: SolverSession, sol: RawSolution, t: Float64Array, portCount: Uint8Array, warnings: string[]): Generator<string> {
  const { model } = session;
  const nodeNames = session.topo.nodeNames;
  let s = `{\n  "schema": ${JSON.stringify(RESULT_SCHEMA)},\n  "frequencyHz": ${sol.frequencyHz},\n  "amplitudes": ${JSON.stringify(model.amplitudes)},\n  "nodes": `;
  if (nodeNames.length === 0) s += '{}';
  else {
    s += '{\n';
    const order = keyOrder(nodeNames);
    const { vRe, vIm } = sol;
    for (let k = 0; k < order.length; k++) {
      const v = order[k];
      // −0 is written 0, as everywhere in the document
      s += `    ${JSON.stringify(nodeNames[v])}: ${complex(vRe[v] === 0 ? 0 : vRe[v], vIm[v] === 0 ? 0 : vIm[v])}${k + 1 < order.length ? ',\n' : '\n'}`;
      if (s.length >= CHUNK) (yield s), (s = '');
    }
    s += '  }';
  }
  s += ',\n  "elements": ';
  const ids = model.elements.map((el) => el.id);
  if (ids.length === 0) s += '{}';
  else {
    s += '{\n';
    const order = keyOrder(ids);
    for (let k = 0; k < order.length; k++) {
      const i = order[k];
      const o = PORT_STRIDE * i;
      s += `    ${JSON.stringify(ids[i])}: {\n`;
      if (portCount[i] === 1) {
        s += `      "voltage": ${complex(t[o], t[o + 1])},\n      "current": ${complex(t[o + 2], t[o + 3])},\n`;
      } else {
        s += `      "voltages": [\n        ${complex(t[o], t[o + 1])},\n        ${complex(t[o + 4], t[o + 5])}\n      ],\n`;
        s += `      "currents": [\n        ${complex(t[o + 2], t[o + 3])},\n        ${complex(t[o + 6], t[o + 7])}\n      ],\n`;
      }
      s += `      "power": { "watts": ${t[o + 8]}, "vars": ${t[o + 9]} }\n    }${k + 1 < order.length ? ',\n' : '\n'}`;
      if (s.length >= CHUNK) (yield s), (s = '');
    }
    s += '  }';
  }
  s += `,\n  "warnings": ${warnings.length ? `[${warnings.map((w) => JSON.stringify(w)).join(', ')}]` : '[]'}\n}`;
  yield s;
}
