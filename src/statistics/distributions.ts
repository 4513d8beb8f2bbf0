// Distributions for uncertain inputs, on plain SI numbers. Parameters are validated here so
// that every caller (built-ins, CLI, web worker) gets the same messages.
import { normalCdf, normalQuantile, normalDensity } from './normal';
import type { RandomSource } from './prng';

export type DistributionFamily = 'normal' | 'lognormal' | 'uniform' | 'loguniform';

export interface UncertainDistribution {
  family: DistributionFamily;
  /** Parameters in SI (lognormal: median and sigmaDex; normal: mean and sd; uniform: lo and hi). */
  params: Record<string, number>;
  median: number;
  /** Where the density is positive: [lo, hi] (infinite ends allowed). */
  support: readonly [number, number];
  /** Bounds of a truncated form (truncatedDistribution), absent otherwise. */
  truncation?: { lo: number; hi: number };
  cdf(x: number): number;
  quantile(p: number): number;
  density(x: number): number;
  sample(rng: RandomSource): number;
}

export class DistributionError extends Error {
  constructor(
    readonly argument: string,
    message: string,
  ) {
    super(message);
    this.name = 'DistributionError';
  }
}

function finite(x: number, arg: string): void {
  if (!Number.isFinite(x)) throw new DistributionError(arg, `${arg} must be a finite number, got ${x}`);
}

/** Normal with mean and standard deviation sd > 0. */
export function normalDistribution(mean: number, sd: number): UncertainDistribution {
  finite(mean, 'mean');
  finite(sd, 'sd');
  if (!(sd > 0)) throw new DistributionError('sd', `sd must be positive, got ${sd}`);
  return {
    family: 'normal',
    params: { mean, sd },
    median: mean,
    support: [-Infinity, Infinity],
    cdf: (x) => normalCdf((x - mean) / sd),
    quantile: (p) => mean + sd * normalQuantile(p),
    density: (x) => normalDensity((x - mean) / sd) / sd,
    sample: (rng) => mean + sd * rng.normal(),
  };
}

/**
 * Log-normal given by its median > 0 and the standard deviation of log10 x in dex (> 0):
 * log10 x ~ Normal(log10 median, sigmaDex). (In natural-log terms mu = ln median, sigma = sigmaDex ln 10.)
 */
export function lognormalDistribution(median: number, sigmaDex: number): UncertainDistribution {
  finite(median, 'median');
  finite(sigmaDex, 'sigmaDex');
  if (!(median > 0)) throw new DistributionError('median', `median must be positive for a log-normal, got ${median}`);
  if (!(sigmaDex > 0)) throw new DistributionError('sigmaDex', `sigmaDex must be positive, got ${sigmaDex}`);
  const mu = Math.log10(median);
  return {
    family: 'lognormal',
    params: { median, sigmaDex },
    median,
    support: [0, Infinity],
    cdf: (x) => (x <= 0 ? 0 : normalCdf((Math.log10(x) - mu) / sigmaDex)),
    quantile: (p) => Math.pow(10, mu + sigmaDex * normalQuantile(p)),
    density: (x) => (x <= 0 ? 0 : normalDensity((Math.log10(x) - mu) / sigmaDex) / (sigmaDex * x * Math.LN10)),
    sample: (rng) => Math.pow(10, mu + sigmaDex * rng.normal()),
  };
}

/** Uniform on [lo, hi], lo < hi. */
export function uniformDistribution(lo: number, hi: number): UncertainDistribution {
  finite(lo, 'lo');
  finite(hi, 'hi');
  if (!(lo < hi)) throw new DistributionError('hi', `hi must be greater than lo, got lo = ${lo}, hi = ${hi}`);
  const w = hi - lo;
  return {
    family: 'uniform',
    params: { lo, hi },
    median: lo + w / 2,
    support: [lo, hi],
    cdf: (x) => (x <= lo ? 0 : x >= hi ? 1 : (x - lo) / w),
    quantile: (p) => lo + p * w,
    density: (x) => (x < lo || x > hi ? 0 : 1 / w),
    sample: (rng) => lo + rng.uniform() * w,
  };
}

/** Log-uniform (uniform in log x) on [lo, hi], 0 < lo < hi. */
export function loguniformDistribution(lo: number, hi: number): UncertainDistribution {
  finite(lo, 'lo');
  finite(hi, 'hi');
  if (!(lo > 0)) throw new DistributionError('lo', `lo must be positive for a log-uniform, got ${lo}`);
  if (!(lo < hi)) throw new DistributionError('hi', `hi must be greater than lo, got lo = ${lo}, hi = ${hi}`);
  const a = Math.log(lo);
  const w = Math.log(hi) - a;
  return {
    family: 'loguniform',
    params: { lo, hi },
    median: Math.exp(a + w / 2),
    support: [lo, hi],
    cdf: (x) => (x <= lo ? 0 : x >= hi ? 1 : (Math.log(x) - a) / w),
    quantile: (p) => Math.exp(a + p * w),
    density: (x) => (x < lo || x > hi ? 0 : 1 / (x * w)),
    sample: (rng) => Math.exp(a + rng.uniform() * w),
  };
}

/**
 * The distribution restricted to [lo, hi] and renormalised: density f(x)/(F(hi) - F(lo)) inside,
 * sampled by inversion, F^-1(F(lo) + u (F(hi) - F(lo))) (e.g. Devroye 1986, Non-Uniform Random
 * Variate Generation, sec. 2.1). Infinite ends are allowed. Far in a tail (F(hi) - F(lo) below
 * about 1e-12) inversion loses precision, so such a truncation is refused.
 */
export function truncatedDistribution(d: UncertainDistribution, lo: number, hi: number): UncertainDistribution {
  if (Number.isNaN(lo) || Number.isNaN(hi)) throw new DistributionError('lo', 'the truncation bounds must be numbers');
  if (!(lo < hi)) throw new DistributionError('hi', `hi must be greater than lo, got lo = ${lo}, hi = ${hi}`);
  const a = Math.max(lo, d.support[0]);
  const b = Math.min(hi, d.support[1]);
  const fa = a === -Infinity ? 0 : d.cdf(a);
  const fb = b === Infinity ? 1 : d.cdf(b);
  const mass = fb - fa;
  if (!(a < b) || !(mass > 1e-12)) {
    throw new DistributionError('lo', `the interval [${lo}, ${hi}] holds no probability of the distribution (its support is [${d.support[0]}, ${d.support[1]}])`);
  }
  const quantile = (p: number) => Math.min(b, Math.max(a, d.quantile(fa + p * mass)));
  return {
    family: d.family,
    params: d.params,
    median: quantile(0.5),
    support: [a, b],
    truncation: { lo: a, hi: b },
    cdf: (x) => (x <= a ? 0 : x >= b ? 1 : (d.cdf(x) - fa) / mass),
    quantile,
    density: (x) => (x < a || x > b ? 0 : d.density(x) / mass),
    sample: (rng) => quantile(rng.uniform()),
  };
}
