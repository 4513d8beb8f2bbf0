// The time budgets every command takes: --cell-budget (one cell's evaluation) and --run-budget
// (the whole command). They are read before the command's own options and set the engine's
// evaluation budget (src/sheet/evaluationBudget.ts); past the run budget every evaluation stops
// with a 'limit' error, and a timer ends the process should an evaluation not reach a check.
import { DEFAULT_CELL_SECONDS, exportBudgets, setCellBudget, setRunBudget } from '../sheet/evaluationBudget';
import { UsageError } from './optionParsing';

/** Default time budget of a whole command, in seconds. */
export const DEFAULT_RUN_SECONDS = 3600;
/** Extra time after the run budget before the process is ended from outside the evaluation. */
const GRACE_SECONDS = 10;

export const BUDGET_HELP = `  --cell-budget SECONDS  time one cell's evaluation may take (default ${DEFAULT_CELL_SECONDS}); past it the
                         cell gets a 'limit' error naming the budget
  --run-budget SECONDS   time the whole command may take (default ${DEFAULT_RUN_SECONDS}); past it every
                         evaluation stops with a 'limit' error`;

function seconds(text: string | undefined, option: string): number {
  if (text === undefined) throw new UsageError(`${option} needs a number of seconds`);
  const v = /^\s*(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s*$/.test(text) ? Number(text) : NaN;
  if (!(v > 0) || !Number.isFinite(v)) throw new UsageError(`${option} must be a positive number of seconds, got "${text}"`);
  return v;
}

/**
 * Takes --cell-budget and --run-budget out of a command's arguments, sets the budgets and starts
 * the run's timer; returns the other arguments and `done`, which clears the timer and budgets.
 */
export function applyBudgetOptions(args: readonly string[], onOverrun: (message: string) => void = defaultOverrun): { args: string[]; done(): void } {
  const rest: string[] = [];
  let cell = DEFAULT_CELL_SECONDS;
  let run = DEFAULT_RUN_SECONDS;
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === '--') {
      rest.push(...args.slice(i));
      break;
    }
    const m = /^--(cell-budget|run-budget)(?:=(.*))?$/.exec(a);
    if (!m) {
      rest.push(a);
      continue;
    }
    const value = m[2] ?? args[++i];
    if (m[1] === 'cell-budget') cell = seconds(value, '--cell-budget');
    else run = seconds(value, '--run-budget');
  }
  setCellBudget(cell);
  setRunBudget(run);
  exportBudgets(process.env); // worker threads of parallel jobs start with these budgets
  // A backstop for work that never reaches a budget check (it fires once the event loop is free).
  const timer = setTimeout(() => onOverrun(`the run budget of ${run} s is used up; stopping`), (run + GRACE_SECONDS) * 1000);
  timer.unref();
  return {
    args: rest,
    done() {
      clearTimeout(timer);
      setCellBudget(DEFAULT_CELL_SECONDS);
      setRunBudget(Infinity);
      exportBudgets(process.env);
    },
  };
}

function defaultOverrun(message: string): void {
  process.stderr.write(`strainsheet: ${message}\n`);
  process.exit(2);
}
