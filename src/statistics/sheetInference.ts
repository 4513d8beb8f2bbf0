// Posterior sampling of the sheet itself: the free cells (priors.ts) are sampled with the ensemble
// sampler (ensembleSampler.ts), the likelihood is a cell holding ln L (e.g. amplitudeLogLikelihood,
// or a sum of several), evaluated through Sheet.evaluateWith, which leaves the sheet untouched.
// A likelihood cell that errs or is NaN counts as zero likelihood; failures are counted and the
// first is kept with its point and message.
import type { Sheet } from '../sheet/sheet';
import { isSheetObject } from '../sheet/sheetObject';
import type { CellState } from '../sheet/types';
import { runEnsemble, type BatchAnswer, type EnsembleChain } from './ensembleSampler';
import { defaultBurnIn, diagnoseRun, type RunDiagnostics } from './chainDiagnostics';
import { freeParameters, fromSamplerCoordinate, logPriorDensity, toSamplerCoordinate, type FreeParameter } from './priors';
import { sortedQuantile, summariseSamples, type SampleSummary } from './sampleSummary';
import { seededRandom } from './prng';
import { streamSeed } from './walkerStreams';
import { SheetJobError, checkCancelled, inOwnUnit, siNumber, unitTextOf, yieldToEventLoop, type JobControl } from './sheetValues';
import { integratedAutocorrelationTime } from './autocorrelation';
import type { ParallelOptions } from '../jobs/runChunks';
import { pooledEvaluator } from './inferBatchJob';

export interface InferenceSpec {
  /** The cell holding ln L (a plain number). */
  likelihood: string;
  /** Free cells (each with a prior or an uncertainty); default: every cell with a prior. */
  free?: string[];
  walkers: number;
  steps: number;
  seed: number;
  /** Steps discarded at the start (default: half, chainDiagnostics.defaultBurnIn). */
  burnIn?: number;
  /** Keep every thin-th step after burn-in (default 1). */
  thin?: number;
  /** Cells whose posteriors are reported alongside (e.g. the local merger-rate density). */
  derived?: string[];
  /** A spectrum cell: its h_c band over posterior draws is reported (posterior predictive). */
  spectrumCell?: string;
  /** Posterior draws for the h_c band (default 200). */
  bandDraws?: number;
}

/** Evaluates points (sampler coordinates) in batches: in-process by default, or by a worker pool. */
export type InferenceEvaluator = (points: Float64Array[]) => Promise<BatchAnswer> | BatchAnswer;

export interface InferenceProgress {
  step: number;
  steps: number;
  acceptance: number;
  /** Current autocorrelation estimate (largest over the parameters, in steps), NaN early on. */
  tau: number;
}

export interface PosteriorSummary {
  cell: string;
  /** Display unit of the numbers ('' for plain numbers). */
  unit: string;
  summary: SampleSummary;
}

export interface InferenceResult {
  likelihood: string;
  walkers: number;
  steps: number;
  seed: number;
  burnIn: number;
  thin: number;
  parameters: Array<PosteriorSummary & { prior: string; from: 'prior' | 'uncertainty'; logScale: boolean }>;
  derived: PosteriorSummary[];
  diagnostics: RunDiagnostics;
  evaluations: number;
  failures: number;
  failureExample?: { point: Record<string, number>; message: string };
  /** Kept draws (walkers x kept steps, walker-major) per parameter and derived cell, in display units. */
  samples: Record<string, Float64Array>;
  /** The whole chain in display units, for CSV: chain[name][step * walkers + walker]. */
  chain: { names: string[]; units: string[]; values: Float64Array[]; logLikelihood: Float64Array; logPrior: Float64Array };
  band?: PredictiveBand;
  stopped: boolean;
}

export interface PredictiveBand {
  cell: string;
  frequencyHz: Float64Array;
  /** Quantiles of h_c at each frequency over the posterior draws: 2.275%, 15.87%, 50%, 84.13%, 97.725%. */
  levels: number[];
  quantiles: Float64Array[];
  draws: number;
}

const MAX_START_TRIES = 50;

