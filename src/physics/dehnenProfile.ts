// Stellar density at a binary's influence radius when the host's stars follow a Dehnen profile
// (Dehnen 1993, MNRAS 265, 250):
//   rho(r) = (3 - gamma) M_s a / (4 pi r^gamma (r + a)^(4 - gamma)),  M_s(<r) = M_s (r / (r + a))^(3 - gamma),
// gamma in [0, 3) the inner slope, M_s the stellar mass, a the scale radius. The influence radius is taken as
// r_inf = G M / sigma^2 (the radius where the stars hold 2M in a singular isothermal sphere) and the scale
// radius so that the stars inside it hold 2M here too: with x = r_inf / (r_inf + a) = (2M / M_s)^(1/(3-gamma)),
//   a = r_inf (1 - x) / x,  rho(r_inf) = (3 - gamma) M (1 - x) / (2 pi r_inf^3)
// (our choice of how to fix the two scales; see docs/orbits.md). gamma = 2 with M_s >> M is the isothermal sphere.
import { G_SI } from './constants';

export function checkInnerSlope(gamma: number): void {
  if (!(gamma >= 0 && gamma < 3)) throw new RangeError(`Dehnen inner slope gamma must lie in [0, 3), got ${gamma}`);
}

/** Dehnen density at radius r, kg/m^3 (Dehnen 1993, MNRAS 265, 250). */
export function dehnenDensity(rM: number, stellarMassKg: number, scaleRadiusM: number, gamma: number): number {
  return ((3 - gamma) * stellarMassKg * scaleRadiusM) / (4 * Math.PI * Math.pow(rM, gamma) * Math.pow(rM + scaleRadiusM, 4 - gamma));
}

/** Stellar mass inside r, kg: M_s (r / (r + a))^(3 - gamma) (Dehnen 1993). */
export function dehnenEnclosedMass(rM: number, stellarMassKg: number, scaleRadiusM: number, gamma: number): number {
  return stellarMassKg * Math.pow(rM / (rM + scaleRadiusM), 3 - gamma);
}

export interface DehnenInfluence {
  /** r_inf = G M / sigma^2, m. */
  influenceRadiusM: number;
  /** Scale radius a that puts 2M of stars inside r_inf, m. */
  scaleRadiusM: number;
  /** rho(r_inf), kg/m^3. */
  densityKgM3: number;
}

/** The Dehnen host of a binary of mass mKg with dispersion sigmaMS and stellar mass stellarMassKg (formulas at the top). */
export function dehnenInfluence(mKg: number, sigmaMS: number, stellarMassKg: number, gamma: number): DehnenInfluence {
  checkInnerSlope(gamma);
  if (!(stellarMassKg > 2 * mKg)) throw new RangeError(`the stars must outweigh twice the binary: stellar mass ${stellarMassKg} kg, binary ${mKg} kg`);
  const r = (G_SI * mKg) / (sigmaMS * sigmaMS);
  const x = Math.pow((2 * mKg) / stellarMassKg, 1 / (3 - gamma));
  return { influenceRadiusM: r, scaleRadiusM: (r * (1 - x)) / x, densityKgM3: ((3 - gamma) * mKg * (1 - x)) / (2 * Math.PI * r * r * r) };
}
