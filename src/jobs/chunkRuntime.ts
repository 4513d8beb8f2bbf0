// The worker's side of a parallel job (worker threads and Web Workers alike): rebuild the sheet from
// its file text (kept while the same text comes again; cells are evaluated when a chunk reads them)
// and run one chunk of a registered job kind.
import { Sheet } from '../sheet/sheet';
import { chunkedJobOf } from './chunkedJob';
import type { ChunkPlan } from './chunkedJob';
import { registerJobKinds } from './jobKinds';

registerJobKinds();

let cached: { text: string; sheet: Sheet } | null = null;

function sheetFor(text: string): Sheet {
  if (cached?.text !== text) cached = { text, sheet: Sheet.fromFile(text, { evaluateOnRead: true }) };
  return cached.sheet;
}

/** No progress or cancellation inside a chunk run by a worker: the pool ends the worker to cancel. */
const NO_CONTROL = { tick: async () => {} };

export async function runChunkInWorker(kind: string, sheetText: string, plan: ChunkPlan, index: number): Promise<unknown> {
  return chunkedJobOf(kind).runChunk(sheetFor(sheetText), plan, index, NO_CONTROL);
}

/** Builds (and keeps) the sheet of `sheetText` without running a chunk; gives its number of cells. For measuring worker start-up. */
export function loadSheetInWorker(sheetText: string): number {
  return sheetFor(sheetText).cells().length;
}
