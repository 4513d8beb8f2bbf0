// Mass functions per dex (number per Mpc^3 per unit log10 M), masses in Msun.
import { integrate } from './gaussLegendre';

/** Schechter function per dex: ln10 Phi* (M/M*)^(1+alpha) e^(-M/M*) (Schechter 1976, ApJ 203, 297, written per dex). */
export function schechterPerDex(mass: number, phiStar: number, mStar: number, alpha: number): number {
  const r = mass / mStar;
  return Math.LN10 * phiStar * Math.pow(r, 1 + alpha) * Math.exp(-r);
}

/**
 * Double Schechter function per dex with one break mass: ln10 e^(-M/M*) [Phi1 (M/M*)^(1+alpha1) +
 * Phi2 (M/M*)^(1+alpha2)] (Baldry et al. 2012, MNRAS 421, 621, written per dex).
 */
export function doubleSchechterPerDex(mass: number, phi1: number, alpha1: number, phi2: number, alpha2: number, mStar: number): number {
  const r = mass / mStar;
  return Math.LN10 * Math.exp(-r) * (phi1 * Math.pow(r, 1 + alpha1) + phi2 * Math.pow(r, 1 + alpha2));
}

/**
 * Mass density Int M phi(M) dlog10M of a mass function per dex over [log10MMin, log10MMax], Msun Mpc^-3
 * (composite Gauss-Legendre, 16 panels of 12 points).
 */
export function massDensityOf(phiPerDex: (mass: number) => number, log10MMin: number, log10MMax: number): number {
  return integrate((x) => Math.pow(10, x) * phiPerDex(Math.pow(10, x)), log10MMin, log10MMax, 16, 12);
}
