// The circular spectrum of a population delayed by a lifetime that depends on (M, q), integrated in z
// inside each (M, q) node by formation redshift (perNodeZStrainForm.ts, BinaryPopulation.zIntegral in
// massDependentDelay.ts), against independent routes: the fixed-lifetime population (delayedPopulation.ts,
// separable, checked against astropy in delayedPopulation.test.ts), the same density integrated z-outer
// through density() (the integrator's general form, steps inside its z panels), a direct z integral
// split at the known step, and the age integral itself (Hogg 1999, eq. 30).
import { describe, expect, it } from 'vitest';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { F_YR_HZ, GYR_S, KM_S_MPC_SI, M_SUN_KG } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { ageAtRedshift } from '../../src/physics/ageInverse';
import { delayedPopulation, redshiftOfAge } from '../../src/physics/delayedPopulation';
import { compositeNodes } from '../../src/physics/gaussLegendre';
import { lifetimeFunction } from '../../src/physics/hardeningLifetime';
import { massScaledEnvironment, MCCONNELL_MA_2013_M_SIGMA } from '../../src/physics/hostEnvironment';
import { delayedPopulationByMass } from '../../src/physics/massDependentDelay';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import type { BinaryPopulation } from '../../src/physics/populationTypes';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const cosmo = new FlatLambdaCdm({ hubbleSI: 69 * KM_S_MPC_SI, omegaM: 0.31 });
// An invented population (no published fit), shaped like the demo's.
const base = phenomenologicalPopulation({
  rateNorm: 1.2e-3, alpha: 0.25, cutoffMass: 1.2e9, beta: 2.1, z0: 1.4, zMax: 5, log10MMin: 6, log10MMax: 11,
  massRatio: powerLawMassRatio(-0.4, 0.05), cosmology: cosmo,
});
/** The population without its zIntegral: the integrator's general z-outer form through density(). */
const zOuter = (p: BinaryPopulation): BinaryPopulation => ({ zMin: p.zMin, zMax: p.zMax, log10MMin: p.log10MMin, log10MMax: p.log10MMax, qMin: p.qMin, qMax: p.qMax, density: p.density });
// 1 nHz to 300 nHz: at 100 and 300 nHz the ISCO cut crosses the heaviest masses inside the z range.
const FREQS = [1e-9, 5e-9, F_YR_HZ, 1e-7, 3e-7];

describe('age from the table (ageInverse.ts)', () => {
  it('equals the age integral FlatLambdaCdm.ageS to 1e-12 from z = 0 to 1e3', () => {
    for (const z of [0, 1e-6, 0.3, 1, 2.5, 4.95, 20, 1e3]) expect(rel(ageAtRedshift(cosmo, z), cosmo.ageS(z)), `z = ${z}`).toBeLessThan(1e-12);
  });
});

