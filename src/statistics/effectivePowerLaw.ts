// A model spectrum's effective power law over the lowest N bins: weighted least squares of
//   log10 h_c(f_k) = log10 A + alpha log10(f_k / f_ref),   gamma = 3 - 2 alpha
// (h_c ~ f^((3 - gamma)/2), Thrane & Romano 2013, PRD 88, 124032), with the covariance of
// (log10 A, gamma) from the fit: s^2 (X^T W X)^-1, s^2 = weighted residual sum of squares / (N - 2)
// (ordinary weighted least squares, e.g. Press et al. 2007, Numerical Recipes 3rd ed., sec. 15.2).
// A pure power law has zero residuals and so zero covariance.
//
// Weights: equal in log when no array is given. With the array's noise-equivalent strain h_n,k per
// bin, w_k = (1 + h_n,k^2 / h_c,k^2)^-2: the inverse variance of a bin's measured power when the
// measurement's scatter scales as signal plus noise power (radiometer form, common practice, no source).

export const DEFAULT_FIT_BINS = 5;

export interface EffectivePowerLaw {
  log10A: number;
  gamma: number;
  /** Covariance of (log10 A, gamma): [var log10A, cov, var gamma]. */
  covariance: [number, number, number];
  bins: number;
  fRefHz: number;
  /** Weighted rms of the residuals in log10 h_c (dex). */
  rmsDex: number;
}

/**
 * Fits the lowest `bins` entries of (f, h_c). `noiseHc`, when given, holds the array's
 * noise-equivalent strain at the same frequencies.
 */
export function fitEffectivePowerLaw(
  fHz: ArrayLike<number>,
  hc: ArrayLike<number>,
  fRefHz: number,
  bins: number = DEFAULT_FIT_BINS,
  noiseHc?: ArrayLike<number>,
): EffectivePowerLaw {
  if (!(Number.isInteger(bins) && bins >= 2)) throw new RangeError(`the fit needs a whole number of bins, at least 2, got ${bins}`);
  if (fHz.length < bins || hc.length < bins) throw new RangeError(`the fit over ${bins} bins needs ${bins} frequencies and strains, got ${Math.min(fHz.length, hc.length)}`);
  if (noiseHc && noiseHc.length < bins) throw new RangeError(`the array's noise covers ${noiseHc.length} bins; the fit needs ${bins}`);
  let sw = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  const lr = Math.log10(fRefHz);
  for (let k = 0; k < bins; k++) {
    const h = hc[k];
    if (!(h > 0 && Number.isFinite(h) && fHz[k] > 0)) throw new RangeError(`bin ${k + 1}: the fit needs a positive finite h_c and frequency, got ${h} at ${fHz[k]} Hz`);
    let w = 1;
    if (noiseHc) {
      const r = noiseHc[k] / h;
      w = 1 / ((1 + r * r) * (1 + r * r));
    }
    const x = Math.log10(fHz[k]) - lr;
    const y = Math.log10(h);
    sw += w;
    sx += w * x;
    sy += w * y;
    sxx += w * x * x;
    sxy += w * x * y;
  }
  const det = sw * sxx - sx * sx;
  if (!(det > 0)) throw new RangeError('the fit needs at least two distinct frequencies');
  const alpha = (sw * sxy - sx * sy) / det;
  const b0 = (sy - alpha * sx) / sw;
  let rss = 0;
  for (let k = 0; k < bins; k++) {
    let w = 1;
    if (noiseHc) {
      const r = noiseHc[k] / hc[k];
      w = 1 / ((1 + r * r) * (1 + r * r));
    }
    const e = Math.log10(hc[k]) - b0 - alpha * (Math.log10(fHz[k]) - lr);
    rss += w * e * e;
  }
  const s2 = bins > 2 ? rss / (bins - 2) : 0;
  // (X^T W X)^-1 = [sxx, -sx; -sx, sw] / det for (b0, alpha); gamma = 3 - 2 alpha.
  const vb = (s2 * sxx) / det;
  const vab = (-s2 * sx) / det;
  const va = (s2 * sw) / det;
  return {
    log10A: b0,
    gamma: 3 - 2 * alpha,
    covariance: [vb, -2 * vab, 4 * va],
    bins,
    fRefHz,
    rmsDex: Math.sqrt(rss / sw),
  };
}
