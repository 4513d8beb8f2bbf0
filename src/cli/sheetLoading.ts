// Reading a sheet file for a command and applying `--set` edits, shared by every command.
import { readFileSync } from 'node:fs';
import { Sheet, SheetEditError, SheetFileError } from '../sheet/sheet';
import { sheetTextFromBytes } from '../sheet/sheetFile';
import { UsageError } from './optionParsing';

/** Thrown when the sheet file cannot be read or is invalid (exit code 2). */
export class SheetLoadError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SheetLoadError';
  }
}

/**
 * Reads and parses a sheet file; throws SheetLoadError with a readable message. With
 * `evaluateOnRead` (commands that need only some cells: jobs, plots) a cell is evaluated when it or a
 * cell reading it is first read (SheetOptions.evaluateOnRead); `evaluate` evaluates every cell.
 */
export function loadSheet(path: string, options: { evaluateOnRead?: boolean } = {}): Sheet {
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(path);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a directory' : code === 'EACCES' ? 'permission denied' : (e as Error).message;
    throw new SheetLoadError(`cannot read ${path}: ${why}`);
  }
  try {
    return Sheet.fromFile(sheetTextFromBytes(bytes), options);
  } catch (e) {
    if (e instanceof SheetFileError) throw new SheetLoadError(`${path}: ${e.message}`);
    throw e;
  }
}

const FUNCTION_HEAD = /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*\(([^()]*)\)\s*=(?!=)/;

/** Splits one `--set` text into the cell name and its formula. */
export function parseSetOption(text: string): { name: string; formula: string } {
  const fn = FUNCTION_HEAD.exec(text);
  if (fn) return { name: fn[1], formula: text.trim() };
  const eq = text.indexOf('=');
  if (eq <= 0) throw new UsageError(`--set needs name=formula, got "${text}"`);
  const name = text.slice(0, eq).trim();
  const formula = text.slice(eq + 1).trim();
  if (formula === '') throw new UsageError(`--set ${name}= needs a formula after =`);
  return { name, formula };
}

/** Applies `--set` options: replaces a cell's formula, or adds the cell. */
export function applySetOptions(sheet: Sheet, sets: readonly string[]): void {
  for (const text of sets) {
    const { name, formula } = parseSetOption(text);
    try {
      if (sheet.has(name)) sheet.updateCell(name, { formula });
      else sheet.setCell({ name, formula });
    } catch (e) {
      if (e instanceof SheetEditError) throw new UsageError(`--set ${name}: ${e.message}`);
      throw e;
    }
  }
}
