// Shapes that build a merger density: redshift dependence and mass-ratio distribution.
import { integrate } from './gaussLegendre';

/** Redshift shape (1+z)^beta e^(-z/z0) (Middleton et al. 2016, MNRAS 455, L72). */
export function redshiftShape(z: number, beta: number, z0: number): number {
  return Math.pow(1 + z, beta) * Math.exp(-z / z0);
}

/** Normalisation of q^gamma on [qMin, 1]: Int q^gamma dq = (1 - qMin^(gamma+1)) / (gamma+1), or ln(1/qMin) at gamma = -1. */
export function powerLawMassRatioNorm(gamma: number, qMin: number): number {
  if (Math.abs(gamma + 1) < 1e-12) return -Math.log(qMin);
  return (1 - Math.pow(qMin, gamma + 1)) / (gamma + 1);
}

/** A normalised mass-ratio density p(q) on [qMin, 1]. */
export interface MassRatioDistribution {
  qMin: number;
  pdf(q: number): number;
}

/** p(q) = q^gamma / norm on [qMin, 1] (Chen, Sesana & Del Pozzo 2017, arXiv:1612.00455, mass-ratio term). */
export function powerLawMassRatio(gamma: number, qMin: number): MassRatioDistribution {
  const norm = powerLawMassRatioNorm(gamma, qMin);
  return { qMin, pdf: (q) => (q >= qMin && q <= 1 ? Math.pow(q, gamma) / norm : 0) };
}

/**
 * p(q) = w(q) / Int_qMin^1 w dq for a user weight w >= 0 (normalised numerically: 8 panels of
 * 16-point Gauss-Legendre). Throws if the integral is not positive and finite.
 */
export function customMassRatio(weight: (q: number) => number, qMin: number): MassRatioDistribution {
  const norm = integrate(weight, qMin, 1, 8, 16);
  if (!(norm > 0) || !Number.isFinite(norm)) throw new RangeError(`the mass-ratio weight integrates to ${norm} over [${qMin}, 1]; it must be positive and finite`);
  return { qMin, pdf: (q) => (q >= qMin && q <= 1 ? weight(q) / norm : 0) };
}
