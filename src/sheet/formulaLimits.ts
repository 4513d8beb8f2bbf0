// Limits on formulas and values (errors of kind 'limit' when exceeded).

/** Longest formula accepted, in characters (long enough for pasted CSV text in quotes). */
export const MAX_FORMULA_LENGTH = 200_000;
/** Deepest bracket nesting accepted before parsing (protects the recursive parser). */
export const MAX_NESTING = 64;
/** Most tree nodes in one formula. */
export const MAX_NODES = 20_000;
/** Most elements a range literal, a matrix literal, a list operation's result or any cell value may have. */
export const MAX_ELEMENTS = 1_000_000;
