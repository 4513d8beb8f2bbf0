// Runs the chunks of a ChunkedJob: in this thread, or through a pool of workers (a ChunkExecutor),
// and combines them. DOM-free and Node-free: the CLI hands in a worker-thread pool
// (nodeWorkerPool.ts), the app a pool of Web Workers (web/jobs/webChunkPool.ts).
import type { Sheet } from '../sheet/sheet';
import { checkCancelled, yieldToEventLoop, type JobControl } from '../statistics/sheetValues';
import type { AnyChunkedJob, ChunkControl, ChunkPlan, ChunkedJob } from './chunkedJob';

/** Runs chunks elsewhere (worker threads, Web Workers). Each worker rebuilds the sheet from its file text. */
export interface ChunkExecutor {
  runChunk(kind: string, sheetText: string, plan: ChunkPlan, index: number): Promise<unknown>;
  /** Ends the workers; with `force`, running chunks are abandoned. */
  close(force?: boolean): Promise<void>;
}

/** How to run a job's chunks: how many workers, and the pool that provides them. */
export interface ParallelOptions {
  /** Number of workers; 1 (or a job of one chunk) runs in this thread. */
  workers: number;
  /** Makes a pool of that many workers (not called when the job runs in this thread). */
  pool?: (workers: number) => ChunkExecutor;
  /**
   * Start the workers only when they pay: chunks run in this thread until the work left is projected
   * (from this thread's pace) to take at least this many ms here, and the chunks not started by then go
   * to the pool. Undefined: every chunk goes to the pool at once. Results are the same either way.
   */
  startAfterMs?: number;
  /** Hears how many workers the pool was made with, when the job makes one (never for a job run in this thread). */
  onPoolStart?: (workers: number) => void;
}

/** Pacing of progress reports and event-loop turns (ms of work between them). */
const SLICE_MS = 30;

/** A ChunkControl for chunks run in this thread: progress over the whole job, cancellation, event-loop turns. */
function inThreadControl(control: JobControl | undefined, total: number, before: () => number): ChunkControl {
  let last = Date.now();
  return {
    async tick(doneInChunk: number) {
      checkCancelled(control);
      const now = Date.now();
      if (now - last >= SLICE_MS) {
        last = now;
        control?.onProgress?.(before() + doneInChunk, total);
        await yieldToEventLoop();
        checkCancelled(control);
      }
    },
  };
}

/**
 * Runs the chunks `indices` of a planned job and gives their results in the order of `indices`.
 * `sheetText` is the sheet's file text (what a worker rebuilds the sheet from).
 */
