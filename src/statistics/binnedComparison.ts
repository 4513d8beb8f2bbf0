// A model spectrum against measured per-bin values: the model's h_c at each bin frequency (log-log
// interpolation on the model grid), converted to the bins' quantity, and its tension with each bin
// in log10 of that quantity. Each bin is two half-normals in log10 joined at its value (the same
// model as measurement.ts; common practice, no source); a bin with lower end 0 is an upper limit
// and only a model above its value is in tension.
import type { BinnedSpectrum } from './binnedSpectrum';
import { centralIntervalSigmas } from './normal';
import { omegaGwFromStrain, residualPowerFromStrain } from './powerLaw';

export interface BinTensions {
  frequencyHz: Float64Array;
  /** The model's value of the bins' quantity at each bin frequency. */
  model: Float64Array;
  /** Signed tension per bin in sigma of log10 (positive: the model is high). */
  tension: Float64Array;
  /** Sum of squared tensions and the number of bins. */
  chiSquare: number;
  bins: number;
}

/** log-log interpolation of h_c on the model grid; frequencies outside it are refused. */
export function strainAtFrequency(fModel: Float64Array, hcModel: Float64Array, f: number): number {
  const n = fModel.length;
  if (n === 0) throw new RangeError('the model spectrum is empty');
  const tol = 1e-12 * f;
  if (f < fModel[0] - tol || f > fModel[n - 1] + tol) {
    throw new RangeError(
      `the bin at ${(f * 1e9).toPrecision(4)} nHz lies outside the model spectrum (${(fModel[0] * 1e9).toPrecision(4)} to ${(fModel[n - 1] * 1e9).toPrecision(4)} nHz)`,
    );
  }
  if (n === 1) return hcModel[0];
  let i = 0;
  while (i < n - 2 && fModel[i + 1] < f) i++;
  const [f0, f1, h0, h1] = [fModel[i], fModel[i + 1], hcModel[i], hcModel[i + 1]];
  if (!(h0 > 0 && h1 > 0)) return h0 + ((h1 - h0) * (f - f0)) / (f1 - f0);
  const t = Math.log(f / f0) / Math.log(f1 / f0);
  return Math.exp(Math.log(h0) + t * Math.log(h1 / h0));
}

export function binTensions(fModel: Float64Array, hcModel: Float64Array, bins: BinnedSpectrum, h0PerS?: number): BinTensions {
  if (bins.quantity === 'omegaGw' && !(h0PerS && h0PerS > 0)) throw new RangeError('Omega_gw bins need H0 to convert the model spectrum');
  const n = bins.frequencyHz.length;
  const k = centralIntervalSigmas(bins.level);
  const model = new Float64Array(n);
  const tension = new Float64Array(n);
  let chi2 = 0;
  for (let i = 0; i < n; i++) {
    const f = bins.frequencyHz[i];
    const hc = strainAtFrequency(fModel, hcModel, f);
    const m = bins.quantity === 'hc' ? hc : bins.quantity === 'omegaGw' ? omegaGwFromStrain(hc, f, h0PerS!) : residualPowerFromStrain(hc, f);
    model[i] = m;
    const d = Math.log10(m) - Math.log10(bins.value[i]);
    let t: number;
    if (d >= 0) t = d / ((Math.log10(bins.upper[i]) - Math.log10(bins.value[i])) / k);
    else t = bins.lower[i] > 0 ? d / ((Math.log10(bins.value[i]) - Math.log10(bins.lower[i])) / k) : 0;
    if (!Number.isFinite(t)) t = d === 0 ? 0 : Math.sign(d) * Infinity; // a zero-width side
    tension[i] = t;
    chi2 += t * t;
  }
  return { frequencyHz: Float64Array.from(bins.frequencyHz), model, tension, chiSquare: chi2, bins: n };
}
