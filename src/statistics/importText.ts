// Shared pieces of reading measurement files (CSV through papaparse, JSON through jsonc-parser, both
// for their positions): the error that names file, line and column, number and frequency parsing.
import Papa from 'papaparse';
import { YEAR_S } from '../physics/constants';

export class ImportError extends Error {
  constructor(
    readonly file: string,
    readonly line: number | null,
    readonly column: number | null,
    readonly detail: string,
  ) {
    super(`${file}${line !== null ? `, line ${line}` : ''}${column !== null ? `, column ${column}` : ''}: ${detail}`);
    this.name = 'ImportError';
  }
}

/** Largest data file read, in characters. */
export const MAX_IMPORT_CHARS = 50_000_000;

export interface CsvRow {
  /** 1-based line number in the file. */
  line: number;
  cells: string[];
}

/** Rows of CSV text, skipping blank lines and '#' comment lines; each row keeps its line number. */
export function csvRows(text: string, file: string): CsvRow[] {
  if (text.length > MAX_IMPORT_CHARS) throw new ImportError(file, null, null, `the file has ${text.length} characters; at most ${MAX_IMPORT_CHARS}`);
  const parsed = Papa.parse<string[]>(text, { delimiter: '', quoteChar: '"' });
  const bad = parsed.errors.find((e) => e.type === 'Quotes');
  if (bad) throw new ImportError(file, (bad.row ?? 0) + 1, null, `${bad.message.toLowerCase()} (a quote is not closed)`);
  const rows: CsvRow[] = [];
  // With no quoted newlines (checked above) papaparse's row i is line i + 1.
  parsed.data.forEach((cells, i) => {
    const first = (cells[0] ?? '').trim();
    if (cells.length === 1 && first === '') return;
    if (first.startsWith('#')) return;
    rows.push({ line: i + 1, cells: cells.map((c) => c.trim()) });
  });
  return rows;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** A finite number from a CSV cell, or an ImportError naming where and what. */
export function numberCell(text: string, file: string, line: number, column: number, what: string): number {
  if (text === '') throw new ImportError(file, line, column, `${what} is empty`);
  if (/^[+-]?(nan|inf|infinity)$/i.test(text)) throw new ImportError(file, line, column, `${what} is "${text}", not a finite number`);
  if (!NUMBER.test(text)) throw new ImportError(file, line, column, `${what}: "${text.slice(0, 40)}" is not a number`);
  return Number(text);
}

const FREQUENCY_UNITS: Record<string, number> = { hz: 1, nhz: 1e-9, uhz: 1e-6, '1/yr': 1 / YEAR_S, per_yr: 1 / YEAR_S };

/** A frequency written as "<number> <unit>" (nHz, uHz, Hz, 1/yr), in Hz. */
export function frequencyWithUnit(text: string, file: string, line: number, column: number): number {
  const m = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([A-Za-z/_1]*)$/.exec(text.trim());
  if (!m) throw new ImportError(file, line, column, `"${text.slice(0, 40)}" is not a frequency with a unit (e.g. 2.26 nHz)`);
  if (m[2] === '') throw new ImportError(file, line, column, `the frequency ${m[1]} has no unit; write e.g. "${m[1]} nHz" (nHz, uHz, Hz or 1/yr)`);
  const scale = FREQUENCY_UNITS[m[2].toLowerCase()];
  if (scale === undefined) throw new ImportError(file, line, column, `unknown frequency unit "${m[2]}" (nHz, uHz, Hz or 1/yr)`);
  const f = Number(m[1]) * scale;
  if (!(f > 0)) throw new ImportError(file, line, column, `the frequency must be positive, got ${text}`);
  return f;
}

/** The scale to Hz of a long-format frequency column header f_Hz, f_nHz, f_uHz or f_per_yr (null if not one). */
export function frequencyColumnScale(header: string): number | null {
  const m = /^f_(hz|nhz|uhz|per_yr)$/i.exec(header.trim());
  return m ? FREQUENCY_UNITS[m[1].toLowerCase()] : null;
}

/** 1-based line and column of a character offset in text. */
export function lineColumnAt(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let last = -1;
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      last = i;
    }
  }
  return { line, column: offset - last };
}
