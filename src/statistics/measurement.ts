// A measured background amplitude: the power-law amplitude A at a reference frequency for an
// assumed spectral index gamma, modelled as a distribution in log10 A.
//
// Model (common practice, no source): an interval [lo, hi] around a median m at credibility
// `level` becomes two half-normals in x = log10 A joined at log10 m, each holding probability 1/2:
//   sigma_lo = (log10 m - log10 lo) / k,  sigma_hi = (log10 hi - log10 m) / k,  k = Phi^-1((1+level)/2),
//   p(x) = phi((x - log10 m)/sigma_side) / sigma_side   (side = lo below the median, hi above).
// So the median and both interval ends are reproduced exactly; the density jumps at the median
// when sigma_lo != sigma_hi. A symmetric interval in log10 A gives the plain log-normal in A.
import { F_YR_HZ } from '../physics/constants';
import { centralIntervalSigmas, normalCdf, normalDensity, normalQuantile } from './normal';

export interface AmplitudeMeasurement {
  /** log10 of the median amplitude at fRefHz. */
  log10Median: number;
  /** Widths (dex) of the lower and upper halves. */
  sigmaLowDex: number;
  sigmaHighDex: number;
  /** The interval as stated and its credibility (fraction in (0,1)); null when given as log10 mean and sigma. */
  stated: { lower: number; upper: number; level: number } | null;
  /** Spectral index of the residual power, P ~ f^-gamma (13/3 for circular GW-driven binaries). */
  gamma: number;
  /** Reference frequency of A, Hz (f_yr unless said otherwise). */
  fRefHz: number;
}

export class MeasurementError extends Error {
  constructor(
    readonly argument: string,
    message: string,
  ) {
    super(message);
    this.name = 'MeasurementError';
  }
}

export const GAMMA_CIRCULAR = 13 / 3;

function checkLevel(level: number): void {
  if (!Number.isFinite(level) || !(level > 0 && level < 1)) {
    throw new MeasurementError(
      'level',
      `level is the credibility of the interval as a fraction in (0, 1), e.g. 0.9 or 90%, got ${level}`,
    );
  }
}

function checkPowerLaw(gamma: number, fRefHz: number): void {
  if (!Number.isFinite(gamma)) throw new MeasurementError('gamma', `gamma must be a finite number, got ${gamma}`);
  if (!(Number.isFinite(fRefHz) && fRefHz > 0)) {
    throw new MeasurementError('fRef', `the reference frequency must be positive and finite, got ${fRefHz} Hz`);
  }
}

/** From a median and an interval [lower, upper] with its credibility level (required). */
export function measurementFromInterval(
  median: number,
  lower: number,
  upper: number,
  level: number,
  gamma: number = GAMMA_CIRCULAR,
  fRefHz: number = F_YR_HZ,
): AmplitudeMeasurement {
  for (const [name, v] of [['median', median], ['lower', lower], ['upper', upper]] as const) {
    if (!(Number.isFinite(v) && v > 0)) throw new MeasurementError(name, `${name} must be a positive amplitude, got ${v}`);
  }
  if (!(lower < median)) throw new MeasurementError('lower', `lower end ${lower} must be below the median ${median}`);
  if (!(upper > median)) throw new MeasurementError('upper', `upper end ${upper} must be above the median ${median}`);
  checkLevel(level);
  checkPowerLaw(gamma, fRefHz);
  const k = centralIntervalSigmas(level);
  const m = Math.log10(median);
  return {
    log10Median: m,
    sigmaLowDex: (m - Math.log10(lower)) / k,
    sigmaHighDex: (Math.log10(upper) - m) / k,
    stated: { lower, upper, level },
    gamma,
    fRefHz,
  };
}

/** From a median and a symmetric half-width in A (median -+ halfWidth), with its level. */
export function measurementFromSymmetric(
  median: number,
  halfWidth: number,
  level: number,
  gamma: number = GAMMA_CIRCULAR,
  fRefHz: number = F_YR_HZ,
): AmplitudeMeasurement {
  if (!(Number.isFinite(halfWidth) && halfWidth > 0)) {
    throw new MeasurementError('halfWidth', `halfWidth must be positive, got ${halfWidth}`);
  }
  if (!(halfWidth < median)) {
    throw new MeasurementError('halfWidth', `halfWidth ${halfWidth} must be smaller than the median ${median} (an amplitude is positive)`);
  }
  return measurementFromInterval(median, median - halfWidth, median + halfWidth, level, gamma, fRefHz);
}

