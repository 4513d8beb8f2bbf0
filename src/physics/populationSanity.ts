// Checks of a population against what is known of black holes today: merger-rate density, number of
// mergers, and the mass locked in merged black holes, to compare with the local black-hole mass density
// (about 3-6e5 Msun Mpc^-3: Marconi et al. 2004, MNRAS 351, 169; Shankar, Weinberg & Miralda-Escude
// 2009, ApJ 690, 20).
import { GYR_S } from './constants';
import type { FlatLambdaCdm } from './cosmology';
import { compositeNodes, type QuadratureRule } from './gaussLegendre';
import { checkPopulation } from './backgroundIntegral';
import type { BinaryPopulation } from './populationTypes';

/** The local black-hole mass density range quoted by Marconi et al. 2004 and Shankar et al. 2009, Msun Mpc^-3 (Shankar, Weinberg & Miralda-Escude 2009, ApJ 690, 20: 3-5.5e5; Marconi et al. 2004, MNRAS 351, 169: 4.6 (+1.9, -1.4) e5 for h = 0.7, so 6e5 lies inside their upper error). */
export const LOCAL_BLACK_HOLE_MASS_DENSITY_RANGE: readonly [number, number] = [3e5, 6e5];

/** 4 panels of 8 Gauss-Legendre points in each of z, log10M and q (32^3 density evaluations). */
const PANELS = 4;
const ORDER = 8;

/** The mass and mass-ratio rules of these checks, with Int dq p(q) once for a separable density. */
interface MassRules {
  mr: QuadratureRule;
  qr: QuadratureRule;
  /** Int dq massRatio(q) on qr for a separable density (density = zMass(z, M) massRatio(q)), else NaN. */
  qIntegral: number;
}

function massRules(pop: BinaryPopulation): MassRules {
  const qr = compositeNodes(pop.qMin, pop.qMax, PANELS, ORDER);
  let qIntegral = NaN;
  if (pop.separable) {
    qIntegral = 0;
    for (let b = 0; b < qr.nodes.length; b++) qIntegral += qr.weights[b] * pop.separable.massRatio(qr.nodes[b]);
  }
  return { mr: compositeNodes(pop.log10MMin, pop.log10MMax, PANELS, ORDER), qr, qIntegral };
}

/**
 * Int dlog10M dq n(z, ., .) at one z, Mpc^-3 per unit z. A separable density's q integral is the
 * same at every (z, M) node, so it is taken once (the same sum of products, reordered).
 */
function perUnitRedshift(pop: BinaryPopulation, z: number, weightOfMass: (msun: number) => number, rules: MassRules = massRules(pop)): number {
  const { mr, qr, qIntegral } = rules;
  const sep = pop.separable;
  let s = 0;
  for (let a = 0; a < mr.nodes.length; a++) {
    const wm = mr.weights[a] * weightOfMass(Math.pow(10, mr.nodes[a]));
    if (sep) {
      s += wm * sep.zMass(z, mr.nodes[a]) * qIntegral;
      continue;
    }
    for (let b = 0; b < qr.nodes.length; b++) s += wm * qr.weights[b] * pop.density(z, mr.nodes[a], qr.nodes[b]);
  }
  return s;
}

/** Merger-rate density at redshift z, Mpc^-3 Gyr^-1 (rest-frame time): Int n dlog10M dq / |dt_r/dz|. */
export function mergerRateDensity(pop: BinaryPopulation, cosmo: FlatLambdaCdm, z: number): number {
  checkPopulation(pop);
  if (!(z >= pop.zMin && z <= pop.zMax)) throw new RangeError(`redshift ${z} lies outside the population's range [${pop.zMin}, ${pop.zMax}]`);
  return perUnitRedshift(pop, z, () => 1) / (cosmo.dtdzS(z) / GYR_S);
}

/** Comoving number density of the mergers between redshifts zLo and zHi (clipped to the population's range), Mpc^-3. */
export function mergedNumberDensityBetween(pop: BinaryPopulation, zLo: number, zHi: number): number {
  const lo = Math.max(zLo, pop.zMin);
  const hi = Math.min(zHi, pop.zMax);
  return hi > lo ? overRedshift(pop, () => 1, lo, hi) : 0;
}

function overRedshift(pop: BinaryPopulation, weightOfMass: (msun: number) => number, zLo = pop.zMin, zHi = pop.zMax): number {
  checkPopulation(pop);
  const zr = compositeNodes(zLo, zHi, PANELS, ORDER);
  const rules = massRules(pop);
  let s = 0;
  for (let c = 0; c < zr.nodes.length; c++) s += zr.weights[c] * perUnitRedshift(pop, zr.nodes[c], weightOfMass, rules);
  return s;
}

/** Comoving number density of all mergers in the population, Mpc^-3. */
export function mergedNumberDensity(pop: BinaryPopulation): number {
  return overRedshift(pop, () => 1);
}

/**
 * Comoving mass density of the black holes that merged (total mass M per merger), Msun Mpc^-3: an upper
 * bound on the mass density of the merger remnants, since a hole that merges twice is counted twice.
 */
export function mergedMassDensity(pop: BinaryPopulation): number {
  let value = mergedMass.get(pop);
  if (value === undefined) {
    value = overRedshift(pop, (m) => m);
    mergedMass.set(pop, value);
  }
  return value;
}

/** Merged mass density per population object (populations are immutable; mergedMassDensity and massFunctionCheck both ask). */
const mergedMass = new WeakMap<BinaryPopulation, number>();
