// Affine-invariant ensemble sampler with the stretch move (Goodman & Weare 2010, Commun. Appl.
// Math. Comput. Sci. 5, 65), the ensemble split into two halves that are updated in turn so that
// the proposals of one half can be evaluated together (in parallel) against the other half.
//
// Reproducibility: walker k draws exactly three uniforms per step from its own stream
// (walkerStreams.ts), so the draws at step t depend only on (seed, chain, k, t). Densities are
// evaluated in batches by the caller (one worker or many); the result is the same either way.
//
// Target: log p_beta(x) = log prior(x) + beta log L(x) (beta = 1 the posterior, beta < 1 the
// power posteriors of thermodynamic integration). A NaN likelihood counts as zero likelihood and
// is counted as a failure, with the first such point kept.
import type { RandomSource } from './prng';
import { walkerStream } from './walkerStreams';

/**
 * Log-likelihoods of a batch of points (NaN or -Infinity: zero likelihood), optionally with
 * `extras` values per point (derived quantities kept alongside the chain: extras[i * E + e]).
 */
export type LogLikelihoodBatch = (points: Float64Array[]) => BatchAnswer | Promise<BatchAnswer>;
export type BatchAnswer = Float64Array | { logLikelihood: Float64Array; extras: Float64Array };

export interface EnsembleOptions {
  /** Number of walkers: even and at least twice the dimension. */
  walkers: number;
  steps: number;
  seed: number;
  /** Initial walker positions (walkers x dimension). */
  start: Float64Array[];
  /** log prior density (up to a constant); -Infinity outside its support. */
  logPrior(x: Float64Array): number;
  logLikelihood: LogLikelihoodBatch;
  /** Inverse temperature in [0, 1] (default 1). */
  beta?: number;
  /** Stretch scale a > 1 (default 2, Goodman & Weare 2010, sec. 3). */
  stretch?: number;
  /** Number of extra values per point the likelihood batch returns (default 0). */
  extras?: number;
  /** Stream key of this chain (tempered chains get their own), default 0. */
  chain?: number;
  /** Called after every step; return false to stop early (cancel). */
  onStep?(info: StepInfo): boolean | void | Promise<boolean | void>;
}

export interface StepInfo {
  step: number;
  steps: number;
  /** Acceptance fraction over all walkers so far. */
  acceptance: number;
  /** The chain so far (steps done x walkers x dim). */
  chain: EnsembleChain;
}

export interface EnsembleChain {
  walkers: number;
  dim: number;
  /** Steps recorded (positions after each step). */
  steps: number;
  /** positions[((step * walkers) + walker) * dim + i] */
  positions: Float64Array;
  logLikelihood: Float64Array;
  logPrior: Float64Array;
  /** Extra values per walker and step: extras[(step * walkers + walker) * nExtras + e]. */
  extras: Float64Array;
  nExtras: number;
  /** Accepted proposals per walker. */
  accepted: Float64Array;
  /** Likelihood evaluations that gave NaN (counted as zero likelihood), and the first such point. */
  failures: number;
  failurePoint?: Float64Array;
  evaluations: number;
  beta: number;
  /** True when onStep asked to stop before all steps were taken. */
  stopped: boolean;
}

export class EnsembleError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'EnsembleError';
  }
}

/** Most values an ensemble chain may hold (walkers x steps x dimension). */
export const MAX_CHAIN_VALUES = 50_000_000;

/** Stretch factor z from g(z) ~ 1/sqrt(z) on [1/a, a] by inversion (Goodman & Weare 2010, sec. 3). */
export function stretchFactor(u: number, a: number): number {
  const s = (a - 1) * u + 1;
  return (s * s) / a;
}

