// The ISCO cut of the spectrum integrals as a sum of logarithms: a binary of total mass M stops
// emitting where f_r = cutFactor x f_ISCO,gw(M), f_ISCO,gw = c^3 / (6^(3/2) pi G M) (Schwarzschild
// ISCO; Misner, Thorne & Wheeler 1973), so with f_r = (1+z) f
//   log10 M_cut / Msun = log10(c^3 / (6^(3/2) pi G Msun)) + log10 cutFactor - log10 f - log10(1+z),
// one log10 per frequency and one per redshift node instead of one per (frequency, redshift) pair.
import { C_SI, G_SI, M_SUN_KG } from './constants';

const LOG10_ISCO_MASS_AT_1HZ = Math.log10((C_SI * C_SI * C_SI) / (Math.pow(6, 1.5) * Math.PI * G_SI * M_SUN_KG));

/** log10 M_cut / Msun at f_r = 1 Hz for the given cutFactor (Infinity: no cut). */
export function cutOffsetLog10(cutFactor: number): number {
  return cutFactor === Infinity ? Infinity : LOG10_ISCO_MASS_AT_1HZ + Math.log10(cutFactor);
}
