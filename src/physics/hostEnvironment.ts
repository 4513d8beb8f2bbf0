// Stellar environments that scale with the host: the velocity dispersion sigma(M) from an M-sigma
// relation and the stellar density at the binary's influence radius from a density profile, so the
// stellar-hardening transition frequency moves with the binary's mass. SI in and out.
import { C_SI, G_SI, M_SUN_KG } from './constants';
import { MCCONNELL_MA_2013 } from './blackHoleBulgeRelation';
import { checkInnerSlope, dehnenInfluence } from './dehnenProfile';
import { checkFrictionPhase, type FrictionPhase } from './dynamicalFriction';
import type { MassEnvironment, StellarEnvironment } from './stellarHardening';

/** log10(M / Msun) = norm + slope log10(sigma / 200 km/s). */
export interface MSigmaRelation {
  norm: number;
  slope: number;
}

/** Full sample: log10(M/Msun) = 8.32 + 5.64 log10(sigma / 200 km/s) (McConnell & Ma 2013, ApJ 764, 184, abstract). */
export const MCCONNELL_MA_2013_M_SIGMA: Readonly<MSigmaRelation> = Object.freeze({ norm: 8.32, slope: 5.64 });

/** The reference dispersion of the M-sigma fits above, m/s. */
export const M_SIGMA_REFERENCE_MS = 200e3;

export function checkMSigma(rel: MSigmaRelation): void {
  if (!Number.isFinite(rel.norm)) throw new RangeError(`M-sigma normalisation must be finite, got ${rel.norm}`);
  if (!(rel.slope > 0) || !Number.isFinite(rel.slope)) throw new RangeError(`M-sigma slope must be positive and finite, got ${rel.slope}`);
}

/** sigma of the host of a black hole (or binary) of mass mKg, m/s: the M-sigma relation inverted. */
export function dispersionOfMass(mKg: number, rel: MSigmaRelation = MCCONNELL_MA_2013_M_SIGMA): number {
  // sigma = 200 km/s x 10^((log10(M/Msun) - norm) / slope) (McConnell & Ma 2013, ApJ 764, 184).
  return M_SIGMA_REFERENCE_MS * Math.pow(10, (Math.log10(mKg / M_SUN_KG) - rel.norm) / rel.slope);
}

/**
 * Influence radius in a singular isothermal sphere, m: the radius enclosing a stellar mass of twice the
 * binary's mass M. With rho(r) = sigma^2 / (2 pi G r^2) (singular isothermal sphere; Binney & Tremaine
 * 2008, Galactic Dynamics, 2nd ed.) the enclosed mass is 2 sigma^2 r / G, so r_inf = G M / sigma^2.
 */
export function isothermalInfluenceRadius(mKg: number, sigmaMS: number): number {
  return (G_SI * mKg) / (sigmaMS * sigmaMS);
}

/** Stellar density of a singular isothermal sphere at radius r, kg/m^3: sigma^2 / (2 pi G r^2) (Binney & Tremaine 2008). */
export function isothermalDensity(rM: number, sigmaMS: number): number {
  return (sigmaMS * sigmaMS) / (2 * Math.PI * G_SI * rM * rM);
}

/** The stellar density profile of the host: singular isothermal sphere, or Dehnen with inner slope gamma. */
export type HostProfile = { kind: 'isothermal' } | { kind: 'dehnen'; gamma: number };

/** How the stellar environment of a binary follows its total mass. */
export interface MassScaledEnvironment {
  mSigma: MSigmaRelation;
  /** Dimensionless hardening rate H (Quinlan 1996, New Astron. 1, 35). */
  hardeningRate: number;
  /** Density profile at the influence radius (isothermal when absent). */
  profile?: HostProfile;
  /** Dynamical-friction phase before the hard binary forms (none when absent): lengthens lifetimes only. */
  friction?: FrictionPhase;
}

export function checkMassScaledEnvironment(s: MassScaledEnvironment): void {
  checkMSigma(s.mSigma);
  if (!(s.hardeningRate > 0) || !Number.isFinite(s.hardeningRate)) throw new RangeError(`hardening rate H must be positive and finite, got ${s.hardeningRate}`);
  if (s.profile?.kind === 'dehnen') checkInnerSlope(s.profile.gamma);
  if (s.friction) checkFrictionPhase(s.friction);
}

