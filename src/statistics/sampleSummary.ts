// Summaries of Monte Carlo samples: quantiles, central intervals and their Monte Carlo error.
import { normalQuantile } from './normal';

/**
 * Sample quantile, linear interpolation between order statistics (definition 7 of Hyndman &
 * Fan 1996, Am. Stat. 50, 361). `sorted` must be ascending.
 */
export function sortedQuantile(sorted: Float64Array, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/**
 * Monte Carlo error of the p-quantile as half the width of its ~68% distribution-free confidence
 * interval from order statistics: ranks n p -+ sqrt(n p (1-p)) (binomial count of samples
 * below the quantile; e.g. Conover 1999, Practical Nonparametric Statistics, 3rd ed., sec. 3.2).
 */
export function quantileMonteCarloError(sorted: Float64Array, p: number): number {
  const n = sorted.length;
  if (n < 2) return NaN;
  const s = Math.sqrt(n * p * (1 - p));
  const rLo = Math.max(0, Math.floor(n * p - s));
  const rHi = Math.min(n - 1, Math.ceil(n * p + s));
  return 0.5 * (sorted[rHi] - sorted[rLo]);
}

export interface IntervalSummary {
  level: number;
  lower: number;
  upper: number;
  /** Monte Carlo errors of the two ends. */
  lowerError: number;
  upperError: number;
}

export interface SampleSummary {
  count: number;
  median: number;
  medianError: number;
  /** 68.27% and 95.45% central intervals (1 and 2 sigma of a normal). */
  intervals: IntervalSummary[];
}

/** The 1-sigma and 2-sigma central probabilities of a normal, 2 Phi(k) - 1. */
export const ONE_SIGMA_LEVEL = 0.6826894921370859;
export const TWO_SIGMA_LEVEL = 0.9544997361036416;

export function summariseSamples(values: ArrayLike<number>, levels: number[] = [ONE_SIGMA_LEVEL, TWO_SIGMA_LEVEL]): SampleSummary {
  const finite = Float64Array.from(Array.prototype.filter.call(values, (x: number) => Number.isFinite(x)) as number[]);
  finite.sort();
  const intervals = levels.map((level) => {
    const pl = 0.5 - level / 2;
    const pu = 0.5 + level / 2;
    return {
      level,
      lower: sortedQuantile(finite, pl),
      upper: sortedQuantile(finite, pu),
      lowerError: quantileMonteCarloError(finite, pl),
      upperError: quantileMonteCarloError(finite, pu),
    };
  });
  return { count: finite.length, median: sortedQuantile(finite, 0.5), medianError: quantileMonteCarloError(finite, 0.5), intervals };
}

/** Fraction of values inside [lo, hi] with its binomial standard error sqrt(p(1-p)/n). */
export function fractionInside(values: ArrayLike<number>, lo: number, hi: number): { fraction: number; error: number } {
  let k = 0;
  let n = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    n++;
    if (v >= lo && v <= hi) k++;
  }
  const f = n ? k / n : NaN;
  return { fraction: f, error: n ? Math.sqrt((f * (1 - f)) / n) : NaN };
}

/** sigma multiple for a central probability, re-exported for summaries (Phi^-1((1+p)/2)). */
export function sigmasForLevel(level: number): number {
  return normalQuantile(0.5 + level / 2);
}
