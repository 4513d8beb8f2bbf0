// Shared pieces of the `scan` and `sample` commands: range parsing, CSV writing, progress and Ctrl-C.
import { writeFileSync } from 'node:fs';
import type { CliIO } from './cliIO';
import { parseOptions, UsageError, type ParsedOptions } from './optionParsing';
import type { Sheet } from '../sheet/sheet';
import { runJob, type AxisSpec, type JobResult, type JobSpec } from '../statistics/jobs';
import { JobCancelledError, SheetJobError, type JobControl } from '../statistics/sheetValues';
import type { ParallelOptions } from '../jobs/runChunks';

/**
 * Options of a command that reads one sheet file, with the flags --help and --quiet and the given
 * value options. With --help the usage goes to standard output and the result is null.
 */
export function sheetCommandOptions(args: readonly string[], values: string[], usage: string, io: CliIO): ParsedOptions | null {
  const opts = parseOptions(args, { flags: ['help', 'quiet'], values });
  if (opts.flags.has('help')) {
    io.out(usage + '\n');
    return null;
  }
  if (opts.positional.length !== 1) throw new UsageError(`expected one sheet file, got ${opts.positional.length}`);
  return opts;
}

/** Parses `name=lo:hi:n[:log|:lin]`; lo and hi are numbers (in the cell's display unit) or formula text. */
export function parseVaryOption(text: string): AxisSpec {
  const eq = text.indexOf('=');
  if (eq <= 0) throw new UsageError(`--vary needs name=lo:hi:n[:log], got "${text}"`);
  const cell = text.slice(0, eq).trim();
  const parts = text.slice(eq + 1).split(':').map((p) => p.trim());
  let log = false;
  const last = parts[parts.length - 1]?.toLowerCase();
  if (last === 'log' || last === 'lin') {
    log = last === 'log';
    parts.pop();
  }
  if (parts.length !== 3) throw new UsageError(`--vary ${cell}: expected lo:hi:n[:log], got "${text.slice(eq + 1)}"`);
  const [loText, hiText, nText] = parts;
  if (!/^\d+$/.test(nText)) throw new UsageError(`--vary ${cell}: the number of points must be a whole number, got "${nText}"`);
  const bound = (t: string, what: string): string | number => {
    if (t === '') throw new UsageError(`--vary ${cell}: the ${what} end is missing`);
    return /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t) ? Number(t) : t;
  };
  return { cell, lo: bound(loText, 'lower'), hi: bound(hiText, 'upper'), n: Number(nText), log };
}

/** A number for CSV: 15 significant digits (drops unit-conversion noise such as 1e-4 -> 0.00010000000000000002), empty when not finite. */
export function csvNumber(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(15))) : '';
}

/** A CSV header field: name plus unit in brackets, quoted if needed. */
export function csvField(name: string, unit?: string): string {
  const t = unit ? `${name} [${unit}]` : name;
  return /[",\n]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t;
}

/** Writes CSV text to a file (when given) or to standard output. */
export function writeCsv(text: string, path: string | undefined, io: CliIO): void {
  if (path) {
    try {
      writeFileSync(path, text);
    } catch (e) {
      throw new UsageError(`cannot write ${path}: ${(e as Error).message}`);
    }
  } else io.out(text);
}

/** A progress reporter on standard error (quiet when asked) and an AbortSignal fired by Ctrl-C. */
export function jobControls(io: CliIO, quiet: boolean): { control: { onProgress?: (d: number, t: number) => void; signal: AbortSignal }; done(): void } {
  const ctl = new AbortController();
  const onInt = () => ctl.abort();
  process.once('SIGINT', onInt);
  let lastPct = -1;
  const onProgress = quiet
    ? undefined
    : (d: number, t: number) => {
        const pct = Math.floor((100 * d) / t);
        if (pct >= lastPct + 10 || d === t) {
          lastPct = pct;
          io.err(`  ${pct}% (${d} of ${t})\n`);
        }
      };
  return { control: { onProgress, signal: ctl.signal }, done: () => process.removeListener('SIGINT', onInt) };
}

/**
 * Runs `work` with progress and Ctrl-C (see jobControls). A job that refuses its input or is
 * cancelled is reported on standard error as `strainsheet <command>: ...` and gives null (the caller
 * then exits with EXIT_BAD_INPUT); any other error is thrown on.
 */
export async function withJobControls<T>(command: string, io: CliIO, quiet: boolean, work: (control: JobControl) => Promise<T>): Promise<T | null> {
  const { control, done } = jobControls(io, quiet);
  try {
    return await work(control);
  } catch (e) {
    if (e instanceof SheetJobError) {
      io.err(`strainsheet ${command}: ${e.message}\n`);
      return null;
    }
    if (e instanceof JobCancelledError) {
      io.err(`strainsheet ${command}: cancelled\n`);
      return null;
    }
    throw e;
  } finally {
    done();
  }
}

/** Runs a sheet job with progress and Ctrl-C; null when it was refused or cancelled (see withJobControls). */
export function runJobForCommand(command: string, sheet: Sheet, spec: JobSpec, io: CliIO, quiet: boolean, parallel?: ParallelOptions): Promise<JobResult | null> {
  return withJobControls(command, io, quiet, (control) => runJob(sheet, spec, control, parallel));
}

/** Formats a number for the summary lines (4 significant digits). */
export function g4(x: number): string {
  return Number.isFinite(x) ? Number(x.toPrecision(4)).toString() : String(x);
}
