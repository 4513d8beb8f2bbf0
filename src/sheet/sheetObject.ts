// Values that are not numbers, units or matrices (populations, spectra, distributions, ...)
// are SheetObjects: built-ins create them, other built-ins consume them, the UI and CLI show them.

export interface SheetObject {
  /** What the object is, e.g. 'population', 'spectrum', 'cosmology', 'distribution'. */
  readonly kind: string;
  /** One short line for the value column, e.g. "spectrum, 40 frequencies, 1.9 nHz to 79 nHz". */
  describe(): string;
  /** Plain JSON (numbers in SI) for `strainsheet evaluate --json` and CSV export. */
  toJSON(): unknown;
}

export function isSheetObject(v: unknown): v is SheetObject {
  return (
    typeof v === 'object' &&
    v !== null &&
    typeof (v as SheetObject).kind === 'string' &&
    typeof (v as SheetObject).describe === 'function' &&
    typeof (v as SheetObject).toJSON === 'function'
  );
}
