import type { Sheet } from '../sheet';
import { currentTransformerSheet } from './currentTransformer';
import { isolationTransformerSheet } from './isolation';
import { wirelessPairSheet } from './wireless';

export interface Example { key: string; title: string; make: () => Sheet }

export const EXAMPLES: Example[] = [
  { key: 'isolation', title: 'Bench isolation transformer (230 V, 50 Hz)', make: isolationTransformerSheet },
  { key: 'wireless', title: 'Wireless charging pair (85 kHz)', make: wirelessPairSheet },
  { key: 'current-transformer', title: 'Current transformer with burden', make: currentTransformerSheet },
];
