// The options of commands that run parallel jobs: --workers N, --shard K/N and --part FILE.
import type { ParsedOptions } from './optionParsing';
import { UsageError } from './optionParsing';
import type { ParallelOptions } from '../jobs/runChunks';
import { defaultWorkerCount, nodeWorkerPool } from '../jobs/nodeWorkerPool';

export const PARALLEL_VALUE_OPTIONS = ['workers', 'shard', 'part'];

/**
 * Without --workers, the threads start only when the work left would take at least this long in this
 * thread: starting them (each loads the engine and rebuilds the sheet) takes about 0.3 s on a laptop,
 * so they pay for runs of a second or more (README, performance).
 */
export const DEFAULT_START_AFTER_MS = 1000;

export const PARALLEL_USAGE = `  --workers N        worker threads (default: the number of cores, here ${defaultWorkerCount()}, started once
                     the work left would take over ${DEFAULT_START_AFTER_MS / 1000} s on one); the results are the same for any N
  --shard K/N        compute only shard K of N (1 <= K <= N) and write a part file instead of CSV;
                     "strainsheet merge" joins the N parts into the result of the whole run
  --part FILE        the part file of --shard (default: <command>-part-K-of-N.json)`;

export interface CliParallelOptions extends ParallelOptions {
  shard?: { index: number; count: number };
  partPath?: string;
}

function wholeAtLeastOne(text: string, what: string): number {
  if (!/^\d+$/.test(text.trim()) || !(Number(text) >= 1) || !Number.isSafeInteger(Number(text))) throw new UsageError(`${what} must be a whole number of at least 1, got "${text}"`);
  return Number(text);
}

/** Parses "K/N" (1 <= K <= N). */
export function parseShard(text: string): { index: number; count: number } {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  if (!m) throw new UsageError(`--shard needs K/N, e.g. 3/16, got "${text}"`);
  const index = wholeAtLeastOne(m[1], '--shard K');
  const count = wholeAtLeastOne(m[2], '--shard N');
  if (index > count) throw new UsageError(`--shard ${text}: K must be at most N`);
  return { index, count };
}

export function parallelOptionsOf(opts: ParsedOptions): CliParallelOptions {
  const w = opts.values.get('workers')?.at(-1);
  const shardText = opts.values.get('shard')?.at(-1);
  const partPath = opts.values.get('part')?.at(-1);
  if (partPath !== undefined && shardText === undefined) throw new UsageError('--part goes with --shard K/N');
  if (shardText !== undefined && opts.values.has('csv')) throw new UsageError('--shard writes a part file (--part), not CSV; "strainsheet merge PARTS... --csv FILE" writes the CSV');
  return {
    workers: w === undefined ? defaultWorkerCount() : wholeAtLeastOne(w, '--workers'),
    ...(w === undefined ? { startAfterMs: DEFAULT_START_AFTER_MS } : {}),
    pool: nodeWorkerPool,
    shard: shardText === undefined ? undefined : parseShard(shardText),
    partPath,
  };
}
