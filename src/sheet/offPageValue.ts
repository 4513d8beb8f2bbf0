// A value that was computed off the page (in the app's worker) and cannot be rebuilt on it: a
// SheetObject (a spectrum, a population, ...) or a function. The page keeps this stand-in, which
// describes the value and writes its JSON, and never evaluates a cell that reads it: such a cell is
// evaluated off the page too (Sheet.offPageCells), where the real value is.

import type { SheetObject } from './sheetObject';

export class OffPageValue implements SheetObject {
  readonly kind = 'offPage';
  constructor(
    /** The kind of the value held off the page ('spectrum', 'function', ...). */
    readonly heldKind: string,
    /** The value's own one-line description. */
    readonly description: string,
    private readonly json: unknown,
  ) {}
  describe(): string {
    return `${this.description} (held off the page)`;
  }
  toJSON(): unknown {
    return this.json;
  }
}

export function isOffPageValue(v: unknown): v is OffPageValue {
  return v instanceof OffPageValue;
}
