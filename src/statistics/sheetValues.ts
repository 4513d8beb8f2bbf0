// The one place where the sheet-level statistics jobs (scans, Monte Carlo, goal seek, rate solve)
// meet sheet values: numbers or mathjs Units in, SI numbers out, and back. The numeric code in
// this folder stays free of mathjs.
import type { Unit } from 'mathjs';
import type { Sheet } from '../sheet/sheet';
import type { CellState } from '../sheet/types';
import { isUnit, math } from '../sheet/mathInstance';

/** A problem with a statistics job on a sheet: the message names the cell and what was wrong. */
export class SheetJobError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SheetJobError';
  }
}

/** Thrown when a job's AbortSignal fires. The sheet is never modified by a job. */
export class JobCancelledError extends Error {
  constructor() {
    super('the job was cancelled');
    this.name = 'JobCancelledError';
  }
}

/** Progress and cancellation of a long job (DOM-free: works in a Web Worker and in Node). */
export interface JobControl {
  /** Called now and then with the work done and the total, in evaluations. */
  onProgress?(done: number, total: number): void;
  signal?: AbortSignal;
}

/** The SI number of a value: a number, or a Unit's value in SI base units. */
export function siNumber(value: unknown): number | null {
  if (typeof value === 'number') return value;
  if (isUnit(value)) {
    const v = (value as Unit & { value: number | null }).value;
    return v === null ? null : v;
  }
  return null;
}

/** A value of the same kind as `template` (plain number or Unit of the same unit) holding xSI. */
export function valueLike(template: unknown, xSI: number): unknown {
  if (isUnit(template)) {
    const q = (template as Unit).clone() as Unit & { value: number };
    q.value = xSI;
    return q;
  }
  return xSI;
}

/** Unit text of a value for tables and CSV headers ('' for plain numbers). */
export function unitTextOf(value: unknown): string {
  return isUnit(value) ? (value as Unit).formatUnits() : '';
}

/** Converters from SI to a template's own unit, kept per template (values are never changed). */
const ownUnitConverters = new WeakMap<object, (xSI: number) => number>();

interface UnitTerm {
  unit: { value: unknown; offset: unknown };
  prefix: { value: unknown };
  power: unknown;
}

/**
 * The divisors mathjs's conversion to `target` applies to an SI number in turn (Unit._denormalize:
 * value / (unit value x prefix value)^power for each unit of the target), or null when a unit has an
 * offset (degC) or a value that is not a plain number, which take mathjs's own path.
 */
function plainDivisors(from: Unit, target: Unit): number[] | null {
  const terms = [...(from as unknown as { units: UnitTerm[] }).units, ...(target as unknown as { units: UnitTerm[] }).units];
  if (!terms.every((t) => t.unit.offset === 0 && typeof t.unit.value === 'number' && typeof t.prefix.value === 'number' && typeof t.power === 'number')) return null;
  return (target as unknown as { units: UnitTerm[] }).units.map((t) => math.pow((t.unit.value as number) * (t.prefix.value as number), t.power as number) as number);
}

/**
 * Converts SI numbers to the template's unit: the unit text is read and parsed once. Plain units
 * then divide by the same numbers, in the same order, as mathjs's Unit.toNumber does; units with
 * an offset set the value of one scratch copy and convert it. Either way the numbers equal
 * Unit.toNumber with the unit's text (tested), and CSV rows create no Unit per value.
 */
function ownUnitConverter(template: Unit): (xSI: number) => number {
  const scratch = template.clone() as Unit & { value: number };
  const units = scratch.formatUnits();
  if (!units) return (xSI) => xSI;
  const target = (math.Unit as unknown as { parse(text: string): Unit }).parse(units);
  const divisors = plainDivisors(scratch, target);
  if (divisors) {
    return (xSI) => {
      let x = xSI;
      for (const d of divisors) x = x / d;
      return x;
    };
  }
  return (xSI) => {
    scratch.value = xSI;
    return scratch.toNumber(target as unknown as string);
  };
}

/** A value shown in its own unit (for messages and CSV): number in that unit. */
export function inOwnUnit(template: unknown, xSI: number): number {
  if (!isUnit(template)) return xSI;
  let convert = ownUnitConverters.get(template as object);
  if (!convert) {
    convert = ownUnitConverter(template as Unit);
    ownUnitConverters.set(template as object, convert);
  }
  return convert(xSI);
}

/** The numeric value of an output state, or a clear message saying why there is none. */
export function numericState(cell: string, state: CellState | undefined): number {
  if (!state) throw new SheetJobError(`output ${cell}: there is no cell of that name`);
  if (state.status === 'error') throw new SheetJobError(`output ${cell} has an error: ${state.error.message}`);
  if (state.status !== 'value') throw new SheetJobError(`output ${cell} has no value yet`);
  const x = siNumber(state.value);
  if (x === null) throw new SheetJobError(`output ${cell} is not a single number or quantity, so it cannot be the output of a scan, Monte Carlo run or solve`);
  return x;
}

/** Like numericState, but NaN instead of an exception for a failed evaluation (used inside scans). */
export function numericOrNaN(state: CellState | undefined): number {
  if (!state || state.status !== 'value') return NaN;
  const x = siNumber(state.value);
  return x === null ? NaN : x;
}

/** The nominal value of an input cell, which must exist and be a number or quantity. */
export function nominalInput(sheet: Sheet, cell: string): { template: unknown; si: number } {
  if (!sheet.has(cell)) throw new SheetJobError(`input ${cell}: there is no cell of that name`);
  const st = sheet.state(cell);
  if (st.status === 'error') throw new SheetJobError(`input ${cell} has an error: ${st.error.message}`);
  if (st.status !== 'value') throw new SheetJobError(`input ${cell} has no value yet`);
  const si = siNumber(st.value);
  if (si === null) throw new SheetJobError(`input ${cell} is not a single number or quantity, so it cannot be varied`);
  return { template: st.value, si };
}

/** Throws JobCancelledError when the signal has fired. */
export function checkCancelled(control?: JobControl): void {
  if (control?.signal?.aborted) throw new JobCancelledError();
}

/**
 * Gives the event loop a turn so that a cancel message or a progress report can get through: with
 * setImmediate where there is one (Node: after pending input such as Ctrl-C, without the 1 ms a
 * timer waits at least), else with a timer (browsers).
 */
export function yieldToEventLoop(): Promise<void> {
  const immediate = (globalThis as { setImmediate?: (f: () => void) => unknown }).setImmediate;
  return new Promise((resolve) => (immediate ? immediate(resolve) : setTimeout(resolve, 0)));
}
