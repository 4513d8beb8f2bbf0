// Runs one job on a private copy of the sheet (DOM-free: used inside the job worker). Scans go
// through Sheet.evaluateWith, which leaves the copy's own state untouched; credible regions and
// likelihoods come from src/statistics.
import { Sheet } from '../../src/sheet/sheet';
import { math } from '../../src/sheet/mathInstance';
import { isSheetObject } from '../../src/sheet/sheetObject';
import type { CellState } from '../../src/sheet/types';
import { axisPriorWeights, hpdThresholds } from '../../src/statistics/credibleRegion';
import { atReferenceFrequency, measurementFromInterval, relativeLikelihood, type AmplitudeMeasurement } from '../../src/statistics/measurement';
import { ONE_SIGMA_LEVEL, TWO_SIGMA_LEVEL } from '../../src/statistics/sampleSummary';
import { F_YR_HZ } from '../../src/physics/constants';
import { measuredFromJson } from '../plots/sheetPlotData';
import type { JobResult, JobSpec, Scan1Result, Scan2Result, ScanAxisSpec } from './jobProtocol';
import { runSampleJob } from './sampleJob';

export interface JobControl {
  signal: AbortSignal;
  progress: (done: number, total: number) => void;
}

export class JobCancelled extends Error {
  constructor() {
    super('the job was cancelled');
    this.name = 'JobCancelled';
  }
}

/** Evenly spaced values from lo to hi (in log when asked). */
export function axisValues(a: ScanAxisSpec): number[] {
  const out: number[] = [];
  for (let k = 0; k < a.n; k++) {
    const t = a.n === 1 ? 0 : k / (a.n - 1);
    out.push(a.log ? a.lo * Math.pow(a.hi / a.lo, t) : a.lo + (a.hi - a.lo) * t);
  }
  return out;
}

/** The value a scanned cell takes: a plain number or a quantity in the axis unit. */
export function overrideValue(a: ScanAxisSpec, v: number): unknown {
  return a.unit ? math.unit(v, a.unit) : v;
}

/** A cell state as a plain SI number, or a message saying why there is none. */
export function stateToNumber(name: string, s: CellState | undefined): number | string {
  if (!s) return `${name} was not computed`;
  if (s.status === 'error') return s.error.message;
  if (s.status === 'pending') return `${name} is still pending`;
  const v = s.value;
  if (typeof v === 'number') return v;
  if (math.isUnit(v)) {
    const si = (v as unknown as { value: number | null }).value;
    return si ?? `${name} is a unit without a value`;
  }
  return `${name} is not a single number`;
}

/** Lets the worker read messages (cancel) now and then; resolves after pending events. */
function breathe(): Promise<void> {
  return new Promise((r) => setTimeout(r, 0));
}

function measurementOf(sheet: Sheet, name: string): AmplitudeMeasurement {
  const v = sheet.value(name);
  if (!isSheetObject(v) || v.kind !== 'measurement') throw new Error(`${name} is not a measurement cell`);
  const m = measuredFromJson(name, v.toJSON());
  if (!m) throw new Error(`${name}: the measurement has no amplitude interval`);
  const parsed = measurementFromInterval(m.median, m.lower, m.upper, m.level, m.gamma, m.fRefHz);
  // Outputs like A_yr are amplitudes at f_yr: compare at that frequency.
  return Math.abs(parsed.fRefHz - F_YR_HZ) / F_YR_HZ > 1e-9 ? atReferenceFrequency(parsed, F_YR_HZ) : parsed;
}

