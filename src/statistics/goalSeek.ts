// Goal seek on the sheet: the value of one input cell for which an output cell takes a target
// value, by bracket widening (log space for positive inputs) and Brent's method (Brent 1973).
import type { Sheet } from '../sheet/sheet';
import { brentRoot, findBracket, NoRootError } from './rootFinding';
import { SheetJobError, nominalInput, numericOrNaN, valueLike, inOwnUnit, unitTextOf } from './sheetValues';

export interface GoalSeekOptions {
  input: string;
  output: string;
  /** Target value of the output, in SI (a plain number for dimensionless outputs). */
  target: number;
  /** Search limits for the input, SI. Positive inputs are searched in log space within (0, inf) by default. */
  lo?: number;
  hi?: number;
  /** Relative tolerance on the input (default 1e-10). */
  relTol?: number;
}

export interface GoalSeekResult {
  input: string;
  output: string;
  valueSI: number;
  /** The solution in the input cell's own unit, and as a value for the cell (number or Unit). */
  value: number;
  unit: string;
  cellValue: unknown;
  achievedSI: number;
  evaluations: number;
}

export function goalSeek(sheet: Sheet, opts: GoalSeekOptions): GoalSeekResult {
  const { input, output, target } = opts;
  if (!Number.isFinite(target)) throw new SheetJobError(`goal seek: the target for ${output} must be a finite number, got ${target}`);
  const nom = nominalInput(sheet, input);
  if (!sheet.has(output)) throw new SheetJobError(`goal seek: there is no output cell ${output}`);
  if (opts.lo !== undefined && opts.hi !== undefined && !(opts.lo < opts.hi)) {
    throw new SheetJobError(`goal seek: the search range for ${input} is empty or reversed (${opts.lo} to ${opts.hi})`);
  }
  const f = (x: number) => {
    const r = sheet.evaluateWith({ [input]: valueLike(nom.template, x) }, [output]);
    return numericOrNaN(r[output]) - target;
  };
  const positive = nom.si > 0 && (opts.lo === undefined || opts.lo >= 0);
  let start = nom.si;
  if (opts.lo !== undefined && start < opts.lo) start = opts.lo;
  if (opts.hi !== undefined && start > opts.hi) start = opts.hi;
  if (positive && start === 0) start = opts.hi !== undefined ? opts.hi / 2 : 1;
  try {
    const b = findBracket(f, start, { positive, lo: opts.lo, hi: opts.hi });
    const r = b.a === b.b ? { x: b.a, fx: b.fa, evaluations: 0 } : brentRoot(f, b.a, b.b, { fa: b.fa, fb: b.fb, relTol: opts.relTol ?? 1e-10 });
    return {
      input,
      output,
      valueSI: r.x,
      value: inOwnUnit(nom.template, r.x),
      unit: unitTextOf(nom.template),
      cellValue: valueLike(nom.template, r.x),
      achievedSI: r.fx + target,
      evaluations: b.evaluations + r.evaluations,
    };
  } catch (e) {
    if (e instanceof NoRootError) throw new SheetJobError(`goal seek: no value of ${input} gives ${output} = ${target}: ${e.message}`);
    throw e;
  }
}