function stateMessage(cell: string, st: CellState | undefined): string {
  if (!st) return `${cell} has no value`;
  if (st.status === 'error') return st.error.message;
  if (st.status !== 'value') return `${cell} has no value`;
  return `${cell} is not a number`;
}

/** ln L from a likelihood cell's state; NaN (with a message) when it failed. */
function likelihoodOf(cell: string, st: CellState | undefined): { value: number; message?: string } {
  if (st && st.status === 'value') {
    const v = st.value;
    if (typeof v === 'number') return Number.isNaN(v) ? { value: NaN, message: `${cell} is NaN` } : { value: v };
    const x = siNumber(v);
    if (x !== null && isSheetObject(v) === false && (v as { dimensions?: number[] }).dimensions?.every((d) => d === 0)) return { value: x };
    return { value: NaN, message: `${cell} must hold a plain number (ln L), got ${isSheetObject(v) ? `a ${v.kind}` : 'a quantity with a unit'}` };
  }
  return { value: NaN, message: stateMessage(cell, st) };
}

function checkSpec(sheet: Sheet, spec: InferenceSpec): void {
  const whole = (x: number, what: string, min: number) => {
    if (!Number.isSafeInteger(x) || x < min) throw new SheetJobError(`infer: ${what} must be a whole number of at least ${min}, got ${x}`);
  };
  whole(spec.walkers, 'the number of walkers', 4);
  if (spec.walkers % 2 !== 0) throw new SheetJobError(`infer: the number of walkers must be even (the ensemble is updated in two halves), got ${spec.walkers}`);
  whole(spec.steps, 'the number of steps', 2);
  whole(spec.seed, 'the seed', 0);
  if (spec.thin !== undefined) whole(spec.thin, 'the thinning', 1);
  if (spec.burnIn !== undefined) {
    whole(spec.burnIn, 'the burn-in', 0);
    if (spec.burnIn >= spec.steps) throw new SheetJobError(`infer: the burn-in (${spec.burnIn}) must be smaller than the number of steps (${spec.steps})`);
  }
  if (!sheet.has(spec.likelihood)) throw new SheetJobError(`likelihood cell ${spec.likelihood}: there is no cell of that name`);
  for (const d of spec.derived ?? []) if (!sheet.has(d)) throw new SheetJobError(`derived cell ${d}: there is no cell of that name`);
  if (spec.spectrumCell && !sheet.has(spec.spectrumCell)) throw new SheetJobError(`spectrum cell ${spec.spectrumCell}: there is no cell of that name`);
}

/** The in-process evaluator: ln L and the derived cells (SI) at each point. */
export function sheetEvaluator(sheet: Sheet, params: FreeParameter[], likelihood: string, derived: string[], onFailure: (point: Float64Array, message: string) => void): InferenceEvaluator {
  const outputs = [likelihood, ...derived];
  const E = derived.length;
  return (points) => {
    const ll = new Float64Array(points.length);
    const extras = new Float64Array(points.length * E);
    points.forEach((u, i) => {
      const overrides: Record<string, unknown> = {};
      params.forEach((p, k) => (overrides[p.cell] = p.valueOf(fromSamplerCoordinate(p, u[k]))));
      let r: Record<string, CellState>;
      try {
        r = sheet.evaluateWith(overrides, outputs);
      } catch (e) {
        ll[i] = NaN;
        extras.fill(NaN, i * E, (i + 1) * E);
        onFailure(u, (e as Error).message);
        return;
      }
      const l = likelihoodOf(likelihood, r[likelihood]);
      ll[i] = l.value;
      if (l.message) onFailure(u, l.message);
      derived.forEach((d, e) => {
        const st = r[d];
        extras[i * E + e] = st && st.status === 'value' ? siNumber(st.value) ?? NaN : NaN;
      });
    });
    return { logLikelihood: ll, extras };
  };
}

export interface InferenceRunOptions {
  /** Workers for the likelihood evaluations (src/jobs): the result is the same for any number. */
  parallel?: ParallelOptions;
}

/**
 * Start positions (sampler coordinates): each walker drawn from the priors with its own stream
 * (seed, chain key, walker), redrawn up to MAX_START_TRIES times where the likelihood is zero.
 * Walkers that found no likelihood start next to one that did. All failing is an error naming the
 * likelihood cell and the free cells.
 */
