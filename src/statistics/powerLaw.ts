// Power-law background conversions: h_c(f) = A (f/f_ref)^alpha with alpha = (3 - gamma)/2, since the
// timing-residual power P = h_c^2 / (12 pi^2 f^3) goes as f^-gamma (Thrane & Romano 2013, PRD 88, 124032).
import { strainExponent } from './measurement';

function positive(x: number, what: string): void {
  if (!(Number.isFinite(x) && x > 0)) throw new RangeError(`${what} must be positive and finite, got ${x}`);
}

/** h_c at frequency f of the power law with amplitude A at fRef and index gamma. */
export function powerLawStrain(amplitude: number, gamma: number, fRefHz: number, fHz: number): number {
  positive(fRefHz, 'the reference frequency');
  positive(fHz, 'the frequency');
  return amplitude * Math.pow(fHz / fRefHz, strainExponent(gamma));
}

/** The same power law's amplitude quoted at another reference frequency. */
export function amplitudeAtNewReference(amplitude: number, gamma: number, fRefHz: number, fNewHz: number): number {
  return powerLawStrain(amplitude, gamma, fRefHz, fNewHz);
}

/**
 * Amplitude at fRef of a power law with index gammaNew that equals the old one (A, gammaOld) at the
 * pivot frequency fPivot: A_new = A (fPivot/fRef)^(alpha_old - alpha_new). Common practice, no source:
 * a change of assumed index moves A unless the pivot is the reference frequency itself.
 */
export function amplitudeForNewIndex(amplitude: number, gammaOld: number, gammaNew: number, fRefHz: number, fPivotHz: number): number {
  positive(fRefHz, 'the reference frequency');
  positive(fPivotHz, 'the pivot frequency');
  return amplitude * Math.pow(fPivotHz / fRefHz, strainExponent(gammaOld) - strainExponent(gammaNew));
}

/** Omega_gw(f) = 2 pi^2 f^2 h_c^2 / (3 H0^2) (Phinney 2001, astro-ph/0108028; Thrane & Romano 2013, PRD 88, 124032). */
export function omegaGwFromStrain(hc: number, fHz: number, h0PerS: number): number {
  positive(h0PerS, 'H0');
  return (2 * Math.PI * Math.PI * fHz * fHz * hc * hc) / (3 * h0PerS * h0PerS);
}

/** h_c from Omega_gw, the inverse of omegaGwFromStrain. */
export function strainFromOmegaGw(omega: number, fHz: number, h0PerS: number): number {
  positive(h0PerS, 'H0');
  return Math.sqrt((3 * h0PerS * h0PerS * omega) / (2 * Math.PI * Math.PI * fHz * fHz));
}

/** One-sided timing-residual power P = h_c^2 / (12 pi^2 f^3), s^3 (Thrane & Romano 2013, PRD 88, 124032). */
export function residualPowerFromStrain(hc: number, fHz: number): number {
  return (hc * hc) / (12 * Math.PI * Math.PI * fHz * fHz * fHz);
}

/** h_c from residual power, the inverse of residualPowerFromStrain. */
export function strainFromResidualPower(power: number, fHz: number): number {
  return Math.sqrt(12 * Math.PI * Math.PI * fHz * fHz * fHz * power);
}
