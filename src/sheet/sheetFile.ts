// The sheet file format (our own, JSON):
//   { "format": "strainsheet", "version": 1, "title": "...", "notes": "...",
//     "cells": [ { "name", "formula", "unit"?, "note"?, "source"?, "section"?, "uncertainty"?, "prior"? } ] }
// Version 2 added "prior"; a file is written as version 1 when no cell has a prior, so files
// without priors stay readable by older versions and keep their bytes.
// Keys are written in that order, empty optional cell fields are left out, 2-space indent and a
// trailing newline, so saving what was loaded gives the same bytes. Loading validates everything
// and refuses a bad file with a message that names the problem.
// zod/mini: the tree-shakable form of zod (about 17 kB in the bundle instead of 85 kB); it carries no
// locale, so every check below gives its own message and the rest are worded in parseSheetFile.
import * as z from 'zod/mini';
import type { CellSpec } from './types';
import { fieldNameInVersion, migrateToCurrent } from './sheetMigrations';
import { jsonStructure } from './jsonStructure';
import { decodeFileBytes, FileEncodingError } from './fileEncoding';

export const FILE_FORMAT = 'strainsheet';
export const FILE_VERSION = 2;
/** The version written for a sheet that uses no version-2 field. */
export const FILE_VERSION_WITHOUT_PRIORS = 1;
/** Largest file accepted, in bytes of UTF-8. */
export const MAX_FILE_BYTES = 5 * 1024 * 1024;
/** Most cells a file may hold. */
export const MAX_FILE_CELLS = 20_000;
/** Deepest nesting of objects and lists accepted (a sheet file has 3 levels). */
export const MAX_FILE_DEPTH = 32;

export interface SheetFile {
  format: typeof FILE_FORMAT;
  version: number;
  title: string;
  notes: string;
  cells: CellSpec[];
}

/** A file that cannot be read as a sheet; the message says why. */
export class SheetFileError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SheetFileError';
  }
}

const CELL_KEYS = ['name', 'formula', 'unit', 'note', 'source', 'section', 'uncertainty', 'prior'] as const;
const HOSTILE_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/** Text of at most `max` characters, with the message zod's locale would otherwise supply. */
const textUpTo = (max: number) => z.string().check(z.maxLength(max, `longer than ${max} characters`));

const cellSchema = z.strictObject({
  name: z.string().check(z.minLength(1, 'the cell name is empty'), z.maxLength(64, 'the cell name is longer than 64 characters')),
  formula: z.string(),
  unit: z.optional(textUpTo(200)),
  note: z.optional(z.string()),
  source: z.optional(z.string()),
  section: z.optional(textUpTo(200)),
  uncertainty: z.optional(z.string()),
  prior: z.optional(z.string()),
});

const fileSchema = z.strictObject({
  format: z.literal(FILE_FORMAT),
  version: z.literal(FILE_VERSION),
  title: z.optional(textUpTo(1000)),
  notes: z.optional(z.string()),
  cells: z.array(cellSchema).check(z.maxLength(MAX_FILE_CELLS, `a sheet file may hold at most ${MAX_FILE_CELLS} cells`)),
});

/** A cell with keys in canonical order and empty optional fields left out. */
export function canonicalCell(spec: CellSpec): CellSpec {
  const out: Record<string, string> = { name: spec.name, formula: spec.formula };
  for (const key of CELL_KEYS.slice(2)) {
    const v = spec[key];
    if (typeof v === 'string' && v !== '') out[key] = v;
  }
  return out as unknown as CellSpec;
}

/** The canonical text of a sheet file. */
export function serializeSheetFile(file: SheetFile, cellText: (cell: CellSpec) => string = cellFileText): string {
  const cells = file.cells;
  const header = {
    format: FILE_FORMAT,
    version: cells.some((c) => typeof c.prior === 'string' && c.prior !== '') ? FILE_VERSION : FILE_VERSION_WITHOUT_PRIORS,
    title: file.title ?? '',
    notes: file.notes ?? '',
    cells: [],
  };
  // JSON.stringify(whole file, null, 2), put together from each cell's own text (which a sheet
  // keeps, so that saving a long sheet after an edit does not write every cell again).
  const head = JSON.stringify(header, null, 2);
  if (cells.length === 0) return `${head}\n`;
  return `${head.slice(0, -'[]\n}'.length)}[\n${cells.map(cellText).join(',\n')}\n  ]\n}\n`;
}

/** A cell's text in a sheet file: canonical keys, indented for its place in the list of cells. */
export function cellFileText(cell: CellSpec): string {
  return JSON.stringify(canonicalCell(cell), null, 2).replace(/^/gm, '    ');
}

function where(path: ReadonlyArray<PropertyKey>, version = FILE_VERSION): string {
  if (path.length === 0) return 'the file';
  let out = '';
  path.forEach((p, i) => {
    // name fields as the file's own version calls them
    const field = typeof p === 'string' ? fieldNameInVersion(p, version, path[0] === 'cells' && i === 2 ? 'cell' : 'file') : p;
    out += typeof field === 'number' ? `[${field + 1}]` : out ? `.${String(field)}` : String(field);
  });
  return out.replace(/^cells\[(\d+)\]/, 'cell $1');
}