describe('per-(M, q) z integral of a mass-dependent delay', () => {
  it('a constant lifetime: equals the fixed-lifetime population (separable form) to 5e-5 at the default resolution, 2e-6 at a finer one', () => {
    const fine = { zPanels: 4, log10MPanels: 8, qPanels: 4, order: 8 };
    for (const tauGyr of [0.5, 3]) {
      const byMass = delayedPopulationByMass(base, cosmo, () => tauGyr * GYR_S);
      expect(byMass.zIntegral).toBeDefined();
      const fixed = delayedPopulation(base, cosmo, tauGyr * GYR_S);
      const perNode = characteristicStrainSquared(byMass, FREQS);
      const separable = characteristicStrainSquared(fixed, FREQS);
      for (let k = 0; k < FREQS.length; k++) expect(rel(perNode[k], separable[k]), `tau ${tauGyr} Gyr, f = ${FREQS[k]} Hz`).toBeLessThan(5e-5);
      const perNodeFine = characteristicStrainSquared(byMass, FREQS, { resolution: fine });
      const separableFine = characteristicStrainSquared(fixed, FREQS, { resolution: fine });
      for (let k = 0; k < FREQS.length; k++) expect(rel(perNodeFine[k], separableFine[k]), `fine: tau ${tauGyr} Gyr, f = ${FREQS[k]} Hz`).toBeLessThan(2e-6);
    }
  });

  it('one (M, q): zIntegral equals Int dz weight density, the z rule split at the known step, to 1e-6 with the default rule and 1e-10 with 8 panels of 10 points', () => {
    const tau = 1.5 * GYR_S;
    const pop = delayedPopulationByMass(base, cosmo, (x, q) => tau * (1 + 0.1 * (x - 8) + 0.2 * q));
    const weight = (z: number) => Math.pow(1 + z, -1 / 3);
    for (const [x, q, zTop] of [[8.5, 0.3, Infinity], [9.5, 0.9, Infinity], [9, 0.5, 1.2]]) {
      const t = tau * (1 + 0.1 * (x - 8) + 0.2 * q);
      // the density steps to 0 where the formation redshift passes zMax = 5: at z(t(5) + tau)
      const step = redshiftOfAge(cosmo, cosmo.ageS(5) + t);
      const top = Math.min(zTop, pop.zMax);
      const direct = (a: number, b: number) => {
        const r = compositeNodes(a, b, 40, 10);
        let s = 0;
        for (let i = 0; i < r.nodes.length; i++) s += r.weights[i] * weight(r.nodes[i]) * pop.density(r.nodes[i], x, q);
        return s;
      };
      const expected = direct(pop.zMin, Math.min(step, top)) + (top > step ? direct(step, top) : 0);
      expect(rel(pop.zIntegral!(x, q, weight, zTop, { panels: 2, order: 6, tol: 1e-6 }), expected), `x ${x} q ${q}`).toBeLessThan(1e-6);
      expect(rel(pop.zIntegral!(x, q, weight, zTop, { panels: 8, order: 10, tol: 1e-6 }), expected), `fine: x ${x} q ${q}`).toBeLessThan(1e-10);
    }
  });

  it('a base starting at z = 0.5 (coalescences bounded below too): constant lifetimes equal the fixed-lifetime form to 1e-4; lifetimes growing with M and q converge (default vs finer resolution) to 1e-5', () => {
    // an invented general density (not separable as given), zero below z = 0.5
    const late: BinaryPopulation = { zMin: 0.5, zMax: 3, log10MMin: 7, log10MMax: 10.5, qMin: 0.1, qMax: 1, density: (z, x, q) => 1e-3 * Math.pow(1 + z, 1.5) * Math.exp(-Math.pow(10, x - 9.5)) * Math.pow(q, -0.3) };
    const freqs = [1e-9, 3e-8, 2e-7];
    const fine = { zPanels: 4, log10MPanels: 8, qPanels: 4, order: 8 };
    for (const tauGyr of [0.3, 2, 6]) {
      const perNode = characteristicStrainSquared(delayedPopulationByMass(late, cosmo, () => tauGyr * GYR_S), freqs);
      const fixed = characteristicStrainSquared(delayedPopulation(late, cosmo, tauGyr * GYR_S), freqs);
      for (let k = 0; k < freqs.length; k++) expect(rel(perNode[k], fixed[k]), `tau ${tauGyr} Gyr, f = ${freqs[k]} Hz`).toBeLessThan(1e-4);
      const byMass = delayedPopulationByMass(late, cosmo, (x, q) => tauGyr * GYR_S * (0.5 + 0.2 * (x - 7) + 0.3 * q));
      const coarse = characteristicStrainSquared(byMass, freqs);
      const finer = characteristicStrainSquared(byMass, freqs, { resolution: fine });
      for (let k = 0; k < freqs.length; k++) expect(rel(coarse[k], finer[k]), `by mass, tau ${tauGyr} Gyr, f = ${freqs[k]} Hz`).toBeLessThan(1e-5);
    }
  });

  // H = 16 is the demo's (lifetimes 0.03-0.3 Gyr), H = 1 gives Gyr lifetimes. (With H = 0.05 lifetimes pass
  // the age of the universe inside the mass range, a kink in M and q that both forms resolve only to
  // about 1% at the default resolution.)
  for (const H of [16, 1]) {
    it(`hardening lifetimes, H = ${H}: equals the z-outer form through density() to 1e-4 at the default resolution and to 5e-6 at a finer one`, () => {
      const lifetime = lifetimeFunction(massScaledEnvironment({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: H }), M_SUN_KG);
      const pop = delayedPopulationByMass(base, cosmo, lifetime);
      const perNode = characteristicStrainSquared(pop, FREQS);
      const outer = characteristicStrainSquared(zOuter(pop), FREQS);
      for (let k = 0; k < FREQS.length; k++) expect(rel(perNode[k], outer[k]), `f = ${FREQS[k]} Hz`).toBeLessThan(1e-4);
      const fine = { zPanels: 4, log10MPanels: 8, qPanels: 4, order: 8 };
      const few = [FREQS[0], FREQS[2], FREQS[4]];
      const perNodeFine = characteristicStrainSquared(pop, few, { resolution: fine });
      const outerFine = characteristicStrainSquared(zOuter(pop), few, { resolution: fine });
      for (let k = 0; k < few.length; k++) expect(rel(perNodeFine[k], outerFine[k]), `f = ${few[k]} Hz`).toBeLessThan(5e-6);
    });
  }
});
