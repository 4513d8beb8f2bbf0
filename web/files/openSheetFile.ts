// Reading a sheet file the user picked or dropped. The bytes are decoded as the command line
// decodes them (UTF-8 with or without byte-order mark, UTF-16; anything else refused with the byte
// offset), then parsed into a new Sheet; only when that succeeds does the caller replace the
// current one, so a bad file leaves the sheet untouched. A file that is not text (an image, a PDF,
// an archive, any binary data) is named as such; its bytes never appear in a message.
import { sheetTextFromBytes } from '../engine/engine';
import { firstBinaryCharacter, knownBinaryKind, lineAndColumn, printable } from './binaryContent';

/** Files larger than this are refused before reading (the engine has its own limit too). */
export const MAX_SHEET_FILE_BYTES = 5_000_000;

export type OpenOutcome<T> = { ok: true; sheet: T } | { ok: false; message: string };

const SHEET_IS = 'a sheet file is JSON text (such as name.strainsheet.json)';

export async function openSheetFile<T>(file: Blob & { name?: string }, parse: (text: string) => T | Promise<T>): Promise<OpenOutcome<T>> {
  const label = file.name ? `"${printable(file.name, 120)}"` : 'The file';
  const refuse = (why: string): OpenOutcome<T> => ({ ok: false, message: printable(`${label} was not opened: ${sentence(why)} The sheet is unchanged.`) });
  if (file.size > MAX_SHEET_FILE_BYTES) {
    return refuse(`it is ${(file.size / 1e6).toFixed(1)} MB, more than the ${MAX_SHEET_FILE_BYTES / 1e6} MB a sheet file may have`);
  }
  let bytes: Uint8Array;
  try {
    bytes = new Uint8Array(await file.arrayBuffer());
  } catch (err) {
    return { ok: false, message: printable(`${label} could not be read (${err instanceof Error ? err.message : String(err)}). The sheet is unchanged.`) };
  }
  const kind = knownBinaryKind(bytes);
  if (kind) return refuse(`it is ${kind}, not a sheet; ${SHEET_IS}`);
  let text: string;
  try {
    text = sheetTextFromBytes(bytes);
  } catch (err) {
    return refuse(`${err instanceof Error ? err.message : String(err)}; ${SHEET_IS}`);
  }
  const bad = firstBinaryCharacter(text);
  if (bad >= 0) {
    const at = lineAndColumn(text, bad);
    const code = text.charCodeAt(bad).toString(16).toUpperCase().padStart(4, '0');
    return refuse(`it holds binary data, not text (character U+${code} at line ${at.line}, column ${at.column}); ${SHEET_IS}`);
  }
  try {
    return { ok: true, sheet: await parse(text) };
  } catch (err) {
    return refuse(err instanceof Error ? err.message : String(err));
  }
}

/** Ends a message with a full stop unless it already ends with punctuation. */
function sentence(text: string): string {
  const t = text.trim();
  return /[.!?]$/.test(t) ? t : `${t}.`;
}
