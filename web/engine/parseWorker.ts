// Reads and checks sheet file text off the page's thread (a large file takes a noticeable time to
// parse and validate). The checked cells come back as JSON text in chunks of CELLS_PER_CHUNK, which
// the page turns into objects one chunk per task: a structured clone of every cell at once would
// be taken apart in one long task on the page's thread.
import { parseSheetFile, SheetFileError, type SheetFile } from '../../src/sheet/sheetFile';

export const CELLS_PER_CHUNK = 1000;

export type ParseReply =
  | { ok: true; head: Omit<SheetFile, 'cells'>; cellChunks: string[] }
  | { ok: false; message: string; fileError: boolean };

self.onmessage = (e: MessageEvent<{ text: string }>) => {
  let reply: ParseReply;
  try {
    const { cells, ...head } = parseSheetFile(e.data.text);
    const cellChunks: string[] = [];
    for (let i = 0; i < cells.length; i += CELLS_PER_CHUNK) cellChunks.push(JSON.stringify(cells.slice(i, i + CELLS_PER_CHUNK)));
    reply = { ok: true, head, cellChunks };
  } catch (err) {
    reply = { ok: false, message: err instanceof Error ? err.message : String(err), fileError: err instanceof SheetFileError };
  }
  (self as unknown as Worker).postMessage(reply);
};
