// Writes the editor's example sheets (src/model/examples) as files in
// examples/sheets/, with fixed ids so that the files only change when an
// example does. Run: node scripts/write-example-sheets.mjs
import { build } from 'esbuild';
import { mkdirSync, unlinkSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { tmpdir } from 'node:os';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const FILES = {
  isolation: 'isolation-transformer-230v.json',
  wireless: 'wireless-charging-85khz.json',
  'current-transformer': 'current-transformer-burden.json',
};

const bundle = join(tmpdir(), `coilwright-examples-${process.pid}.mjs`);
await build({
  stdin: {
    contents: "export { EXAMPLES, seedIds } from './src/model/index.ts'; export { formatJson } from './src/cli/format.ts';",
    resolveDir: root,
    loader: 'ts',
  },
  outfile: bundle,
  bundle: true,
  platform: 'node',
  format: 'esm',
  logLevel: 'error',
});
let mod;
try {
  mod = await import(pathToFileURL(bundle).href);
} finally {
  unlinkSync(bundle);
}
const { EXAMPLES, seedIds, formatJson } = mod;
const out = join(root, 'examples', 'sheets');
mkdirSync(out, { recursive: true });
EXAMPLES.forEach((ex, i) => {
  const file = FILES[ex.key] ?? `${ex.key}.json`;
  seedIds(1000 + i);
  writeFileSync(join(out, file), formatJson(ex.make()) + '\n');
  console.log(`examples/sheets/${file}`);
});
