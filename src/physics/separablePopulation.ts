// A population whose density factorises in z, total mass and mass ratio (the form of Middleton et al.
// 2016, MNRAS 455, L72 with the q term of Chen, Sesana & Del Pozzo 2017, arXiv:1612.00455):
//   d^3n/(dz dlog10M dq) = redshift(z) * exp(lnMass(log10M)) * massRatio(q).
// The mass factor is given as a logarithm so that the integrator adds ln M^(5/3) to it and takes one
// exp per mass node (backgroundIntegral.ts).
import type { BinaryPopulation } from './populationTypes';

export interface SeparableDensity {
  /** z factor, Mpc^-3 per unit z (finite, >= 0). */
  redshift(z: number): number;
  /** Natural log of the mass factor per dex of total mass (Msun); -Infinity where the factor is 0. */
  lnMass(log10M: number): number;
  /** Mass-ratio factor per unit q (finite, >= 0). */
  massRatio(q: number): number;
}

export type PopulationLimits = Pick<BinaryPopulation, 'zMin' | 'zMax' | 'log10MMin' | 'log10MMax' | 'qMin' | 'qMax' | 'qBreaks'>;

/** The BinaryPopulation of a separable density: density, zMass and the factors agree by construction. */
export function separablePopulation(limits: PopulationLimits, d: SeparableDensity): BinaryPopulation {
  // The integrators vary q fastest and z slowest, so the z and mass factors are kept from the last call.
  let lastZ = NaN;
  let zFactor = 0;
  let lastX = NaN;
  let massFactor = 0;
  const zMass = (z: number, log10M: number): number => {
    if (z !== lastZ) {
      zFactor = d.redshift(z);
      lastZ = z;
    }
    if (log10M !== lastX) {
      massFactor = Math.exp(d.lnMass(log10M));
      lastX = log10M;
    }
    return zFactor * massFactor;
  };
  // the factor itself (called as a plain function, as the others), so that what is kept per factor
  // function (the spectrum's q integral, circularMassModels.ts) is found again for a new population
  const massRatio = d.massRatio;
  // the limits copied field by field: an object spread costs microseconds per population here
  const pop: BinaryPopulation = {
    zMin: limits.zMin,
    zMax: limits.zMax,
    log10MMin: limits.log10MMin,
    log10MMax: limits.log10MMax,
    qMin: limits.qMin,
    qMax: limits.qMax,
    density: (z, log10M, q) => zMass(z, log10M) * massRatio(q),
    separable: { zMass, massRatio, redshift: d.redshift, lnMass: d.lnMass },
  };
  if (limits.qBreaks !== undefined) pop.qBreaks = limits.qBreaks;
  return pop;
}
