// Comparing a predicted amplitude A_yr with a measurement (see measurement.ts for the model).
import { F_YR_HZ } from '../physics/constants';
import {
  atReferenceFrequency,
  measurementCdf,
  measurementDensityLog10,
  measurementInterval,
  relativeLikelihood,
  tensionSigmas,
  type AmplitudeMeasurement,
} from './measurement';
import { normalCdf } from './normal';

export interface AmplitudeComparison {
  predicted: number;
  /** The measurement's median amplitude at f_yr. */
  measuredMedian: number;
  /** predicted / measured median. */
  ratio: number;
  /** (log10 A_pred - log10 A_med) / sigma of that side: positive when the prediction is high. */
  tensionSigma: number;
  /** Density of the measurement in log10 A at the prediction, per dex. */
  likelihood: number;
  /** Likelihood relative to the peak, exp(-tension^2/2). */
  relativeLikelihood: number;
  /** Where the prediction falls in the measurement's distribution (cdf, 0..1). */
  percentile: number;
  /** Whether the prediction lies inside the stated interval (or the 68.27% interval when none was stated). */
  inside: boolean;
  level: number;
}

/** Compares a predicted A at f_yr (for the measurement's gamma) with the measurement. */
export function compareAmplitude(predictedAyr: number, measured: AmplitudeMeasurement): AmplitudeComparison {
  if (!(Number.isFinite(predictedAyr) && predictedAyr > 0)) {
    throw new RangeError(`the predicted amplitude must be positive and finite, got ${predictedAyr}`);
  }
  const m = measured.fRefHz === F_YR_HZ ? measured : atReferenceFrequency(measured, F_YR_HZ);
  const level = m.stated ? m.stated.level : 2 * normalCdf(1) - 1;
  const interval = m.stated ? m.stated : measurementInterval(m, level);
  const med = Math.pow(10, m.log10Median);
  return {
    predicted: predictedAyr,
    measuredMedian: med,
    ratio: predictedAyr / med,
    tensionSigma: tensionSigmas(m, predictedAyr),
    likelihood: measurementDensityLog10(m, predictedAyr),
    relativeLikelihood: relativeLikelihood(m, predictedAyr),
    percentile: measurementCdf(m, predictedAyr),
    inside: predictedAyr >= interval.lower && predictedAyr <= interval.upper,
    level,
  };
}

/**
 * Probability that an uncertain prediction, log-normal with median `predictedMedian` and width
 * `sigmaDex`, lies inside [lower, upper]: Phi((log hi - mu)/s) - Phi((log lo - mu)/s).
 */
export function probabilityInsideLogNormal(predictedMedian: number, sigmaDex: number, lower: number, upper: number): number {
  const mu = Math.log10(predictedMedian);
  return normalCdf((Math.log10(upper) - mu) / sigmaDex) - normalCdf((Math.log10(lower) - mu) / sigmaDex);
}
