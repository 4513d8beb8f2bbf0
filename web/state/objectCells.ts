// The cells whose value is a sheet object or a function: what the plots and the key results look
// for. Kept up to date from the cells the engine reports as changed, so a view that wants them
// reads a short list instead of every cell of a long sheet.
import { isSheetObject } from '../engine/engine';

/** Whether a value is one the whole-sheet views look for (a sheet object or a function cell's function). */
export function isObjectValue(v: unknown): boolean {
  return typeof v === 'function' || isSheetObject(v);
}

export class ObjectCells {
  private names = new Set<string>();
  private sorted: string[] | null = null;

  /** Notes a cell's current value (undefined: no value, or no such cell). */
  update(name: string, value: unknown): void {
    const is = value !== undefined && isObjectValue(value);
    if (is === this.names.has(name)) return;
    if (is) this.names.add(name);
    else this.names.delete(name);
    this.sorted = null;
  }

  /** Forgets names that are no longer cells. */
  keepOnly(has: (name: string) => boolean): void {
    for (const n of this.names) if (!has(n)) this.update(n, undefined);
    this.sorted = null; // the sheet order may have changed too
  }

  /** Starts again from every cell of a sheet. */
  rebuild(names: Iterable<string>, valueOf: (name: string) => unknown): void {
    this.names = new Set();
    this.sorted = null;
    for (const n of names) this.update(n, valueOf(n));
  }

  /** The names in sheet order (`position` gives a cell's place). */
  inOrder(position: (name: string) => number): string[] {
    this.sorted ??= [...this.names].sort((a, b) => position(a) - position(b));
    return this.sorted;
  }

  get size(): number {
    return this.names.size;
  }
}
