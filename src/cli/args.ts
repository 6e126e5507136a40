/** A fault in the command line itself (exit status 2). */
export class UsageError extends Error {}

export const USAGE = `usage:
  coilwright solve FILE.json
  coilwright sweep FILE.json --from HZ --to HZ --points N [--log] [--probe NAME[,NAME...]]
  coilwright svg SHEET.json
  coilwright tf FILE.json --input SOURCE --output node:NAME|voltage:ELEMENT|current:ELEMENT
  coilwright transient FILE.json --stop S [--step S] [--probe NAME[,NAME...]] [--tolerance R] [--start given|dc]
  coilwright harmonics FILE.json [--count N] [--probe NAME[,NAME...]]

FILE is a graph model (coilwright.graph/1) or a sheet saved by the editor.
HZ and S (seconds) are decimal numbers (50, 85000, 8.5e4, 2e-3); N a whole number from 1 to 1000000.
Exit status: 0 solved, 1 the model was refused, 2 the command line is wrong,
3 the output could not be written.`;

export interface SolveCommand { command: 'solve' | 'svg'; file: string }
export interface SweepCommand { command: 'sweep'; file: string; from: number; to: number; points: number; log: boolean; probe?: string[] }
export interface TfCommand { command: 'tf'; file: string; input: string; output: string }
export interface TransientCommand {
  command: 'transient';
  file: string;
  stop: number;
  step: number;
  tolerance: number;
  start: 'given' | 'dc';
  probe?: string[];
}
export interface HarmonicsCommand { command: 'harmonics'; file: string; count?: number; probe?: string[] }
export type Command = SolveCommand | SweepCommand | TfCommand | TransientCommand | HarmonicsCommand | { command: 'help' };

/** The most harmonics `harmonics` solves (the solver's MAX_HARMONIC_COUNT). */
export const MAX_HARMONICS = 100_000;

/** The most samples `transient` prints (contract). */
export const MAX_SAMPLES = 1_000_000;

/** A decimal number as people write one: digits, a point, an exponent; no hexadecimal, no "Infinity", no spaces. */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const MAX_POINTS = 1_000_000;

const shown = (raw: string) => JSON.stringify(raw.length > 40 ? `${raw.slice(0, 40)}…` : raw);

function number(flag: string, raw: string | undefined, unit = 'hertz (like 50, 85000 or 8.5e4)'): number {
  if (raw === undefined) throw new UsageError(`${flag} needs a value`);
  const v = Number(raw);
  if (!DECIMAL.test(raw) || !Number.isFinite(v)) throw new UsageError(`${flag} must be a decimal number of ${unit}, got ${shown(raw)}`);
  return v;
}

function probeList(raw: string): string[] {
  const probe = raw.split(',').map((s) => s.trim());
  if (probe.some((p) => p === '')) throw new UsageError('--probe needs a comma-separated list of node or element names');
  return probe;
}

function wholeNumber(flag: string, raw: string): number {
  const v = Number(raw);
  if (!/^\d+$/.test(raw) || !(v >= 1 && v <= MAX_POINTS)) {
    throw new UsageError(`${flag} must be a whole number from 1 to ${MAX_POINTS} in decimal digits, got ${shown(raw)}`);
  }
  return v;
}

