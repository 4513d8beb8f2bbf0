// Monte Carlo propagation through the sheet: every cell with an `uncertainty` formula (giving a
// distribution) is drawn from it with a seeded generator (prng.ts) and the outputs are evaluated
// with Sheet.evaluateWith, which leaves the sheet as it was.
import type { Sheet } from '../sheet/sheet';
import { isSheetObject } from '../sheet/sheetObject';
import { isUnit } from '../sheet/mathInstance';
import type { Unit } from 'mathjs';
import { seededRandom, type RandomSource } from './prng';
import { fractionInside, summariseSamples, type SampleSummary } from './sampleSummary';
import { relativeLikelihood, type AmplitudeMeasurement } from './measurement';
import { measuredBand, type MeasuredBand } from './sheetScan';
import { F_YR_HZ } from '../physics/constants';
import { atReferenceFrequency } from './measurement';
import { SheetJobError, checkCancelled, numericOrNaN, siNumber, unitTextOf, yieldToEventLoop, type JobControl } from './sheetValues';

/** What the Monte Carlo needs of a distribution value (the 'distribution' SheetObject of the built-ins). */
export interface SampleableDistribution {
  kind: 'distribution';
  sample(rng: RandomSource): unknown;
  describe(): string;
}

export function isSampleable(v: unknown): v is SampleableDistribution {
  return isSheetObject(v) && v.kind === 'distribution' && typeof (v as unknown as SampleableDistribution).sample === 'function';
}

export const MAX_SAMPLES = 10_000_000;

/** The uncertain cells of a sheet and their distributions (evaluated from each cell's uncertainty formula). */
export function uncertainCells(sheet: Sheet): Map<string, SampleableDistribution> {
  const out = new Map<string, SampleableDistribution>();
  for (const spec of sheet.cells()) {
    if (!spec.uncertainty || spec.uncertainty.trim() === '') continue;
    let value: unknown;
    try {
      value = sheet.overridesFromFormulas({ [spec.name]: spec.uncertainty })[spec.name];
    } catch (e) {
      throw new SheetJobError(`uncertainty of ${spec.name}: ${(e as Error).message}`);
    }
    if (!isSampleable(value)) {
      throw new SheetJobError(`uncertainty of ${spec.name} must give a distribution (e.g. lognormalDist(...)), got ${isSheetObject(value) ? `a ${value.kind}` : typeof value}`);
    }
    // The samples must have the dimension of the cell's nominal value.
    const nominal = sheet.state(spec.name);
    if (nominal.status === 'value') {
      const probe = value.sample(seededRandom(0));
      const a = isUnit(nominal.value) ? (nominal.value as Unit) : null;
      const b = isUnit(probe) ? (probe as Unit) : null;
      const dimless = (u: Unit | null) => !u || u.dimensions.every((d: number) => d === 0);
      const same = a && b ? a.equalBase(b) : dimless(a) && dimless(b);
      if (!same) {
        throw new SheetJobError(
          `uncertainty of ${spec.name} gives values in ${b ? b.formatUnits() || 'no unit' : 'no unit'}, but ${spec.name} is in ${a ? a.formatUnits() : 'no unit'}`,
        );
      }
    }
    out.set(spec.name, value);
  }
  return out;
}

export interface MonteCarloOptions {
  samples: number;
  seed: number;
  outputs: string[];
  /** Compare the first output with this measurement (overlap). */
  measurement?: AmplitudeMeasurement;
  /** Keep the input draws in the result (default true). */
  keepInputs?: boolean;
}

export interface MonteCarloResult {
  samples: number;
  seed: number;
  /** Input cells drawn and their distributions (describe()). */
  inputs: Array<{ cell: string; distribution: string }>;
  inputDraws?: Record<string, Float64Array>;
  /** Output values in SI per sample (NaN where the output had an error). */
  outputs: Record<string, Float64Array>;
  units: Record<string, string>;
  summaries: Record<string, SampleSummary>;
  failures: number;
  firstError?: string;
  /** Overlap of the first output's samples with the measurement. */
  overlap?: {
    band: MeasuredBand;
    /** Fraction of samples inside the measured interval, with its binomial error. */
    fractionInside: number;
    fractionInsideError: number;
    /** Mean of the measurement's relative likelihood over the samples. */
    meanRelativeLikelihood: number;
  };
}

