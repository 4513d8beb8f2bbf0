// The local black-hole mass function of the velocity-dispersion route (Sheth et al. 2003, ApJ 594, 225, eq. 4,
// through the M-sigma relation of McConnell & Ma 2013, ApJ 764, 184, with log-normal scatter), against an
// independent scipy computation (test/reference/sigma_mass_function.json: quad over sigma, with the normal
// tail done analytically for n(>M) and scipy's gamma for the normalisation), then through the sheet.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/sigma_mass_function.json';
import { MPC_M } from '../../src/physics/constants';
import { dispersionReference } from '../../src/physics/dispersionReference';
import { MCCONNELL_MA_2013_M_SIGMA } from '../../src/physics/hostEnvironment';
import { MARCONI_2004_MASS_DENSITY } from '../../src/physics/massFunctionCheck';
import { dispersionNormalisation, sheth2003, sigmaMassDensity, sigmaMassFunctionPerDex, sigmaNumberAbove, type SigmaMassFunctionSpec } from '../../src/physics/sigmaMassFunction';
import { errorOf, sheetOf, siOf, valueOf } from './sheetHelpers';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const d = fixture.dispersion_function;
const spec = (eps: number): SigmaMassFunctionSpec => ({ dispersion: sheth2003(d.h), mSigma: MCCONNELL_MA_2013_M_SIGMA, scatterDex: eps });

describe('velocity-dispersion route to the local black-hole mass function, against scipy', () => {
  it('the parameters are those of the fixture, and beta / Gamma(alpha/beta) by quadrature equals scipy.special.gamma to 1e-12', () => {
    const s = sheth2003(d.h).phiStarMpc3;
    expect(rel(s, d.phi_star_Mpc3)).toBeLessThan(1e-14);
    expect(rel(dispersionNormalisation(d.alpha, d.beta), d.beta_over_gamma)).toBeLessThan(1e-12);
    expect(MCCONNELL_MA_2013_M_SIGMA).toEqual({ norm: fixture.m_sigma.norm, slope: fixture.m_sigma.slope });
  });

  it('beta / Gamma(alpha/beta) stays right when the pair changes between calls (the last pair is kept): the fixture, then beta / Gamma(3) = 1 at (6, 2) (Gamma(n + 1) = n!, Abramowitz & Stegun 1964, 6.1.6), then the fixture again', () => {
    expect(rel(dispersionNormalisation(d.alpha, d.beta), d.beta_over_gamma)).toBeLessThan(1e-12);
    expect(rel(dispersionNormalisation(6, 2), 1)).toBeLessThan(1e-12);
    expect(rel(dispersionNormalisation(d.alpha, d.beta), d.beta_over_gamma)).toBeLessThan(1e-12);
  });

  for (const c of fixture.cases) {
    it(`scatter ${c.scatter_dex} dex: phi per dex (1e7 to 1e10 Msun) to 1e-9, n(>M) (1e8 to 1e10 Msun) to 1e-10, the mass density to 1e-6 (Mpc^-3, Msun Mpc^-3)`, () => {
      const s = spec(c.scatter_dex);
      for (const p of c.phi_per_dex) {
        const got = sigmaMassFunctionPerDex(p.log10M, s);
        expect(rel(got, p.value_Mpc3), `log10 M ${p.log10M}: expected ${p.value_Mpc3}, got ${got}`).toBeLessThan(1e-9);
      }
      for (const p of c.number_above) {
        const got = sigmaNumberAbove(Math.pow(10, p.log10M), s);
        expect(rel(got, p.value_Mpc3), `log10 M ${p.log10M}: expected ${p.value_Mpc3}, got ${got}`).toBeLessThan(1e-10);
      }
      const rho = sigmaMassDensity(s);
      expect(rel(rho, c.mass_density_Msun_Mpc3), `expected ${c.mass_density_Msun_Mpc3}, got ${rho}`).toBeLessThan(1e-6);
    });
  }

  it(`the band: n(>M) with the M-sigma normalisation shifted by +-${fixture.band_dex} dex, to 1e-10`, () => {
    const c = fixture.cases.find((k) => k.scatter_dex === 0.38)!;
    const ref = dispersionReference({ h: d.h, scatterDex: 0.38, bandDex: fixture.band_dex });
    c.number_above.forEach((p, i) => {
      const r = ref.numberAbove(Math.pow(10, p.log10M));
      expect(rel(r.value, p.value_Mpc3)).toBeLessThan(1e-10);
      expect(rel(r.low, c.band_low[i])).toBeLessThan(1e-10);
      expect(rel(r.high, c.band_high[i])).toBeLessThan(1e-10);
      expect(r.low).toBeLessThan(r.value);
      expect(r.high).toBeGreaterThan(r.value);
    });
  });

  it('check of the trade: the black-hole mass density of the early-type route lies within a factor of 10 below the local density of Marconi et al. 2004 (MNRAS 351, 169, abstract: 4.6e5 Msun Mpc^-3 for h = 0.7); late-type bulges are not in the dispersion function, so it may not exceed the upper end', () => {
    const rho = dispersionReference({ h: 0.7, scatterDex: 0.38, bandDex: 0.1 }).massDensity();
    expect(rho).toBeGreaterThan(MARCONI_2004_MASS_DENSITY.value / 10);
    expect(rho).toBeLessThan(MARCONI_2004_MASS_DENSITY.high);
  });

  it('refuses parameters out of range', () => {
    expect(() => dispersionReference({ h: 0, scatterDex: 0.3, bandDex: 0.1 })).toThrow(/Hubble parameter/);
    expect(() => dispersionReference({ h: 0.7, scatterDex: -1, bandDex: 0.1 })).toThrow(/intrinsic scatter/);
    expect(() => dispersionReference({ h: 0.7, scatterDex: 0.3, bandDex: 3 })).toThrow(/band/);
  });
});

