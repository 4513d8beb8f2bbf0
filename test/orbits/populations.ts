// Invented test populations (no published fits): a smooth parametric one and a narrow box that
// behaves like a single kind of binary at one redshift.
import { KM_S_MPC_SI } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import type { BinaryPopulation } from '../../src/physics/populationTypes';

export const testCosmology = new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 });

/** A smooth invented population: total masses 1e6 to 1e10 Msun, z up to 4. */
export function smoothPopulation(rateScale = 1): BinaryPopulation {
  return phenomenologicalPopulation({
    rateNorm: 2e-3 * rateScale,
    alpha: 0.4,
    cutoffMass: 2e9,
    beta: 1.5,
    z0: 1.2,
    zMax: 4,
    log10MMin: 6,
    log10MMax: 10,
    massRatio: powerLawMassRatio(-0.3, 0.1),
    cosmology: testCosmology,
  });
}

/** A narrow box: density n (Mpc^-3 per unit z, dex, q) on z in [z, z+dz], log10M in [x, x+dx], q in [q, q+dq]. */
export function boxPopulation(n: number, z: number, log10M: number, q = 0.999, dz = 1e-4, dx = 1e-4, dq = 1e-3): BinaryPopulation {
  return {
    zMin: z,
    zMax: z + dz,
    log10MMin: log10M,
    log10MMax: log10M + dx,
    qMin: q,
    qMax: Math.min(1, q + dq),
    density: () => n,
  };
}
