// Long statistics jobs described as plain data, so that a Web Worker (or the CLI) can run them:
// the caller posts a JobSpec, gets progress through onProgress and cancels with an AbortSignal.
// Jobs evaluate through Sheet.evaluateWith and never modify the sheet.
//
//   const sheet = Sheet.fromFile(text);
//   const ctl = new AbortController();
//   const result = await runJob(sheet, { kind: 'scan', vary: [{ cell: 'rate_norm', lo: '1e-4 Mpc^-3 Gyr^-1',
//     hi: '1e-2 Mpc^-3 Gyr^-1', n: 100, log: true }], outputs: ['A_yr'], measurementCell: 'measured' },
//     { onProgress: (done, total) => post({ done, total }), signal: ctl.signal });
import { realiseJob, type RealiseOptions, type RealiseResult } from './realiseJob';
import type { Sheet } from '../sheet/sheet';
import { isSheetObject } from '../sheet/sheetObject';
import type { AmplitudeMeasurement } from './measurement';
import type { AxisPrior } from './credibleRegion';
import type { Scan1DResult, Scan2DResult, ScanAxis } from './sheetScan';
import type { MonteCarloResult } from './sheetMonteCarlo';
import { scan1dJob } from './scan1dJob';
import { scan2dJob } from './scan2dJob';
import { monteCarloJob } from './monteCarloJob';
import type { AnyChunkedJob } from '../jobs/chunkedJob';
import { runChunkedJob, type ParallelOptions } from '../jobs/runChunks';
import { goalSeek, type GoalSeekResult } from './goalSeek';
import { solveRateForMeasurement, type RateSolveResult } from './rateSolve';
import { SheetJobError, nominalInput, siNumber, type JobControl } from './sheetValues';

/** A range end: a formula as text ('1e-3 Mpc^-3 Gyr^-1', '2 * rate_norm'), or a number in the cell's display unit (or SI). */
export type Bound = string | number;

export interface AxisSpec {
  cell: string;
  lo: Bound;
  hi: Bound;
  n: number;
  log?: boolean;
  prior?: AxisPrior;
}

export type JobSpec =
  | { kind: 'scan'; vary: AxisSpec[]; outputs: string[]; measurementCell?: string; levels?: number[] }
  | { kind: 'sample'; samples: number; seed: number; outputs: string[]; measurementCell?: string }
  | { kind: 'goalSeek'; input: string; output: string; target: Bound; lo?: Bound; hi?: Bound }
  | { kind: 'rate'; measurementCell: string; rateCell?: string; output?: string; densityCell?: string }
  | ({ kind: 'realise' } & RealiseOptions);

export type JobResult =
  | { kind: 'scan1d'; result: Scan1DResult }
  | { kind: 'scan2d'; result: Scan2DResult }
  | { kind: 'sample'; result: MonteCarloResult }
  | { kind: 'goalSeek'; result: Omit<GoalSeekResult, 'cellValue'> }
  | { kind: 'rate'; result: RateSolveResult }
  | { kind: 'realise'; result: RealiseResult };

/** The measurement held by a cell (a 'measurement' SheetObject from measuredAmplitude and friends). */
export function measurementOfCell(sheet: Sheet, cell: string): AmplitudeMeasurement {
  if (!sheet.has(cell)) throw new SheetJobError(`measurement cell ${cell}: there is no cell of that name`);
  const st = sheet.state(cell);
  if (st.status === 'error') throw new SheetJobError(`measurement cell ${cell} has an error: ${st.error.message}`);
  const v = st.status === 'value' ? st.value : undefined;
  if (!isSheetObject(v) || v.kind !== 'measurement' || !(v as unknown as { measurement?: unknown }).measurement) {
    throw new SheetJobError(`measurement cell ${cell} must hold a measurement (e.g. measuredAmplitude(...)), got ${isSheetObject(v) ? `a ${v.kind}` : typeof v}`);
  }
  return (v as unknown as { measurement: AmplitudeMeasurement }).measurement;
}

