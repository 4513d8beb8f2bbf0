// Integrated autocorrelation time of MCMC output with Sokal's automatic window (Sokal 1997, in
// Functional Integration, NATO ASI Series B 361, 131): tau(M) = 1 + 2 sum_{t=1..M} rho(t), with
// M the smallest lag such that M >= c tau(M) (c = 5). For an ensemble the autocovariance is
// averaged over the walkers before normalising (common practice for ensemble samplers, no source).

import { lagProductSums } from './fourierTransform';

export const SOKAL_WINDOW_C = 5;

export interface AutocorrelationTime {
  /** Integrated autocorrelation time in steps (>= about 1 for a Markov chain). */
  tau: number;
  /** Window M at which the sum stopped. */
  window: number;
  /** False when no lag satisfied M >= c tau: the series is too short for a reliable tau. */
  windowFound: boolean;
  /** Statistical error of tau: tau sqrt(2 (2M + 1) / N) (Sokal 1997, sec. 3, N = all values). */
  error: number;
}

/**
 * tau for one or several series of equal length (walkers). `c` is the window factor.
 * Autocovariance at lag t: (1/n) sum_i (x_i - xbar)(x_{i+t} - xbar), xbar per series.
 */
export function integratedAutocorrelationTime(series: ArrayLike<number>[], c = SOKAL_WINDOW_C): AutocorrelationTime {
  const m = series.length;
  if (m === 0) throw new RangeError('no series given');
  const n = series[0].length;
  for (const s of series) if (s.length !== n) throw new RangeError('all series must have the same length');
  if (n < 2) return { tau: NaN, window: 0, windowFound: false, error: NaN };
  // Autocovariance at every lag, averaged over the series: one FFT per series (O(n log n) instead of
  // O(n^2) when the window is long, which the progress reports of a sampler hit every 100 ms).
  const autocovAll = new Float64Array(n);
  const centred = new Float64Array(n);
  for (const s of series) {
    let mean = 0;
    for (let i = 0; i < n; i++) mean += s[i];
    mean /= n;
    for (let i = 0; i < n; i++) centred[i] = s[i] - mean;
    const sums = lagProductSums(centred);
    for (let t = 0; t < n; t++) autocovAll[t] += sums[t] / n / m;
  }
  const autocov = (t: number): number => autocovAll[t];
  const c0 = autocov(0);
  if (!(c0 > 0)) return { tau: NaN, window: 0, windowFound: false, error: NaN };
  let tau = 1;
  let M = 0;
  let found = false;
  for (let t = 1; t < n; t++) {
    tau += (2 * autocov(t)) / c0;
    M = t;
    if (t >= c * tau) {
      found = true;
      break;
    }
  }
  const total = n * m;
  return { tau, window: M, windowFound: found, error: tau * Math.sqrt((2 * (2 * M + 1)) / total) };
}