describe('localMassFunction in the sheet', () => {
  const MPC3 = MPC_M ** 3;
  const cells = {
    cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
    pop: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, 1e9 Msun, redshiftPowerExp(2, 1.5, 5), massRatioPowerLaw(-0.5, 0.05))',
    local: 'localMassFunction("velocityDispersion")',
    check: 'massFunctionCheck(pop, local)',
    phiLocal: 'referencePhi(local, [1e8, 1e9] Msun)',
    phiSchechter: 'referencePhi(referenceMassFunction(1e-3 Mpc^-3, 5e8 Msun, -0.5, 0.3), 5e8 Msun)',
    noScatter: 'massFunctionCheck(pop, localMassFunction("velocityDispersion", 0, 0))',
    e1: 'localMassFunction("luminosity")',
    e2: 'localMassFunction("velocityDispersion", 3)',
    e3: 'localMassFunction("velocityDispersion", 0.3, -1)',
    e4: 'localMassFunction(1)',
    e5: 'referencePhi(pop, 1e9 Msun)',
  };

  it('massFunctionCheck against the named reference gives its n(>1e9), n(>1e10) and band (scipy fixture, scatter 0.38 dex, band 0.1 dex, h = 0.7), to 1e-8', () => {
    const s = sheetOf(cells);
    const c = fixture.cases.find((k) => k.scatter_dex === 0.38)!;
    const check = valueOf(s, 'check') as { describe(): string; check: { rows: { massMsun: number; reference: number; referenceLow: number; referenceHigh: number; remnants: number; ratio: number }[] } };
    for (const row of check.check.rows) {
      const i = c.number_above.findIndex((p) => p.log10M === Math.log10(row.massMsun));
      expect(rel(row.reference, c.number_above[i].value_Mpc3)).toBeLessThan(1e-8);
      expect(rel(row.referenceLow, c.band_low[i])).toBeLessThan(1e-8);
      expect(rel(row.referenceHigh, c.band_high[i])).toBeLessThan(1e-8);
      expect(row.ratio).toBe(row.remnants / row.reference);
    }
    expect(String((valueOf(s, 'local') as { describe(): string }).describe())).toMatch(/Sheth et al. 2003.*scatter 0.38 dex/);
    const phi = (valueOf(s, 'phiLocal') as { toArray(): unknown[] }).toArray();
    expect(rel(siOf(phi[0]) * MPC3, c.phi_per_dex.find((p) => p.log10M === 8)!.value_Mpc3)).toBeLessThan(1e-9);
    expect(rel(siOf(phi[1]) * MPC3, c.phi_per_dex.find((p) => p.log10M === 9)!.value_Mpc3)).toBeLessThan(1e-9);
    // Schechter per dex at M = M*: ln10 Phi* e^-1 (Schechter 1976, written per dex)
    expect(rel(siOf(valueOf(s, 'phiSchechter')) * MPC3, Math.LN10 * 1e-3 * Math.exp(-1))).toBeLessThan(1e-12);
    const flat = valueOf(s, 'noScatter') as { check: { rows: { reference: number; referenceLow: number }[] } };
    const c0 = fixture.cases.find((k) => k.scatter_dex === 0)!;
    expect(rel(flat.check.rows[1].reference, c0.number_above[2].value_Mpc3)).toBeLessThan(1e-8);
    expect(flat.check.rows[1].referenceLow).toBe(flat.check.rows[1].reference);
  });

  it('errors name the built-in and the argument', () => {
    const s = sheetOf(cells);
    expect(errorOf(s, 'e1')).toMatch(/argument name of localMassFunction must be one of "velocityDispersion", got "luminosity"/);
    expect(errorOf(s, 'e2')).toMatch(/argument scatterDex of localMassFunction must lie in \[0, 2\]/);
    expect(errorOf(s, 'e3')).toMatch(/argument bandDex of localMassFunction must lie in \[0, 2\]/);
    expect(errorOf(s, 'e4')).toMatch(/argument name of localMassFunction must be one of/);
    expect(errorOf(s, 'e5')).toMatch(/argument reference of referencePhi/);
  });
});