export async function startingPoints(
  spec: { likelihood: string; walkers: number; seed: number },
  params: FreeParameter[],
  evaluate: InferenceEvaluator,
  logPrior: (u: Float64Array) => number,
  takeFailure: () => { point: Float64Array; message: string } | undefined,
  control?: JobControl,
  chainKey = 0,
): Promise<Float64Array[]> {
  const names = params.map((p) => p.cell);
  const W = spec.walkers;
  const dim = params.length;
  const tries: Float64Array[][] = [];
  for (let k = 0; k < W; k++) {
    const rng = seededRandom(streamSeed(spec.seed, [chainKey, k, 1]));
    tries.push(Array.from({ length: MAX_START_TRIES }, () => Float64Array.from(params, (p) => toSamplerCoordinate(p, p.prior.sample(rng)))));
  }
  const start = tries.map((t) => t[0]);
  const ok = new Array<boolean>(W).fill(false);
  let firstMessage: string | undefined;
  for (let t = 0; t < MAX_START_TRIES && ok.some((x) => !x); t++) {
    const todo = ok.map((x, k) => (x ? -1 : k)).filter((k) => k >= 0);
    const pts = todo.map((k) => tries[k][t]);
    const answer = await evaluate(pts);
    const vals = answer instanceof Float64Array ? answer : answer.logLikelihood;
    todo.forEach((k, j) => {
      if (vals[j] > -Infinity && Number.isFinite(logPrior(pts[j]))) {
        ok[k] = true;
        start[k] = pts[j];
      }
    });
    firstMessage ??= takeFailure()?.message;
    checkCancelled(control);
  }
  if (!ok.some((x) => x)) {
    throw new SheetJobError(
      `the likelihood cell ${spec.likelihood} is zero (or fails) at every starting point drawn from the priors of ${names.join(', ')} (${MAX_START_TRIES} draws per walker)` +
        (firstMessage ? `; first failure: ${firstMessage}` : ''),
    );
  }
  // Walkers that found no likelihood start at a good walker's point nudged by a tiny amount (deterministic).
  const good = start.filter((_, k) => ok[k]);
  for (let k = 0; k < W; k++) if (!ok[k]) start[k] = good[k % good.length].map((x, i) => x + 1e-6 * (1 + Math.abs(x)) * ((k + i) % 2 ? 1 : -1));
  takeFailure();
  return start;
}

export async function runInference(sheet: Sheet, spec: InferenceSpec, control?: JobControl & { onStep?(p: InferenceProgress): void }, run: InferenceRunOptions = {}): Promise<InferenceResult> {
  checkSpec(sheet, spec);
  const params = freeParameters(sheet, spec.free);
  const names = params.map((p) => p.cell);
  for (const n of names) {
    if (n === spec.likelihood) throw new SheetJobError(`${n} is the likelihood cell; it cannot be free`);
  }
  const derived = (spec.derived ?? []).filter((d) => !names.includes(d));
  if (spec.walkers < 2 * params.length) {
    throw new SheetJobError(`infer: use at least twice as many walkers as free cells (${2 * params.length} for ${params.length}), got ${spec.walkers}`);
  }
  let failureExample: { point: Float64Array; message: string } | undefined;
  const onFailure = (u: Float64Array, message: string) => {
    failureExample ??= { point: Float64Array.from(u), message };
  };
  const pooled =
    run.parallel && run.parallel.workers > 1 && run.parallel.pool
      ? pooledEvaluator(sheet, { free: names, likelihood: spec.likelihood, derived }, run.parallel, onFailure)
      : null;
  try {
    return await sample(sheet, spec, params, derived, pooled ? pooled.evaluate : sheetEvaluator(sheet, params, spec.likelihood, derived, onFailure), control, () => {
      const f = failureExample;
      failureExample = undefined;
      return f;
    });
  } finally {
    await pooled?.close();
  }
}

