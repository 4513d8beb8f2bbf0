/// <reference lib="webworker" />
// The job worker: runs scans and Monte Carlo samples away from the page, so the sheet stays live.
// It builds its own Sheet from the file text; the page's sheet is never touched. Scans and samples
// run their chunks on a pool of further Web Workers (webChunkPool.ts): as many as the page asks for,
// or, by default, one per core once the job proves long (runChunks.ts, startAfterMs).
import type { FromWorker, ToWorker } from './jobProtocol';
import { runJob } from './jobRunner';
import type { ChunkExecutor } from '../../src/jobs/runChunks';
import { webWorkerCount } from './webWorkerCount';

/** The pool of chunk workers, its code (workerpool) loaded when a job first needs one. */
function webChunkPool(workers: number): ChunkExecutor {
  const pool = import('./webChunkPool').then((m) => m.webChunkPool(workers));
  return {
    runChunk: async (kind, sheetText, plan, index) => (await pool).runChunk(kind, sheetText, plan, index),
    close: async (force) => (await pool).close(force),
  };
}

/**
 * Without a worker count, chunks run here until the work left would take this long here; the rest go
 * to one Web Worker per core. Each of those first loads the engine and rebuilds the sheet (0.5-1 s
 * on a 2-core laptop, README, performance), so they pay only for longer jobs.
 */
const WEB_START_AFTER_MS = 1000;

const scope = self as unknown as DedicatedWorkerGlobalScope;
const running = new Map<number, AbortController>();

function send(m: FromWorker): void {
  scope.postMessage(m);
}

scope.onmessage = async (e: MessageEvent<ToWorker>) => {
  const m = e.data;
  if (m.type === 'cancel') {
    running.get(m.jobId)?.abort();
    return;
  }
  const controller = new AbortController();
  running.set(m.jobId, controller);
  const t0 = performance.now();
  try {
    const result = await runJob(m.sheetText, m.job, {
      signal: controller.signal,
      progress: (done, total, detail) => send({ type: 'progress', jobId: m.jobId, done, total, detail }),
    }, m.workers === undefined ? { workers: webWorkerCount(), pool: webChunkPool, startAfterMs: WEB_START_AFTER_MS } : { workers: m.workers, pool: webChunkPool });
    if (controller.signal.aborted) send({ type: 'cancelled', jobId: m.jobId });
    else send({ type: 'result', jobId: m.jobId, result, elapsedMs: performance.now() - t0 });
  } catch (err) {
    if (controller.signal.aborted) send({ type: 'cancelled', jobId: m.jobId });
    else send({ type: 'error', jobId: m.jobId, message: err instanceof Error ? err.message : String(err) });
  } finally {
    running.delete(m.jobId);
  }
};
