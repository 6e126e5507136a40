import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

export const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

/** The command line bundled into a folder of the test's own, so that no test races another rebuilding dist-cli; returns the folder and the bundle. */
export async function bundleCli(prefix: string): Promise<{ dir: string; cli: string }> {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  const cli = join(dir, 'coilwright.mjs');
  await build({ entryPoints: [join(root, 'src/cli/main.ts')], outfile: cli, bundle: true, platform: 'node', format: 'esm', target: 'node20', logLevel: 'error' });
  return { dir, cli };
}
