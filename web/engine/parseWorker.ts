// Reads and checks sheet file text off the page's thread (a large file takes a noticeable time to
// parse and validate); the plain SheetFile comes back by structured clone.
import { parseSheetFile, SheetFileError } from '../../src/sheet/sheetFile';

export type ParseReply = { ok: true; file: ReturnType<typeof parseSheetFile> } | { ok: false; message: string; fileError: boolean };

self.onmessage = (e: MessageEvent<{ text: string }>) => {
  let reply: ParseReply;
  try {
    reply = { ok: true, file: parseSheetFile(e.data.text) };
  } catch (err) {
    reply = { ok: false, message: err instanceof Error ? err.message : String(err), fileError: err instanceof SheetFileError };
  }
  (self as unknown as Worker).postMessage(reply);
};