/** A bound in SI for a cell: formula text evaluated in the sheet, or a number in the cell's display unit. */
export function boundSI(sheet: Sheet, cell: string, bound: Bound, what: string): number {
  const nom = nominalInput(sheet, cell);
  let value: unknown;
  if (typeof bound === 'number') {
    if (!Number.isFinite(bound)) throw new SheetJobError(`${what} of ${cell} must be finite, got ${bound}`);
    const unit = sheet.get(cell)?.unit;
    const dimensioned = siNumber(nom.template) !== null && typeof nom.template !== 'number';
    if (!dimensioned) return bound;
    if (!unit) throw new SheetJobError(`${what} of ${cell} needs a unit: ${cell} is a quantity; write it as text with its unit, e.g. "${bound} ${(nom.template as { formatUnits(): string }).formatUnits()}"`);
    value = sheet.overridesFromFormulas({ [cell]: `${bound} ${unit}` })[cell];
  } else if (typeof bound === 'string') {
    if (bound.trim() === '') throw new SheetJobError(`${what} of ${cell} is empty`);
    try {
      value = sheet.overridesFromFormulas({ [cell]: bound })[cell];
    } catch (e) {
      throw new SheetJobError(`${what} of ${cell} ("${bound}"): ${(e as Error).message}`);
    }
  } else {
    throw new SheetJobError(`${what} of ${cell} must be a number or formula text`);
  }
  const si = siNumber(value);
  if (si === null) throw new SheetJobError(`${what} of ${cell} must be a number or quantity`);
  const a = nom.template as { equalBase?(u: unknown): boolean; dimensions?: number[] };
  const b = value as { dimensions?: number[] };
  const dims = (x: { dimensions?: number[] }) => (x && Array.isArray(x.dimensions) ? x.dimensions.join(',') : '0,0,0,0,0,0,0,0,0');
  if (dims(a) !== dims(b)) throw new SheetJobError(`${what} of ${cell} has a different unit from ${cell} itself`);
  return si;
}

function axis(sheet: Sheet, a: AxisSpec): ScanAxis {
  return {
    cell: a.cell,
    lo: boundSI(sheet, a.cell, a.lo, 'the lower end of the scan'),
    hi: boundSI(sheet, a.cell, a.hi, 'the upper end of the scan'),
    n: a.n,
    log: a.log ?? false,
    prior: a.prior,
  };
}

/** A scan or sample spec as a chunked job (src/jobs/chunkedJob.ts) with its options, and how to wrap its result. */
export interface PlannedJobSpec {
  job: AnyChunkedJob;
  options: unknown;
  wrap(result: unknown): JobResult;
}

/** The chunked job behind a 'scan' or 'sample' spec (null for the other kinds, which are not split). */
export function chunkedJobFor(sheet: Sheet, spec: JobSpec): PlannedJobSpec | null {
  switch (spec.kind) {
    case 'scan': {
      const measurement = spec.measurementCell ? measurementOfCell(sheet, spec.measurementCell) : undefined;
      if (spec.vary.length === 1) {
        return { job: scan1dJob, options: { axis: axis(sheet, spec.vary[0]), outputs: spec.outputs, measurement }, wrap: (r) => ({ kind: 'scan1d', result: r as Scan1DResult }) };
      }
      if (spec.vary.length === 2) {
        if (spec.outputs.length !== 1) throw new SheetJobError('a two-input scan maps one output; name exactly one');
        return {
          job: scan2dJob,
          options: { x: axis(sheet, spec.vary[0]), y: axis(sheet, spec.vary[1]), output: spec.outputs[0], measurement, levels: spec.levels },
          wrap: (r) => ({ kind: 'scan2d', result: r as Scan2DResult }),
        };
      }
      throw new SheetJobError(`a scan varies one or two inputs, got ${spec.vary.length}`);
    }
    case 'sample': {
      const measurement = spec.measurementCell ? measurementOfCell(sheet, spec.measurementCell) : undefined;
      return {
        job: monteCarloJob,
        options: { samples: spec.samples, seed: spec.seed, outputs: spec.outputs, measurement },
        wrap: (r) => ({ kind: 'sample', result: r as MonteCarloResult }),
      };
    }
    case 'realise': {
      const { kind: _kind, ...options } = spec;
      return { job: realiseJob, options, wrap: (r) => ({ kind: 'realise', result: r as RealiseResult }) };
    }
    default:
      return null;
  }
}

/** Runs a job; scans and samples run their chunks in this thread or on workers (`parallel`). */
export async function runJob(sheet: Sheet, spec: JobSpec, control?: JobControl, parallel?: ParallelOptions): Promise<JobResult> {
  const chunked = chunkedJobFor(sheet, spec);
  if (chunked) return chunked.wrap(await runChunkedJob(chunked.job, sheet, chunked.options, control, parallel));
  switch (spec.kind) {
    case 'goalSeek': {
      const targetState = boundSI(sheet, spec.output, spec.target, 'the target');
      // Plain data only (a worker posts it): the mathjs cellValue stays behind.
      const { cellValue: _cellValue, ...plain } = goalSeek(sheet, {
        input: spec.input,
        output: spec.output,
        target: targetState,
        lo: spec.lo === undefined ? undefined : boundSI(sheet, spec.input, spec.lo, 'the lower search limit'),
        hi: spec.hi === undefined ? undefined : boundSI(sheet, spec.input, spec.hi, 'the upper search limit'),
      });
      return { kind: 'goalSeek', result: plain };
    }
    case 'rate':
      return {
        kind: 'rate',
        result: solveRateForMeasurement(sheet, {
          measurement: measurementOfCell(sheet, spec.measurementCell),
          rateCell: spec.rateCell,
          output: spec.output,
          densityCell: spec.densityCell,
        }),
      };
    default:
      throw new SheetJobError(`unknown job kind ${(spec as { kind: string }).kind}`);
  }
}
