// A fixed lifetime from galaxy merger to coalescence (Agazie et al. 2023, ApJL 952, L37): the formation
// redshift and |dt/dz| ratio against astropy (test/reference/delays.json), and the limits the issue
// states: no delay is today's spectrum exactly, a delay longer than the age of the universe removes the
// population, and the number of binaries that coalesce is the number formed minus those that stall
// (a change of variables, independent of the code's per-redshift Jacobian).
import { describe, expect, it } from 'vitest';
import fixture from '../reference/delays.json';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { GYR_S, KM_S_MPC_SI } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { delayedPopulation, formationRedshift, redshiftOfAge, stalledFraction } from '../../src/physics/delayedPopulation';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import { mergedNumberDensity } from '../../src/physics/populationSanity';
import { errorOf, sheetOf, siOf, valueOf } from './sheetHelpers';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const cosmoOf = (h0: number, om: number) => new FlatLambdaCdm({ hubbleSI: h0 * KM_S_MPC_SI, omegaM: om });

function population(cosmology: FlatLambdaCdm) {
  return phenomenologicalPopulation({
    rateNorm: 1e-3, alpha: 0.2, cutoffMass: 3e9, beta: 2, z0: 1.5, zMax: 5, log10MMin: 6, log10MMax: 11,
    massRatio: powerLawMassRatio(0, 0.05), cosmology,
  });
}

describe('formation redshift of a binary with a fixed lifetime (astropy z_at_value, test/reference/delays.json)', () => {
  for (const c of fixture.cases) {
    const cosmo = cosmoOf(c.H0_km_s_Mpc, c.Om0);
    if ('stall' in c) {
      it(`redshift at which the universe was ${c.tau_Gyr} Gyr younger than today, H0 ${c.H0_km_s_Mpc}: z = ${c.z_f.toPrecision(6)} to 1e-7`, () => {
        const z = redshiftOfAge(cosmo, cosmo.ageS(0) - c.tau_Gyr * GYR_S);
        expect(rel(z, c.z_f), `expected ${c.z_f}, got ${z}`).toBeLessThan(1e-7);
      });
      continue;
    }
    it(`z_c = ${c.z_c}, tau = ${c.tau_Gyr} Gyr, H0 ${c.H0_km_s_Mpc}: z_f = ${c.z_f.toPrecision(6)} and |dt/dz| ratio to 1e-7`, () => {
      const zf = formationRedshift(cosmo, c.z_c, c.tau_Gyr * GYR_S);
      expect(rel(zf, c.z_f), `expected ${c.z_f}, got ${zf}`).toBeLessThan(1e-7);
      const ratio = cosmo.dtdzS(c.z_c) / cosmo.dtdzS(zf);
      expect(rel(ratio, c.dtdz_ratio!), `expected ${c.dtdz_ratio}, got ${ratio}`).toBeLessThan(1e-7);
    });
  }
  it('no formation redshift exists for a lifetime longer than the age at coalescence (NaN)', () => {
    const cosmo = cosmoOf(70, 0.3);
    expect(formationRedshift(cosmo, 1, cosmo.ageS(1) * 1.01)).toBeNaN();
  });
});

