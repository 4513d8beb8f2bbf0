// The command line's pool of worker threads (workerpool, see DEVELOPERS.md): each thread loads the
// engine once (bin/strainsheet-worker.mjs) and runs chunks of parallel jobs.
import { availableParallelism } from 'node:os';
import { existsSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Pool } from 'workerpool';
import type { ChunkExecutor } from './runChunks';
import { SheetJobError } from '../statistics/sheetValues';

/** The number of cores Node may use (the default of --workers). */
export function defaultWorkerCount(): number {
  return availableParallelism();
}

/**
 * The worker threads' entry. Inside the bundled CLI (dist-cli/strainsheet.cjs) it is the bundle built
 * with it (dist-cli/chunkWorker.cjs), so both run the same code; from the sources (tests, benchmarks)
 * it is bin/strainsheet-worker.mjs, which takes that bundle when it is fresh and the sources otherwise.
 */
function workerScript(): string {
  const here = fileURLToPath(import.meta.url);
  if (basename(dirname(here)) === 'dist-cli') return join(dirname(here), 'chunkWorker.cjs');
  let dir = dirname(here);
  for (let i = 0; i < 5; i++) {
    const candidate = join(dir, 'bin', 'strainsheet-worker.mjs');
    if (existsSync(candidate)) return candidate;
    dir = dirname(dir);
  }
  throw new Error('cannot find bin/strainsheet-worker.mjs next to the strainsheet sources');
}

/**
 * A pool of `workers` worker threads running chunks. workerpool is loaded, and the threads started,
 * on the first request, so that commands that never use the pool do not load it (the bundle
 * initialises a module imported with import() when it is first imported).
 */
export function nodeWorkerPool(workers: number): ChunkExecutor & { loadSheet(sheetText: string): Promise<number> } {
  let started: Promise<Pool> | undefined;
  const pool = () =>
    (started ??= import('workerpool').then(({ default: workerpool }) =>
      workerpool.pool(workerScript(), { workerType: 'thread', minWorkers: workers, maxWorkers: workers }),
    ));
  return {
    /** Starts a worker (if none is idle) and builds the sheet there: the start-up cost of a worker. */
    loadSheet: async (sheetText) => (await pool()).exec('loadSheet', [sheetText]),
    async runChunk(kind, sheetText, plan, index) {
      try {
        return await (await pool()).exec('runChunk', [kind, sheetText, plan, index]);
      } catch (e) {
        // Errors cross the thread boundary as plain objects: keep the job's own kind of error.
        if ((e as Error)?.name === 'SheetJobError') throw new SheetJobError((e as Error).message);
        throw e;
      }
    },
    async close(force = false) {
      if (started) await (await started).terminate(force);
    },
  };
}
