// Emission of a circular binary whose inspiral is driven by gravitational waves alone.
import { C_SI, G_SI } from './constants';
import type { EmissionKernel } from './populationTypes';

const PREFACTOR = (Math.pow(Math.PI, 2 / 3) / 3) * Math.pow(G_SI, 2 / 3);

/** dE/dln f_r = (pi^(2/3)/3) G^(2/3) M_c^(5/3) f_r^(2/3), J (Phinney 2001, astro-ph/0108028). */
export const circularGwKernel: EmissionKernel = (frHz, mcKg) => PREFACTOR * Math.pow(mcKg, 5 / 3) * Math.pow(frHz, 2 / 3);

/** Rest-frame GW frequency at the innermost stable circular orbit, c^3 / (6^(3/2) pi G M), Hz (Schwarzschild ISCO at r = 6GM/c^2; Misner, Thorne & Wheeler 1973). */
export function iscoGwFrequencyHz(totalMassKg: number): number {
  return (C_SI * C_SI * C_SI) / (Math.pow(6, 1.5) * Math.PI * G_SI * totalMassKg);
}

/** Total mass, kg, whose ISCO GW frequency equals frHz (inverse of iscoGwFrequencyHz). */
export function iscoTotalMassKg(frHz: number): number {
  return (C_SI * C_SI * C_SI) / (Math.pow(6, 1.5) * Math.PI * G_SI * frHz);
}
