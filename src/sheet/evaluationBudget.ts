// The evaluation budget: how long one cell's evaluation may run, a deadline for the whole run
// (the command line sets one), and how many list elements one evaluation may build in all.
// The engine calls beginCell()/endCell() around each cell; the hot spots that can run long (calls
// of function cells, list arithmetic, ranges, list literals) call checkTime() and countBuilt(),
// which throw a BuiltinError of kind 'limit' naming the budget. The clock is read lazily (the
// first check in a cell starts the cell's clock, then every 16th check reads it), so a cell that
// never reaches a check costs nothing more than two assignments.
import { BuiltinError } from './cellError';
import { MAX_ELEMENTS } from './formulaLimits';

/** Default time budget of one cell's evaluation, in seconds (the command line's --cell-budget). */
export const DEFAULT_CELL_SECONDS = 5;
/** Most list elements one cell's evaluation may build in all (ranges, list literals, results). */
export const MAX_BUILT_ELEMENTS = 20 * MAX_ELEMENTS;

let cellBudgetMs = DEFAULT_CELL_SECONDS * 1000;
/** Absolute performance.now() time after which every check fails (Infinity: no deadline). */
let runDeadline = Infinity;
let runBudgetSeconds = Infinity;
/** performance.now() at the cell's first check, or -1 before it. */
let cellStart = -1;
let ticks = 0;
let built = 0;
/** Whether a cell is being evaluated (checks outside any cell, e.g. from a job, do nothing). */
let active = false;
/** Whether the current cell's time budget ran out (set even when a built-in caught the error). */
let timedOut = false;
/** Whether a recalculation hands a cell that runs out of time on to be evaluated elsewhere (the app's page). */
let handOff = false;

/**
 * On: a cell whose evaluation in a recalculation runs out of the cell budget is not given a
 * 'limit' error but left waiting to be evaluated elsewhere, with a longer budget (the app's page
 * hands it to a worker; Sheet.offPageCells, Sheet.supplyOffPage). Off (the default): a 'limit' error.
 */
export function setHandOffOnTimeout(on: boolean): void {
  handOff = on;
}

export function handOffOnTimeout(): boolean {
  return handOff;
}

/**
 * Runs `fn` with hand-off off: for a built-in whose value the page must hold itself (its plots read
 * more than the value's JSON), so it runs to the end where it is instead of being handed off.
 */
export function withoutHandOff<T>(fn: () => T): T {
  const was = handOff;
  handOff = false;
  try {
    return fn();
  } finally {
    handOff = was;
  }
}

/** Sets the time budget of one cell's evaluation (seconds, > 0). */
export function setCellBudget(seconds: number): void {
  if (!(seconds > 0) || !Number.isFinite(seconds)) throw new RangeError(`the cell budget must be a positive number of seconds, got ${seconds}`);
  cellBudgetMs = seconds * 1000;
}

/** The time budget of one cell's evaluation, in seconds. */
export function cellBudgetSeconds(): number {
  return cellBudgetMs / 1000;
}

/** Sets a deadline `seconds` from now for everything evaluated from here on (Infinity: none). */
export function setRunBudget(seconds: number): void {
  if (!(seconds > 0)) throw new RangeError(`the run budget must be a positive number of seconds, got ${seconds}`);
  runBudgetSeconds = seconds;
  runDeadline = Number.isFinite(seconds) ? performance.now() + seconds * 1000 : Infinity;
}

/** What beginCell() saves, so that a nested evaluation gives the outer cell its clock back. */
export interface BudgetMark {
  start: number;
  ticks: number;
  built: number;
  active: boolean;
  timedOut: boolean;
}

/** Starts a cell's evaluation: its clock (read at the first check) and its element count. */
export function beginCell(): BudgetMark {
  const mark = { start: cellStart, ticks, built, active, timedOut };
  cellStart = -1;
  ticks = 0;
  built = 0;
  active = true;
  timedOut = false;
  return mark;
}

