import { readFileSync, statSync } from 'node:fs';
import { parseArgs, UsageError, USAGE } from './args';
import { loadModelText } from './load';
import { jsonPieces } from './format';
import { ModelRefusal, solveGraph, sweepGraph, frequencyGrid, ProbeError, transferFunction, TransferUsageError } from '../solver';

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

/** Writes pieces to standard output in chunks of about 1 MB, waiting when the pipe is full. */
async function writeOut(pieces: Iterable<string>): Promise<void> {
  let buf: string[] = [];
  let size = 0;
  const flush = () =>
    new Promise<void>((resolve, reject) => {
      const chunk = buf.join('');
      buf = [];
      size = 0;
      process.stdout.write(chunk, (err) => (err ? reject(err) : resolve()));
    });
  for (const p of pieces) {
    buf.push(p);
    size += p.length;
    if (size >= 1 << 20) await flush();
  }
  buf.push('\n');
  await flush();
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
  try {
    let out: unknown;
    if (cmd.command === 'svg') {
      const { renderSheetSvg } = await import('./svg');
      out = await renderSheetSvg(readFile(cmd.file), cmd.file);
    } else {
      // the file's text and parsed JSON are dropped once the model is read
      const { model } = await loadModelText(readFile(cmd.file), cmd.file);
      if (cmd.command === 'solve') out = solveGraph(model);
      else if (cmd.command === 'sweep') out = sweepGraph(model, frequencyGrid(cmd.from, cmd.to, cmd.points, cmd.log), cmd.probe);
      else if (cmd.command === 'tf') out = transferFunction(model, cmd.input, cmd.output);
    }
    await writeOut(typeof out === 'string' ? [out] : jsonPieces(out));
  } catch (e) {
    if (e instanceof ProbeError || e instanceof TransferUsageError) fail(2, e.message);
    if (e instanceof ModelRefusal) fail(1, e.message);
    if (e instanceof RangeError && /call stack|Invalid array length|Invalid typed array length/.test(e.message)) {
      fail(1, `${cmd.file}: the model is too large or too deeply nested to read (${e.message})`);
    }
    fail(1, `internal error while solving ${cmd.file}: ${(e as Error)?.message ?? String(e)}; please report it with the file`);
  }
}

main(process.argv.slice(2)).catch((e) => fail(1, `internal error: ${(e as Error)?.message ?? String(e)}`));
