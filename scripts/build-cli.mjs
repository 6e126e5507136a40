// Bundles the command line once into dist-cli/coilwright.mjs so that each call
// starts in about a second instead of compiling TypeScript on every run.
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
export const cliOut = join(root, 'dist-cli', 'coilwright.mjs');

export async function buildCli() {
  await build({
    entryPoints: [join(root, 'src/cli/main.ts')],
    outfile: cliOut,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    splitting: false,
    logLevel: 'error',
    legalComments: 'none',
  });
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  await buildCli();
}
