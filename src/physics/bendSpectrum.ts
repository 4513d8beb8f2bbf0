// A generic low-frequency turnover of the background (Sampson, Cornish & McWilliams 2015, PRD 91, 084055):
//   h_c(f) = A (f/f_yr)^(-2/3) [1 + (f_bend/f)^kappa]^(-1/2),
// kappa = 10/3 for stellar hardening (the exponent of the Quinlan 1996 residence time, see
// stellarHardening.ts) and 7/3 for a circumbinary gas disc (the paper's title, authors and journal checked
// on its first page; unverified: 7/3, which is not on that page, the only part of the paper reachable,
// searched again 2026-12-02).
import { F_YR_HZ } from './constants';
import { circularGwKernel } from './circularKernel';
import { bendShape, circularTimesShapeKernel } from './factoredKernel';
import type { EmissionKernel } from './populationTypes';

/** Bend indices kappa of the trade (see the header for their sources). */
export const BEND_INDEX = Object.freeze({ stellar: 10 / 3, gas: 7 / 3 });

export function checkBend(fBendHz: number, kappa: number): void {
  if (!(fBendHz >= 0) || !Number.isFinite(fBendHz)) throw new RangeError(`bend frequency must be finite and >= 0, got ${fBendHz} Hz`);
  if (!(kappa > 0) || !Number.isFinite(kappa)) throw new RangeError(`bend index kappa must be positive and finite, got ${kappa}`);
}

/** 1 / (1 + (f_bend/f)^kappa): the factor on h_c^2 (and on dE/dln f_r when used as a kernel). */
export function bendFactor(fHz: number, fBendHz: number, kappa: number): number {
  if (fBendHz === 0) return 1;
  return 1 / (1 + Math.pow(fBendHz / fHz, kappa));
}

/** h_c = A (f/f_yr)^(-2/3) [1 + (f_bend/f)^kappa]^(-1/2) (Sampson, Cornish & McWilliams 2015). */
export function bentPowerLawStrain(fHz: number, amplitude: number, fBendHz: number, kappa: number): number {
  return amplitude * Math.pow(fHz / F_YR_HZ, -2 / 3) * Math.sqrt(bendFactor(fHz, fBendHz, kappa));
}

/**
 * The bend as an emission-kernel factor, in the rest frame: base * 1 / (1 + (f_bend,r / f_r)^kappa).
 * A population at redshift z then bends at the observed f_bend,r / (1+z).
 */
export function bendEmissionKernel(base: EmissionKernel, fBendRestHz: number, kappa: number): EmissionKernel {
  checkBend(fBendRestHz, kappa);
  if (base === circularGwKernel) {
    // circular x 1 / (1 + (f_r / f_bend)^(-kappa)): the integrator's fast path (factor 1 without a bend).
    if (fBendRestHz === 0) return base;
    return circularTimesShapeKernel({ scaleHz: fBendRestHz, shape: bendShape(kappa), bendIndex: kappa });
  }
  return (fr, mc, m, q, z) => base(fr, mc, m, q, z) * bendFactor(fr, fBendRestHz, kappa);
}
