import { readFileSync, statSync } from 'node:fs';
import { parseArgs, UsageError, USAGE } from './args';
import { loadModelText } from './load';
import { formatJson } from './format';
import { ModelRefusal, solveGraph, sweepGraph, frequencyGrid, ProbeError } from '../solver';

const MAX_FILE_BYTES = 512 * 1024 * 1024;

function fail(code: 1 | 2, message: string): never {
  process.stderr.write(`coilwright: ${message.replace(/\s*\n\s*/g, ' ')}\n`);
  process.exit(code);
}

function readFile(path: string): string {
  let size: number;
  try {
    const st = statSync(path);
    if (!st.isFile()) fail(2, `${path}: not a file`);
    size = st.size;
  } catch {
    fail(2, `${path}: no such file`);
  }
  if (size > MAX_FILE_BYTES) fail(1, `${path}: file is ${size} bytes, more than the ${MAX_FILE_BYTES}-byte limit`);
  return readFileSync(path, 'utf8');
}

async function main(argv: string[]): Promise<void> {
  let cmd;
  try {
    cmd = parseArgs(argv);
  } catch (e) {
    if (e instanceof UsageError) fail(2, `${e.message}\n${USAGE.split('\n').slice(0, 4).join(' | ')}`);
    throw e;
  }
  if (cmd.command === 'help') {
    process.stdout.write(USAGE + '\n');
    return;
  }
  const text = readFile(cmd.file);
  try {
    const { model } = await loadModelText(text, cmd.file);
    let out: unknown;
    if (cmd.command === 'solve') out = solveGraph(model);
    else if (cmd.command === 'sweep') out = sweepGraph(model, frequencyGrid(cmd.from, cmd.to, cmd.points, cmd.log), cmd.probe);
    else {
      const { renderSheetSvg } = await import('./svg');
      out = await renderSheetSvg(text, cmd.file);
    }
    const body = typeof out === 'string' ? out : formatJson(out);
    await new Promise<void>((resolve, reject) => process.stdout.write(body + '\n', (err) => (err ? reject(err) : resolve())));
  } catch (e) {
    if (e instanceof ProbeError) fail(2, e.message);
    if (e instanceof ModelRefusal) fail(1, e.message);
    if (e instanceof RangeError && /call stack|Invalid array length|Invalid typed array length/.test(e.message)) {
      fail(1, `${cmd.file}: the model is too large or too deeply nested to read (${e.message})`);
    }
    fail(1, `internal error while solving ${cmd.file}: ${(e as Error)?.message ?? String(e)}; please report it with the file`);
  }
}

main(process.argv.slice(2)).catch((e) => fail(1, `internal error: ${(e as Error)?.message ?? String(e)}`));