export async function monteCarlo(sheet: Sheet, opts: MonteCarloOptions, control?: JobControl): Promise<MonteCarloResult> {
  const { samples, seed, outputs } = opts;
  if (!Number.isInteger(samples) || samples < 1) throw new SheetJobError(`Monte Carlo: the number of samples must be a positive whole number, got ${samples}`);
  if (samples > MAX_SAMPLES) throw new SheetJobError(`Monte Carlo: at most ${MAX_SAMPLES} samples, got ${samples}`);
  if (!Number.isSafeInteger(seed) || seed < 0) throw new SheetJobError(`Monte Carlo: the seed must be a non-negative whole number, got ${seed}`);
  if (outputs.length === 0) throw new SheetJobError('Monte Carlo: name at least one output cell');
  for (const o of outputs) if (!sheet.has(o)) throw new SheetJobError(`Monte Carlo: there is no output cell ${o}`);
  const dists = uncertainCells(sheet);
  if (dists.size === 0) throw new SheetJobError('Monte Carlo: no cell has an uncertainty; give at least one input an uncertainty formula such as lognormalDist(...)');
  for (const o of outputs) if (dists.has(o)) throw new SheetJobError(`Monte Carlo: ${o} is an uncertain input itself, not an output`);

  const rng = seededRandom(seed);
  const names = [...dists.keys()];
  const keep = opts.keepInputs ?? true;
  const inputDraws: Record<string, Float64Array> = {};
  if (keep) for (const n of names) inputDraws[n] = new Float64Array(samples);
  const res: Record<string, Float64Array> = {};
  for (const o of outputs) res[o] = new Float64Array(samples);
  let failures = 0;
  let firstError: string | undefined;
  let last = Date.now();
  const overrides: Record<string, unknown> = {};
  for (let s = 0; s < samples; s++) {
    for (const n of names) {
      const v = dists.get(n)!.sample(rng);
      overrides[n] = v;
      if (keep) inputDraws[n][s] = siNumber(v) ?? NaN;
    }
    const r = sheet.evaluateWith(overrides, outputs);
    let failed = false;
    for (const o of outputs) {
      const v = numericOrNaN(r[o]);
      res[o][s] = v;
      if (Number.isNaN(v)) {
        failed = true;
        if (!firstError) firstError = r[o]?.status === 'error' ? (r[o] as { error: { message: string } }).error.message : `${o} is not a number`;
      }
    }
    if (failed) failures++;
    if (Date.now() - last >= 30) {
      last = Date.now();
      checkCancelled(control);
      control?.onProgress?.(s + 1, samples);
      await yieldToEventLoop();
      checkCancelled(control);
    }
  }
  control?.onProgress?.(samples, samples);
  const units: Record<string, string> = {};
  const summaries: Record<string, SampleSummary> = {};
  for (const o of outputs) {
    const st = sheet.state(o);
    units[o] = st.status === 'value' ? unitTextOf(st.value) : '';
    summaries[o] = summariseSamples(res[o]);
  }
  const result: MonteCarloResult = {
    samples,
    seed,
    inputs: names.map((n) => ({ cell: n, distribution: dists.get(n)!.describe() })),
    inputDraws: keep ? inputDraws : undefined,
    outputs: res,
    units,
    summaries,
    failures,
    firstError,
  };
  if (opts.measurement) {
    const band = measuredBand(opts.measurement);
    const m = opts.measurement.fRefHz === F_YR_HZ ? opts.measurement : atReferenceFrequency(opts.measurement, F_YR_HZ);
    const xs = res[outputs[0]];
    const fi = fractionInside(xs, band.lower, band.upper);
    let sumL = 0;
    let n = 0;
    for (const x of xs) {
      if (!(Number.isFinite(x) && x > 0)) continue;
      sumL += relativeLikelihood(m, x);
      n++;
    }
    result.overlap = { band, fractionInside: fi.fraction, fractionInsideError: fi.error, meanRelativeLikelihood: n ? sumL / n : NaN };
  }
  return result;
}
