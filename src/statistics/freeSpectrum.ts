// A measured free spectrum: posterior samples of the timing-residual amplitude in each frequency bin
// f_k (= k/T for an array of span T), and the prior the analysis used, so it can be divided out.
//
// Convention (one-sided residual PSD P(f) = h_c^2 / (12 pi^2 f^3), Thrane & Romano 2013, PRD 88,
// 124032; times the bin width 1/T, as in the free-spectrum refits of Lamb, Taylor & van Haasteren
// 2023, PRD 108, 103019):   rho_k^2 = h_c(f_k)^2 / (12 pi^2 f_k^3 T),  rho_k in seconds.
// Samples are log10 rho_k (s) or log10 h_c(f_k). The model enters at the bin frequency f_k itself
// (docs/freeSpectrum.md says why the bin centre and not the mean over the bin).

export type FreeSpectrumQuantity = 'log10Rho' | 'log10Hc';

/** The prior on each bin's sampled quantity: uniform on [lower, upper] (same for every bin), or none. */
export type FreeSpectrumPrior = { kind: 'uniform'; lower: number; upper: number } | { kind: 'none' };

export interface FreeSpectrumData {
  quantity: FreeSpectrumQuantity;
  /** Bin frequencies f_k, Hz, increasing. */
  frequencyHz: Float64Array;
  /** Span T of the data, s (sets rho from h_c). */
  spanS: number;
  /** samples[k] holds the samples of bin k. */
  samples: Float64Array[];
  prior: FreeSpectrumPrior;
}

/** Size limit of a stored free spectrum (bins x samples per bin). */
export const FREE_SPECTRUM_MAX_BINS = 30;
export const FREE_SPECTRUM_MAX_SAMPLES = 10_000;

export class FreeSpectrumError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FreeSpectrumError';
  }
}

/** log10 rho_k - log10 h_c(f_k) = -1/2 log10(12 pi^2 f^3 T) (the convention above). */
export function log10RhoOffset(fHz: number, spanS: number): number {
  return -0.5 * Math.log10(12 * Math.PI * Math.PI * fHz * fHz * fHz * spanS);
}

/** rho_k (s) from h_c at f_k, and back. */
export function rhoFromStrain(hc: number, fHz: number, spanS: number): number {
  return hc / Math.sqrt(12 * Math.PI * Math.PI * fHz * fHz * fHz * spanS);
}
export function strainFromRho(rho: number, fHz: number, spanS: number): number {
  return rho * Math.sqrt(12 * Math.PI * Math.PI * fHz * fHz * fHz * spanS);
}

/** Offset that turns log10 h_c at bin k into the data's quantity. */
export function quantityOffset(data: FreeSpectrumData, k: number): number {
  return data.quantity === 'log10Rho' ? log10RhoOffset(data.frequencyHz[k], data.spanS) : 0;
}

/** Free spectra already checked (the same objects): a stored free spectrum is an immutable value. */
const checked = new WeakSet<FreeSpectrumData>();

/**
 * Checks a free spectrum and returns it; every problem names the bin (and sample). The same object
 * is checked once (the built-in checks it, and the likelihood built from it later does not again).
 */
export function validateFreeSpectrum(data: FreeSpectrumData): FreeSpectrumData {
  if (checked.has(data)) return data;
  const nb = data.frequencyHz.length;
  if (nb === 0) throw new FreeSpectrumError('the free spectrum has no bins');
  if (nb > FREE_SPECTRUM_MAX_BINS) throw new FreeSpectrumError(`too many bins (${nb}); at most ${FREE_SPECTRUM_MAX_BINS}`);
  if (data.samples.length !== nb) throw new FreeSpectrumError(`${nb} bin frequencies but ${data.samples.length} bins of samples`);
  if (!(Number.isFinite(data.spanS) && data.spanS > 0)) throw new FreeSpectrumError(`the span T must be positive and finite, got ${data.spanS} s`);
  const p = data.prior;
  if (p.kind === 'uniform' && !(Number.isFinite(p.lower) && Number.isFinite(p.upper) && p.lower < p.upper)) {
    throw new FreeSpectrumError(`the prior range must be two finite numbers, lower < upper, got ${p.lower} to ${p.upper}`);
  }
  const lower = p.kind === 'uniform' ? p.lower : -Infinity;
  const upper = p.kind === 'uniform' ? p.upper : Infinity;
  for (let k = 0; k < nb; k++) {
    const f = data.frequencyHz[k];
    if (!(Number.isFinite(f) && f > 0)) throw new FreeSpectrumError(`bin ${k + 1}: frequency must be positive and finite, got ${f} Hz`);
    if (k > 0 && f === data.frequencyHz[k - 1]) throw new FreeSpectrumError(`bin ${k + 1}: frequency ${f} Hz repeats bin ${k}`);
    if (k > 0 && f < data.frequencyHz[k - 1]) throw new FreeSpectrumError(`bin ${k + 1}: frequencies must increase, ${f} Hz follows ${data.frequencyHz[k - 1]} Hz`);
    const s = data.samples[k];
    if (s.length < 2) throw new FreeSpectrumError(`bin ${k + 1} has ${s.length} samples; at least 2 are needed`);
    if (s.length > FREE_SPECTRUM_MAX_SAMPLES) throw new FreeSpectrumError(`bin ${k + 1} has ${s.length} samples; at most ${FREE_SPECTRUM_MAX_SAMPLES}`);
    const bad = firstBadSample(s, lower, upper);
    if (bad >= 0) {
      const v = s[bad];
      const why = Number.isFinite(v) ? `lies outside the prior range ${lower} to ${upper}` : 'is not a finite number';
      throw new FreeSpectrumError(`bin ${k + 1}, sample ${bad + 1}: ${v} ${why}`);
    }
    if (allEqual(s)) throw new FreeSpectrumError(`bin ${k + 1}: all samples are equal (${s[0]}); a density needs spread`);
  }
  checked.add(data);
  return data;
}

/** Index of the first sample that is not a finite number in [lower, upper], or -1. */
function firstBadSample(s: Float64Array, lower: number, upper: number): number {
  for (let i = 0; i < s.length; i++) {
    const v = s[i];
    // v - v is NaN for an infinite v and for NaN (which also fails both comparisons)
    if (!(v >= lower && v <= upper && v - v === 0)) return i;
  }
  return -1;
}

function allEqual(s: Float64Array): boolean {
  const first = s[0];
  for (let i = 1; i < s.length; i++) if (s[i] !== first) return false;
  return true;
}
