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

/**
 * Converts SI numbers to the template's unit: the unit text is read and parsed once, then each
 * call sets the value of one scratch copy and converts it (Unit.toNumber with the parsed unit
 * gives the same number as with its text), so CSV rows create no Unit per value.
 */
function ownUnitConverter(template: Unit): (xSI: number) => number {
  const scratch = template.clone() as Unit & { value: number };
  const units = scratch.formatUnits();
  if (!units) return (xSI) => xSI;
  const target = (math.Unit as unknown as { parse(text: string): Unit }).parse(units);
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
