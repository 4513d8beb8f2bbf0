// A local black-hole mass function built from published relations: the velocity-dispersion function of
// early-type galaxies (Sheth et al. 2003, ApJ 594, 225, eq. 4),
//   phi(sigma) dsigma = phi* (sigma/sigma*)^alpha exp[-(sigma/sigma*)^beta] beta / Gamma(alpha/beta) dsigma/sigma,
// carried through an M-sigma relation log10 M = a + b log10(sigma / 200 km/s) with a log-normal intrinsic
// scatter of eps dex (McConnell & Ma 2013, ApJ 764, 184 for a and b):
//   phi_BH(log10 M) = Int dln sigma phi(ln sigma) N(log10 M; a + b log10(sigma/200 km/s), eps)   (per dex),
// N the normal density. Masses in Msun, number densities in Mpc^-3.
import { compositeNodes, compositeSum } from './gaussLegendre';
import { normalCdf, normalUpperTail } from '../statistics/normal';
import { M_SIGMA_REFERENCE_MS, type MSigmaRelation } from './hostEnvironment';
import { integrateMassFunction } from './remnantMassFunction';

/** The modified Schechter function in sigma: phi* (Mpc^-3 once h is applied), sigma* (km/s), alpha, beta. */
export interface DispersionFunction {
  phiStarMpc3: number;
  sigmaStarKmS: number;
  alpha: number;
  beta: number;
}

/**
 * Sheth et al. 2003 (ApJ 594, 225, eq. 4), early-type galaxies: (phi*, sigma*, alpha, beta) =
 * (0.0020 +- 0.0001, 88.8 +- 17.7 km/s, 6.5 +- 1.0, 1.93 +- 0.22); phi* in h^3 Mpc^-3. Unverified in the
 * paper itself: its abstract (the only part reachable, searched 2026-12-02) gives no numbers; the four
 * values agree with a third-party summary of the paper that names eq. 4 and gives no units, so the units
 * of phi* (h^3 Mpc^-3) are not checked.
 */
export const SHETH_2003_EARLY_TYPES = Object.freeze({ phiStarH3Mpc3: 0.002, sigmaStarKmS: 88.8, alpha: 6.5, beta: 1.93 });

/** Sheth et al. 2003 with phi* in Mpc^-3 for the Hubble parameter h = H0 / (100 km/s/Mpc). */
export function sheth2003(h: number): DispersionFunction {
  const s = SHETH_2003_EARLY_TYPES;
  return { phiStarMpc3: s.phiStarH3Mpc3 * h * h * h, sigmaStarKmS: s.sigmaStarKmS, alpha: s.alpha, beta: s.beta };
}

/** Range of x = sigma/sigma* the integrals cover, ln x in [LN_X_LO, LN_X_HI]: x^alpha e^(-x^beta) is below 1e-18 of its peak outside for the fits used. */
const LN_X_LO = Math.log(1e-3);
const LN_X_HI = Math.log(40);

/**
 * beta / Gamma(alpha/beta) = 1 / Int_0^inf x^alpha e^(-x^beta) dln x (the substitution u = x^beta gives
 * Gamma(alpha/beta) / beta), by composite Gauss-Legendre in ln x.
 */
export function dispersionNormalisation(alpha: number, beta: number): number {
  // the last pair's value is kept: the counts of a reference ask for the same (alpha, beta) many times
  if (alpha === lastNormalisation.alpha && beta === lastNormalisation.beta) return lastNormalisation.value;
  const value = normalisationSum(alpha, beta);
  lastNormalisation = { alpha, beta, value };
  return value;
}
let lastNormalisation = { alpha: NaN, beta: NaN, value: NaN };

function normalisationSum(alpha: number, beta: number): number {
  const r = compositeNodes(LN_X_LO, LN_X_HI, 64, 8);
  let s = 0;
  for (let i = 0; i < r.nodes.length; i++) {
    const x = Math.exp(r.nodes[i]);
    s += r.weights[i] * Math.pow(x, alpha) * Math.exp(-Math.pow(x, beta));
  }
  return 1 / s;
}

/** What the mass function is made of. */
export interface SigmaMassFunctionSpec {
  dispersion: DispersionFunction;
  mSigma: MSigmaRelation;
  /** Intrinsic scatter of log10 M at fixed sigma, dex (>= 0). */
  scatterDex: number;
}

export function checkSigmaMassFunction(s: SigmaMassFunctionSpec): void {
  const d = s.dispersion;
  if (!(d.phiStarMpc3 > 0 && d.sigmaStarKmS > 0 && d.alpha > 0 && d.beta > 0)) throw new RangeError('dispersion function parameters must be positive');
  if (!(s.mSigma.slope > 0) || !Number.isFinite(s.mSigma.norm)) throw new RangeError(`M-sigma slope must be positive and the normalisation finite, got ${s.mSigma.norm}, ${s.mSigma.slope}`);
  if (!(s.scatterDex >= 0 && s.scatterDex <= 2)) throw new RangeError(`intrinsic scatter must lie in [0, 2] dex, got ${s.scatterDex}`);
}

/** Galaxies per ln sigma, Mpc^-3 (Sheth et al. 2003, eq. 4, per ln sigma). */
export function dispersionPerLnSigma(sigmaKmS: number, d: DispersionFunction, normalisation = dispersionNormalisation(d.alpha, d.beta)): number {
  const x = sigmaKmS / d.sigmaStarKmS;
  return d.phiStarMpc3 * Math.pow(x, d.alpha) * Math.exp(-Math.pow(x, d.beta)) * normalisation;
}

