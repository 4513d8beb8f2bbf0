import type { CellError } from './cellError';

/** A cell as the user writes it and the file stores it. */
export interface CellSpec {
  /** Identifier; the cell's address. */
  name: string;
  /** mathjs expression, or a function definition `f(x, y) = body` (then name must be `f`). */
  formula: string;
  /** Display unit, e.g. 'Mpc', 'nHz'. Values stay SI inside; only the display converts. */
  unit?: string;
  /** Free text shown beside the cell. */
  note?: string;
  /** Published source of the assumption the cell holds (authors, year, journal). */
  source?: string;
  /** Grouping on screen: 'cosmology', 'population', 'orbits', 'array', 'measurement', 'results', or the user's own. */
  section?: string;
  /**
   * Optional uncertainty for Monte Carlo propagation, as a formula giving a distribution,
   * e.g. `lognormalDist(1e-3, 0.3)`. The formula above stays the nominal value.
   */
  uncertainty?: string;
  /**
   * Optional prior for inference, as a formula giving a distribution (like `uncertainty`). A cell
   * with a prior is a free parameter of `infer`. The engine stores the text and never reads it.
   */
  prior?: string;
}

/**
 * Status of a cell as observers see it. A pending cell may be waiting for an evaluation off the
 * page (the app): `offPage` when it is evaluated elsewhere itself (the ticket names that
 * evaluation, `since` is performance.now() when it was handed on), `waitsFor` when an input it
 * reads, directly or not, is.
 */
export type CellState =
  | { status: 'pending'; offPage?: OffPageTicket; waitsFor?: string }
  | { status: 'value'; value: unknown }
  | { status: 'error'; error: CellError };

/** Observer interface shared by the UI and the command line. */
export interface SheetObserver {
  pending?(name: string): void;
  value?(name: string, value: unknown): void;
  error?(name: string, error: CellError): void;
  /** A cell was added, removed, renamed or its spec changed (structure of the sheet). */
  structure?(): void;
}

/** An evaluation handed off the page: supplied back with Sheet.supplyOffPage(name, ticket, state). */
export interface OffPageTicket {
  ticket: number;
  since: number;
}
