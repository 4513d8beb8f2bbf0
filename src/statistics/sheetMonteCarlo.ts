// Monte Carlo propagation through the sheet: every cell with an `uncertainty` formula (giving a
// distribution) is drawn from it with seeded generators (prng.ts, one stream per chunk of samples:
// prngStreams.ts) and the outputs are evaluated with Sheet.evaluateWith, which leaves the sheet as
// it was. The sampling loop itself is monteCarloJob.ts.
import type { Sheet } from '../sheet/sheet';
import { isSheetObject } from '../sheet/sheetObject';
import { isUnit } from '../sheet/mathInstance';
import type { Unit } from 'mathjs';
import { seededRandom, type RandomSource } from './prng';
import type { SampleSummary } from './sampleSummary';
import type { AmplitudeMeasurement } from './measurement';
import type { MeasuredBand } from './sheetScan';
import { checkSqrtProportional } from './proportionality';
import { SheetJobError, siNumber, type JobControl } from './sheetValues';
import { runChunkedJob, type ParallelOptions } from '../jobs/runChunks';
import { monteCarloJob } from './monteCarloJob';

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
    out.set(spec.name, cellDistribution(sheet, spec.name, spec.uncertainty));
  }
  return out;
}

/**
 * The distribution an uncertainty formula gives for one cell, evaluated against the sheet as it is;
 * throws SheetJobError naming the cell when the formula fails, gives no distribution, or gives
 * values of another dimension than the cell's nominal value. Also used to check an edit before it is made.
 */
export function cellDistribution(sheet: Sheet, name: string, formula: string): SampleableDistribution {
  let value: unknown;
  try {
    value = sheet.overridesFromFormulas({ [name]: formula })[name];
  } catch (e) {
    throw new SheetJobError(`uncertainty of ${name}: ${(e as Error).message}`);
  }
  if (!isSampleable(value)) {
    throw new SheetJobError(`uncertainty of ${name} must give a distribution (e.g. lognormalDist(...)), got ${isSheetObject(value) ? `a ${value.kind}` : typeof value}`);
  }
  // The samples must have the dimension of the cell's nominal value.
  const nominal = sheet.state(name);
  if (nominal.status === 'value') {
    const probe = value.sample(seededRandom(0));
    const a = isUnit(nominal.value) ? (nominal.value as Unit) : null;
    const b = isUnit(probe) ? (probe as Unit) : null;
    const dimless = (u: Unit | null) => !u || u.dimensions.every((d: number) => d === 0);
    const same = a && b ? a.equalBase(b) : dimless(a) && dimless(b);
    if (!same) {
      throw new SheetJobError(`uncertainty of ${name} gives values in ${b ? b.formatUnits() || 'no unit' : 'no unit'}, but ${name} is in ${a ? a.formatUnits() : 'no unit'}`);
    }
  }
  return value;
}

export interface MonteCarloOptions {
  samples: number;
  seed: number;
  outputs: string[];
  /** Compare the first output with this measurement (overlap). */
  measurement?: AmplitudeMeasurement;
  /** Keep the input draws in the result (default true). */
  keepInputs?: boolean;
  /**
   * Evaluate every sample in full even for inputs the outputs go as the square root of (default
   * false: such inputs, e.g. the merger-rate normalisation, are applied as a factor sqrt(x/x0)
   * after checking the law with probes, which gives the same numbers to rounding).
   */
  evaluateEverySample?: boolean;
}

export interface MonteCarloResult {
  samples: number;
  seed: number;
  /** Input cells drawn and their distributions (describe()). */
  inputs: Array<{ cell: string; distribution: string }>;
  /** Inputs applied as a sqrt(x/x0) factor instead of evaluations (the sqrt law checked with probes). */
  scaledInputs: string[];
  evaluations: number;
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

/**
 * Uncertain inputs every output goes as the square root of, checked at the nominal point and at
 * two draws of the other uncertain inputs (their own fixed seed, so the run's stream is unchanged).
 * Samples of such an input only need the factor sqrt(x/x0): A_yr and the normalisation, Phinney 2001.
 */
export function sqrtFactorInputs(sheet: Sheet, names: string[], dists: Map<string, SampleableDistribution>, outputs: string[]): string[] {
  const found: string[] = [];
  const probeRng = seededRandom(0x5eed);
  const otherDraws = [0, 1].map(() => Object.fromEntries(names.map((n) => [n, dists.get(n)!.sample(probeRng)])));
  for (const n of names) {
    const x0 = siNumber(sheet.value(n));
    if (x0 === null || !(x0 > 0)) continue;
    const ok = outputs.every((o) => {
      try {
        if (!checkSqrtProportional(sheet, n, o).proportional) return false;
        return otherDraws.every((d) => {
          const others = Object.fromEntries(Object.entries(d).filter(([k]) => k !== n));
          return checkSqrtProportional(sheet, n, o, others).proportional;
        });
      } catch {
        return false;
      }
    });
    if (ok) found.push(n);
  }
  return found;
}

/** Monte Carlo over the uncertain cells (monteCarloJob.ts), in this thread or on workers (`parallel`). */
export async function monteCarlo(sheet: Sheet, opts: MonteCarloOptions, control?: JobControl, parallel?: ParallelOptions): Promise<MonteCarloResult> {
  return runChunkedJob(monteCarloJob, sheet, opts, control, parallel);
}
