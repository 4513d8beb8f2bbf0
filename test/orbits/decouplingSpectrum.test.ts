// Eccentricity set at decoupling: each binary starts its GW-driven decay with e0 at its own decoupling
// frequency from a mass-scaled stellar environment (f0 = f_t(e0)/2, f_t from Quinlan 1996 and Peters 1964
// with sigma from McConnell & Ma 2013), checked against a direct harmonic sum (Peters & Mathews 1963 g(n,e))
// integrated over mass by scipy (test/reference/generate_decoupling_spectrum.py).
import { describe, expect, it } from 'vitest';
import fixture from '../reference/decoupling_spectrum.json';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { circularGwKernel } from '../../src/physics/circularKernel';
import { M_SUN_KG } from '../../src/physics/constants';
import { massScaledEnvironment, MCCONNELL_MA_2013_M_SIGMA } from '../../src/physics/hostEnvironment';
import { stellarEccentricKernel, stellarTransitionSemiMajorAxis } from '../../src/physics/stellarHardening';
import { environmentOfMass } from '../../src/physics/hostEnvironment';
import { keplerOrbitalFrequency } from '../../src/physics/petersEvolution';
import { boxPopulation } from './populations';

const { population } = fixture;
const scaled = { mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: population.hardening_H };
// The fixture's population: one redshift (a box 1e-7 wide), log10M uniform on [8, 10], q = 1.
const pop = boxPopulation(1, population.z, population.log10M[0], 1 - 1e-9, 1e-7, population.log10M[1] - population.log10M[0], 1e-9);
const resolution = { log10MPanels: 200, order: 8 };

describe('eccentricity set at decoupling: spectrum shape against a direct harmonic sum (scipy)', () => {
  for (const run of fixture.runs) {
    it(`e0 = ${run.e0}: h_c^2 eccentric / circular equals Int M^(5/3) Phi(f (1+z)/f0(M)) dlog10M / Int M^(5/3) dlog10M to 5e-4 (200 mass panels; Phi jumps at whole f_r/f0, so the default 4 mass panels of 6 points are coarser: 1e-2 at the lowest bin for e0 = 0.8)`, () => {
      const freqs = run.points.map((p) => p.f_hz);
      const kernel = stellarEccentricKernel(circularGwKernel, massScaledEnvironment(scaled), run.e0);
      const ecc = characteristicStrainSquared(pop, freqs, { kernel, resolution });
      const circ = characteristicStrainSquared(pop, freqs, { resolution });
      run.points.forEach((p, k) => {
        const got = ecc[k] / circ[k];
        const err = Math.abs(got / p.ratio - 1);
        expect(err, `f = ${p.f_hz} Hz: expected ${p.ratio}, got ${got}, error ${err}`).toBeLessThan(5e-4);
      });
    });
  }

  it('each binary decouples at its own frequency: f0 falls with mass as M^(3/(2 x 5.64) - 1), and the eccentric spectrum rises above the circular one just above the heavy binaries\' f0 (fixture: ratio 1.11 at 1 nHz for e0 = 0.5)', () => {
    const f0 = (mSun: number) => keplerOrbitalFrequency(stellarTransitionSemiMajorAxis(mSun * M_SUN_KG, 1, environmentOfMass(mSun * M_SUN_KG, scaled), 0.5), mSun * M_SUN_KG);
    expect(Math.abs(f0(1e10) / f0(1e9) / Math.pow(10, 3 / (2 * 5.64) - 1) - 1)).toBeLessThan(1e-12);
    const above = fixture.runs[0].points.find((p) => p.f_hz === 1e-9);
    expect(above?.ratio).toBeGreaterThan(1.05);
  });
});
