// Reading a sheet file the user picked or dropped. The bytes are decoded as the command line
// decodes them (UTF-8 with or without byte-order mark, UTF-16; anything else refused with the byte
// offset), then parsed into a new Sheet; only when that succeeds does the caller replace the
// current one, so a bad file leaves the sheet untouched.
import { sheetTextFromBytes } from '../engine/engine';

/** Files larger than this are refused before reading (the engine has its own limit too). */
export const MAX_SHEET_FILE_BYTES = 5_000_000;

export type OpenOutcome<T> = { ok: true; sheet: T } | { ok: false; message: string };

export async function openSheetFile<T>(file: Blob & { name?: string }, parse: (text: string) => T | Promise<T>): Promise<OpenOutcome<T>> {
  const label = file.name ? `"${file.name}"` : 'The file';
  if (file.size > MAX_SHEET_FILE_BYTES) {
    return { ok: false, message: `${label} was not opened: it is ${(file.size / 1e6).toFixed(1)} MB, more than the ${MAX_SHEET_FILE_BYTES / 1e6} MB a sheet file may have. The sheet is unchanged.` };
  }
  let bytes: Uint8Array;
  try {
    bytes = new Uint8Array(await file.arrayBuffer());
  } catch (err) {
    return { ok: false, message: `${label} could not be read (${err instanceof Error ? err.message : String(err)}). The sheet is unchanged.` };
  }
  try {
    return { ok: true, sheet: await parse(sheetTextFromBytes(bytes)) };
  } catch (err) {
    return { ok: false, message: `${label} was not opened: ${sentence(err instanceof Error ? err.message : String(err))} The sheet is unchanged.` };
  }
}

/** Ends a message with a full stop unless it already ends with punctuation. */
function sentence(text: string): string {
  const t = text.trim();
  return /[.!?]$/.test(t) ? t : `${t}.`;
}
