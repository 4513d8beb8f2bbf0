// Errors are values stored in a cell, never exceptions that escape the engine.

export type CellErrorKind =
  | 'syntax' // the formula does not parse (position given)
  | 'name' // a reference to a name that is not a cell or built-in
  | 'refused' // the formula uses a construct outside the allow-list
  | 'unit' // dimensions do not match
  | 'domain' // a built-in was given an argument outside its domain
  | 'nonfinite' // the result is NaN or infinite
  | 'cycle' // the cell is on a dependency cycle
  | 'input' // an input cell has an error
  | 'limit' // the formula exceeded a size or time limit
  | 'eval'; // any other evaluation failure

export interface CellError {
  kind: CellErrorKind;
  /** Plain-language message that names the cell or argument and what was wrong. */
  message: string;
  /** Character offset in the formula text, where known (syntax errors). */
  position?: number;
  /** For kind 'input': the failed input cell. For kind 'cycle': the cycle as names. */
  inputs?: string[];
}

/**
 * Thrown by built-in functions for bad arguments (out of domain, wrong unit, wrong kind).
 * The engine catches it and stores a CellError of the given kind in the calling cell.
 */
export class BuiltinError extends Error {
  readonly kind: CellErrorKind;
  constructor(message: string, kind: CellErrorKind = 'domain') {
    super(message);
    this.name = 'BuiltinError';
    this.kind = kind;
  }
}