/** Ends a cell's evaluation, restoring the state beginCell() saved; true when the cell ran out of its time budget. */
export function endCell(mark: BudgetMark): boolean {
  const ranOut = timedOut;
  cellStart = mark.start;
  ticks = mark.ticks;
  built = mark.built;
  active = mark.active;
  timedOut = mark.timedOut || ranOut;
  return ranOut;
}

function seconds(ms: number): string {
  return `${Number((ms / 1000).toPrecision(3))} s`;
}

function readClock(): void {
  const now = performance.now();
  if (cellStart < 0) cellStart = now;
  else if (now - cellStart > cellBudgetMs) {
    timedOut = true;
    throw new BuiltinError(`the evaluation ran longer than its time budget of ${seconds(cellBudgetMs)} per cell (stopped after ${seconds(now - cellStart)})`, 'limit');
  }
  if (now > runDeadline) throw new BuiltinError(`the run's time budget of ${seconds(runBudgetSeconds * 1000)} is used up`, 'limit');
}

/** Throws a 'limit' error when the cell's or the run's time budget is used up (reads the clock on every 16th call). */
export function checkTime(): void {
  if (!active || (cellStart >= 0 && (++ticks & 15) !== 0)) return;
  readClock();
}

/**
 * As checkTime, where a cell that runs out of time is handed off (the app's page) and nowhere else:
 * built-ins' own long loops call it, so the page hands them off while the command line, whose
 * built-in loops are not interrupted, lets them run to the end.
 */
export function checkTimeIfHandingOff(): void {
  if (handOff) checkTime();
}

/**
 * As checkTimeIfHandingOff, reading the clock every time: for built-ins' loops that check at a
 * coarse step (once per frequency bin, per table row), each step longer than a clock read. Off the
 * page (hand-off off) it costs one comparison.
 */
export function checkTimeNowIfHandingOff(): void {
  if (handOff && active) readClock();
}

/** As checkTime, reading the clock every time (for operations that take longer than a clock read). */
export function checkTimeNow(): void {
  if (active) readClock();
}

/** Counts `n` list elements built by the current evaluation; throws past MAX_BUILT_ELEMENTS. */
export function countBuilt(n: number, what: string): void {
  if (!active) return;
  built += n;
  if (built > MAX_BUILT_ELEMENTS) {
    throw new BuiltinError(`${what}: the formula builds more than ${MAX_BUILT_ELEMENTS} list elements in all (at most ${MAX_BUILT_ELEMENTS} per cell)`, 'limit');
  }
}

/** Environment variables that carry the budgets to worker threads of the same command. */
export const CELL_BUDGET_ENV = 'STRAINSHEET_CELL_BUDGET';
export const RUN_DEADLINE_ENV = 'STRAINSHEET_RUN_DEADLINE';

/** Puts the current budgets in the environment (seconds; the run deadline as epoch milliseconds), for worker threads started later. */
export function exportBudgets(env: Record<string, string | undefined>): void {
  env[CELL_BUDGET_ENV] = String(cellBudgetMs / 1000);
  if (Number.isFinite(runDeadline)) env[RUN_DEADLINE_ENV] = `${Date.now() + (runDeadline - performance.now())}:${runBudgetSeconds}`;
  else delete env[RUN_DEADLINE_ENV];
}

/** Takes the budgets a parent thread exported (see exportBudgets); nothing when there are none. */
function importBudgets(): void {
  const env = (globalThis as { process?: { env?: Record<string, string | undefined> } }).process?.env;
  const cell = Number(env?.[CELL_BUDGET_ENV]);
  if (cell > 0 && Number.isFinite(cell)) cellBudgetMs = cell * 1000;
  const [deadline, seconds] = (env?.[RUN_DEADLINE_ENV] ?? '').split(':').map(Number);
  if (Number.isFinite(deadline) && deadline > 0 && seconds > 0) {
    runDeadline = performance.now() + (deadline - Date.now());
    runBudgetSeconds = seconds;
  }
}
importBudgets();