/**
 * Stellar (bulge) mass of the host of a black hole (or binary) of mass mKg, kg: the median
 * M_BH-M_bulge relation log10 M = 8.46 + 1.05 log10(M_bulge / 1e11 Msun) inverted (McConnell & Ma 2013, ApJ 764, 184).
 */
export function bulgeMassOfMass(mKg: number): number {
  const r = MCCONNELL_MA_2013;
  return 1e11 * M_SUN_KG * Math.pow(10, (Math.log10(mKg / M_SUN_KG) - r.a) / r.b);
}

const ISOTHERMAL: HostProfile = Object.freeze({ kind: 'isothermal' });

/** Stellar density at the influence radius of a binary of mass mKg with host dispersion sigmaMS, kg/m^3. */
export function influenceDensity(mKg: number, sigmaMS: number, profile: HostProfile = ISOTHERMAL): number {
  if (profile.kind === 'dehnen') return dehnenInfluence(mKg, sigmaMS, bulgeMassOfMass(mKg), profile.gamma).densityKgM3;
  return isothermalDensity(isothermalInfluenceRadius(mKg, sigmaMS), sigmaMS);
}

/**
 * The stellar environment of a binary of total mass mKg: sigma from the M-sigma relation, rho the
 * density at the influence radius (the environment at the influence radius sets the hardening rate:
 * Sesana & Khan 2015, MNRAS 454, L66), rho = sigma^6 / (2 pi G^3 M^2) for the isothermal sphere,
 * (3 - gamma) M (1 - x) / (2 pi r_inf^3) for the Dehnen profile (dehnenProfile.ts).
 */
export function environmentOfMass(mKg: number, s: MassScaledEnvironment): StellarEnvironment {
  const sigma = dispersionOfMass(mKg, s.mSigma);
  return { densityKgM3: influenceDensity(mKg, sigma, s.profile), dispersionMS: sigma, hardeningRate: s.hardeningRate };
}

/** A copy of the plain data of s (so later edits of the caller's object change nothing). */
export function copyMassScaledEnvironment(s: MassScaledEnvironment): MassScaledEnvironment {
  return {
    mSigma: { norm: s.mSigma.norm, slope: s.mSigma.slope },
    hardeningRate: s.hardeningRate,
    ...(s.profile ? { profile: { ...s.profile } } : {}),
    ...(s.friction ? { friction: { ...s.friction } } : {}),
  };
}

/**
 * The mass factor of the transition frequency in an isothermal host: with rho = sigma^6 / (2 pi G^3 M^2),
 * equal stellar and GW hardening rates (Quinlan 1996, New Astron. 1, 35; Peters 1964, Phys. Rev. 136,
 * B1224) give f_t = (c sigma)^(3/2) / (pi G M) (5 H / (128 pi F(e)))^(3/10) eta^(-3/10), and sigma from
 * M-sigma (McConnell & Ma 2013) makes the mass factor a power law, coefficient x (M/Msun)^(3/(2 slope) - 1).
 */
export function isothermalTransitionMassFactor(rel: MSigmaRelation, hardeningRate: number, enhancement: number): (mKg: number) => number {
  const exponent = 1.5 / rel.slope - 1;
  const coefficient =
    (Math.pow(C_SI * M_SIGMA_REFERENCE_MS, 1.5) * Math.pow(10, (-1.5 * rel.norm) / rel.slope) * Math.pow((5 * hardeningRate) / (128 * Math.PI * enhancement), 0.3)) /
    (Math.PI * G_SI * M_SUN_KG);
  return (mKg) => coefficient * Math.pow(mKg / M_SUN_KG, exponent);
}

/** The environment as a function of the binary's total mass, for the stellar kernels (stellarHardening.ts). */
export function massScaledEnvironment(s: MassScaledEnvironment): MassEnvironment {
  checkMassScaledEnvironment(s);
  const scaled = copyMassScaledEnvironment(s);
  const ofMass = (mKg: number) => environmentOfMass(mKg, scaled);
  if (scaled.profile?.kind === 'dehnen') return { ofMass };
  return { ofMass, transitionMassFactor: (enhancement) => isothermalTransitionMassFactor(scaled.mSigma, scaled.hardeningRate, enhancement) };
}
