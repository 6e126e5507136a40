// Writes the editor's example sheets (src/model/examples, the one definition
// of each scenario) as files in examples/sheets/, with fixed ids so that the
// files only change when an example does, and the graph model each derives
// as examples/graphs/. test/model/examples.test.ts checks that the files are
// what this writes. Run: node scripts/write-example-sheets.mjs
import { build } from 'esbuild';
import { mkdirSync, unlinkSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { tmpdir } from 'node:os';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

const bundle = join(tmpdir(), `coilwright-examples-${process.pid}.mjs`);
await build({
  stdin: {
    contents: "export { EXAMPLES, seedIds, exampleFiles } from './src/model/index.ts'; export { formatJson } from './src/cli/format.ts';",
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
const { exampleFiles, formatJson } = mod;
for (const f of exampleFiles()) {
  mkdirSync(join(root, dirname(f.path)), { recursive: true });
  writeFileSync(join(root, f.path), formatJson(f.json) + '\n');
  console.log(f.path);
}
