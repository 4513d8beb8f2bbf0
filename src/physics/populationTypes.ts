// The population every spectrum routine integrates over (plain numbers, no units objects).

/**
 * A population of binaries that merge, described as a comoving number density of remnants
 * (Phinney 2001, astro-ph/0108028: n, not a rate).
 * density(z, log10M, q) = d^3n / (dz dlog10M dq) in Mpc^-3, where M is the total mass
 * m1 + m2 in solar masses and q = m2/m1 <= 1.
 */
export interface BinaryPopulation {
  density(z: number, log10M: number, q: number): number;
  /** Integration limits (the density is taken as zero outside them). */
  zMin: number;
  zMax: number;
  log10MMin: number;
  log10MMax: number;
  qMin: number;
  qMax: number;
  /**
   * Optional (added for the integrator's accuracy): mass ratios inside (qMin, qMax) where the density
   * in q changes character; the spectrum's q rule puts panel edges there (massRatioRule.ts).
   */
  qBreaks?: readonly number[];
  /**
   * Optional (added for the integrator's speed): a density that factorises as
   * density(z, log10M, q) = zMass(z, log10M) * massRatio(q) may give its factors here, so that the q
   * integral is done once. The factors must multiply to `density` exactly.
   */
  separable?: SeparableFactors;
  /**
   * Optional (added for the integrator's speed): a density that, at each (log10M, q), is smooth in z on
   * one interval and 0 outside it, the interval depending on (M, q) (a delay that depends on mass), may
   * integrate itself in z: Int dz weight(z) density(z, log10M, q) over z <= zTop (weight smooth, >= 0),
   * with `rule` panels of `order` Gauss-Legendre points and error control to relative tol. It must
   * agree with integrating `density`. The circular spectrum then integrates z inside each (M, q), so no
   * step of the density falls inside a z panel (perNodeZStrainForm.ts).
   */
  zIntegral?: (log10M: number, q: number, weight: (z: number) => number, zTop: number, rule: ZRule) => number;
}

/** Panels, points per panel and relative error tolerance of a z integral (BinaryPopulation.zIntegral). */
export interface ZRule {
  panels: number;
  order: number;
  tol: number;
}

/**
 * Factors of a separable density (see separablePopulation.ts, which builds a consistent population
 * from them). zMass and massRatio are always given; a density that also factorises in z and M,
 * zMass(z, log10M) = redshift(z) * exp(lnMass(log10M)), gives those two as well, and the circular
 * spectrum then computes each factor's node values once per spectrum and one exp per mass node.
 */
export interface SeparableFactors {
  zMass(z: number, log10M: number): number;
  massRatio(q: number): number;
  /** z factor, Mpc^-3 per unit z (finite, >= 0). */
  redshift?: (z: number) => number;
  /** Natural log of the mass factor per dex (finite, or -Infinity where the factor is 0). */
  lnMass?: (log10M: number) => number;
}

/**
 * Energy a single binary radiates per logarithmic rest-frame frequency, dE/dln f_r, in joules,
 * at rest-frame GW frequency frHz, for chirp mass mcKg, total mass mKg, mass ratio q, redshift z.
 * The circular GW-driven kernel is (pi^(2/3)/3) G^(2/3) Mc^(5/3) f_r^(2/3) (Phinney 2001);
 * eccentric and environment kernels multiply or replace it (see src/physics).
 */
export type EmissionKernel = (frHz: number, mcKg: number, mKg: number, q: number, z: number) => number;
