// The app's pool of Web Workers for the chunks of a job (workerpool, as the command line's worker
// threads): started by the job worker (jobWorker.ts) when a job has more than one chunk.
import workerpool from 'workerpool';
import chunkWorkerUrl from './chunkWebWorker.ts?shared-worker-url';
import type { ChunkExecutor } from '../../src/jobs/runChunks';
import { SheetJobError } from '../../src/statistics/sheetValues';

export { webWorkerCount } from './webWorkerCount';

export function webChunkPool(workers: number): ChunkExecutor {
  const pool = workerpool.pool(chunkWorkerUrl, {
    workerType: 'web',
    minWorkers: workers,
    maxWorkers: workers,
    workerOpts: { type: 'module', name: 'strainsheet-chunks' },
  });
  return {
    async runChunk(kind, sheetText, plan, index) {
      try {
        return await pool.exec('runChunk', [kind, sheetText, plan, index]);
      } catch (e) {
        if ((e as Error)?.name === 'SheetJobError') throw new SheetJobError((e as Error).message);
        throw e;
      }
    },
    async close(force = false) {
      await pool.terminate(force);
    },
  };
}
