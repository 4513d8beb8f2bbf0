// Comparing realisations of a finite population with a measured free spectrum (an option beside the
// smooth-spectrum comparison, which the headline verdict uses):
//  - the likelihood averaged over realisations, ln((1/R) sum_r L(h_c of realisation r)), the
//    marginal likelihood of the population with the realisation as a nuisance (Monte Carlo average);
//  - per bin, the measured spectrum's percentile among the realisations, P(model_k < measured_k) with
//    both random: 1 - (1/R) sum_r F_k(x_k,r), F_k the bin's posterior cdf (KDE, freeSpectrumLikelihood.ts).
import type { RealisationDraws } from '../physics/binaryRealisations';
import type { FreeSpectrumLikelihood } from './freeSpectrumLikelihood';

export interface RealisationComparison {
  /** ln of the likelihood averaged over realisations (log-sum-exp, stable). */
  averagedLogLikelihood: number;
  /** Per bin: ln of the bin's likelihood factor averaged over realisations. */
  binAveragedLogLikelihood: Float64Array;
  /** Per bin: the measured spectrum's percentile among the realisations, in [0, 1]. */
  measuredPercentile: Float64Array;
}

/** Log of the mean of exp(values) (log-sum-exp with the maximum taken out). */
function logMeanExp(values: ArrayLike<number>): number {
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) if (values[i] > max) max = values[i];
  if (max === -Infinity) return -Infinity;
  let s = 0;
  for (let i = 0; i < values.length; i++) s += Math.exp(values[i] - max);
  return max + Math.log(s / values.length);
}

/** The realisations' bins must be the likelihood's first bins (same frequencies to 1e-9 relative). */
export function compareRealisations(lik: FreeSpectrumLikelihood, draws: RealisationDraws, frequencyHz: ArrayLike<number>): RealisationComparison {
  const nb = lik.bins;
  if (draws.bins < nb) throw new RangeError(`the realisations have ${draws.bins} bins, the free spectrum ${nb}`);
  for (let k = 0; k < nb; k++) {
    if (!(Math.abs(frequencyHz[k] / lik.frequencyHz[k] - 1) <= 1e-9)) throw new RangeError(`bin ${k + 1}: the realisations are at ${frequencyHz[k]} Hz, the free spectrum at ${lik.frequencyHz[k]} Hz`);
  }
  const R = draws.count;
  const total = new Float64Array(R);
  const perBin = Array.from({ length: nb }, () => new Float64Array(R));
  const pct = new Float64Array(nb);
  const hc = new Float64Array(draws.bins);
  const binLl = new Float64Array(nb);
  const binPct = new Float64Array(nb);
  for (let r = 0; r < R; r++) {
    for (let k = 0; k < draws.bins; k++) hc[k] = draws.hc[r * draws.bins + k];
    lik.binLogLikelihoods(hc, binLl);
    lik.percentiles(hc, binPct);
    let t = 0;
    for (let k = 0; k < nb; k++) {
      perBin[k][r] = binLl[k];
      t += binLl[k];
      pct[k] += binPct[k];
    }
    total[r] = t;
  }
  return {
    averagedLogLikelihood: logMeanExp(total),
    binAveragedLogLikelihood: Float64Array.from(perBin, logMeanExp),
    measuredPercentile: Float64Array.from(pct, (p) => 1 - p / R),
  };
}