function checkOptions(o: EnsembleOptions): { dim: number; beta: number; a: number } {
  const { walkers, steps, start } = o;
  if (!Number.isInteger(walkers) || walkers < 4 || walkers % 2 !== 0) throw new EnsembleError(`the number of walkers must be an even whole number of at least 4, got ${walkers}`);
  if (!Number.isInteger(steps) || steps < 1) throw new EnsembleError(`the number of steps must be a positive whole number, got ${steps}`);
  if (start.length !== walkers) throw new EnsembleError(`${start.length} start positions given for ${walkers} walkers`);
  const dim = start[0]?.length ?? 0;
  if (dim < 1) throw new EnsembleError('the parameter space needs at least one dimension');
  if (walkers < 2 * dim) throw new EnsembleError(`use at least twice as many walkers as parameters (${2 * dim} for ${dim}), got ${walkers}`);
  if (walkers * steps * dim > MAX_CHAIN_VALUES) throw new EnsembleError(`walkers x steps x parameters = ${walkers * steps * dim} exceeds the limit of ${MAX_CHAIN_VALUES}`);
  for (const p of start) {
    if (p.length !== dim) throw new EnsembleError('all start positions need the same number of parameters');
    for (const x of p) if (!Number.isFinite(x)) throw new EnsembleError('start positions must be finite numbers');
  }
  const beta = o.beta ?? 1;
  if (!(beta >= 0 && beta <= 1)) throw new EnsembleError(`the inverse temperature must lie in [0, 1], got ${beta}`);
  const a = o.stretch ?? 2;
  if (!(a > 1 && Number.isFinite(a))) throw new EnsembleError(`the stretch scale must be greater than 1, got ${a}`);
  return { dim, beta, a };
}

