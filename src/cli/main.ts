import { readFileSync, statSync } from 'node:fs';
import { parseArgs, UsageError, USAGE, type HarmonicsCommand, type SweepCommand, type TransientCommand } from './args';
import { loadModelText } from './load';
import { jsonPieces } from './format';
import { harmonicsSizeProblem, MAX_FILE_BYTES, sweepSizeProblem } from './limits';
import { ColumnSpool, SpoolError } from './sweepSpool';
import { sweepJsonPieces } from './sweepJson';
import { solveJsonPieces } from './solveJson';
import { transientJsonPieces } from './transientJson';
import { ModelRefusal, SolverSession, sweepStream, frequencyAt, ProbeError, transferFunction, TransferUsageError, transientStream, harmonicSteadyState } from '../solver';
import { DEFAULT_HARMONIC_COUNT } from '../model/fourier';
import type { GraphModel } from '../model/graph';

/** Exit status: 0 solved, 1 the model was refused, 2 the command line is wrong, 3 the output could not be written. */
type Status = 0 | 1 | 2 | 3;

function fail(code: Exclude<Status, 0>, message: string): never {
  try {
    process.stderr.write(`coilwright: ${message.replace(/\s*\n\s*/g, ' ')}\n`);
  } catch {
    /* standard error is gone too: the status says it */
  }
  process.exit(code);
}

/** A closed pipe (a reader such as `head` that has read enough) ends the command quietly; any other write error is one line. */
function outputFailed(err: NodeJS.ErrnoException): never {
  if (err.code === 'EPIPE') process.exit(0);
  const why = err.code === 'ENOSPC' ? 'no space left on the device' : err.code === 'EFBIG' ? 'the file grew too large' : err.message;
  fail(3, `could not write the output: ${why}${err.code ? ` (${err.code})` : ''}`);
}

process.stdout.on('error', outputFailed);
process.stderr.on('error', () => process.exit(process.exitCode ?? 1));

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
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    fail(1, `${path}: could not be read (${code === 'ERR_STRING_TOO_LONG' ? 'too long for this tool' : (e as Error).message})`);
  }
}

/** Writes pieces to standard output in chunks of about 1 MB, waiting when the pipe is full. */
async function writeOut(pieces: Iterable<string>): Promise<void> {
  let buf: string[] = [];
  let size = 0;
  const flush = () =>
    new Promise<void>((resolve) => {
      const chunk = buf.join('');
      buf = [];
      size = 0;
      process.stdout.write(chunk, (err) => (err ? outputFailed(err) : resolve()));
    });
  for (const p of pieces) {
    buf.push(p);
    size += p.length;
    if (size >= 1 << 20) await flush();
  }
  buf.push('\n');
  await flush();
}

/** Solves every point first, into a spool (memory stays one block), then writes the JSON from it. */
async function sweep(model: GraphModel, cmd: SweepCommand): Promise<void> {
  const stream = sweepStream(model, cmd.probe);
  const { layout } = stream;
  const tooBig = sweepSizeProblem(cmd.points, layout.width, model.elements.length);
  if (tooBig) throw new ModelRefusal(`sweep: ${tooBig}`, [{ kind: 'model' }]);
  const frequencies = new Float64Array(cmd.points);
  for (let i = 0; i < cmd.points; i++) frequencies[i] = frequencyAt(cmd.from, cmd.to, cmd.points, cmd.log, i);
  const spool = new ColumnSpool(layout.width);
  try {
    const point = new Float64Array(2 * layout.width);
    for (let i = 0; i < frequencies.length; i++) {
      stream.solveInto(frequencies[i], point);
      spool.push(point);
    }
    spool.finish();
    await writeOut(sweepJsonPieces({ amplitudes: model.amplitudes, frequenciesHz: frequencies, layout, warnings: stream.warnings, spool }));
  } finally {
    spool.close();
  }
}

/** Runs the time response into a spool (memory stays one block), then writes the JSON from it. */
async function transient(model: GraphModel, cmd: TransientCommand): Promise<void> {
  const stream = transientStream(model, { stopS: cmd.stop, stepS: cmd.step, tolerance: cmd.tolerance, start: cmd.start }, cmd.probe);
  const { layout } = stream;
  const samples = Math.floor((cmd.stop / cmd.step) * (1 + 1e-12) + 1e-9) + 1;
  const tooBig = sweepSizeProblem(samples, Math.ceil(layout.width / 2), model.elements.length);
  if (tooBig) throw new ModelRefusal(`transient: ${tooBig.replace(/points/g, 'samples')}`, [{ kind: 'model' }]);
  const slots = Math.max(1, Math.ceil(layout.width / 2));
  const spool = new ColumnSpool(slots);
  const timesS = new Float64Array(samples);
  let count = 0;
  try {
    const point = new Float64Array(2 * slots);
    const warnings = stream.run((t, values) => {
      point.set(values);
      spool.push(point);
      timesS[count++] = t;
    });
    spool.finish();
    await writeOut(transientJsonPieces({ timesS: timesS.subarray(0, count), layout, warnings, spool, steadyState: stream.steadyState() }));
  } finally {
    spool.close();
  }
}

/** The harmonic steady state, held in memory within the limits (an upper bound on its size is checked first). */
async function harmonics(model: GraphModel, cmd: HarmonicsCommand): Promise<void> {
  const orders = (cmd.count ?? DEFAULT_HARMONIC_COUNT) + 1;
  // every node and element at most: nodes ≤ 2 per element, four series for a transformer
  const quantities = cmd.probe ? 4 * cmd.probe.length : 6 * model.elements.length;
  const tooBig = harmonicsSizeProblem(orders, quantities, model.elements.length);
  if (tooBig) throw new ModelRefusal(`harmonics: ${tooBig}`, [{ kind: 'model' }]);
  await writeOut(jsonPieces(harmonicSteadyState(model, { count: cmd.count, probe: cmd.probe })));
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
    await writeOut([USAGE]);
    return;
  }
  try {
    if (cmd.command === 'svg') {
      const { renderSheetSvg } = await import('./svg');
      await writeOut([await renderSheetSvg(readFile(cmd.file), cmd.file)]);
      return;
    }
    // the file's text and parsed JSON are dropped once the model is read
    const { model } = await loadModelText(readFile(cmd.file), cmd.file);
    if (cmd.command === 'solve') {
      const session = new SolverSession(model);
      await writeOut(solveJsonPieces(session, session.solveRaw(model.frequencyHz)));
    } else if (cmd.command === 'sweep') await sweep(model, cmd);
    else if (cmd.command === 'tf') await writeOut(jsonPieces(transferFunction(model, cmd.input, cmd.output)));
    else if (cmd.command === 'transient') await transient(model, cmd);
    else if (cmd.command === 'harmonics') await harmonics(model, cmd);
  } catch (e) {
    if (e instanceof ProbeError || e instanceof TransferUsageError) fail(2, e.message);
    if (e instanceof ModelRefusal) fail(1, e.message);
    if (e instanceof SpoolError) fail(3, e.message);
    if (e instanceof RangeError && /call stack|Invalid array length|Invalid typed array length|Invalid string length/.test(e.message)) {
      fail(1, `${cmd.file}: the model is too large or too deeply nested for this tool (${e.message})`);
    }
    fail(1, `${cmd.file}: could not be solved: ${(e as Error)?.message ?? String(e)}`);
  }
}

main(process.argv.slice(2)).catch((e) => fail(1, `${(e as Error)?.message ?? String(e)}`));
