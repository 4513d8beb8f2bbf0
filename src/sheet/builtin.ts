// A built-in function of the sheet: a plain implementation plus the documentation shown in the
// help panel and the reference page. Physics and statistics stay plain numeric code in
// src/physics and src/statistics; files in src/builtins adapt them (units, argument checks).

export interface BuiltinArg {
  name: string;
  /** Expected unit or kind, as shown in help: 'km/s/Mpc', 'dimensionless', 'population', 'function(z, log10M, q)'. */
  unit: string;
  description: string;
  optional?: boolean;
}

export interface Builtin {
  /** Name used in formulas; our own camelCase name. Must be a valid identifier. */
  name: string;
  /** Help grouping: 'cosmology', 'population', 'spectrum', 'orbits', 'environment', 'statistics', 'array', 'utility'. */
  category: string;
  /** One line saying what it computes. */
  summary: string;
  args: BuiltinArg[];
  returns: { unit: string; description: string };
  /** Published source of the formula, one line: authors, year, journal (or 'common practice, no source'). */
  source: string;
  /** Example formula and what it gives, for the help panel. */
  example?: string;
  /**
   * The implementation. Receives mathjs values (number, Unit, Matrix, SheetObject, or a JS function
   * for a function cell) and returns one. Throws BuiltinError for bad arguments.
   */
  fn: (...args: any[]) => unknown;
}