export async function runEnsemble(o: EnsembleOptions): Promise<EnsembleChain> {
  const { dim, beta, a } = checkOptions(o);
  const { walkers, steps, seed } = o;
  const E = o.extras ?? 0;
  const half = walkers / 2;
  const rngs: RandomSource[] = Array.from({ length: walkers }, (_, k) => walkerStream(seed, o.chain ?? 0, k));
  const chain: EnsembleChain = {
    walkers,
    dim,
    steps: 0,
    positions: new Float64Array(steps * walkers * dim),
    logLikelihood: new Float64Array(steps * walkers),
    logPrior: new Float64Array(steps * walkers),
    extras: new Float64Array(steps * walkers * E),
    nExtras: E,
    accepted: new Float64Array(walkers),
    failures: 0,
    evaluations: 0,
    beta,
    stopped: false,
  };
  const pos = o.start.map((p) => Float64Array.from(p));
  const lp = new Float64Array(walkers);
  const ll = new Float64Array(walkers);
  const ex = new Float64Array(walkers * E).fill(NaN);
  let answerExtras = new Float64Array(0);

  // Likelihoods of the points with prior support; NaN -> -Infinity and counted. Extras of the
  // batch are left in answerExtras (NaN for points not evaluated).
  const evaluate = async (points: Float64Array[], priors: Float64Array): Promise<Float64Array> => {
    const idx: number[] = [];
    for (let i = 0; i < points.length; i++) if (priors[i] > -Infinity) idx.push(i);
    const out = new Float64Array(points.length).fill(-Infinity);
    answerExtras = new Float64Array(points.length * E).fill(NaN);
    if (idx.length === 0) return out;
    const answer = await o.logLikelihood(idx.map((i) => points[i]));
    const vals = answer instanceof Float64Array ? answer : answer.logLikelihood;
    if (vals.length !== idx.length) throw new EnsembleError(`the likelihood gave ${vals.length} values for ${idx.length} points`);
    if (E > 0) {
      const xs = answer instanceof Float64Array ? null : answer.extras;
      if (!xs || xs.length !== idx.length * E) throw new EnsembleError(`the likelihood gave no ${E} extra values per point`);
      idx.forEach((i, j) => answerExtras.set(xs.subarray(j * E, (j + 1) * E), i * E));
    }
    chain.evaluations += idx.length;
    idx.forEach((i, j) => {
      const v = vals[j];
      if (Number.isNaN(v)) {
        chain.failures++;
        chain.failurePoint ??= Float64Array.from(points[i]);
      } else if (v === Infinity) {
        throw new EnsembleError('a log-likelihood of +Infinity is not a density; check the likelihood');
      } else out[i] = v;
    });
    return out;
  };
  const logTarget = (prior: number, like: number) => (prior === -Infinity || like === -Infinity ? -Infinity : prior + (beta === 0 ? 0 : beta * like));

  for (let k = 0; k < walkers; k++) lp[k] = o.logPrior(pos[k]);
  ll.set(await evaluate(pos, lp));
  ex.set(answerExtras);
  if (Array.from(lp).every((v, k) => logTarget(v, ll[k]) === -Infinity)) {
    throw new EnsembleError('every walker starts where the prior or the likelihood is zero');
  }

  const proposal = Array.from({ length: half }, () => new Float64Array(dim));
  const zs = new Float64Array(half);
  const us = new Float64Array(half);
  const propPrior = new Float64Array(half);
  for (let t = 0; t < steps; t++) {
    for (let h = 0; h < 2; h++) {
      const first = h * half;
      const other = (1 - h) * half;
      for (let i = 0; i < half; i++) {
        const k = first + i;
        const rng = rngs[k];
        const j = other + Math.min(half - 1, Math.floor(rng.uniform() * half));
        const z = stretchFactor(rng.uniform(), a);
        us[i] = rng.uniform();
        zs[i] = z;
        const y = proposal[i];
        for (let d = 0; d < dim; d++) y[d] = pos[j][d] + z * (pos[k][d] - pos[j][d]);
        propPrior[i] = o.logPrior(y);
      }
      const propLike = await evaluate(proposal, propPrior);
      for (let i = 0; i < half; i++) {
        const k = first + i;
        const cur = logTarget(lp[k], ll[k]);
        const next = logTarget(propPrior[i], propLike[i]);
        if (next === -Infinity) continue;
        // Acceptance min(1, z^(n-1) p(Y)/p(X_k)) (Goodman & Weare 2010, sec. 3).
        const logRatio = cur === -Infinity ? Infinity : (dim - 1) * Math.log(zs[i]) + next - cur;
        if (Math.log(us[i]) < logRatio) {
          pos[k].set(proposal[i]);
          lp[k] = propPrior[i];
          ll[k] = propLike[i];
          if (E > 0) ex.set(answerExtras.subarray(i * E, (i + 1) * E), k * E);
          chain.accepted[k]++;
        }
      }
    }
    for (let k = 0; k < walkers; k++) {
      chain.positions.set(pos[k], (t * walkers + k) * dim);
      chain.logLikelihood[t * walkers + k] = ll[k];
      chain.logPrior[t * walkers + k] = lp[k];
    }
    if (E > 0) chain.extras.set(ex, t * walkers * E);
    chain.steps = t + 1;
    if (o.onStep) {
      let acc = 0;
      for (const n of chain.accepted) acc += n;
      const go = await o.onStep({ step: t + 1, steps, acceptance: acc / (walkers * (t + 1)), chain });
      if (go === false) {
        chain.stopped = true;
        break;
      }
    }
  }
  return chain;
}

/** Values of parameter i for walker k over the kept steps (after burnIn, every thin-th step). */
export function walkerSeries(c: EnsembleChain, i: number, k: number, burnIn = 0, thin = 1): Float64Array {
  const out: number[] = [];
  for (let t = burnIn; t < c.steps; t += thin) out.push(c.positions[(t * c.walkers + k) * c.dim + i]);
  return Float64Array.from(out);
}

/** All walkers' series of parameter i after burn-in and thinning (one array per walker). */
export function parameterSeries(c: EnsembleChain, i: number, burnIn = 0, thin = 1): Float64Array[] {
  return Array.from({ length: c.walkers }, (_, k) => walkerSeries(c, i, k, burnIn, thin));
}

/** Acceptance fraction of the whole ensemble. */
export function acceptanceFraction(c: EnsembleChain): number {
  let acc = 0;
  for (const n of c.accepted) acc += n;
  return c.steps === 0 ? NaN : acc / (c.walkers * c.steps);
}