describe('delayed population', () => {
  const cosmo = cosmoOf(70, 0.3);
  const base = population(cosmo);
  const freqs = [2e-9, 1e-8, 3.17e-8, 1e-7];

  it('a lifetime of 0 gives exactly the spectrum without a delay', () => {
    const a = characteristicStrainSquared(base, freqs);
    const b = characteristicStrainSquared(delayedPopulation(base, cosmo, 0), freqs);
    expect(Array.from(b)).toEqual(Array.from(a));
  });

  it('a lifetime longer than the age of the universe removes the population: no spectrum, every binary stalls', () => {
    const tau = cosmo.ageS(0) * 1.001;
    const h2 = characteristicStrainSquared(delayedPopulation(base, cosmo, tau), freqs);
    expect(Array.from(h2)).toEqual([0, 0, 0, 0]);
    expect(stalledFraction(base, cosmo, tau)).toBe(1);
  });

  it('the density at z_c is the base density at astropy z_f times the astropy |dt/dz| ratio', () => {
    const c = fixture.cases.find((x) => !('stall' in x) && x.H0_km_s_Mpc === 70 && x.tau_Gyr === 1 && x.z_c === 1)!;
    const d = delayedPopulation(base, cosmo, c.tau_Gyr * GYR_S);
    const expected = base.density(c.z_f, 8.5, 0.5) * c.dtdz_ratio!;
    expect(rel(d.density(c.z_c, 8.5, 0.5), expected)).toBeLessThan(1e-6);
  });

  for (const tauGyr of [1, 3, 8]) {
    it(`binaries that coalesce = binaries formed x (1 - stalled fraction), lifetime ${tauGyr} Gyr (change of variables; quadrature tolerance 2e-3)`, () => {
      const tau = tauGyr * GYR_S;
      const coalescing = mergedNumberDensity(delayedPopulation(base, cosmo, tau));
      const expected = mergedNumberDensity(base) * (1 - stalledFraction(base, cosmo, tau));
      expect(rel(coalescing, expected), `coalescing ${coalescing}, expected ${expected}`).toBeLessThan(2e-3);
    });
  }

  it('a longer lifetime moves coalescences to lower redshift, so h_c at f_yr, weighted by (1+z)^(-1/3), changes and more binaries stall', () => {
    const h1 = characteristicStrainSquared(delayedPopulation(base, cosmo, 1 * GYR_S), [3.17e-8])[0];
    const h3 = characteristicStrainSquared(delayedPopulation(base, cosmo, 3 * GYR_S), [3.17e-8])[0];
    expect(h3).not.toBe(h1);
    expect(stalledFraction(base, cosmo, 3 * GYR_S)).toBeGreaterThan(stalledFraction(base, cosmo, 1 * GYR_S));
  });
});

describe('delayedPopulation and stalledFraction as built-ins', () => {
  const s = sheetOf({
    cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
    zshape: 'redshiftPowerExp(2, 1.5, 5)',
    qshape: 'massRatioPowerLaw(0, 0.05)',
    pop: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, 3e9 Msun, zshape, qshape)',
    same: 'delayedPopulation(pop, 0 Gyr)',
    late: 'delayedPopulation(pop, 3 Gyr)',
    a0: 'amplitudeAtYear(pop)',
    aSame: 'amplitudeAtYear(same)',
    aLate: 'amplitudeAtYear(late)',
    stalled: 'stalledFraction(pop, 3 Gyr)',
    dens: 'dens(z, x, q) = 1e-6',
    custom: 'customPopulation(dens)',
    noCosmo: 'delayedPopulation(custom, 1 Gyr)',
    negative: 'delayedPopulation(pop, -1 Gyr)',
    plain: 'stalledFraction(pop, 3)',
  });
  it('a lifetime of 0 Gyr gives the same A_yr; 3 Gyr a different one and a stalled fraction in (0, 1)', () => {
    expect(siOf(valueOf(s, 'aSame'))).toBe(siOf(valueOf(s, 'a0')));
    expect(siOf(valueOf(s, 'aLate'))).not.toBe(siOf(valueOf(s, 'a0')));
    const f = siOf(valueOf(s, 'stalled'));
    expect(f).toBeGreaterThan(0);
    expect(f).toBeLessThan(1);
  });
  const cases: [string, RegExp][] = [
    ['noCosmo', /population.*delayedPopulation.*no cosmology/],
    ['negative', /lifetime.*delayedPopulation/],
    ['plain', /lifetime.*stalledFraction/],
  ];
  for (const [cell, pattern] of cases) it(`${cell}: ${pattern.source}`, () => expect(errorOf(s, cell)).toMatch(pattern));
});
