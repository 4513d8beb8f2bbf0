// The completed galaxy route (Chen, Sesana & Conselice 2019, MNRAS 488, 401): with constant pair fraction
// and merger time, no time shift, no evolution of the relation, it is today's route
// (galaxyMergerPopulation.ts) to rounding; with independent scatter, mass-dependent pairs and the time
// shift it is checked against an independent integral (scipy dblquad with astropy ages, fixture).
import { describe, expect, it } from 'vitest';
import { GYR_S, KM_S_MPC_SI } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { galaxyMergerPopulation, type GalaxyMergerParams } from '../../src/physics/galaxyMergerPopulation';
import { galaxyPairRoutePopulation, type GalaxyPairRouteParams } from '../../src/physics/galaxyPairRoute';
import { KORMENDY_HO_2013 } from '../../src/physics/blackHoleBulgeRelation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import { errorOf, sheetOf, valueOf } from './sheetHelpers';
import fixture from '../reference/galaxy_pairs.json';
import { MIN_JACOBIAN, mergerShiftTable } from '../../src/physics/mergerTimeShift';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { delayedPopulation } from '../../src/physics/delayedPopulation';
import { delayedPopulationByMass } from '../../src/physics/massDependentDelay';

const cosmo = new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 });
const massFunction = { log10PhiStar0: -2.8, log10PhiStarSlope: -0.25, mStar: 10 ** 10.9, alpha0: -1.2, alphaSlope: -0.05 };

function today(scatterDex: number): GalaxyMergerParams {
  return {
    massFunction,
    pairFraction0: 0.025,
    betaPair: 1.0,
    mergerTime0Gyr: 0.8,
    betaTau: -0.3,
    galaxyMassRatio: powerLawMassRatio(-0.5, 0.2),
    bulgeFraction: 0.5,
    relation: { ...KORMENDY_HO_2013, scatterDex },
    zMax: 4,
    log10MMin: 6,
    log10MMax: 11,
    cosmology: cosmo,
  };
}

function completed(t: GalaxyMergerParams, extra: Partial<GalaxyPairRouteParams> = {}): GalaxyPairRouteParams {
  return {
    massFunction: t.massFunction,
    pair: { f0: t.pairFraction0, alpha: 0, beta: t.betaPair },
    time: { tau0Gyr: t.mergerTime0Gyr, alpha: 0, beta: t.betaTau, gamma: 0 },
    galaxyMassRatio: t.galaxyMassRatio,
    bulgeFraction: t.bulgeFraction,
    relation: t.relation,
    relationZeta: 0,
    scatter: 'shared',
    timeShift: false,
    zMax: t.zMax,
    log10MMin: t.log10MMin,
    log10MMax: t.log10MMax,
    cosmology: cosmo,
    ...extra,
  };
}

const points: [number, number, number][] = [];
for (const z of [0, 0.3, 1.1, 2.7]) for (const x of [7, 8.3, 9.1, 9.9, 10.6]) for (const q of [0.15, 0.4, 0.77, 1]) points.push([z, x, q]);

describe('the completed galaxy route reduces to today\'s route for constant inputs', () => {
  for (const [sigma, scatter] of [[0.3, 'shared'], [0, 'shared'], [0, 'independent']] as const) {
    it(`scatter ${sigma} dex (${scatter}): the density agrees to 1e-12 at ${points.length} points`, () => {
      const t = today(sigma);
      const old = galaxyMergerPopulation(t);
      const pop = galaxyPairRoutePopulation(completed(t, { scatter }));
      expect(pop.qMin).toBeCloseTo(old.qMin, 14);
      let worst = 0;
      for (const [z, x, q] of points) {
        const a = old.density(z, x, q);
        const b = pop.density(z, x, q);
        const err = a === 0 ? Math.abs(b) : Math.abs(b / a - 1);
        worst = Math.max(worst, err);
      }
      expect(worst).toBeLessThan(1e-12);
    });
  }
});

