/// <reference lib="webworker" />
// One Web Worker of the app's chunk pool (webChunkPool.ts): rebuilds the sheet from its file text and
// runs chunks of scans and Monte Carlo (src/jobs/chunkRuntime.ts).
import workerpool from 'workerpool';
import { runChunkInWorker } from '../../src/jobs/chunkRuntime';

workerpool.worker({ runChunk: runChunkInWorker });
