// The headline comparison of a model spectrum with a measurement across the whole band: the
// free-spectrum likelihood bin by bin, and the model's effective (A, gamma) in the measured
// (A, gamma) posterior. Verdict rules (stated in docs/freeSpectrum.md; thresholds are ours, common
// practice, no source):
//   per bin, z_k = sqrt(2 (peak_k - lnL_k)): the bin's likelihood ratio to its best value written as
//   a Gaussian number of sigma (z = 2 is a ratio e^-2); signed + when the model is above the
//   bin's posterior median;
//   inconsistent: a bin among the lowest `fitBins` has z > 3, or the (A, gamma) point lies outside
//                 the 99.7% highest-density region;
//   in tension:   any bin has z > 2, or the point lies outside the 95% region;
//   consistent:   otherwise.
// So a model the lowest bins rule out is never called consistent, whatever its A_yr.
import type { AmplitudeGammaRegion } from './amplitudeGammaPosterior';
import { type EffectivePowerLaw, fitEffectivePowerLaw } from './effectivePowerLaw';
import type { FreeSpectrumLikelihood } from './freeSpectrumLikelihood';

export const BIN_TENSION_Z = 2;
export const BIN_EXCLUSION_Z = 3;
export const REGION_TENSION_LEVEL = 0.95;
export const REGION_EXCLUSION_LEVEL = 0.997;

export type Verdict = 'consistent' | 'tension' | 'inconsistent';

export interface BandComparison {
  verdict: Verdict;
  logLikelihood: number;
  frequencyHz: Float64Array;
  binLogLikelihood: Float64Array;
  /** Signed z per bin (positive: model above the posterior's median). */
  binZ: Float64Array;
  percentile: Float64Array;
  /** Model / measured median of rho (or h_c) per bin. */
  binRatio: Float64Array;
  /** 1-based bins with |z| > BIN_TENSION_Z. */
  disagreeingBins: number[];
  fit: EffectivePowerLaw;
  /** Credible level of the HPD region through the fitted point (null without an (A, gamma) posterior). */
  regionLevel: number | null;
  /** Sentences saying which bins or region disagree. */
  reasons: string[];
}

function medianOfTable(like: FreeSpectrumLikelihood, k: number): number {
  const t = like.tables[k];
  const total = t.cdf[t.size - 1];
  // i: the last grid point before the cdf reaches half the total (the cdf never falls: bisection)
  let lo = 1;
  let hi = t.size;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (t.cdf[mid] < 0.5 * total) lo = mid + 1;
    else hi = mid;
  }
  const i = lo - 1;
  const a = t.cdf[i];
  const b = t.cdf[i + 1];
  const w = b > a ? (0.5 * total - a) / (b - a) : 0;
  return t.x0 + (i + w) * t.dx;
}

const nHz = (f: number) => `${(f * 1e9).toPrecision(3)} nHz`;

export function compareAcrossBand(
  hcAtBins: ArrayLike<number>,
  like: FreeSpectrumLikelihood,
  region: AmplitudeGammaRegion | null,
  fitBins: number,
  noiseHc?: ArrayLike<number>,
): BandComparison {
  const n = like.bins;
  const lnL = like.binLogLikelihoods(hcAtBins);
  const pct = like.percentiles(hcAtBins);
  const x = like.modelQuantity(hcAtBins);
  const z = new Float64Array(n);
  const ratio = new Float64Array(n);
  const disagreeing: number[] = [];
  for (let k = 0; k < n; k++) {
    const med = medianOfTable(like, k);
    const mag = Math.sqrt(Math.max(0, 2 * (like.peak[k] - lnL[k])));
    z[k] = x[k] >= med ? mag : -mag;
    ratio[k] = Math.pow(10, x[k] - med);
    if (mag > BIN_TENSION_Z) disagreeing.push(k + 1);
  }
  const fRef = region?.posterior.fRefHz ?? 1 / (365.25 * 86400);
  const fit = fitEffectivePowerLaw(like.frequencyHz, hcAtBins, fRef, Math.min(fitBins, n), noiseHc);
  const regionLevel = region ? region.credibleLevel(fit.log10A, fit.gamma) : null;
  const reasons: string[] = [];
  const lowest = Math.min(fitBins, n);
  const lowExcluded = disagreeing.filter((b) => b <= lowest && Math.abs(z[b - 1]) > BIN_EXCLUSION_Z);
  const describeBins = (bins: number[]) =>
    bins
      .map((b) => `bin ${b} (${nHz(like.frequencyHz[b - 1])}: model ${ratio[b - 1] >= 1 ? `${ratio[b - 1].toPrecision(2)}x above` : `${(1 / ratio[b - 1]).toPrecision(2)}x below`} the median, ${Math.abs(z[b - 1]).toFixed(1)} sigma)`)
      .join(', ');
  if (lowExcluded.length) reasons.push(`the lowest bins rule it out: ${describeBins(lowExcluded)}`);
  const others = disagreeing.filter((b) => !lowExcluded.includes(b));
  if (others.length) reasons.push(`disagreeing bins: ${describeBins(others)}`);
  if (regionLevel !== null && regionLevel > REGION_TENSION_LEVEL) {
    reasons.push(
      `its effective (A, gamma) = (${Math.pow(10, fit.log10A).toPrecision(2)}, ${fit.gamma.toFixed(2)}) over the lowest ${fit.bins} bins lies outside the ${(100 * (regionLevel > REGION_EXCLUSION_LEVEL ? REGION_EXCLUSION_LEVEL : REGION_TENSION_LEVEL)).toPrecision(3)}% region of the measured (A, gamma) posterior (on its ${(100 * regionLevel).toPrecision(3)}% contour)`,
    );
  }
  let verdict: Verdict = 'consistent';
  if (lowExcluded.length || (regionLevel !== null && regionLevel > REGION_EXCLUSION_LEVEL)) verdict = 'inconsistent';
  else if (disagreeing.length || (regionLevel !== null && regionLevel > REGION_TENSION_LEVEL)) verdict = 'tension';
  return {
    verdict,
    logLikelihood: lnL.reduce((a, b) => a + b, 0),
    frequencyHz: like.frequencyHz,
    binLogLikelihood: lnL,
    binZ: z,
    percentile: pct,
    binRatio: ratio,
    disagreeingBins: disagreeing,
    fit,
    regionLevel,
    reasons,
  };
}
