import { seedIds } from '../ids';
import type { Sheet } from '../sheet';
import { sheetToGraph } from '../toGraph';
import { controlTransformerSheet } from './control';
import { currentTransformerSheet } from './currentTransformer';
import { distributionTransformerSheet } from './distribution';
import { isolationTransformerSheet } from './isolation';
import { currentTransformerOpensSheet } from './ctOpens';
import { transformerSwitchInSheet } from './switchIn';
import { wirelessPairSheet, wirelessSquareDriveSheet } from './wireless';

export interface Example { key: string; title: string; file: string; make: () => Sheet }

export const EXAMPLES: Example[] = [
  { key: 'isolation', title: 'Bench isolation transformer (230 V, 50 Hz)', file: 'isolation-transformer-230v.json', make: isolationTransformerSheet },
  { key: 'wireless', title: 'Wireless charging pair (85 kHz)', file: 'wireless-charging-85khz.json', make: wirelessPairSheet },
  { key: 'current-transformer', title: 'Current transformer with burden', file: 'current-transformer-burden.json', make: currentTransformerSheet },
  { key: 'wireless-square', title: 'Wireless pair, square-wave drive from rest (85 kHz)', file: 'wireless-square-drive-85khz.json', make: wirelessSquareDriveSheet },
  { key: 'distribution', title: 'Distribution transformer from its tests (25 kVA, 11 kV)', file: 'distribution-transformer-25kva.json', make: distributionTransformerSheet },
  { key: 'control', title: 'Control transformer per unit (250 VA, 400 V / 24 V)', file: 'control-transformer-per-unit.json', make: controlTransformerSheet },
  { key: 'switch-in', title: 'Transformer switched in at the crest and at the zero (230 V, 50 Hz)', file: 'transformer-switch-in-230v.json', make: transformerSwitchInSheet },
  { key: 'ct-opens', title: 'Current transformer whose burden is opened (spike)', file: 'current-transformer-burden-opens.json', make: currentTransformerOpensSheet },
];

/**
 * The example files as they are written to examples/: each scenario's sheet
 * (with fixed ids) and the graph model it derives, so the two can never drift.
 */
export function exampleFiles(): { path: string; json: unknown }[] {
  return EXAMPLES.flatMap((ex, i) => {
    seedIds(1000 + i);
    const sheet = ex.make();
    return [
      { path: `examples/sheets/${ex.file}`, json: sheet },
      { path: `examples/graphs/${ex.file}`, json: sheetToGraph(sheet) },
    ];
  });
}
