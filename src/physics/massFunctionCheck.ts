// Compares a population's merger remnants at z = 0 with a local black-hole mass function: the number
// density above 1e9 and 1e10 Msun (remnantMassFunction.ts) against a reference Schechter mass function
// with a stated uncertainty in dex, and the merged mass density, an upper bound on the remnants' mass
// density (a hole that merges twice is counted twice), against a published local mass density.
import { schechterPerDex } from './massFunctions';
import { mergedMassDensity } from './populationSanity';
import type { BinaryPopulation } from './populationTypes';
import { numberAbove, remnantNumberAbove } from './remnantMassFunction';

/** A reference local mass function: Schechter per dex with a symmetric uncertainty of log10 phi. */
export interface ReferenceMassFunction {
  /** Phi*, Mpc^-3. */
  phiStar: number;
  /** Break mass M*, Msun. */
  mStar: number;
  alpha: number;
  /** 1-sigma uncertainty of log10 phi at every mass, dex (>= 0). */
  uncertaintyDex: number;
  /** Largest mass of the reference integral, log10 Msun. */
  log10MMax: number;
}

/**
 * Local black-hole mass density for h = 0.7, Msun Mpc^-3: 4.6 (+1.9, -1.4) x 1e5 (Marconi et al. 2004,
 * MNRAS 351, 169, abstract).
 */
export const MARCONI_2004_MASS_DENSITY = Object.freeze({ value: 4.6e5, low: 3.2e5, high: 6.5e5, source: 'Marconi et al. 2004, MNRAS 351, 169 (h = 0.7)' });

/**
 * A reference local mass function of any form: its value per dex and its number density above a mass
 * with a 1-sigma range (e.g. the velocity-dispersion route of localMassFunction.ts).
 */
export interface LocalMassFunction {
  label: string;
  /** Mpc^-3 per dex at massMsun. */
  phiPerDex(massMsun: number): number;
  /** Mpc^-3 above massMsun, with its range. */
  numberAbove(massMsun: number): { value: number; low: number; high: number };
}

export type AnyReference = ReferenceMassFunction | LocalMassFunction;

function isLocal(ref: AnyReference): ref is LocalMassFunction {
  return typeof (ref as LocalMassFunction).numberAbove === 'function';
}

/** phi per dex of either kind of reference, Mpc^-3. */
export function referencePerDex(ref: AnyReference, massMsun: number): number {
  if (isLocal(ref)) return ref.phiPerDex(massMsun);
  return massMsun <= Math.pow(10, ref.log10MMax) ? schechterPerDex(massMsun, ref.phiStar, ref.mStar, ref.alpha) : 0;
}

export interface ThresholdRow {
  massMsun: number;
  /** Remnants of the population above the mass, Mpc^-3. */
  remnants: number;
  /** The reference above the mass, Mpc^-3, and its 1-sigma range. */
  reference: number;
  referenceLow: number;
  referenceHigh: number;
  /** remnants / reference. */
  ratio: number;
}

export interface MassFunctionCheck {
  rows: ThresholdRow[];
  /** Merged mass density, Msun Mpc^-3: an upper bound on the mass density of the remnants. */
  mergedMassUpperBound: number;
  localMassDensity: typeof MARCONI_2004_MASS_DENSITY;
}

export const CHECK_MASSES: readonly number[] = [1e9, 1e10];

/** Number density above massMsun of the reference, with the 1-sigma range from its uncertainty in dex. */
export function referenceNumberAbove(ref: AnyReference, massMsun: number): { value: number; low: number; high: number } {
  if (isLocal(ref)) return ref.numberAbove(massMsun);
  const value = numberAbove((m) => schechterPerDex(m, ref.phiStar, ref.mStar, ref.alpha), massMsun, ref.log10MMax);
  const f = Math.pow(10, ref.uncertaintyDex);
  return { value, low: value / f, high: value * f };
}

export function massFunctionCheck(pop: BinaryPopulation, ref: AnyReference, masses: readonly number[] = CHECK_MASSES): MassFunctionCheck {
  const rows = masses.map((m) => {
    const r = referenceNumberAbove(ref, m);
    const remnants = remnantNumberAbove(pop, m);
    return { massMsun: m, remnants, reference: r.value, referenceLow: r.low, referenceHigh: r.high, ratio: remnants / r.value };
  });
  return { rows, mergedMassUpperBound: mergedMassDensity(pop), localMassDensity: MARCONI_2004_MASS_DENSITY };
}
