// Opening a sheet without holding the page: the text is parsed and checked in a worker, then the
// cells are compiled a slice at a time on the page's thread (between slices the page handles its
// events), and the sheet comes back with its recalculation deferred (SheetSession runs it in slices).
import { Sheet, SheetFileError } from '../../src/sheet/sheet';
import { parseSheetFile, type SheetFile } from '../../src/sheet/sheetFile';
import type { ParseReply } from './parseWorker';
import { APP_SLICE_MS, yieldToPage } from './slices';

/** Files shorter than this are parsed on the page's thread (starting a worker costs more). */
const PARSE_IN_WORKER_FROM = 200_000;

function parseInWorker(text: string): Promise<SheetFile> {
  return new Promise((resolve, reject) => {
    let worker: Worker;
    try {
      worker = new Worker(new URL('./parseWorker.ts', import.meta.url), { type: 'module', name: 'strainsheet-parse' });
    } catch {
      resolve(parseSheetFile(text)); // no workers here: parse on this thread
      return;
    }
    worker.onmessage = (e: MessageEvent<ParseReply>) => {
      worker.terminate();
      const r = e.data;
      if (r.ok) resolve(cellsInSlices(r.head, r.cellChunks));
      else reject(r.fileError ? new SheetFileError(r.message) : new Error(r.message));
    };
    worker.onerror = (e) => {
      worker.terminate();
      reject(new Error(`the sheet file could not be read: ${e.message || 'the reading worker failed'}`));
    };
    worker.postMessage({ text });
  });
}

/** The checked cells from the worker's chunks of JSON text, one chunk per task. */
async function cellsInSlices(head: Omit<SheetFile, 'cells'>, chunks: string[]): Promise<SheetFile> {
  const cells: SheetFile['cells'] = [];
  for (const chunk of chunks) {
    for (const c of JSON.parse(chunk) as SheetFile['cells']) cells.push(c);
    await yieldToPage();
  }
  return { ...head, cells };
}

/** Parses, checks and builds a sheet from file text; rejects with SheetFileError naming the problem. */
export async function loadSheet(text: string): Promise<Sheet> {
  const file = text.length < PARSE_IN_WORKER_FROM ? parseSheetFile(text) : await parseInWorker(text);
  const sheet = await Sheet.fromFileInSlices(file, yieldToPage, APP_SLICE_MS);
  // Its last slice ends a task of its own: putting the sheet in place is the next one.
  await yieldToPage();
  return sheet;
}
