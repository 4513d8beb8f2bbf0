// The phenomenological merger density of Middleton, Del Pozzo, Farr, Sesana & Vecchio 2016 (MNRAS 455,
// L72, arXiv:1507.00992; authors, title and abstract checked; unverified: volume and page, which no copy
// reachable with the search tool states) with the mass-ratio term of Chen, Sesana & Del Pozzo 2017
// (arXiv:1612.00455; unverified: the form of their q term, which their abstract, the only part reachable,
// does not give):
//   d^3n/(dz dlog10M dq) = ndot0 (M/1e7 Msun)^(-alpha) e^(-M/M*) (1+z)^beta e^(-z/z0) |dt_r/dz| p(q).
// Our choice: M is the TOTAL mass m1 + m2 (the population contract's variable). Middleton et al. 2016
// write the density in chirp mass (their abstract); which mass Chen et al. use is unverified. Fitted
// parameter values from these papers therefore do not carry over unchanged.
import { GYR_S } from './constants';
import type { FlatLambdaCdm } from './cosmology';
import type { BinaryPopulation } from './populationTypes';
import { redshiftShape, type MassRatioDistribution } from './populationShapes';
import { separablePopulation } from './separablePopulation';

export interface PhenomenologicalParams {
  /** ndot0: merger-rate normalisation, Mpc^-3 Gyr^-1 per unit z-shape, per dex of M, per unit p(q). */
  rateNorm: number;
  /** Mass slope alpha of (M / 1e7 Msun)^(-alpha). */
  alpha: number;
  /** Exponential cutoff mass M*, Msun. */
  cutoffMass: number;
  /** Redshift shape: (1+z)^beta e^(-z/z0) by default, or a user function of z. */
  beta: number;
  z0: number;
  redshiftWeight?: (z: number) => number;
  zMax: number;
  log10MMin: number;
  log10MMax: number;
  massRatio: MassRatioDistribution;
  cosmology: FlatLambdaCdm;
}

/** Pivot mass of the mass term, Msun (Middleton et al. 2016). */
export const PIVOT_MASS_MSUN = 1e7;

/** A z factor built lately, with what it was built from. */
interface RedshiftFactor {
  rateNorm: number;
  beta: number;
  z0: number;
  weight: ((z: number) => number) | undefined;
  cosmology: FlatLambdaCdm;
  factor: (z: number) => number;
}

const recentRedshiftFactors: RedshiftFactor[] = [];
const KEPT = 4;

/**
 * The z factor ndot0 shape(z) |dt_r/dz|: the same function for the same rate, shape and cosmology,
 * so that populations differing only in their mass terms (a Monte Carlo of the mass slope) share it,
 * and the spectrum's z rule, kept per z factor (circularStrainForm.ts), is laid out once for them.
 */
function redshiftFactor(p: PhenomenologicalParams): (z: number) => number {
  const w = p.redshiftWeight;
  const c = p.cosmology;
  for (const e of recentRedshiftFactors) {
    if (e.rateNorm === p.rateNorm && e.weight === w && e.cosmology === c && (w !== undefined || (e.beta === p.beta && e.z0 === p.z0))) return e.factor;
  }
  const zWeight = w ?? ((z: number) => redshiftShape(z, p.beta, p.z0));
  const rateNorm = p.rateNorm;
  // a rate per rest-frame time becomes n per unit z through |dt_r/dz| (Phinney 2001)
  const factor = (z: number) => rateNorm * zWeight(z) * (c.dtdzS(z) / GYR_S);
  if (recentRedshiftFactors.length >= KEPT) recentRedshiftFactors.shift();
  recentRedshiftFactors.push({ rateNorm, beta: p.beta, z0: p.z0, weight: w, cosmology: c, factor });
  return factor;
}

/** p(q) of each mass-ratio distribution as one function, so that its q integrals can be kept (circularMassModels.ts). */
const ratioFactors = new WeakMap<MassRatioDistribution, (q: number) => number>();

function ratioFactor(d: MassRatioDistribution): (q: number) => number {
  let f = ratioFactors.get(d);
  if (!f) ratioFactors.set(d, (f = (q: number) => d.pdf(q)));
  return f;
}

/** The merger density as a BinaryPopulation (density in Mpc^-3 per unit z, per dex, per unit q). */
export function phenomenologicalPopulation(p: PhenomenologicalParams): BinaryPopulation {
  const log10Pivot = Math.log10(PIVOT_MASS_MSUN);
  const slope = -p.alpha * Math.LN10;
  return separablePopulation(
    { zMin: 0, zMax: p.zMax, log10MMin: p.log10MMin, log10MMax: p.log10MMax, qMin: p.massRatio.qMin, qMax: 1 },
    {
      redshift: redshiftFactor(p),
      // ln[(M/M_pivot)^(-alpha) e^(-M/M*)], with M = 10^log10M = e^(ln10 log10M)
      lnMass: (x) => slope * (x - log10Pivot) - Math.exp(Math.LN10 * x) / p.cutoffMass,
      massRatio: ratioFactor(p.massRatio),
    },
  );
}
