// Dynamical friction on a black hole sinking on a circular orbit through a singular isothermal sphere of
// one-dimensional dispersion sigma (circular speed v_c = sqrt(2) sigma). Chandrasekhar's drag,
//   F = 4 pi G^2 M^2 rho lnL [erf(X) - 2X e^(-X^2)/sqrt(pi)] / v^2,  X = v / (sqrt(2) sigma) = 1,
// with rho = v_c^2 / (4 pi G r^2) takes angular momentum M v_c r away at the rate F r, so
//   r dr/dt = -chi lnL G M / v_c,  chi = erf(1) - 2 e^(-1) / sqrt(pi) = 0.428,
// and the time from r_i to r_f is (r_i^2 - r_f^2) v_c / (2 chi lnL G M) = 1.169 (r_i^2 - r_f^2) v_c / (lnL G M)
// (Binney & Tremaine 2008, Galactic Dynamics, 2nd ed., section 8.1: t_fric = 1.17 r_i^2 v_c / (lnL G M)).
import { G_SI } from './constants';
import { erfc } from '../statistics/normal';

/** chi = erf(1) - 2 e^-1 / sqrt(pi): the bracket of Chandrasekhar's formula at X = 1. */
export const FRICTION_CHI = 1 - erfc(1) - (2 * Math.exp(-1)) / Math.sqrt(Math.PI);

/** The sinking phase: where it starts and the Coulomb logarithm ln(Lambda) of Chandrasekhar's formula. */
export interface FrictionPhase {
  /** Separation at which dynamical friction starts to act on the lighter black hole, m. */
  startRadiusM: number;
  /** Coulomb logarithm ln(Lambda) > 0. */
  coulombLog: number;
}

export function checkFrictionPhase(f: FrictionPhase): void {
  if (!(f.startRadiusM >= 0) || !Number.isFinite(f.startRadiusM)) throw new RangeError(`friction start radius must be finite and >= 0, got ${f.startRadiusM} m`);
  if (!(f.coulombLog > 0) || !Number.isFinite(f.coulombLog)) throw new RangeError(`Coulomb logarithm must be positive and finite, got ${f.coulombLog}`);
}

/**
 * Time a point mass takes to sink from startRadiusM to endRadiusM on a circular orbit in a singular
 * isothermal sphere of dispersion sigmaMS, s (formula at the top); 0 when it starts inside endRadiusM.
 */
export function frictionTime(sinkingMassKg: number, sigmaMS: number, startRadiusM: number, endRadiusM: number, coulombLog: number): number {
  if (!(sinkingMassKg > 0) || !Number.isFinite(sinkingMassKg)) throw new RangeError(`sinking mass must be positive and finite, got ${sinkingMassKg} kg`);
  if (!(sigmaMS > 0) || !Number.isFinite(sigmaMS)) throw new RangeError(`velocity dispersion must be positive and finite, got ${sigmaMS} m/s`);
  checkFrictionPhase({ startRadiusM, coulombLog });
  if (!(endRadiusM >= 0)) throw new RangeError(`end radius must be >= 0, got ${endRadiusM} m`);
  if (startRadiusM <= endRadiusM) return 0;
  const vc = Math.SQRT2 * sigmaMS;
  return ((startRadiusM * startRadiusM - endRadiusM * endRadiusM) * vc) / (2 * FRICTION_CHI * coulombLog * G_SI * sinkingMassKg);
}
