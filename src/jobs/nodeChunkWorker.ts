// Entry of a worker thread of the command line's pool (nodeWorkerPool.ts), started through
// bin/strainsheet-worker.mjs.
import workerpool from 'workerpool';
import { loadSheetInWorker, runChunkInWorker } from './chunkRuntime';

workerpool.worker({ runChunk: runChunkInWorker, loadSheet: loadSheetInWorker });