async function scanOne(sheet: Sheet, job: Extract<JobSpec, { kind: 'scan1' }>, ctl: JobControl): Promise<Scan1Result> {
  const xs = axisValues(job.axis);
  const y: number[] = [];
  const failures: Scan1Result['failures'] = [];
  let last = performance.now();
  for (let i = 0; i < xs.length; i++) {
    if (ctl.signal.aborted) throw new JobCancelled();
    const r = sheet.evaluateWith({ [job.axis.cell]: overrideValue(job.axis, xs[i]) }, [job.output]);
    const v = stateToNumber(job.output, r[job.output]);
    if (typeof v === 'number') y.push(v);
    else {
      y.push(NaN);
      if (failures.length < 5) failures.push({ index: i, message: v });
    }
    if (performance.now() - last > 30) {
      ctl.progress(i + 1, xs.length);
      await breathe();
      last = performance.now();
    }
  }
  ctl.progress(xs.length, xs.length);
  return { kind: 'scan1', input: job.axis, output: job.output, x: xs, y, failures };
}

async function scanTwo(sheet: Sheet, job: Extract<JobSpec, { kind: 'scan2' }>, ctl: JobControl): Promise<Scan2Result> {
  const m = measurementOf(sheet, job.measurement);
  const xs = axisValues(job.x);
  const ys = axisValues(job.y);
  const nx = xs.length;
  const total = nx * ys.length;
  // Priors: log-uniform on log-spaced axes, uniform on linear ones (so every grid cell has equal prior mass).
  const wx = axisPriorWeights({ values: Float64Array.from(xs), log: job.x.log, prior: job.x.log ? 'log-uniform' : 'uniform' });
  const wy = axisPriorWeights({ values: Float64Array.from(ys), log: job.y.log, prior: job.y.log ? 'log-uniform' : 'uniform' });
  const mass = new Float64Array(total);
  const failures: Scan2Result['failures'] = [];
  let last = performance.now();
  for (let j = 0; j < ys.length; j++) {
    for (let i = 0; i < nx; i++) {
      if (ctl.signal.aborted) throw new JobCancelled();
      const r = sheet.evaluateWith({ [job.x.cell]: overrideValue(job.x, xs[i]), [job.y.cell]: overrideValue(job.y, ys[j]) }, [job.output]);
      const v = stateToNumber(job.output, r[job.output]);
      if (typeof v === 'number' && v > 0) mass[i + nx * j] = relativeLikelihood(m, v) * wx[i] * wy[j];
      else if (failures.length < 5) failures.push({ index: i + nx * j, message: typeof v === 'number' ? `${job.output} = ${v} is not a positive amplitude` : v });
      if (performance.now() - last > 30) {
        ctl.progress(i + 1 + nx * j, total);
        await breathe();
        last = performance.now();
      }
    }
  }
  ctl.progress(total, total);
  const levels = [ONE_SIGMA_LEVEL, TWO_SIGMA_LEVEL];
  const hpd = hpdThresholds(mass, levels);
  const prior = `${job.x.log ? 'log-uniform' : 'uniform'} in ${job.x.cell}, ${job.y.log ? 'log-uniform' : 'uniform'} in ${job.y.cell}, over the grid`;
  return {
    kind: 'scan2',
    x: job.x,
    y: job.y,
    output: job.output,
    xValues: xs,
    yValues: ys,
    mass: Array.from(hpd.posterior),
    levels: levels.map((level, k) => ({ level, threshold: hpd.thresholds[k] })),
    prior,
    failures,
  };
}

export async function runJob(sheetText: string, job: JobSpec, ctl: JobControl): Promise<JobResult> {
  const sheet = Sheet.fromFile(sheetText);
  for (const name of job.kind === 'scan2' ? [job.x.cell, job.y.cell] : job.kind === 'scan1' ? [job.axis.cell] : []) {
    if (!sheet.has(name)) throw new Error(`there is no cell named ${name} to scan`);
  }
  if (!sheet.has(job.output)) throw new Error(`there is no output cell named ${job.output}`);
  if (job.kind === 'scan1') return scanOne(sheet, job, ctl);
  if (job.kind === 'scan2') return scanTwo(sheet, job, ctl);
  return runSampleJob(sheet, job, ctl);
}
