// The black-hole mass-function check: remnants of a population whose z = 0 remnant mass function is a
// Schechter function, against its closed form (upper incomplete gamma, scipy fixture).
import { describe, expect, it } from 'vitest';
import fixture from '../reference/mass_function.json';
import { schechterPerDex } from '../../src/physics/massFunctions';
import { MARCONI_2004_MASS_DENSITY, massFunctionCheck, referenceNumberAbove } from '../../src/physics/massFunctionCheck';
import { mergedMassDensity } from '../../src/physics/populationSanity';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import { integrateMassFunction, remnantMassFunction, remnantNumberAbove } from '../../src/physics/remnantMassFunction';
import { errorOf, sheetOf, siOf, valueOf } from './sheetHelpers';

interface Case {
  phiStar_Mpc3: number;
  mStar_Msun: number;
  alpha: number;
  m0_Msun: number;
  m1_Msun: number;
  number_Mpc3: number;
  mass_Msun_Mpc3: number;
}

const rel = (a: number, b: number) => Math.abs(a / b - 1);

/** Mergers spread evenly over 0 < z < 2 and 0.1 < q < 1 whose remnants follow a Schechter function per dex. */
function schechterRemnants(c: Case, log10MMin: number): BinaryPopulation {
  return {
    zMin: 0,
    zMax: 2,
    log10MMin,
    log10MMax: Math.log10(c.m1_Msun),
    qMin: 0.1,
    qMax: 1,
    density: (_z, x) => (schechterPerDex(Math.pow(10, x), c.phiStar_Mpc3, c.mStar_Msun, c.alpha) / 2) / 0.9,
  };
}

describe('remnant mass function of a Schechter input (scipy gammaincc fixture, Schechter 1976 closed form)', () => {
  for (const c of fixture.cases as Case[]) {
    const label = `Phi* ${c.phiStar_Mpc3}, M* ${c.mStar_Msun.toExponential(1)}, alpha ${c.alpha}, ${c.m0_Msun.toExponential(0)} to ${c.m1_Msun.toExponential(0)} Msun`;
    it(`number above the threshold: ${label}`, () => {
      const pop = schechterRemnants(c, 6);
      const got = remnantNumberAbove(pop, c.m0_Msun);
      const err = rel(got, c.number_Mpc3);
      expect(err, `expected ${c.number_Mpc3}, got ${got}, relative error ${err}`).toBeLessThan(1e-6);
    });
    it(`mass density between the masses: ${label}`, () => {
      const pop = schechterRemnants(c, Math.log10(c.m0_Msun));
      const got = integrateMassFunction((x) => remnantMassFunction(pop, x), pop.log10MMin, pop.log10MMax, 1);
      const err = rel(got, c.mass_Msun_Mpc3);
      expect(err, `expected ${c.mass_Msun_Mpc3}, got ${got}, relative error ${err}`).toBeLessThan(1e-6);
    });
  }
  it('the remnant mass function is the Schechter function itself (z and q factors integrate to 1)', () => {
    const c = (fixture.cases as Case[])[0];
    const pop = schechterRemnants(c, 6);
    for (const x of [8, 9, 10]) expect(rel(remnantMassFunction(pop, x), schechterPerDex(Math.pow(10, x), c.phiStar_Mpc3, c.mStar_Msun, c.alpha))).toBeLessThan(1e-12);
    expect(remnantMassFunction(pop, 5.9)).toBe(0);
  });
});