export async function runChunks<P extends ChunkPlan, C>(
  job: ChunkedJob<unknown, P, C, unknown>,
  sheet: Sheet,
  plan: P,
  indices: readonly number[],
  control?: JobControl,
  parallel?: ParallelOptions & { sheetText?: string },
): Promise<C[]> {
  const total = indices.reduce((s, i) => s + job.chunkWork(plan, i), 0);
  let done = 0;
  const workers = Math.min(parallel?.workers ?? 1, indices.length);
  checkCancelled(control);
  if (workers <= 1 || !parallel?.pool) {
    const out: C[] = [];
    for (const i of indices) {
      out.push(await job.runChunk(sheet, plan, i, inThreadControl(control, total, () => done)));
      done += job.chunkWork(plan, i);
      control?.onProgress?.(done, total);
      if (out.length < indices.length) {
        await yieldToEventLoop();
        checkCancelled(control);
      }
    }
    return out;
  }
  const sheetText = () => parallel.sheetText ?? sheet.toFileText();
  const counted = (r: C, i: number) => {
    done += job.chunkWork(plan, i);
    control?.onProgress?.(done, total);
    return r;
  };
  const startPool = (n: number) => {
    parallel.onPoolStart?.(n);
    return parallel.pool!(n);
  };
  if (parallel.startAfterMs === undefined) return inPool(job, plan, indices, control, startPool(workers), sheetText(), counted);
  // Chunks run here while the work left looks short; once it does not, the rest go to the pool.
  const out: C[] = new Array(indices.length);
  const t0 = performance.now();
  let doneHere = 0;
  let next = 0;
  let pooled: Promise<void> | undefined;
  let pool: ChunkExecutor | undefined;
  // The first quarter of startAfterMs is warm-up (code runs cold at first, slower still on a busy
  // machine); from there the pace of this thread is judged, once half has passed, against the work
  // left (from the start when a whole startAfterMs went by without a second look, as in a job that
  // reports no progress inside its chunks).
  const limit = parallel.startAfterMs;
  let warm: { t: number; done: number } | undefined;
  const handOverIfLong = (doneNow: number) => {
    if (pooled || next >= indices.length) return;
    const now = performance.now();
    const elapsed = now - t0;
    if (!warm && elapsed >= limit / 4) warm = { t: now, done: doneNow };
    if (elapsed < limit / 2) return;
    const pace = warm && doneNow > warm.done ? (now - warm.t) / (doneNow - warm.done) : elapsed >= limit && doneNow > 0 ? elapsed / doneNow : undefined;
    if (pace === undefined || pace * (total - doneNow) < limit) return;
    const positions = Array.from({ length: indices.length - next }, (_, k) => next + k);
    next = indices.length;
    pool = startPool(Math.min(workers, positions.length));
    pooled = inPool(job, plan, positions.map((p) => indices[p]), control, pool, sheetText(), (r, i, k) => (out[positions[k]] = counted(r, i))).then(() => {});
    // a rejection is awaited below; until then it must not count as unhandled
    pooled.catch(() => {});
  };
  const here = inThreadControl(control, total, () => done);
  const tick = async (doneInChunk: number) => {
    await here.tick(doneInChunk);
    handOverIfLong(doneHere + doneInChunk);
  };
  try {
    while (next < indices.length) {
      const position = next++;
      const i = indices[position];
      out[position] = counted(await job.runChunk(sheet, plan, i, { tick }), i);
      doneHere += job.chunkWork(plan, i);
      handOverIfLong(doneHere);
      if (next < indices.length) {
        await yieldToEventLoop();
        checkCancelled(control);
      }
    }
  } catch (e) {
    // a chunk here failed or was cancelled: the workers' chunks are abandoned
    await pool?.close(true);
    throw e;
  }
  if (pooled) await pooled;
  return out;
}

/**
 * Runs chunks `indices` in `pool` (closed at the end; forced closed when the job is cancelled) and gives
 * their results in the order of `indices`; `onResult` hears each result (and its position) as it comes.
 */
async function inPool<P extends ChunkPlan, C>(
  job: ChunkedJob<unknown, P, C, unknown>,
  plan: P,
  indices: readonly number[],
  control: JobControl | undefined,
  pool: ChunkExecutor,
  sheetText: string,
  onResult: (result: C, index: number, position: number) => C,
): Promise<C[]> {
  let cancelled = false;
  const onAbort = () => {
    cancelled = true;
    void pool.close(true);
  };
  control?.signal?.addEventListener('abort', onAbort, { once: true });
  try {
    return await Promise.all(indices.map(async (i, k) => onResult((await pool.runChunk(job.kind, sheetText, plan, i)) as C, i, k)));
  } catch (e) {
    if (cancelled) checkCancelled(control);
    throw e;
  } finally {
    control?.signal?.removeEventListener('abort', onAbort);
    if (!cancelled) await pool.close(false);
  }
}

/** Plans a job, runs all its chunks and combines them. */
export async function runChunkedJob<O, P extends ChunkPlan, C, R>(
  job: ChunkedJob<O, P, C, R>,
  sheet: Sheet,
  options: O,
  control?: JobControl,
  parallel?: ParallelOptions & { sheetText?: string },
): Promise<R> {
  const plan = job.plan(sheet, options);
  // A job whose work was all done in plan() (e.g. a scan fully scaled by the sqrt law) reports it done.
  if (plan.chunks === 0) control?.onProgress?.(plan.work, plan.work);
  const indices = Array.from({ length: plan.chunks }, (_, i) => i);
  const chunks = await runChunks(job as AnyChunkedJob, sheet, plan, indices, control, parallel);
  return job.combine(sheet, plan, chunks as C[]);
}