function utf8Length(text: string): number {
  if (text.length > MAX_FILE_BYTES) return text.length; // at least this many bytes
  return new TextEncoder().encode(text).length;
}

/** The text of a sheet file's bytes (UTF-8, with or without byte-order mark, or UTF-16); throws SheetFileError naming the encoding problem. */
export function sheetTextFromBytes(bytes: Uint8Array): string {
  if (bytes.length > MAX_FILE_BYTES) {
    throw new SheetFileError(`the file is too large (${(bytes.length / 1048576).toFixed(1)} MB; a sheet file may be at most 5 MB)`);
  }
  try {
    return decodeFileBytes(bytes).text;
  } catch (e) {
    if (e instanceof FileEncodingError) throw new SheetFileError(e.message);
    throw e;
  }
}

/** Parses and validates sheet file text (migrating older versions); throws SheetFileError. */
export function parseSheetFile(text: string): SheetFile {
  if (typeof text !== 'string') throw new SheetFileError('the sheet file must be text');
  const bytes = utf8Length(text);
  if (bytes > MAX_FILE_BYTES) {
    throw new SheetFileError(`the file is too large (${(bytes / 1048576).toFixed(1)} MB; a sheet file may be at most 5 MB)`);
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1); // a byte-order mark left by the decoder
  if (text.trim() === '') throw new SheetFileError('the file is empty');
  const structure = jsonStructure(text);
  if (structure.depth > MAX_FILE_DEPTH) {
    throw new SheetFileError(`the file nests objects and lists ${structure.depth} levels deep; a sheet file has 3 (at most ${MAX_FILE_DEPTH} are read)`);
  }
  let data: unknown;
  let hostile: string | undefined;
  try {
    data = JSON.parse(text, (key, value) => {
      if (HOSTILE_KEYS.has(key)) hostile ??= key;
      return value;
    });
  } catch (e) {
    const detail = (e as Error).message.replace(/^JSON\.parse: /, '');
    throw new SheetFileError(`the file is not valid JSON (it may be truncated or damaged): ${detail}`);
  }
  if (hostile !== undefined) throw new SheetFileError(`the file contains the key "${hostile}", which sheet files never use; it was refused`);
  if (structure.duplicate) throw new SheetFileError(duplicateMessage(structure.duplicate, data));
  if (typeof data !== 'object' || data === null || Array.isArray(data)) {
    throw new SheetFileError('the file is not a Strainsheet sheet (expected a JSON object)');
  }
  const record = data as Record<string, unknown>;
  if (record.format !== FILE_FORMAT) {
    throw new SheetFileError(`the file is not a Strainsheet sheet (its "format" should be "${FILE_FORMAT}")`);
  }
  const version = record.version;
  if (typeof version !== 'number' || !Number.isInteger(version) || version < 0) {
    throw new SheetFileError('the file has no valid "version" (a whole number)');
  }
  if (version > FILE_VERSION) {
    throw new SheetFileError(`the file was made by a newer Strainsheet (file version ${version}; this one reads versions up to ${FILE_VERSION})`);
  }
  const migrated = version < FILE_VERSION ? migrateToCurrent(record, version) : record;
  if (Array.isArray(migrated.cells) && migrated.cells.length > MAX_FILE_CELLS) {
    throw new SheetFileError(`the file has ${migrated.cells.length} cells; a sheet file may hold at most ${MAX_FILE_CELLS}`);
  }
  const parsed = fileSchema.safeParse(migrated);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    let detail = issue.message;
    if (issue.code === 'unrecognized_keys') detail = `unknown field${issue.keys.length > 1 ? 's' : ''} ${issue.keys.map((k) => `"${k}"`).join(', ')}`;
    else if (issue.code === 'invalid_type') detail = `expected ${issue.expected === 'string' ? 'text' : issue.expected}`;
    else if (issue.code === 'invalid_value') detail = `expected ${issue.values.map((v) => JSON.stringify(v)).join(' or ')}`;
    throw new SheetFileError(`the sheet file is invalid at ${where(issue.path, version)}: ${detail}`);
  }
  const f = parsed.data;
  const seen = new Map<string, number>();
  f.cells.forEach((c, i) => {
    const first = seen.get(c.name);
    if (first !== undefined) throw new SheetFileError(`the cell name ${c.name} appears twice (cells ${first + 1} and ${i + 1})`);
    seen.set(c.name, i);
  });
  return {
    format: FILE_FORMAT,
    version: FILE_VERSION,
    title: f.title ?? '',
    notes: f.notes ?? '',
    cells: f.cells.map((c) => canonicalCell(c as CellSpec)),
  };
}

/** Names a repeated key and where it is: the cell by number and name, or the field. */
function duplicateMessage(dup: { key: string; path: Array<string | number> }, data: unknown): string {
  const { key, path } = dup;
  if (path[0] === 'cells' && typeof path[1] === 'number') {
    const cell = (data as { cells?: unknown[] }).cells?.[path[1]] as { name?: unknown } | undefined;
    const name = typeof cell?.name === 'string' ? ` (${cell.name})` : '';
    const inside = path.length > 2 ? ` inside ${where(path)}` : '';
    return `the key "${key}" appears twice in cell ${path[1] + 1}${name}${inside}; a file must give each field once`;
  }
  return `the key "${key}" appears twice in ${path.length ? where(path) : "the file's top level"}; a file must give each field once`;
}
