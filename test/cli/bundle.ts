import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { beforeAll } from 'vitest';
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

/**
 * A bundle of the command line built before the file's tests (beforeAll), a runner for it, and model files
 * written into a folder of the test's own.
 */
export function cliHarness(prefix: string) {
  const dir = mkdtempSync(join(tmpdir(), `${prefix}models-`));
  let cli = '';
  beforeAll(async () => {
    ({ cli } = await bundleCli(prefix));
  });
  let counter = 0;
  const run = (args: string[]) => spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8' });
  const fileWith = (content: unknown) => {
    const p = join(dir, `m${counter++}.json`);
    writeFileSync(p, JSON.stringify(content));
    return p;
  };
  return { run, fileWith };
}