describe('massFunctionCheck', () => {
  const c = (fixture.cases as Case[]).find((k) => k.alpha === -0.5 && k.m0_Msun === 1e9 && k.m1_Msun === 1e12)!;
  const c10 = (fixture.cases as Case[]).find((k) => k.alpha === -0.5 && k.m0_Msun === 1e10 && k.m1_Msun === 1e12)!;
  const ref = { phiStar: c.phiStar_Mpc3, mStar: c.mStar_Msun, alpha: c.alpha, uncertaintyDex: 0.3, log10MMax: 12 };
  it('the reference above 1e9 and 1e10 Msun follows the closed form, its range is +-0.3 dex (scipy fixture)', () => {
    const r9 = referenceNumberAbove(ref, 1e9);
    expect(rel(r9.value, c.number_Mpc3)).toBeLessThan(1e-6);
    expect(rel(r9.high / r9.value, Math.pow(10, 0.3))).toBeLessThan(1e-14);
    expect(rel(referenceNumberAbove(ref, 1e10).value, c10.number_Mpc3)).toBeLessThan(1e-6);
  });
  it('a population whose remnants are the reference gives ratio 1; twice the density gives 2', () => {
    const pop = schechterRemnants(c, 6);
    const check = massFunctionCheck(pop, ref);
    expect(check.rows.map((r) => r.massMsun)).toEqual([1e9, 1e10]);
    for (const r of check.rows) expect(Math.abs(r.ratio - 1)).toBeLessThan(1e-6);
    const twice = massFunctionCheck({ ...pop, density: (z, x, q) => 2 * pop.density(z, x, q) }, ref);
    for (const r of twice.rows) expect(Math.abs(r.ratio - 2)).toBeLessThan(2e-6);
    expect(check.mergedMassUpperBound).toBe(mergedMassDensity(pop));
  });
  it('carries the local mass density of Marconi et al. 2004 (MNRAS 351, 169, abstract: 4.6 +1.9 -1.4 x 1e5 Msun/Mpc^3, h = 0.7)', () => {
    expect(MARCONI_2004_MASS_DENSITY).toMatchObject({ value: 4.6e5, low: 4.6e5 - 1.4e5, high: 4.6e5 + 1.9e5 });
  });
});

describe('mass-function built-ins', () => {
  // A phenomenological density with no redshift evolution over z < 2 (e^(-z/1e12)), mass slope and cutoff
  // of the fixture's Schechter function (Phi* = 1e-3 Mpc^-3, M* = 5e8 Msun, alpha = -0.5): its z = 0
  // remnants are that Schechter function when the rate is ln10 Phi* / ((M*/1e7)^0.5 t_L(2)), t_L the
  // lookback time (Hogg 1999 eq. 30), since Int |dt/dz| dz = t_L.
  const c = (fixture.cases as Case[]).find((k) => k.alpha === -0.5 && k.m0_Msun === 1e9 && k.m1_Msun === 1e11)!;
  const c10 = (fixture.cases as Case[]).find((k) => k.alpha === -0.5 && k.m0_Msun === 1e10 && k.m1_Msun === 1e11)!;
  const cells = {
    cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
    tL: 'lookbackTime(cosmo, 2)',
    pop: 'mergerPopulation(cosmo, log(10) * 1e-3 Mpc^-3 / (sqrt(50) * tL), -0.5, 5e8 Msun, redshiftPowerExp(0, 1e12, 2), massRatioPowerLaw(0, 0.1), 1e6 Msun, 1e11 Msun)',
    above: 'remnantNumberAbove(pop, 1e10 Msun)',
    ref: 'referenceMassFunction(1e-3 Mpc^-3, 5e8 Msun, -0.5, 0.3, 1e11 Msun)',
    check: 'massFunctionCheck(pop, ref)',
    badRef: 'referenceMassFunction(1e-3 Mpc^-3, 5e8 Msun, -0.5, 4)',
    badTop: 'referenceMassFunction(1e-3 Mpc^-3, 5e8 Msun, -0.5, 0.3, 1e9 Msun)',
    badPop: 'massFunctionCheck(ref, ref)',
  };
  it('remnantNumberAbove gives Mpc^-3 matching the closed form (scipy fixture)', () => {
    const s = sheetOf(cells);
    const MPC3 = 3.0856775814913673e22 ** 3;
    const got = siOf(valueOf(s, 'above')) * MPC3;
    expect(rel(got, c10.number_Mpc3)).toBeLessThan(1e-6);
    const check = valueOf(s, 'check') as { describe(): string; check: { rows: { remnants: number; ratio: number }[] } };
    expect(rel(check.check.rows[0].remnants, c.number_Mpc3)).toBeLessThan(1e-6);
    for (const r of check.check.rows) expect(Math.abs(r.ratio - 1)).toBeLessThan(1e-6);
    expect(check.describe()).toMatch(/n\(>1e9 Msun\).*n\(>1e10 Msun\).*upper bound/);
  });
  it('bad arguments name the function and argument', () => {
    const s = sheetOf(cells);
    expect(errorOf(s, 'badRef')).toMatch(/uncertaintyDex of referenceMassFunction/);
    expect(errorOf(s, 'badTop')).toMatch(/maxMass of referenceMassFunction must exceed/);
    expect(errorOf(s, 'badPop')).toMatch(/population of massFunctionCheck/);
  });
});
