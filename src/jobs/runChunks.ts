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
  const sheetText = parallel.sheetText ?? sheet.toFileText();
  const pool = parallel.pool(workers);
  let cancelled = false;
  const onAbort = () => {
    cancelled = true;
    void pool.close(true);
  };
  control?.signal?.addEventListener('abort', onAbort, { once: true });
  try {
    const results = await Promise.all(
      indices.map(async (i) => {
        const r = (await pool.runChunk(job.kind, sheetText, plan, i)) as C;
        done += job.chunkWork(plan, i);
        control?.onProgress?.(done, total);
        return r;
      }),
    );
    return results;
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
