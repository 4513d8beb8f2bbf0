// Scans of a sheet: one input over a range (outputs against it, with the measured band), or two
// inputs on a grid (a likelihood map with highest-posterior-density contours). When the output
// goes as the square root of an axis input (A_yr and the merger-rate normalisation, Phinney 2001,
// astro-ph/0108028), that axis costs no evaluations: one line is computed and scaled.
import type { Sheet } from '../sheet/sheet';
import { F_YR_HZ } from '../physics/constants';
import { atReferenceFrequency, measurementInterval, type AmplitudeMeasurement } from './measurement';
import type { AxisPrior } from './credibleRegion';
import { ONE_SIGMA_LEVEL, TWO_SIGMA_LEVEL } from './sampleSummary';
import { SheetJobError, inOwnUnit, nominalInput, numericState, unitTextOf, type JobControl } from './sheetValues';
import { runChunkedJob, type ParallelOptions } from '../jobs/runChunks';
import { scan1dJob } from './scan1dJob';
import { scan2dJob } from './scan2dJob';

export const MAX_AXIS_POINTS = 10_000;
export const MAX_GRID_POINTS = 1_000_000;

export interface ScanAxis {
  cell: string;
  /** Range in SI (the cell's value in SI base units). */
  lo: number;
  hi: number;
  n: number;
  log: boolean;
  /** Prior for likelihood maps (default: log-uniform on a log axis, uniform on a linear one). */
  prior?: AxisPrior;
}

export interface AxisResult {
  cell: string;
  valuesSI: Float64Array;
  /** The same values in the cell's own unit. */
  values: Float64Array;
  unit: string;
  log: boolean;
  prior: AxisPrior;
}

/** Validated grid points of an axis. */
export function axisValues(axis: ScanAxis, show: (xSI: number) => string = String): Float64Array {
  const { cell, lo, hi, n, log } = axis;
  if (!Number.isInteger(n) || n < 2) throw new SheetJobError(`scan of ${cell}: the number of points must be a whole number of at least 2, got ${n}`);
  if (n > MAX_AXIS_POINTS) throw new SheetJobError(`scan of ${cell}: at most ${MAX_AXIS_POINTS} points per axis, got ${n}`);
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) throw new SheetJobError(`scan of ${cell}: the range ends must be finite, got ${lo} to ${hi}`);
  if (lo === hi) throw new SheetJobError(`scan of ${cell}: the range is empty (both ends are ${show(lo)})`);
  if (lo > hi) throw new SheetJobError(`scan of ${cell}: the range is reversed (${show(lo)} to ${show(hi)}); give the lower end first`);
  if (log && !(lo > 0)) throw new SheetJobError(`scan of ${cell}: a log scan needs a positive lower end, got ${show(lo)}`);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / (n - 1);
    out[i] = log ? Math.exp(Math.log(lo) + t * (Math.log(hi) - Math.log(lo))) : lo + t * (hi - lo);
  }
  out[0] = lo;
  out[n - 1] = hi;
  return out;
}

export function axisResult(sheet: Sheet, axis: ScanAxis): { result: AxisResult; template: unknown; nominal: number } {
  const nom = nominalInput(sheet, axis.cell);
  const unit = unitTextOf(nom.template);
  const valuesSI = axisValues(axis, (x) => `${Number(inOwnUnit(nom.template, x).toPrecision(10))}${unit ? ` ${unit}` : ''}`);
  const values = valuesSI.map((x) => inOwnUnit(nom.template, x));
  const prior = axis.prior ?? (axis.log ? 'log-uniform' : 'uniform');
  if (prior === 'log-uniform' && !(axis.lo > 0)) throw new SheetJobError(`scan of ${axis.cell}: a log-uniform prior needs a positive range`);
  return { result: { cell: axis.cell, valuesSI, values, unit: unitTextOf(nom.template), log: axis.log, prior }, template: nom.template, nominal: nom.si };
}

/** The measured band at f_yr (median and the stated interval, or 68.27% when none). */
export interface MeasuredBand {
  median: number;
  lower: number;
  upper: number;
  level: number;
}
export function measuredBand(m: AmplitudeMeasurement): MeasuredBand {
  const at = m.fRefHz === F_YR_HZ ? m : atReferenceFrequency(m, F_YR_HZ);
  const level = at.stated ? at.stated.level : ONE_SIGMA_LEVEL;
  const iv = at.stated ?? measurementInterval(at, level);
  return { median: 10 ** at.log10Median, lower: iv.lower, upper: iv.upper, level };
}

/** An output must exist and hold a single number or quantity at the sheet's own values. */
export function requireNumericOutput(sheet: Sheet, output: string, job: string): void {
  if (!sheet.has(output)) throw new SheetJobError(`${job}: there is no output cell ${output}`);
  try {
    numericState(output, sheet.state(output));
  } catch (e) {
    throw new SheetJobError(`${job}: ${(e as Error).message}`);
  }
}

export interface Scan1DResult {
  axis: AxisResult;
  /** Output values in SI, one per axis point (NaN where the output had an error). */
  outputs: Record<string, Float64Array>;
  units: Record<string, string>;
  /** Outputs obtained by scaling one evaluation (sqrt law checked with two probes). */
  scaled: string[];
  failures: number;
  firstError?: string;
  band?: MeasuredBand;
}

export function outputUnit(sheet: Sheet, cell: string): string {
  const st = sheet.state(cell);
  return st.status === 'value' ? unitTextOf(st.value) : '';
}

/** A one-input scan (scan1dJob.ts), in this thread or on workers (`parallel`). */
export async function scan1D(
  sheet: Sheet,
  axis: ScanAxis,
  outputs: string[],
  opts: { measurement?: AmplitudeMeasurement } = {},
  control?: JobControl,
  parallel?: ParallelOptions,
): Promise<Scan1DResult> {
  return runChunkedJob(scan1dJob, sheet, { axis, outputs, measurement: opts.measurement }, control, parallel);
}

export interface Scan2DResult {
  x: AxisResult;
  y: AxisResult;
  output: string;
  unit: string;
  /** Output values in SI, row-major: values[iy * nx + ix]. */
  values: Float64Array;
  /** Which axis (if any) was obtained by the sqrt scaling instead of evaluations. */
  scaledAxis: 'x' | 'y' | null;
  evaluations: number;
  failures: number;
  firstError?: string;
  /** With a measurement: likelihood relative to its peak value 1, posterior mass per cell and HPD levels. */
  band?: MeasuredBand;
  likelihood?: Float64Array;
  posterior?: Float64Array;
  levels?: number[];
  /** Posterior-mass thresholds per level: cells with posterior >= threshold are inside. */
  thresholds?: number[];
  enclosed?: number[];
  priors?: string;
}

/** 68.27% and 95.45%: the 1- and 2-sigma probabilities of a normal, as for the Monte Carlo intervals. */
export const DEFAULT_CREDIBLE_LEVELS = [ONE_SIGMA_LEVEL, TWO_SIGMA_LEVEL];

/** A two-input map (scan2dJob.ts), in this thread or on workers (`parallel`). */
export async function scan2D(
  sheet: Sheet,
  xAxis: ScanAxis,
  yAxis: ScanAxis,
  output: string,
  opts: { measurement?: AmplitudeMeasurement; levels?: number[] } = {},
  control?: JobControl,
  parallel?: ParallelOptions,
): Promise<Scan2DResult> {
  return runChunkedJob(scan2dJob, sheet, { x: xAxis, y: yAxis, output, measurement: opts.measurement, levels: opts.levels }, control, parallel);
}
