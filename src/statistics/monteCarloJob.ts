// Monte Carlo as a chunked job (src/jobs/chunkedJob.ts): samples in chunks of SAMPLE_CHUNK; chunk c
// draws from chunkRandom(seed, c) (prngStreams.ts), so the samples depend on the seed and never on
// the number of workers. Inputs every output goes as the square root of (the merger-rate
// normalisation, Phinney 2001) are applied as a factor sqrt(x/x0), found with probes in plan().
import type { Sheet } from '../sheet/sheet';
import { chunkRandom } from './prngStreams';
import { chunkRange, type ChunkedJob, type ChunkPlan } from '../jobs/chunkedJob';
import { summariseSamples, fractionInside, type SampleSummary } from './sampleSummary';
import { atReferenceFrequency, relativeLikelihood } from './measurement';
import { F_YR_HZ } from '../physics/constants';
import { measuredBand, requireNumericOutput } from './sheetScan';
import { MAX_SAMPLES, sqrtFactorInputs, uncertainCells, type MonteCarloOptions, type MonteCarloResult, type SampleableDistribution } from './sheetMonteCarlo';
import { SheetJobError, numericOrNaN, siNumber, unitTextOf } from './sheetValues';

/** Samples per chunk. Part of what a seed means: changing it changes every run's samples past the first chunk. */
export const SAMPLE_CHUNK = 500;

interface MonteCarloPlan extends ChunkPlan {
  options: MonteCarloOptions;
  names: string[];
  descriptions: string[];
  scaled: string[];
  nominalSI: Record<string, number>;
}

interface MonteCarloChunk {
  draws: Record<string, Float64Array>;
  outputs: Record<string, Float64Array>;
  evaluations: number;
  failures: number;
  firstError?: string;
}

/** The distributions of a sheet, kept per sheet object (a worker reuses its sheet for many chunks). */
const distributionsOf = new WeakMap<Sheet, Map<string, SampleableDistribution>>();
function distributions(sheet: Sheet): Map<string, SampleableDistribution> {
  let d = distributionsOf.get(sheet);
  if (!d) distributionsOf.set(sheet, (d = uncertainCells(sheet)));
  return d;
}

export const monteCarloJob: ChunkedJob<MonteCarloOptions, MonteCarloPlan, MonteCarloChunk, MonteCarloResult> = {
  kind: 'sample',
  plan(sheet, opts) {
    const { samples, seed, outputs } = opts;
    if (!Number.isInteger(samples) || samples < 1) throw new SheetJobError(`Monte Carlo: the number of samples must be a positive whole number, got ${samples}`);
    if (samples > MAX_SAMPLES) throw new SheetJobError(`Monte Carlo: at most ${MAX_SAMPLES} samples, got ${samples}`);
    if (!Number.isSafeInteger(seed) || seed < 0) throw new SheetJobError(`Monte Carlo: the seed must be a non-negative whole number, got ${seed}`);
    if (outputs.length === 0) throw new SheetJobError('Monte Carlo: name at least one output cell');
    for (const o of outputs) requireNumericOutput(sheet, o, 'Monte Carlo');
    const dists = uncertainCells(sheet);
    distributionsOf.set(sheet, dists);
    if (dists.size === 0) throw new SheetJobError('Monte Carlo: no cell has an uncertainty; give at least one input an uncertainty formula such as lognormalDist(...)');
    for (const o of outputs) if (dists.has(o)) throw new SheetJobError(`Monte Carlo: ${o} is an uncertain input itself, not an output`);
    const names = [...dists.keys()];
    const scaled = opts.evaluateEverySample ? [] : sqrtFactorInputs(sheet, names, dists, outputs);
    const nominalSI = Object.fromEntries(scaled.map((n) => [n, siNumber(sheet.value(n))!]));
    return {
      chunks: Math.ceil(samples / SAMPLE_CHUNK),
      work: samples,
      options: opts,
      names,
      descriptions: names.map((n) => dists.get(n)!.describe()),
      scaled,
      nominalSI,
    };
  },
  chunkWork(plan, index) {
    const { start, end } = chunkRange(plan.options.samples, SAMPLE_CHUNK, index);
    return end - start;
  },
  async runChunk(sheet, plan, index, control) {
    const { start, end } = chunkRange(plan.options.samples, SAMPLE_CHUNK, index);
    const { names, options } = plan;
    const outputs = options.outputs;
    const dists = distributions(sheet);
    const keep = options.keepInputs ?? true;
    const rng = chunkRandom(options.seed, index);
    const direct = names.filter((n) => !(n in plan.nominalSI));
    const base = direct.length === 0 ? sheet.evaluateWith({}, outputs) : null;
    let evaluations = base ? 1 : 0;
    const count = end - start;
    const draws: Record<string, Float64Array> = {};
    if (keep) for (const n of names) draws[n] = new Float64Array(count);
    const res: Record<string, Float64Array> = {};
    for (const o of outputs) res[o] = new Float64Array(count);
    let failures = 0;
    let firstError: string | undefined;
    const overrides: Record<string, unknown> = {};
    for (let s = 0; s < count; s++) {
      let factor = 1;
      for (const n of names) {
        const v = dists.get(n)!.sample(rng);
        const x = siNumber(v) ?? NaN;
        if (n in plan.nominalSI) factor *= Math.sqrt(x / plan.nominalSI[n]);
        else overrides[n] = v;
        if (keep) draws[n][s] = x;
      }
      let r = base;
      if (!r) {
        r = sheet.evaluateWith(overrides, outputs);
        evaluations++;
      }
      let failed = false;
      for (const o of outputs) {
        const v = numericOrNaN(r[o]) * factor;
        res[o][s] = v;
        if (Number.isNaN(v)) {
          failed = true;
          if (!firstError) firstError = r[o]?.status === 'error' ? (r[o] as { error: { message: string } }).error.message : `${o} is not a number`;
        }
      }
      if (failed) failures++;
      await control.tick(s + 1);
    }
    return { draws, outputs: res, evaluations, failures, firstError };
  },
  combine(sheet, plan, chunks) {
    const { samples, seed, outputs, measurement } = plan.options;
    const keep = plan.options.keepInputs ?? true;
    const inputDraws: Record<string, Float64Array> = {};
    if (keep) for (const n of plan.names) inputDraws[n] = new Float64Array(samples);
    const res: Record<string, Float64Array> = {};
    for (const o of outputs) res[o] = new Float64Array(samples);
    let evaluations = 0;
    let failures = 0;
    let firstError: string | undefined;
    chunks.forEach((c, k) => {
      const at = k * SAMPLE_CHUNK;
      if (keep) for (const n of plan.names) inputDraws[n].set(c.draws[n], at);
      for (const o of outputs) res[o].set(c.outputs[o], at);
      evaluations += c.evaluations;
      failures += c.failures;
      firstError ??= c.firstError;
    });
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
      inputs: plan.names.map((n, i) => ({ cell: n, distribution: plan.descriptions[i] })),
      scaledInputs: plan.scaled,
      evaluations,
      inputDraws: keep ? inputDraws : undefined,
      outputs: res,
      units,
      summaries,
      failures,
      firstError,
    };
    if (measurement) {
      const band = measuredBand(measurement);
      const m = measurement.fRefHz === F_YR_HZ ? measurement : atReferenceFrequency(measurement, F_YR_HZ);
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
  },
};
