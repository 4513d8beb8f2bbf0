/// <reference lib="webworker" />
// One Web Worker of the app's chunk pool (webChunkPool.ts): rebuilds the sheet from its file text and
// runs chunks of scans and Monte Carlo, as src/jobs/chunkRuntime.ts does on the command line, with
// each job kind's code (webJobKinds.ts) and the groups of built-ins the sheet names
// (web/engine/lazyBuiltins.ts) loaded when a chunk first needs them.
import workerpool from 'workerpool';
import { Sheet } from '../../src/sheet/sheet';
import type { ChunkPlan } from '../../src/jobs/chunkedJob';
import { loadBuiltinsNamedIn } from '../engine/builtinsNeeded';
import { loadJobKind } from './webJobKinds';

let cached: { text: string; sheet: Sheet } | null = null;

function sheetFor(text: string): Sheet {
  if (cached?.text !== text) cached = { text, sheet: Sheet.fromFile(text, { evaluateOnRead: true }) };
  return cached.sheet;
}

/** No progress or cancellation inside a chunk run by a worker: the pool ends the worker to cancel. */
const NO_CONTROL = { tick: async () => {} };

workerpool.worker({
  runChunk: async (kind: string, sheetText: string, plan: ChunkPlan, index: number) => {
    const [job] = await Promise.all([loadJobKind(kind), loadBuiltinsNamedIn(sheetText)]);
    return job.runChunk(sheetFor(sheetText), plan, index, NO_CONTROL);
  },
});
