// A timing array as the detection outlook sees it: pulsars with their noise, a common observing span
// and cadence, and optionally their sky positions. Plain numbers in SI; checks live in src/builtins.
import { F_YR_HZ } from './constants';
import { binsBelowNyquist, spanHarmonics } from './frequencyGrid';

/** Noise of one pulsar's timing residuals. */
export interface PulsarNoise {
  /** Timing precision (rms white residual) per observation, s. */
  precisionS: number;
  /** Time between observations, s. */
  cadenceS: number;
  /** Red-noise amplitude in the characteristic-strain-like convention below (dimensionless); 0 for none. */
  redAmplitude: number;
  /** Red-noise spectral index gamma of the residual PSD, P proportional to f^(-gamma). */
  redGamma: number;
}

export interface PulsarArray {
  /** One entry per pulsar. */
  pulsars: PulsarNoise[];
  /** Observing span, common to all pulsars, s. */
  spanS: number;
  /**
   * Sky positions as [right ascension, declination] in radians, one per pulsar; null means the
   * positions are unknown and pair sums use the expectation over isotropic positions.
   */
  positions: Array<[number, number]> | null;
}

/**
 * One-sided residual PSD of white noise, s^2/Hz: P_w = 2 sigma^2 dt. Parseval's theorem for N = T/dt
 * samples of variance sigma^2 spread evenly up to the Nyquist frequency 1/(2 dt); the same form is
 * used by Hazboun, Romano & Smith 2019, PRD 100, 104028.
 */
export function whiteNoisePsd(precisionS: number, cadenceS: number): number {
  return 2 * precisionS * precisionS * cadenceS;
}

/**
 * One-sided residual PSD of power-law red noise, s^2/Hz: P_r = A^2/(12 pi^2) f_yr^-3 (f/f_yr)^-gamma,
 * the residual PSD of a strain-like power law h = A (f/f_yr)^((3-gamma)/2) through P = h^2/(12 pi^2 f^3)
 * (the PSD/strain relation in docs/array.md; same convention in Hazboun, Romano & Smith 2019, PRD 100, 104028).
 */
export function redNoisePsd(amplitude: number, gamma: number, fHz: number): number {
  if (amplitude === 0) return 0;
  return ((amplitude * amplitude) / (12 * Math.PI * Math.PI)) * F_YR_HZ ** -3 * (fHz / F_YR_HZ) ** -gamma;
}

/**
 * Total noise PSD of one pulsar's residuals at frequency fHz, s^2/Hz. Above the pulsar's own Nyquist
 * frequency 1/(2 dt) it has no data, so its noise there is infinite (it adds nothing to any pair).
 */
export function pulsarNoisePsd(p: PulsarNoise, fHz: number): number {
  if (fHz * 2 * p.cadenceS > 1 + 1e-9) return Infinity;
  return whiteNoisePsd(p.precisionS, p.cadenceS) + redNoisePsd(p.redAmplitude, p.redGamma, fHz);
}

/**
 * Residual PSD a characteristic strain h_c produces at frequency f, s^2/Hz:
 * P = h_c^2 / (12 pi^2 f^3) (the PSD/strain relation in the one-sided convention of Hazboun, Romano & Smith 2019, PRD 100, 104028: residual response 1/(12 pi^2 f^2) times S_h = h_c^2/f).
 */
export function residualPsdFromStrain(hc: number, fHz: number): number {
  return (hc * hc) / (12 * Math.PI * Math.PI * fHz * fHz * fHz);
}

/** Inverse of residualPsdFromStrain: h_c = sqrt(12 pi^2 f^3 P). */
export function strainFromResidualPsd(psd: number, fHz: number): number {
  return Math.sqrt(12 * Math.PI * Math.PI * fHz * fHz * fHz * psd);
}

/** Largest number of frequency bins the outlook evaluates (span / (2 cadence)); a guard against hangs. */
export const MAX_FREQUENCY_BINS = 200_000;

/**
 * Fourier frequency bins of a span T sampled every dt: f_k = k/T for k = 1 .. floor(T/(2 dt)), i.e.
 * up to the Nyquist frequency 1/(2 dt) (common practice, no source). The cadence used is the shortest
 * of the array's pulsars. Unlike frequencyGridFromSpan, a span of exactly two cadences (one bin at the
 * Nyquist frequency) is allowed, and the limit is MAX_FREQUENCY_BINS.
 */
export function frequencyBins(spanS: number, cadenceS: number): Float64Array {
  const count = binsBelowNyquist(spanS, cadenceS);
  if (!(count >= 1)) {
    throw new RangeError(`span ${spanS} s holds no frequency bin below the Nyquist frequency of cadence ${cadenceS} s`);
  }
  if (count > MAX_FREQUENCY_BINS) {
    throw new RangeError(`span / (2 cadence) gives ${count} frequency bins, more than the limit of ${MAX_FREQUENCY_BINS}`);
  }
  return spanHarmonics(spanS, count);
}

/** Shortest cadence in the array, s (its Nyquist frequency bounds the bins). */
export function shortestCadence(array: PulsarArray): number {
  let c = Infinity;
  for (const p of array.pulsars) c = Math.min(c, p.cadenceS);
  return c;
}
