// Sanity sums against closed forms.
import { describe, expect, it } from 'vitest';
import { GYR_S, KM_S_MPC_SI } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import { mergedMassDensity, mergedNumberDensity, mergerRateDensity } from '../../src/physics/populationSanity';
import type { BinaryPopulation } from '../../src/physics/populationTypes';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const cosmo = new FlatLambdaCdm({ hubbleSI: 67.4 * KM_S_MPC_SI, omegaM: 0.315 });

describe('population sanity sums', () => {
  const box: BinaryPopulation = { zMin: 0, zMax: 2, log10MMin: 7, log10MMax: 9, qMin: 0.2, qMax: 1, density: () => 3e-4 };
  it('number of mergers in a uniform box = density x volume of the box', () => {
    expect(rel(mergedNumberDensity(box), 3e-4 * 2 * 2 * 0.8)).toBeLessThan(1e-13);
  });
  it('merged mass of a uniform box = density x dz dq x (10^x1 - 10^x0) / ln 10', () => {
    expect(rel(mergedMassDensity(box), (3e-4 * 2 * 0.8 * (1e9 - 1e7)) / Math.LN10)).toBeLessThan(1e-10);
  });
  // alpha = 0, no cutoff, flat redshift shape: the rate today is ndot0 x (log10MMax - log10MMin), and
  // the number of mergers is that rate times the lookback time to zMax (Hogg 1999, eq. 30).
  const flat = phenomenologicalPopulation({ rateNorm: 2e-3, alpha: 0, cutoffMass: 1e300, beta: 0, z0: 1, redshiftWeight: () => 1, zMax: 3, log10MMin: 6, log10MMax: 10, massRatio: powerLawMassRatio(0.3, 0.1), cosmology: cosmo });
  it('merger-rate density today = ndot0 x width in dex (p(q) normalised)', () => {
    expect(rel(mergerRateDensity(flat, cosmo, 0), 2e-3 * 4)).toBeLessThan(1e-10); // q^0.3 by Gauss-Legendre: not exact
    expect(rel(mergerRateDensity(flat, cosmo, 2), 2e-3 * 4)).toBeLessThan(1e-10);
  });
  it('number of mergers = rate x lookback time to zMax', () => {
    expect(rel(mergedNumberDensity(flat), 2e-3 * 4 * (cosmo.lookbackTimeS(3) / GYR_S))).toBeLessThan(1e-9);
  });
  it('rejects a redshift outside the population', () => {
    expect(() => mergerRateDensity(flat, cosmo, 4)).toThrow(/outside the population/);
  });
});