/** From the mean and standard deviation of log10 A (a log-normal in A). */
export function measurementFromLog10(
  log10Mean: number,
  sigmaDex: number,
  gamma: number = GAMMA_CIRCULAR,
  fRefHz: number = F_YR_HZ,
): AmplitudeMeasurement {
  if (!Number.isFinite(log10Mean)) throw new MeasurementError('log10Mean', `log10Mean must be finite, got ${log10Mean}`);
  if (!(Number.isFinite(sigmaDex) && sigmaDex > 0)) throw new MeasurementError('sigma', `sigma (dex) must be positive, got ${sigmaDex}`);
  checkPowerLaw(gamma, fRefHz);
  return { log10Median: log10Mean, sigmaLowDex: sigmaDex, sigmaHighDex: sigmaDex, stated: null, gamma, fRefHz };
}

/** Power-law exponent of h_c: h_c ~ f^alpha with alpha = (3 - gamma)/2 (P ~ h_c^2 f^-3). */
export function strainExponent(gamma: number): number {
  return (3 - gamma) / 2;
}

/** The measurement's amplitude distribution moved to another reference frequency (same gamma). */
export function atReferenceFrequency(m: AmplitudeMeasurement, fRefHz: number): AmplitudeMeasurement {
  checkPowerLaw(m.gamma, fRefHz);
  const shift = strainExponent(m.gamma) * Math.log10(fRefHz / m.fRefHz);
  const stated = m.stated && {
    lower: m.stated.lower * Math.pow(10, shift),
    upper: m.stated.upper * Math.pow(10, shift),
    level: m.stated.level,
  };
  return { ...m, log10Median: m.log10Median + shift, stated, fRefHz };
}

/** log10 A at the median and at the quantile p of the measurement. */
export function measurementQuantileLog10(m: AmplitudeMeasurement, p: number): number {
  if (!(p > 0 && p < 1)) return p <= 0 ? -Infinity : Infinity;
  const z = normalQuantile(p);
  return m.log10Median + z * (z < 0 ? m.sigmaLowDex : m.sigmaHighDex);
}

/** Cumulative probability of the measurement at amplitude A. */
export function measurementCdf(m: AmplitudeMeasurement, amplitude: number): number {
  if (!(amplitude > 0)) return 0;
  const d = Math.log10(amplitude) - m.log10Median;
  return normalCdf(d / (d < 0 ? m.sigmaLowDex : m.sigmaHighDex));
}

/** Signed distance of log10 A from the median in units of the sigma of that side. */
export function tensionSigmas(m: AmplitudeMeasurement, amplitude: number): number {
  const d = Math.log10(amplitude) - m.log10Median;
  return d / (d < 0 ? m.sigmaLowDex : m.sigmaHighDex);
}

/** Probability density of the measurement in x = log10 A at amplitude A (per dex). */
export function measurementDensityLog10(m: AmplitudeMeasurement, amplitude: number): number {
  const d = Math.log10(amplitude) - m.log10Median;
  const s = d < 0 ? m.sigmaLowDex : m.sigmaHighDex;
  return normalDensity(d / s) / s;
}

/** Likelihood relative to its value at the median, exp(-t^2/2) with t the tension. */
export function relativeLikelihood(m: AmplitudeMeasurement, amplitude: number): number {
  if (!(amplitude > 0)) return 0;
  const t = tensionSigmas(m, amplitude);
  return Math.exp(-0.5 * t * t);
}

/** The interval of the measurement at a given credibility (central, in log10 A). */
export function measurementInterval(m: AmplitudeMeasurement, level: number): { lower: number; upper: number } {
  checkLevel(level);
  return {
    lower: Math.pow(10, measurementQuantileLog10(m, 0.5 - level / 2)),
    upper: Math.pow(10, measurementQuantileLog10(m, 0.5 + level / 2)),
  };
}