describe('the completed galaxy route against an independent integral over galaxy variables (scipy and astropy fixture)', () => {
  interface Case { name: string; sigma: number; scatter: 'independent' | 'shared'; shift: boolean; zeta: number; z: number; log10M: number; q: number; density_Mpc3: number }
  const fp = fixture.parameters;
  for (const c of fixture.cases as Case[]) {
    // With the time shift, pairs beyond zMax keep the mass function of zMax: the kink this puts in the
    // scatter integral limits the Gauss-Legendre rule to about 1e-4.
    const tol = c.shift ? 3e-4 : 1e-4;
    it(`${c.name}: z ${c.z}, log10M ${c.log10M}, q ${c.q} within ${tol}`, () => {
      const pop = galaxyPairRoutePopulation({
        massFunction: fp.massFunction,
        pair: fp.pair,
        time: { tau0Gyr: fp.time.tau0, alpha: fp.time.alpha, beta: fp.time.beta, gamma: fp.time.gamma },
        galaxyMassRatio: powerLawMassRatio(fp.qgGamma, fp.qgMin),
        bulgeFraction: fp.bulgeFraction,
        relation: { a: fp.a, b: fp.b, scatterDex: c.sigma, source: 'test' },
        relationZeta: c.zeta,
        scatter: c.scatter,
        timeShift: c.shift,
        zMax: fp.zMax,
        log10MMin: 6,
        log10MMax: 11,
        cosmology: new FlatLambdaCdm({ hubbleSI: fp.H0 * KM_S_MPC_SI, omegaM: fp.Om0 }),
      });
      const got = pop.density(c.z, c.log10M, c.q);
      const err = Math.abs(got / c.density_Mpc3 - 1);
      expect(err, `expected ${c.density_Mpc3}, got ${got}, relative error ${err.toExponential(2)}`).toBeLessThan(tol);
    });
  }
});

describe('A_yr of the fast scatter sums against a converged reference', () => {
  // Reference: the same model with 8 grid steps per sigma (Boole and trapezoid errors fall as h^6 and
  // faster) and a finer spectrum rule (4 x 8 x 2 panels of 8 points); measured differences 2e-7 (one draw)
  // and 4e-6 (a draw for each hole), against the 1e-4 asked of the default.
  const yr = 1 / (365.25 * 86400);
  const t = today(0.3);
  for (const scatter of ['shared', 'independent'] as const) {
    it(`${scatter} scatter, mass-dependent pairs and time-scales, time shift, zeta = 0.5: within 1e-4`, () => {
      const params = completed(t, { pair: { f0: 0.025, alpha: 0.2, beta: 1 }, time: { tau0Gyr: 0.8, alpha: -0.3, beta: -0.3, gamma: -0.5 }, relationZeta: 0.5, scatter, timeShift: true });
      const fast = characteristicStrainSquared(galaxyPairRoutePopulation(params), [yr])[0];
      const ref = characteristicStrainSquared(galaxyPairRoutePopulation({ ...params, scatterStepsPerSigma: 8 }), [yr], { resolution: { zPanels: 4, log10MPanels: 8, qPanels: 2, order: 8 } })[0];
      const err = Math.abs(Math.sqrt(fast / ref) - 1);
      expect(err, `A_yr ${Math.sqrt(fast)} against ${Math.sqrt(ref)}: ${err.toExponential(2)}`).toBeLessThan(1e-4);
    });
  }
  it('independent draws mark q = q_G,min^b as a break of the q rule (without it A_yr is 9e-4 low at the default resolution)', () => {
    const pop = galaxyPairRoutePopulation(completed(t, { scatter: 'independent' }));
    expect(pop.qBreaks).toEqual([Math.pow(0.2, KORMENDY_HO_2013.b)]);
    expect(galaxyPairRoutePopulation(completed(t)).qBreaks).toBeUndefined();
  });
  it('a delayed galaxy route (one lifetime, or one per mass) keeps the q break of its base', () => {
    const base = galaxyPairRoutePopulation(completed(t, { scatter: 'independent' }));
    expect(delayedPopulation(base, cosmo, 0.5 * GYR_S).qBreaks).toEqual(base.qBreaks);
    expect(delayedPopulationByMass(base, cosmo, (x) => (0.2 + 0.05 * (x - 6)) * GYR_S).qBreaks).toEqual(base.qBreaks);
  });
  it('outside the population limits the grid routes give 0 (the population contract), inside a positive density', () => {
    for (const scatter of ['shared', 'independent'] as const) {
      const pop = galaxyPairRoutePopulation(completed(t, { scatter, timeShift: true }));
      expect(pop.density(1, 11.2, 0.5)).toBe(0);
      expect(pop.density(1, 5.8, 0.5)).toBe(0);
      expect(pop.density(1, 9, pop.qMin / 2)).toBe(0);
      expect(pop.density(1, 9, 0.5)).toBeGreaterThan(0);
    }
  });
  it('refuses a grid of fewer than 1 step per sigma', () => {
    expect(() => galaxyPairRoutePopulation({ ...completed(t, { scatter: 'independent' }), scatterStepsPerSigma: 0.5 })).toThrow(/scatterStepsPerSigma/);
  });
});

