// The generic parallel job: a sheet, options and (for random jobs) a seed, split into chunks whose
// results depend only on (sheet, plan, chunk index). The chunks may run in this thread, in worker
// threads (nodeWorkerPool.ts), in Web Workers, or on different machines (shard part files), and
// the combined result is the same in every case. How to add a job kind: DEVELOPERS.md, "Parallel jobs".
import type { Sheet } from '../sheet/sheet';

/** Progress and cancellation inside one chunk (a chunk in a worker gets a no-op version). */
export interface ChunkControl {
  /** Call now and then with the units of work done in this chunk; may throw JobCancelledError. */
  tick(doneInChunk: number): Promise<void>;
}

/** The plan every chunk needs: plain data (structured-cloneable), fixed in the main thread. */
export interface ChunkPlan {
  /** Number of chunks. Fixed by the job and its options, never by the number of workers. */
  chunks: number;
  /** Units of work (points, samples) of the job, for progress; a job with no chunks reports them done at once. */
  work: number;
}

export interface ChunkedJob<Options, Plan extends ChunkPlan, Chunk, Result> {
  /** Registry name, also written into part files: 'scan1d', 'sample', ... */
  readonly kind: string;
  /** Main thread: check the options against the sheet and fix what every chunk needs (throws SheetJobError). */
  plan(sheet: Sheet, options: Options): Plan;
  /** Units of work in one chunk (for progress). */
  chunkWork(plan: Plan, index: number): number;
  /**
   * Any thread: the work of chunk `index`. Its result (plain data; Float64Arrays allowed) must depend only
   * on the sheet, the plan and the index. Random jobs draw from chunkRandom(seed, index) (prngStreams.ts).
   */
  runChunk(sheet: Sheet, plan: Plan, index: number, control: ChunkControl): Promise<Chunk>;
  /** Main thread: the job's result from every chunk's result, in index order. */
  combine(sheet: Sheet, plan: Plan, chunks: Chunk[]): Result;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type AnyChunkedJob = ChunkedJob<any, any, any, any>;

const registry = new Map<string, AnyChunkedJob>();

/** Makes a job kind known to the workers (which receive the kind's name, not its code). */
export function registerChunkedJob(job: AnyChunkedJob): void {
  const known = registry.get(job.kind);
  if (known && known !== job) throw new Error(`two parallel job kinds are named ${job.kind}`);
  registry.set(job.kind, job);
}

export function chunkedJobOf(kind: string): AnyChunkedJob {
  const job = registry.get(kind);
  if (!job) throw new Error(`unknown parallel job kind "${kind}" (known: ${[...registry.keys()].join(', ')})`);
  return job;
}

/** Chunks [first, end) of shard k of n (1-based k): contiguous, near-equal runs of chunk indices. */
export function shardChunks(chunks: number, k: number, n: number): { first: number; end: number } {
  if (!Number.isInteger(n) || n < 1 || !Number.isInteger(k) || k < 1 || k > n) throw new RangeError(`shard ${k}/${n}: need whole numbers 1 <= K <= N`);
  return { first: Math.floor(((k - 1) * chunks) / n), end: Math.floor((k * chunks) / n) };
}

/** Splits `count` items into chunks of `size`: the [start, end) of chunk `index`. */
export function chunkRange(count: number, size: number, index: number): { start: number; end: number } {
  const start = index * size;
  return { start, end: Math.min(count, start + size) };
}
