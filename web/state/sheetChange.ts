// What an edit changed in a sheet, found and applied without copying or rebuilding the sheet: the
// cells between the longest unchanged start and end of the list (the engine gives a changed cell a
// new spec object, so the unchanged ends are found by identity, then by content), the title and the
// notes. Undo applies a change backwards, redo forwards, as edits of the live sheet: only the cells
// that changed and those that read them are recalculated, and the values are those of the sheet
// rebuilt from its file (the engine's incremental recalculation, test/sheet/properties.test.ts).
import { Sheet, type CellSpec } from '../engine/engine';
import { FILE_FORMAT, FILE_VERSION, serializeSheetFile } from '../../src/sheet/sheetFile';

/** A sheet's contents at one moment: its cells' specs (the engine's own objects, never changed), title and notes. */
export interface SheetCapture {
  title: string;
  notes: string;
  specs: readonly Readonly<CellSpec>[];
}

export function captureSheet(sheet: Sheet): SheetCapture {
  return { title: sheet.title, notes: sheet.notes, specs: sheet.specList() };
}

interface Side {
  title: string;
  notes: string;
  /** The cells between the unchanged start and end, in order. */
  middle: Readonly<CellSpec>[];
}

/** A change from one capture to another (empty when they hold the same sheet). */
export interface SheetChange {
  /** Cells at the start of the list that did not change. */
  start: number;
  before: Side;
  after: Side;
}

const SPEC_KEYS = ['name', 'formula', 'unit', 'note', 'source', 'section', 'uncertainty', 'prior'] as const;

function sameSpec(a: Readonly<CellSpec>, b: Readonly<CellSpec>): boolean {
  return a === b || SPEC_KEYS.every((k) => a[k] === b[k]);
}

/** The change from `a` to `b`: a pass over the unchanged ends, then the cells between them. */
export function changeBetween(a: SheetCapture, b: SheetCapture): SheetChange {
  const x = a.specs;
  const y = b.specs;
  let start = 0;
  while (start < x.length && start < y.length && sameSpec(x[start], y[start])) start++;
  let end = 0;
  while (end < x.length - start && end < y.length - start && sameSpec(x[x.length - 1 - end], y[y.length - 1 - end])) end++;
  return {
    start,
    before: { title: a.title, notes: a.notes, middle: x.slice(start, x.length - end) },
    after: { title: b.title, notes: b.notes, middle: y.slice(start, y.length - end) },
  };
}

export function isEmptyChange(c: SheetChange): boolean {
  return c.before.middle.length === 0 && c.after.middle.length === 0 && c.before.title === c.after.title && c.before.notes === c.after.notes;
}

/**
 * Brings a sheet that holds one side of the change to the other side (`to`), by edits: cells that
 * are not on that side are removed, changed or new ones set, then the order, title and notes.
 */
export function applyChange(sheet: Sheet, change: SheetChange, to: 'before' | 'after'): void {
  const target = change[to];
  const from = change[to === 'before' ? 'after' : 'before'];
  const wanted = new Map(target.middle.map((c) => [c.name, c]));
  const present = new Map(from.middle.map((c) => [c.name, c]));
  for (const c of from.middle) if (!wanted.has(c.name)) sheet.removeCell(c.name);
  for (const c of target.middle) {
    const now = present.get(c.name);
    if (!now || !sameSpec(now, c)) sheet.setCell({ ...c });
  }
  // The unchanged start stays in place; the cells after it are the target's middle, then the
  // unchanged end in its own order (new cells were added at the very end).
  const names = sheet.specList().map((c) => c.name);
  const order = [...names.slice(0, change.start), ...target.middle.map((c) => c.name), ...names.slice(change.start).filter((n) => !wanted.has(n))];
  if (order.some((n, i) => n !== names[i])) sheet.reorder(order);
  if (sheet.title !== target.title) sheet.title = target.title;
  if (sheet.notes !== target.notes) sheet.notes = target.notes;
}

/** The file text of a capture (the last resort when a change cannot be applied: rebuild from it). */
export function captureText(c: SheetCapture): string {
  return serializeSheetFile({ format: FILE_FORMAT, version: FILE_VERSION, title: c.title, notes: c.notes, cells: c.specs as CellSpec[] });
}
