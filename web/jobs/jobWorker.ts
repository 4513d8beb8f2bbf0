/// <reference lib="webworker" />
// The job worker: runs scans and Monte Carlo samples away from the page, so the sheet stays live.
// It builds its own Sheet from the file text; the page's sheet is never touched. Scans and samples
// run their chunks on a pool of further Web Workers (webChunkPool.ts), one per core.
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
    }, { workers: m.workers ?? webWorkerCount(), pool: webChunkPool });
    if (controller.signal.aborted) send({ type: 'cancelled', jobId: m.jobId });
    else send({ type: 'result', jobId: m.jobId, result, elapsedMs: performance.now() - t0 });
  } catch (err) {
    if (controller.signal.aborted) send({ type: 'cancelled', jobId: m.jobId });
    else send({ type: 'error', jobId: m.jobId, message: err instanceof Error ? err.message : String(err) });
  } finally {
    running.delete(m.jobId);
  }
};
