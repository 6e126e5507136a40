import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { formatJson } from '../../src/cli/format';
import { sweepJsonPieces } from '../../src/cli/sweepJson';
import { ColumnSpool } from '../../src/cli/sweepSpool';
import { frequencyGrid, parseGraphModel, sweepGraph, sweepStream } from '../../src/solver';
import type { GraphModel } from '../../src/model/graph';
import { model } from '../helpers';
import { root } from './bundle';

/**
 * The sweep written point by point through the spool is, byte for byte, the
 * JSON of the whole sweep gathered in memory (the `coilwright.sweep/1` layout
 * of the graph-model contract), for one block or many.
 */

function streamed(m: GraphModel, freqs: number[], probe: string[] | undefined, blockPoints: number): string {
  const stream = sweepStream(m, probe);
  const spool = new ColumnSpool(stream.layout.width, blockPoints);
  const point = new Float64Array(2 * stream.layout.width);
  for (const f of freqs) {
    stream.solveInto(f, point);
    spool.push(point);
  }
  spool.finish();
  try {
    return [...sweepJsonPieces({ amplitudes: m.amplitudes, frequenciesHz: Float64Array.from(freqs), layout: stream.layout, warnings: stream.warnings, spool })].join('');
  } finally {
    spool.close();
  }
}

const wireless = parseGraphModel(JSON.parse(readFileSync(join(root, 'examples', 'graphs', 'wireless-charging-85khz.json'), 'utf8')));
// an ideal transformer (pairs of phasors) and an isolated secondary (a warning)
const transformer = parseGraphModel(model(50, [
  { id: 'V1', kind: 'voltage-source', nodes: ['a', 'gnd'], magnitude: 10, phaseDeg: 30 },
  { id: 'T1', kind: 'ideal-transformer', nodes: ['a', 'gnd', 's', 't'], ratio: 2 },
  { id: 'R1', kind: 'resistor', nodes: ['s', 't'], ohms: 4 },
], [], { amplitudes: 'peak' }));

describe('the streamed sweep JSON', () => {
  const cases: [string, GraphModel, number[], string[] | undefined][] = [
    ['every quantity of the wireless pair', wireless, frequencyGrid(60e3, 110e3, 23, true), undefined],
    ['a probe of one node and one element', wireless, frequencyGrid(60e3, 110e3, 10, false), ['n1', 'Rbat']],
    ['a transformer, peak amplitudes, a warning', transformer, [1, 50, 1e4, 2e5, 3e6], undefined],
    ['an element and no node', transformer, [50], ['T1']],
    ['a node and no element', transformer, [50, 60], ['s']],
  ];
  for (const [name, m, freqs, probe] of cases) {
    it(`equals the gathered sweep: ${name}`, () => {
      const whole = formatJson(sweepGraph(m, freqs, probe));
      for (const block of [1, 3, freqs.length, 4096]) expect(streamed(m, freqs, probe, block), `block of ${block}`).toBe(whole);
    });
  }
});