/** Panels over the +-8 eps window in ln sigma around the mean relation (Gauss-Legendre, 8 points each). */
const WINDOW_PANELS = 12;
const HALF_WINDOW = 8;

/** The black-hole mass function per dex, Mpc^-3, at log10(M/Msun) (formula at the top). */
export function sigmaMassFunctionPerDex(log10M: number, s: SigmaMassFunctionSpec, normalisation = dispersionNormalisation(s.dispersion.alpha, s.dispersion.beta)): number {
  const { norm, slope } = s.mSigma;
  const ref = M_SIGMA_REFERENCE_MS / 1e3;
  const eps = s.scatterDex;
  // ln sigma where the mean relation gives log10 M: ln(200 km/s) + ln10 (log10 M - a) / b
  const lnSigmaOf = (lg: number) => Math.log(ref) + (Math.LN10 * (lg - norm)) / slope;
  if (eps === 0) return dispersionPerLnSigma(Math.exp(lnSigmaOf(log10M)), s.dispersion, normalisation) * (Math.LN10 / slope);
  const lnStar = Math.log(s.dispersion.sigmaStarKmS);
  const lo = Math.max(lnSigmaOf(log10M - HALF_WINDOW * eps), lnStar + LN_X_LO);
  const hi = Math.min(lnSigmaOf(log10M + HALF_WINDOW * eps), lnStar + LN_X_HI);
  if (!(hi > lo)) return 0;
  const r = compositeNodes(lo, hi, WINDOW_PANELS, 8);
  const gaussNorm = 1 / (Math.sqrt(2 * Math.PI) * eps);
  let sum = 0;
  for (let i = 0; i < r.nodes.length; i++) {
    const sigma = Math.exp(r.nodes[i]);
    const mean = norm + slope * Math.log10(sigma / ref);
    const u = (log10M - mean) / eps;
    sum += r.weights[i] * dispersionPerLnSigma(sigma, s.dispersion, normalisation) * gaussNorm * Math.exp(-0.5 * u * u);
  }
  return sum;
}

/** Largest mass of the integrals, log10 Msun (the function is below 1e-15 of its value at 1e10 Msun beyond). */
export const SIGMA_MASS_FUNCTION_TOP = 12.5;

/** Panels of the ln sigma integral of sigmaNumberAbove: per unit ln sigma outside the step, and across the step of +-8 eps. */
const PANELS_PER_LN_SIGMA = 3;
const STEP_PANELS = 12;

/**
 * Number density above massMsun, Mpc^-3: phi_BH integrated over log10 M up to SIGMA_MASS_FUNCTION_TOP.
 * With scatter the two integrals are swapped (Fubini): the log10 M integral of the normal density is
 * a difference of normal cdfs, n(>M) = Int dln sigma phi(ln sigma) [Phi((top - mean)/eps) - Phi((log10 M - mean)/eps)],
 * one ln sigma integral over the range of the dispersion function, with panels packed where the step lies.
 */
export function sigmaNumberAbove(massMsun: number, s: SigmaMassFunctionSpec): number {
  const c = dispersionNormalisation(s.dispersion.alpha, s.dispersion.beta);
  const lg0 = Math.log10(massMsun);
  const eps = s.scatterDex;
  if (eps === 0) return integrateMassFunction((x) => sigmaMassFunctionPerDex(x, s, c), lg0, SIGMA_MASS_FUNCTION_TOP);
  if (!(SIGMA_MASS_FUNCTION_TOP > lg0)) return 0;
  const { norm, slope } = s.mSigma;
  const lnRef = Math.log(M_SIGMA_REFERENCE_MS / 1e3);
  const lnStar = Math.log(s.dispersion.sigmaStarKmS);
  const lo = lnStar + LN_X_LO;
  const hi = lnStar + LN_X_HI;
  // ln sigma where the mean relation reaches log10 M0, and the half width of the step there
  const centre = lnRef + (Math.LN10 * (lg0 - norm)) / slope;
  const half = (HALF_WINDOW * eps * Math.LN10) / slope;
  const edges = [lo, Math.min(Math.max(centre - half, lo), hi), Math.min(Math.max(centre + half, lo), hi), hi];
  const f = (lnSigma: number): number => {
    const mean = norm + (slope * (lnSigma - lnRef)) / Math.LN10;
    const a = (lg0 - mean) / eps;
    const b = (SIGMA_MASS_FUNCTION_TOP - mean) / eps;
    // Phi(b) - Phi(a), from the upper tails when a > 0 so that nothing cancels
    const p = a > 0 ? normalUpperTail(a) - normalUpperTail(b) : normalCdf(b) - normalCdf(a);
    return dispersionPerLnSigma(Math.exp(lnSigma), s.dispersion, c) * p;
  };
  let sum = 0;
  for (let i = 0; i < 3; i++) {
    const w = edges[i + 1] - edges[i];
    if (!(w > 0)) continue;
    const panels = i === 1 ? STEP_PANELS : Math.max(2, Math.ceil(w * PANELS_PER_LN_SIGMA));
    sum += compositeSum(edges[i], edges[i + 1], panels, 8, f);
  }
  return sum;
}

/** Mass density in black holes above massMsun, Msun Mpc^-3. */
export function sigmaMassDensity(s: SigmaMassFunctionSpec, massMsun = 1e5): number {
  const c = dispersionNormalisation(s.dispersion.alpha, s.dispersion.beta);
  return integrateMassFunction((x) => sigmaMassFunctionPerDex(x, s, c), Math.log10(massMsun), SIGMA_MASS_FUNCTION_TOP, 1);
}