describe('time shift with a time-scale growing with redshift', () => {
  it('betaTau = 1: a pair at z_p with tau = K (1+z_p) merging today is found again; later-overtaken pairs are left out', () => {
    const table = mergerShiftTable(cosmo, 0, 30, 1);
    // t0 - t(z_p) = K (1+z_p) (Hogg 1999 eq. 30 ages, cosmology.ts checked against astropy)
    const t0 = cosmo.ageS(0);
    const kOf = (zp: number) => (t0 - cosmo.ageS(zp)) / GYR_S / (1 + zp);
    // Cubic Hermite interpolation of the tabulated K -> z_p map: about 1e-5 here, where the slope changes fast.
    for (const zp of [0.2, 0.5]) {
      const r = table.pairRedshift(kOf(zp));
      expect(r).not.toBeNull();
      expect(Math.abs(r!.zPair / zp - 1)).toBeLessThan(1e-4);
      expect(r!.dtMergerPerDtPair).toBeGreaterThanOrEqual(MIN_JACOBIAN);
    }
    // With tau = K (1+z_p), dt_merger/dt_pair = 1 - tau / ((1+z_p) |dt/dz|) falls below 0.05 before z_p = 1:
    // the pair at z_p = 2 is left out and the later pair with the same K (z_p < 1) is returned.
    const r2 = table.pairRedshift(kOf(2));
    expect(r2).not.toBeNull();
    expect(r2!.zPair).toBeLessThan(1);
    expect(Math.abs(kOf(r2!.zPair) / kOf(2) - 1)).toBeLessThan(1e-4);
    expect(table.pairRedshift(50)).toBeNull();
  });
});

describe('galaxyPairPopulation built-in', () => {
  const cells = {
    cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
    smf: 'stellarMassFunction(10^-2.8 Mpc^-3, -0.25, 10^10.9 Msun, -1.2, -0.05)',
    rel: 'kormendyHoRelation()',
    old: 'galaxyMergerPopulation(cosmo, smf, 0.025, 1, 0.8 Gyr, -0.3, massRatioPowerLaw(-0.5, 0.2), 0.5, rel, 4)',
    same: 'galaxyPairPopulation(cosmo, smf, pairFraction(0.025, 0, 1), mergerTimeScale(0.8 Gyr, 0, -0.3, 0), massRatioPowerLaw(-0.5, 0.2), 0.5, rel, 0, false, false, 4)',
    full: 'galaxyPairPopulation(cosmo, smf, pairFraction(0.025, 0.2, 1), mergerTimeScale(0.8 Gyr, -0.3, -0.3, -0.5), massRatioPowerLaw(-0.5, 0.2), 0.5, rel, 0.5)',
    badF: 'pairFraction(1.5, 0, 0)',
    badTau: 'mergerTimeScale(0.8, 0, 0, 0)',
    badFlag: 'galaxyPairPopulation(cosmo, smf, pairFraction(0.025, 0, 1), mergerTimeScale(0.8 Gyr, 0, 0, 0), massRatioPowerLaw(-0.5, 0.2), 0.5, rel, 0, 2)',
  };
  it('with constant pair fraction and time-scale, shared scatter and no shift it is galaxyMergerPopulation', () => {
    const s = sheetOf(cells);
    const a = (valueOf(s, 'old') as { population: BinaryPopulation }).population;
    const b = (valueOf(s, 'same') as { population: BinaryPopulation }).population;
    for (const [z, x, q] of points) {
      const da = a.density(z, x, q);
      expect(da === 0 ? b.density(z, x, q) : Math.abs(b.density(z, x, q) / da - 1)).toBeLessThan(1e-12);
    }
    expect((valueOf(s, 'full') as { describe(): string }).describe()).toMatch(/galaxy pairs/);
  });
  it('bad arguments name the function and argument', () => {
    const s = sheetOf(cells);
    expect(errorOf(s, 'badF')).toMatch(/f0 of pairFraction/);
    expect(errorOf(s, 'badTau')).toMatch(/tau0 of mergerTimeScale needs a unit of time/);
    expect(errorOf(s, 'badFlag')).toMatch(/independentScatter of galaxyPairPopulation must be true or false/);
  });
});