async function sample(
  sheet: Sheet,
  spec: InferenceSpec,
  params: FreeParameter[],
  derived: string[],
  evaluate: InferenceEvaluator,
  control: (JobControl & { onStep?(p: InferenceProgress): void }) | undefined,
  takeFailure: () => { point: Float64Array; message: string } | undefined,
): Promise<InferenceResult> {
  const names = params.map((p) => p.cell);
  const logPrior = (u: Float64Array) => logPriorDensity(params, u);

  const start = await startingPoints(spec, params, evaluate, logPrior, takeFailure, control);
  const W = spec.walkers;
  const dim = params.length;

  let last = Date.now();
  // The autocorrelation estimate for the progress report, refreshed at most once a second.
  let tau = NaN;
  let tauAt = -Infinity;
  const chain: EnsembleChain = await runEnsemble({
    walkers: W,
    steps: spec.steps,
    seed: spec.seed,
    start,
    logPrior,
    logLikelihood: evaluate,
    extras: derived.length,
    onStep: async (info) => {
      if (Date.now() - last < 100 && info.step !== info.steps) return;
      last = Date.now();
      checkCancelled(control);
      if (info.step >= 20 && (Date.now() - tauAt >= 1000 || info.step === info.steps)) {
        tauAt = Date.now();
        tau = NaN;
        const from = Math.floor(info.step / 2);
        for (let i = 0; i < dim; i++) {
          const series = Array.from({ length: W }, (_, k) => {
            const out = new Float64Array(info.step - from);
            for (let t = from; t < info.step; t++) out[t - from] = info.chain.positions[(t * W + k) * dim + i];
            return out;
          });
          const a = integratedAutocorrelationTime(series).tau;
          if (!(tau >= a)) tau = a;
        }
      }
      control?.onProgress?.(info.step, info.steps);
      control?.onStep?.({ step: info.step, steps: info.steps, acceptance: info.acceptance, tau });
      await yieldToEventLoop();
      checkCancelled(control);
    },
  });
  const burnIn = spec.burnIn ?? defaultBurnIn(chain.steps);
  const thin = spec.thin ?? 1;
  if (burnIn >= chain.steps) throw new SheetJobError(`infer: only ${chain.steps} steps were taken, not more than the burn-in of ${burnIn}`);
  const diagnostics = diagnoseRun(chain, names, burnIn, thin);
  const result = summarise(sheet, spec, params, derived, chain, burnIn, thin, diagnostics);
  const fe = takeFailure();
  if (fe) {
    result.failureExample = {
      point: Object.fromEntries(params.map((p, i) => [p.cell, p.toDisplay(fromSamplerCoordinate(p, fe.point[i]))])),
      message: fe.message,
    };
  }
  if (spec.spectrumCell) result.band = await predictiveBand(sheet, spec, params, chain, burnIn, thin, control);
  return result;
}

function summarise(sheet: Sheet, spec: InferenceSpec, params: FreeParameter[], derived: string[], chain: EnsembleChain, burnIn: number, thin: number, diagnostics: RunDiagnostics): InferenceResult {
  const W = chain.walkers;
  const dim = chain.dim;
  const E = chain.nExtras;
  const n = chain.steps * W;
  const names = [...params.map((p) => p.cell), ...derived];
  const derivedTemplates = derived.map((d) => sheet.value(d));
  const units = [...params.map((p) => (p.unit ? p.unit : unitTextOf(sheet.value(p.cell)))), ...derivedTemplates.map((t, i) => sheet.get(derived[i])?.unit || unitTextOf(t))];
  const values = names.map(() => new Float64Array(n));
  for (let j = 0; j < n; j++) {
    params.forEach((p, i) => (values[i][j] = p.toDisplay(fromSamplerCoordinate(p, chain.positions[j * dim + i]))));
    derived.forEach((d, e) => (values[dim + e][j] = displayOf(sheet, d, derivedTemplates[e], chain.extras[j * E + e])));
  }
  const samples: Record<string, Float64Array> = {};
  names.forEach((name, i) => {
    const kept: number[] = [];
    for (let k = 0; k < W; k++) for (let t = burnIn; t < chain.steps; t += thin) kept.push(values[i][t * W + k]);
    samples[name] = Float64Array.from(kept);
  });
  // Monte Carlo errors of the quantiles scaled from independent draws to the effective sample size.
  const inflate = (s: SampleSummary, ess: number): SampleSummary => {
    const f = Number.isFinite(ess) && ess > 0 ? Math.sqrt(Math.max(1, s.count / ess)) : NaN;
    return { ...s, medianError: s.medianError * f, intervals: s.intervals.map((iv) => ({ ...iv, lowerError: iv.lowerError * f, upperError: iv.upperError * f })) };
  };
  const minEss = Math.min(...diagnostics.parameters.map((p) => p.ess));
  return {
    likelihood: spec.likelihood,
    walkers: W,
    steps: chain.steps,
    seed: spec.seed,
    burnIn,
    thin,
    parameters: params.map((p, i) => ({
      cell: p.cell,
      unit: units[i],
      prior: p.description,
      from: p.from,
      logScale: p.logScale,
      summary: inflate(summariseSamples(samples[p.cell]), diagnostics.parameters[i].ess),
    })),
    derived: derived.map((d, e) => ({ cell: d, unit: units[dim + e], summary: inflate(summariseSamples(samples[d]), minEss) })),
    diagnostics,
    evaluations: chain.evaluations,
    failures: chain.failures,
    samples,
    chain: { names, units, values, logLikelihood: chain.logLikelihood, logPrior: chain.logPrior },
    stopped: chain.stopped,
  };
}