export function parseArgs(argv: string[]): Command {
  const [command, ...rest] = argv;
  if (command === undefined || command === 'help' || command === '--help' || command === '-h') return { command: 'help' };
  if (command !== 'solve' && command !== 'sweep' && command !== 'svg' && command !== 'tf' && command !== 'transient' && command !== 'harmonics') {
    throw new UsageError(`unknown command "${command}"; use solve, sweep, tf, transient, harmonics or svg`);
  }
  const positional: string[] = [];
  const flags = new Map<string, string | true>();
  for (let i = 0; i < rest.length; i++) {
    const a = rest[i];
    if (a.startsWith('--')) {
      const eq = a.indexOf('=');
      const name = eq > 0 ? a.slice(0, eq) : a;
      if (flags.has(name)) throw new UsageError(`${name} is given twice`);
      if (name === '--log') {
        if (eq > 0) throw new UsageError('--log takes no value');
        flags.set(name, true);
      } else if (
        (['--from', '--to', '--points', '--probe'].includes(name) && command === 'sweep') ||
        (['--input', '--output'].includes(name) && command === 'tf') ||
        (['--stop', '--step', '--probe', '--tolerance', '--start'].includes(name) && command === 'transient') ||
        (['--count', '--probe'].includes(name) && command === 'harmonics')
      ) {
        const value = eq > 0 ? a.slice(eq + 1) : rest[++i];
        if (value === undefined) throw new UsageError(`${name} needs a value`);
        flags.set(name, value);
      } else {
        throw new UsageError(`unknown option "${name}" for ${command}`);
      }
    } else positional.push(a);
  }
  if (positional.length === 0) throw new UsageError(`${command} needs a FILE`);
  if (positional.length > 1) throw new UsageError(`${command} takes one FILE, got ${positional.length}: ${positional.join(' ')}`);
  const file = positional[0];
  if (command === 'tf') {
    for (const need of ['--input', '--output']) if (!flags.has(need)) throw new UsageError(`tf needs ${need}`);
    const input = (flags.get('--input') as string).trim();
    const output = (flags.get('--output') as string).trim();
    if (!input) throw new UsageError('--input needs the id of a voltage or current source');
    if (!/^(node|voltage|current):.+$/.test(output)) throw new UsageError(`--output must be node:NAME, voltage:ELEMENT or current:ELEMENT, got "${output}"`);
    return { command, file, input, output };
  }
  if (command === 'transient') {
    if (!flags.has('--stop')) throw new UsageError('transient needs --stop (the end of the run, seconds)');
    const seconds = 'seconds (like 0.02 or 2e-3)';
    const stop = number('--stop', flags.get('--stop') as string, seconds);
    if (!(stop > 0)) throw new UsageError(`--stop must be above 0 s, got ${stop}`);
    const step = flags.has('--step') ? number('--step', flags.get('--step') as string, seconds) : stop / 1000;
    if (!(step > 0)) throw new UsageError(`--step must be above 0 s, got ${step}`);
    if (step > stop) throw new UsageError(`--step (${step} s) is longer than --stop (${stop} s); the output step must fit in the run`);
    const samples = Math.floor((stop / step) * (1 + 1e-12) + 1e-9) + 1;
    if (samples > MAX_SAMPLES) throw new UsageError(`--stop / --step gives ${samples} samples, more than the ${MAX_SAMPLES} a run prints; lengthen --step`);
    const tolerance = flags.has('--tolerance') ? number('--tolerance', flags.get('--tolerance') as string, 'the accuracy asked for (like 1e-4)') : 1e-4;
    if (!(tolerance >= 1e-10 && tolerance <= 1e-2)) throw new UsageError(`--tolerance must be from 1e-10 to 1e-2, got ${tolerance}`);
    const start = flags.has('--start') ? (flags.get('--start') as string) : 'given';
    if (start !== 'given' && start !== 'dc') throw new UsageError(`--start must be given or dc, got ${shown(start)}`);
    return { command, file, stop, step, tolerance, start, probe: flags.has('--probe') ? probeList(flags.get('--probe') as string) : undefined };
  }
  if (command === 'harmonics') {
    let count: number | undefined;
    if (flags.has('--count')) {
      const raw = flags.get('--count') as string;
      count = Number(raw);
      if (!/^\d+$/.test(raw) || !(count >= 1 && count <= MAX_HARMONICS)) {
        throw new UsageError(`--count must be a whole number from 1 to ${MAX_HARMONICS} in decimal digits (the highest harmonic solved), got ${shown(raw)}`);
      }
    }
    return { command, file, count, probe: flags.has('--probe') ? probeList(flags.get('--probe') as string) : undefined };
  }
  if (command !== 'sweep') {
    if (flags.size) throw new UsageError(`${command} takes no options`);
    return { command, file };
  }
  for (const need of ['--from', '--to', '--points']) if (!flags.has(need)) throw new UsageError(`sweep needs ${need}`);
  const from = number('--from', flags.get('--from') as string);
  const to = number('--to', flags.get('--to') as string);
  const points = wholeNumber('--points', flags.get('--points') as string);
  const log = flags.has('--log');
  if (from < 0 || to < 0) throw new UsageError('--from and --to must be 0 Hz or more');
  if (from > to) throw new UsageError(`--from (${from} Hz) is above --to (${to} Hz); a sweep runs from the lower frequency up, so swap them`);
  if (log && (from <= 0 || to <= 0)) throw new UsageError('--log needs --from and --to above 0 Hz');
  const probe = flags.has('--probe') ? probeList(flags.get('--probe') as string) : undefined;
  return { command, file, from, to, points, log, probe };
}
