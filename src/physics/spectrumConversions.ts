// Quantities the trade derives from h_c(f). SI: frequencies in Hz, H0 in s^-1.
import { F_YR_HZ } from './constants';
import type { Spectrum } from './spectrum';

/** Omega_gw(f) = 2 pi^2 f^2 h_c^2 / (3 H0^2) (Phinney 2001, astro-ph/0108028, with rho_c = 3H0^2/(8 pi G)). */
export function omegaGw(fHz: number, hc: number, hubbleSI: number): number {
  return (2 * Math.PI * Math.PI * fHz * fHz * hc * hc) / (3 * hubbleSI * hubbleSI);
}

/** One-sided timing-residual power spectral density P(f) = h_c^2 / (12 pi^2 f^3), s^3 (i.e. s^2/Hz) (the one-sided convention of Hazboun, Romano & Smith 2019, PRD 100, 104028: residual response 1/(12 pi^2 f^2) times S_h = h_c^2/f). */
export function residualPowerSpectralDensity(fHz: number, hc: number): number {
  return (hc * hc) / (12 * Math.PI * Math.PI * fHz * fHz * fHz);
}

/** Timing residual of order h_c / (2 pi f), s: an order-of-magnitude scale (common practice, no source). */
export function equivalentResidual(fHz: number, hc: number): number {
  return hc / (2 * Math.PI * fHz);
}

/**
 * rms timing residual in a band of width deltaF around f, sqrt(P(f) deltaF), s (follows from the
 * one-sided PSD above). At deltaF = f it is h_c / (2 sqrt(3) pi f): sqrt(3) below equivalentResidual.
 */
export function rmsResidualInBand(fHz: number, hc: number, bandwidthHz: number): number {
  return Math.sqrt(residualPowerSpectralDensity(fHz, hc) * bandwidthHz);
}

/** gamma = 3 - 2 alpha: slope of P(f) proportional to f^(-gamma) for h_c proportional to f^alpha (follows from P = h_c^2/(12 pi^2 f^3)). */
export function gammaFromAlpha(alpha: number): number {
  return 3 - 2 * alpha;
}

/** alpha = (3 - gamma) / 2. */
export function alphaFromGamma(gamma: number): number {
  return (3 - gamma) / 2;
}

/** Power law h_c = A (f / f_yr)^alpha. */
export function powerLawStrain(fHz: number, amplitude: number, alpha: number): number {
  return amplitude * Math.pow(fHz / F_YR_HZ, alpha);
}

/**
 * Local slope dln h_c / dln f on the spectrum's grid: centred differences in ln f (second order on
 * uneven grids), one-sided at the ends.
 */
export function localSpectralSlope(s: Spectrum): Float64Array {
  const n = s.frequencyHz.length;
  const out = new Float64Array(n);
  if (n < 2) return out.fill(NaN);
  const x = Array.from(s.frequencyHz, Math.log);
  const y = Array.from(s.hc, (h) => Math.log(h));
  for (let i = 0; i < n; i++) {
    if (i === 0) out[i] = (y[1] - y[0]) / (x[1] - x[0]);
    else if (i === n - 1) out[i] = (y[n - 1] - y[n - 2]) / (x[n - 1] - x[n - 2]);
    else {
      const h1 = x[i] - x[i - 1];
      const h2 = x[i + 1] - x[i];
      out[i] = (h1 * h1 * (y[i + 1] - y[i]) + h2 * h2 * (y[i] - y[i - 1])) / (h1 * h2 * (h1 + h2));
    }
  }
  return out;
}

/**
 * h_c at f by interpolation of ln h_c linear in ln f between grid points; outside the grid, the
 * nearest end segment is extended (a power law). Throws if f is not positive.
 */
export function strainAtFrequency(s: Spectrum, fHz: number): number {
  const n = s.frequencyHz.length;
  if (!(fHz > 0)) throw new RangeError(`frequency must be positive, got ${fHz} Hz`);
  if (n === 0) throw new RangeError('the spectrum has no frequencies');
  if (n === 1) {
    if (fHz === s.frequencyHz[0]) return s.hc[0];
    throw new RangeError('a spectrum of one frequency can only be read at that frequency');
  }
  let i = 0;
  while (i < n - 2 && s.frequencyHz[i + 1] < fHz) i++;
  const x0 = Math.log(s.frequencyHz[i]);
  const x1 = Math.log(s.frequencyHz[i + 1]);
  const y0 = Math.log(s.hc[i]);
  const y1 = Math.log(s.hc[i + 1]);
  const t = (Math.log(fHz) - x0) / (x1 - x0);
  return Math.exp(y0 + t * (y1 - y0));
}