function displayOf(sheet: Sheet, cell: string, template: unknown, xSI: number): number {
  const unit = sheet.get(cell)?.unit;
  if (!Number.isFinite(xSI)) return NaN;
  const own = inOwnUnit(template, xSI);
  if (!unit) return own;
  try {
    const t = template as { clone(): { value: number; toNumber(u: string): number } };
    const q = t.clone();
    q.value = xSI;
    return q.toNumber(unit);
  } catch {
    return own;
  }
}

export const BAND_LEVELS = [0.02275, 0.15866, 0.5, 0.84134, 0.97725];

/** h_c of the spectrum cell at posterior draws spread evenly over the kept chain, and its quantiles. */
async function predictiveBand(sheet: Sheet, spec: InferenceSpec, params: FreeParameter[], chain: EnsembleChain, burnIn: number, thin: number, control?: JobControl): Promise<PredictiveBand> {
  const cell = spec.spectrumCell!;
  const W = chain.walkers;
  const kept: number[] = [];
  for (let t = burnIn; t < chain.steps; t += thin) for (let k = 0; k < W; k++) kept.push(t * W + k);
  const draws = Math.min(spec.bandDraws ?? 200, kept.length);
  let freq: Float64Array | null = null;
  const rows: Float64Array[] = [];
  for (let d = 0; d < draws; d++) {
    const j = kept[Math.floor(((d + 0.5) * kept.length) / draws)];
    const overrides: Record<string, unknown> = {};
    params.forEach((p, i) => (overrides[p.cell] = p.valueOf(fromSamplerCoordinate(p, chain.positions[j * chain.dim + i]))));
    const st = sheet.evaluateWith(overrides, [cell])[cell];
    const v = st.status === 'value' ? (st.value as { frequencyHz?: Float64Array; hc?: Float64Array }) : null;
    if (!v || !(v.frequencyHz instanceof Float64Array) || !(v.hc instanceof Float64Array)) {
      if (d === 0) throw new SheetJobError(`spectrum cell ${cell} must hold a spectrum (frequencies and h_c): ${stateMessage(cell, st)}`);
      continue;
    }
    freq ??= v.frequencyHz;
    if (v.hc.length === freq.length) rows.push(v.hc);
    if (d % 20 === 19) {
      checkCancelled(control);
      await yieldToEventLoop();
    }
  }
  const f = freq!;
  const quantiles = BAND_LEVELS.map(() => new Float64Array(f.length));
  const col = new Float64Array(rows.length);
  for (let i = 0; i < f.length; i++) {
    rows.forEach((r, d) => (col[d] = r[i]));
    col.sort();
    BAND_LEVELS.forEach((p, q) => (quantiles[q][i] = sortedQuantile(col, p)));
  }
  return { cell, frequencyHz: f, levels: BAND_LEVELS, quantiles, draws: rows.length };
}
