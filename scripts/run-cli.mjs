// `npm run -s cli -- ARGS`: runs the bundled command line, rebuilding it first
// when any source file is newer than the bundle (a fresh clone builds once).
import { statSync, readdirSync } from 'node:fs';
import { join, dirname } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const out = join(root, 'dist-cli', 'coilwright.mjs');

function newestSource(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(p));
    else if (/\.tsx?$/.test(entry.name)) newest = Math.max(newest, statSync(p).mtimeMs);
  }
  return newest;
}

let stale = true;
try {
  stale = statSync(out).mtimeMs < newestSource(join(root, 'src'));
} catch {
  stale = true;
}
if (stale) {
  const { buildCli } = await import('./build-cli.mjs');
  await buildCli();
}
await import(pathToFileURL(out).href);
