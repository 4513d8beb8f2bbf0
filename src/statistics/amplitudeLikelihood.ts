// The log-likelihood of a predicted amplitude under a measured one: the measurement's density in
// x = log10 A (measurement.ts, two half-normals) read as a likelihood, which assumes the published
// posterior was taken with a prior flat in log10 A (common practice, no source).
//   ln L = -t^2/2 - ln(sigma_side sqrt(2 pi)),  t = (log10 A - log10 A_med)/sigma_side.
import type { AmplitudeMeasurement } from './measurement';
import { atReferenceFrequency } from './measurement';

const LN_SQRT_2PI = 0.5 * Math.log(2 * Math.PI);

/** ln L at amplitude A (A given at the measurement's own reference frequency); -Infinity at A = 0. */
export function amplitudeLogLikelihood(m: AmplitudeMeasurement, amplitude: number): number {
  if (amplitude === 0) return -Infinity;
  if (!(amplitude > 0)) return NaN;
  const d = Math.log10(amplitude) - m.log10Median;
  const s = d < 0 ? m.sigmaLowDex : m.sigmaHighDex;
  const t = d / s;
  return -0.5 * t * t - Math.log(s) - LN_SQRT_2PI;
}

/** The same for an amplitude quoted at another reference frequency (moved along the measurement's power law). */
export function amplitudeLogLikelihoodAt(m: AmplitudeMeasurement, amplitude: number, fRefHz: number): number {
  return amplitudeLogLikelihood(fRefHz === m.fRefHz ? m : atReferenceFrequency(m, fRefHz), amplitude);
}
