// Emission kernels of the form "circular GW-driven kernel times a factor of f_r / scale":
//   dE/dln f_r = (dE/dln f_r)_circular(f_r, M_c) * shape(f_r / scale),
// where scale is one frequency for the whole population (eccentric orbits from one f0, the bend of
// Sampson, Cornish & McWilliams 2015) or a frequency of each binary's total mass and mass ratio (the
// stellar transition of Quinlan 1996). Such a kernel carries its description, so the integrator
// (backgroundIntegral.ts) can use the strain form of Phinney 2001 and reuse its mass and mass-ratio
// sums instead of calling the kernel at every node; both give the same h_c^2 (tested to 1e-10).
import { circularGwKernel } from './circularKernel';
import type { EmissionKernel } from './populationTypes';

export interface CircularTimesShape {
  /** The frequency f_r is divided by, Hz: one value, or one per binary of total mass mKg and mass ratio q. */
  scaleHz: number | ((mKg: number, q: number) => number);
  /** The factor on the circular kernel as a function of f_r / scale (finite, >= 0). */
  shape: (ratio: number) => number;
  /**
   * Set when shape(r) is 1 / (1 + r^(-bendIndex)) (stellar hardening, the bend): the integrator then
   * computes scale^bendIndex once per node and f_r^(-bendIndex) once per frequency and redshift.
   */
  bendIndex?: number;
  /**
   * Optional, when scaleHz(mKg, q) = mass(mKg) x ratio(q) (the stellar transition frequency): the
   * integrator then evaluates one factor per mass node and one per mass-ratio node. The product must
   * equal scaleHz to rounding.
   */
  scaleFactors?: { mass(mKg: number): number; ratio(q: number): number };
}

/** The shape 1 / (1 + r^(-kappa)) of a low-frequency bend (Sampson, Cornish & McWilliams 2015, PRD 91, 084055). */
export function bendShape(kappa: number): (ratio: number) => number {
  return (r) => 1 / (1 + Math.pow(r, -kappa));
}

const descriptions = new WeakMap<EmissionKernel, CircularTimesShape>();

/** The kernel circular(f_r, M_c) * shape(f_r / scale), remembered with its description. */
export function circularTimesShapeKernel(desc: CircularTimesShape): EmissionKernel {
  const { scaleHz, shape } = desc;
  const kernel: EmissionKernel =
    typeof scaleHz === 'number'
      ? (fr, mc, m, q, z) => circularGwKernel(fr, mc, m, q, z) * shape(fr / scaleHz)
      : (fr, mc, m, q, z) => circularGwKernel(fr, mc, m, q, z) * shape(fr / scaleHz(m, q));
  descriptions.set(kernel, desc);
  return kernel;
}

/** The description of a kernel made by circularTimesShapeKernel, else undefined. */
export function circularTimesShapeOf(kernel: EmissionKernel): CircularTimesShape | undefined {
  return descriptions.get(kernel);
}
