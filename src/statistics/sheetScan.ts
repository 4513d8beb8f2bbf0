// Scans of a sheet: one input over a range (outputs against it, with the measured band), or two
// inputs on a grid (a likelihood map with highest-posterior-density contours). When the output
// goes as the square root of an axis input (A_yr and the merger-rate normalisation, Phinney 2001,
// astro-ph/0108028), that axis costs no evaluations: one line is computed and scaled.
import type { Sheet } from '../sheet/sheet';
import { F_YR_HZ } from '../physics/constants';
import { atReferenceFrequency, measurementInterval, relativeLikelihood, type AmplitudeMeasurement } from './measurement';
import { axisPriorWeights, hpdThresholds, type AxisPrior } from './credibleRegion';
import { checkSqrtProportional } from './proportionality';
import { ONE_SIGMA_LEVEL, TWO_SIGMA_LEVEL } from './sampleSummary';
import {
  SheetJobError,
  checkCancelled,
  inOwnUnit,
  nominalInput,
  numericOrNaN,
  numericState,
  unitTextOf,
  valueLike,
  yieldToEventLoop,
  type JobControl,
} from './sheetValues';

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

function axisResult(sheet: Sheet, axis: ScanAxis): { result: AxisResult; template: unknown; nominal: number } {
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

/** Pacing of progress reports and event-loop turns (ms of work between them). */
const SLICE_MS = 30;

class Pacer {
  private last = Date.now();
  constructor(
    private readonly control: JobControl | undefined,
    private readonly total: number,
  ) {}
  async tick(done: number): Promise<void> {
    checkCancelled(this.control);
    const now = Date.now();
    if (now - this.last >= SLICE_MS || done === this.total) {
      this.last = now;
      this.control?.onProgress?.(done, this.total);
      await yieldToEventLoop();
      checkCancelled(this.control);
    }
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

function outputUnit(sheet: Sheet, cell: string): string {
  const st = sheet.state(cell);
  return st.status === 'value' ? unitTextOf(st.value) : '';
}

export async function scan1D(
  sheet: Sheet,
  axis: ScanAxis,
  outputs: string[],
  opts: { measurement?: AmplitudeMeasurement } = {},
  control?: JobControl,
): Promise<Scan1DResult> {
  if (outputs.length === 0) throw new SheetJobError('scan: name at least one output cell');
  for (const o of outputs) requireNumericOutput(sheet, o, 'scan');
  const { result: ax, template, nominal } = axisResult(sheet, axis);
  const n = ax.valuesSI.length;
  const res: Record<string, Float64Array> = {};
  const units: Record<string, string> = {};
  const scaled: string[] = [];
  const direct: string[] = [];
  for (const o of outputs) {
    res[o] = new Float64Array(n);
    units[o] = outputUnit(sheet, o);
    let sqrtLaw = false;
    if (nominal > 0 && axis.lo > 0) {
      try {
        sqrtLaw = checkSqrtProportional(sheet, axis.cell, o).proportional;
      } catch {
        sqrtLaw = false;
      }
    }
    if (sqrtLaw) {
      const y0 = numericOrNaN(sheet.state(o));
      for (let i = 0; i < n; i++) res[o][i] = y0 * Math.sqrt(ax.valuesSI[i] / nominal);
      scaled.push(o);
    } else direct.push(o);
  }
  let failures = 0;
  let firstError: string | undefined;
  const pacer = new Pacer(control, n);
  if (direct.length) {
    for (let i = 0; i < n; i++) {
      const r = sheet.evaluateWith({ [axis.cell]: valueLike(template, ax.valuesSI[i]) }, direct);
      for (const o of direct) {
        const st = r[o];
        res[o][i] = numericOrNaN(st);
        if (Number.isNaN(res[o][i])) {
          failures++;
          if (!firstError) firstError = st?.status === 'error' ? st.error.message : `${o} is not a number at ${axis.cell} = ${ax.values[i]}`;
        }
      }
      await pacer.tick(i + 1);
    }
  } else {
    control?.onProgress?.(n, n);
  }
  return { axis: ax, outputs: res, units, scaled, failures, firstError, band: opts.measurement ? measuredBand(opts.measurement) : undefined };
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

export async function scan2D(
  sheet: Sheet,
  xAxis: ScanAxis,
  yAxis: ScanAxis,
  output: string,
  opts: { measurement?: AmplitudeMeasurement; levels?: number[] } = {},
  control?: JobControl,
): Promise<Scan2DResult> {
  if (xAxis.cell === yAxis.cell) throw new SheetJobError(`scan: the two axes must be different cells, both are ${xAxis.cell}`);
  requireNumericOutput(sheet, output, 'scan');
  const X = axisResult(sheet, xAxis);
  const Y = axisResult(sheet, yAxis);
  const nx = X.result.valuesSI.length;
  const ny = Y.result.valuesSI.length;
  if (nx * ny > MAX_GRID_POINTS) throw new SheetJobError(`scan: at most ${MAX_GRID_POINTS} grid points, got ${nx} x ${ny}`);
  const values = new Float64Array(nx * ny);
  let failures = 0;
  let firstError: string | undefined;
  let evaluations = 0;

  // Does the output go as sqrt of one axis? Probe at the nominal point and at the ends of the other axis.
  const sqrtIn = (A: typeof X, B: typeof X, bAxis: ScanAxis): boolean => {
    if (!(A.nominal > 0) || !(A.result.valuesSI[0] > 0)) return false;
    try {
      const ends = [B.result.valuesSI[0], B.result.valuesSI[B.result.valuesSI.length - 1]];
      if (!checkSqrtProportional(sheet, A.result.cell, output).proportional) return false;
      return ends.every((b) => checkSqrtProportional(sheet, A.result.cell, output, { [bAxis.cell]: valueLike(B.template, b) }).proportional);
    } catch {
      return false;
    }
  };
  const scaledAxis: 'x' | 'y' | null = sqrtIn(Y, X, xAxis) ? 'y' : sqrtIn(X, Y, yAxis) ? 'x' : null;

  const record = (k: number, st: ReturnType<Sheet['evaluateWith']>[string], where: string) => {
    const v = numericOrNaN(st);
    if (Number.isNaN(v)) {
      failures++;
      if (!firstError) firstError = st?.status === 'error' ? st.error.message : `${output} is not a number at ${where}`;
    }
    return v;
  };

  if (scaledAxis) {
    // One line along the evaluated axis at the nominal value of the scaled one.
    const E = scaledAxis === 'y' ? X : Y;
    const S = scaledAxis === 'y' ? Y : X;
    const nE = E.result.valuesSI.length;
    const pacer = new Pacer(control, nE);
    const line = new Float64Array(nE);
    for (let i = 0; i < nE; i++) {
      const r = sheet.evaluateWith({ [E.result.cell]: valueLike(E.template, E.result.valuesSI[i]) }, [output]);
      evaluations++;
      line[i] = record(i, r[output], `${E.result.cell} = ${E.result.values[i]}`);
      await pacer.tick(i + 1);
    }
    const factors = S.result.valuesSI.map((s) => Math.sqrt(s / S.nominal));
    for (let iy = 0; iy < ny; iy++) {
      for (let ix = 0; ix < nx; ix++) {
        values[iy * nx + ix] = scaledAxis === 'y' ? line[ix] * factors[iy] : line[iy] * factors[ix];
      }
    }
    if (failures) failures *= scaledAxis === 'y' ? ny : nx;
  } else {
    const pacer = new Pacer(control, nx * ny);
    for (let iy = 0; iy < ny; iy++) {
      const yv = valueLike(Y.template, Y.result.valuesSI[iy]);
      for (let ix = 0; ix < nx; ix++) {
        const r = sheet.evaluateWith({ [xAxis.cell]: valueLike(X.template, X.result.valuesSI[ix]), [yAxis.cell]: yv }, [output]);
        evaluations++;
        values[iy * nx + ix] = record(iy * nx + ix, r[output], `${xAxis.cell} = ${X.result.values[ix]}, ${yAxis.cell} = ${Y.result.values[iy]}`);
        await pacer.tick(iy * nx + ix + 1);
      }
    }
  }

  const result: Scan2DResult = {
    x: X.result,
    y: Y.result,
    output,
    unit: outputUnit(sheet, output),
    values,
    scaledAxis,
    evaluations,
    failures,
    firstError,
  };
  if (opts.measurement) {
    const m = opts.measurement;
    const levels = opts.levels ?? DEFAULT_CREDIBLE_LEVELS;
    const likelihood = new Float64Array(nx * ny);
    const mass = new Float64Array(nx * ny);
    const wx = axisPriorWeights({ values: X.result.valuesSI, log: xAxis.log, prior: X.result.prior });
    const wy = axisPriorWeights({ values: Y.result.valuesSI, log: yAxis.log, prior: Y.result.prior });
    const mAtYr = m.fRefHz === F_YR_HZ ? m : atReferenceFrequency(m, F_YR_HZ);
    for (let iy = 0; iy < ny; iy++) {
      for (let ix = 0; ix < nx; ix++) {
        const k = iy * nx + ix;
        const v = values[k];
        const L = Number.isFinite(v) && v > 0 ? relativeLikelihood(mAtYr, v) : 0;
        likelihood[k] = L;
        mass[k] = L * wx[ix] * wy[iy];
      }
    }
    let hpd;
    try {
      hpd = hpdThresholds(mass, levels);
    } catch (e) {
      throw new SheetJobError(`scan: ${(e as Error).message} (the measurement allows none of the scanned range)`);
    }
    Object.assign(result, {
      band: measuredBand(m),
      likelihood,
      posterior: hpd.posterior,
      levels,
      thresholds: hpd.thresholds,
      enclosed: hpd.enclosed,
      priors: `${xAxis.cell}: ${X.result.prior}, ${yAxis.cell}: ${Y.result.prior} over the scanned ranges`,
    });
  }
  return result;
}
