// The dynamical-friction phase of a binary's lifetime and the Dehnen host at the influence radius, against
// scipy (test/reference/friction_dehnen.json: solve_ivp of Chandrasekhar's drag, brentq + quad of the Dehnen
// enclosed mass) and closed forms; then through the lifetime, the delayed population and the sheet.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/friction_dehnen.json';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { G_SI, GYR_S, KM_S_MPC_SI, M_SUN_KG, MPC_M, PC_M } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { dehnenDensity, dehnenEnclosedMass, dehnenInfluence } from '../../src/physics/dehnenProfile';
import { FRICTION_CHI, frictionTime } from '../../src/physics/dynamicalFriction';
import { frictionPhaseTime, hardBinaryLifetime, hardSeparation, lifetimeFunction } from '../../src/physics/hardeningLifetime';
import { bulgeMassOfMass, dispersionOfMass, environmentOfMass, isothermalDensity, isothermalInfluenceRadius, massScaledEnvironment, MCCONNELL_MA_2013_M_SIGMA, type MassScaledEnvironment } from '../../src/physics/hostEnvironment';
import { delayedPopulationByMass, stalledFractionByMass } from '../../src/physics/massDependentDelay';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import { errorOf, sheetOf, siOf, valueOf } from './sheetHelpers';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const MSUN_PC3 = M_SUN_KG / PC_M ** 3;
const cosmo = new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 });
// An invented population (no published fit).
const base = phenomenologicalPopulation({
  rateNorm: 1e-3, alpha: 0.2, cutoffMass: 3e9, beta: 2, z0: 1.5, zMax: 5, log10MMin: 6, log10MMax: 11,
  massRatio: powerLawMassRatio(0, 0.05), cosmology: cosmo,
});
const host = (extra: Partial<MassScaledEnvironment> = {}): MassScaledEnvironment => ({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: 16, ...extra });

describe('dynamical friction in a singular isothermal sphere', () => {
  for (const c of fixture.friction) {
    it(`${c.kind} case: ${(c.time_s / GYR_S).toPrecision(4)} Gyr, against scipy solve_ivp of Chandrasekhar's drag, to 1e-8`, () => {
      let t: number;
      if (c.kind === 'fixed') {
        t = frictionTime((c.sinking_mass_sun as number) * M_SUN_KG, c.sigma_kms * 1e3, c.start_pc * PC_M, (c.end_pc as number) * PC_M, c.coulomb_log);
      } else {
        const m = (c.M_sun as number) * M_SUN_KG;
        const q = c.q as number;
        const env = environmentOfMass(m, host());
        expect(rel(env.dispersionMS, c.sigma_kms * 1e3)).toBeLessThan(1e-12);
        expect(rel(hardSeparation(m - m / (1 + q), env.dispersionMS), c.a_h_m as number)).toBeLessThan(1e-12);
        t = frictionPhaseTime(m, q, env, { startRadiusM: c.start_pc * PC_M, coulombLog: c.coulomb_log });
      }
      expect(rel(t, c.time_s), `expected ${c.time_s} s, got ${t} s`).toBeLessThan(1e-8);
    });
  }

  it('the coefficient 1/(2 chi) rounds to the 1.17 of t_fric = 1.17 r_i^2 v_c / (lnL G M) (Binney & Tremaine 2008, section 8.1), and the time scales as r_i^2 / (lnL M)', () => {
    expect(Math.abs(1 / (2 * FRICTION_CHI) - 1.17)).toBeLessThan(0.005);
    const sigma = 200e3;
    const m = 1e8 * M_SUN_KG;
    const t = frictionTime(m, sigma, 1e3 * PC_M, 0, 5);
    expect(rel(t, ((1 / (2 * FRICTION_CHI)) * (1e3 * PC_M) ** 2 * Math.SQRT2 * sigma) / (5 * G_SI * m))).toBeLessThan(1e-14);
    expect(rel(frictionTime(m, sigma, 2e3 * PC_M, 0, 5), 4 * t)).toBeLessThan(1e-14);
    expect(rel(frictionTime(2 * m, sigma, 1e3 * PC_M, 0, 10), t / 4)).toBeLessThan(1e-14);
  });

  it('starting inside the end radius takes no time; bad inputs are refused', () => {
    expect(frictionTime(M_SUN_KG, 1e5, 1, 2, 5)).toBe(0);
    expect(() => frictionTime(M_SUN_KG, 1e5, -1, 0, 5)).toThrow(/start radius/);
    expect(() => frictionTime(M_SUN_KG, 1e5, 1, 0, 0)).toThrow(/Coulomb logarithm/);
    expect(() => frictionTime(0, 1e5, 1, 0, 5)).toThrow(/sinking mass/);
  });
});

describe('the friction phase in the lifetime and the population', () => {
  it('no friction phase, or one that starts at 0 (inside a_h), gives exactly the hardening lifetimes of today', () => {
    const env = massScaledEnvironment(host());
    const without = lifetimeFunction(env, M_SUN_KG);
    const zero = lifetimeFunction(env, M_SUN_KG, { startRadiusM: 0, coulombLog: 5 });
    for (const [lg, q] of [[6, 0.05], [9, 0.5], [11, 1]]) {
      const m = Math.pow(10, lg) * M_SUN_KG;
      expect(without(lg, q)).toBe(hardBinaryLifetime(m, q, env.ofMass(m)));
      expect(zero(lg, q)).toBe(without(lg, q));
    }
    const freqs = [2e-9, 3.17e-8];
    const a = characteristicStrainSquared(delayedPopulationByMass(base, cosmo, without), freqs);
    const b = characteristicStrainSquared(delayedPopulationByMass(base, cosmo, zero), freqs);
    for (let k = 0; k < freqs.length; k++) expect(b[k]).toBe(a[k]);
  });

  it('the lifetime is the friction time plus the hardening time; friction lengthens delays and raises the stalled share', () => {
    const env = massScaledEnvironment(host());
    const friction = { startRadiusM: 1e3 * PC_M, coulombLog: 5 };
    const withFriction = lifetimeFunction(env, M_SUN_KG, friction);
    const m = 1e9 * M_SUN_KG;
    expect(withFriction(9, 0.5)).toBe(hardBinaryLifetime(m, 0.5, env.ofMass(m)) + frictionPhaseTime(m, 0.5, env.ofMass(m), friction));
    const plain = stalledFractionByMass(base, cosmo, lifetimeFunction(env, M_SUN_KG));
    const slowed = stalledFractionByMass(base, cosmo, withFriction);
    expect(slowed).toBeGreaterThan(plain);
  });

  it('a friction phase longer than the age of the universe for every binary (start 1 Mpc, lnL 3: over 30 Gyr even at 1e11 Msun, q = 1) removes the population: h_c = 0, stalled share 1', () => {
    const env = massScaledEnvironment(host());
    const lifetime = lifetimeFunction(env, M_SUN_KG, { startRadiusM: MPC_M, coulombLog: 3 });
    expect(lifetime(11, 1)).toBeGreaterThan(30 * GYR_S);
    expect(stalledFractionByMass(base, cosmo, lifetime)).toBe(1);
    const hc2 = characteristicStrainSquared(delayedPopulationByMass(base, cosmo, lifetime), [2e-9, 3.17e-8]);
    expect(Array.from(hc2)).toEqual([0, 0]);
  });
});

describe('Dehnen host at the influence radius', () => {
  for (const c of fixture.dehnen) {
    it(`M = ${c.M_sun} Msun, gamma = ${c.gamma}: rho(r_inf) = ${c.rho_inf_msun_pc3.toPrecision(5)} Msun/pc^3 and the scale radius, against scipy brentq + quad of the enclosed mass (2M inside r_inf), to 1e-9`, () => {
      const m = c.M_sun * M_SUN_KG;
      const sigma = dispersionOfMass(m);
      expect(rel(sigma, c.sigma_kms * 1e3)).toBeLessThan(1e-12);
      const ms = bulgeMassOfMass(m);
      expect(rel(ms, c.stellar_mass_sun * M_SUN_KG)).toBeLessThan(1e-12);
      const d = dehnenInfluence(m, sigma, ms, c.gamma);
      expect(rel(d.influenceRadiusM, c.r_inf_m)).toBeLessThan(1e-12);
      expect(rel(d.scaleRadiusM, c.scale_radius_m), `a: expected ${c.scale_radius_m}, got ${d.scaleRadiusM}`).toBeLessThan(1e-9);
      expect(rel(d.densityKgM3, c.rho_inf_msun_pc3 * MSUN_PC3), `rho: expected ${c.rho_inf_msun_pc3}, got ${d.densityKgM3 / MSUN_PC3}`).toBeLessThan(1e-9);
      expect(rel(environmentOfMass(m, host({ profile: { kind: 'dehnen', gamma: c.gamma } })).densityKgM3, d.densityKgM3)).toBe(0);
      // the closed forms of the profile itself (Dehnen 1993): density and 2M enclosed
      expect(rel(dehnenDensity(d.influenceRadiusM, ms, d.scaleRadiusM, c.gamma), d.densityKgM3)).toBeLessThan(1e-12);
      expect(rel(dehnenEnclosedMass(d.influenceRadiusM, ms, d.scaleRadiusM, c.gamma), 2 * m)).toBeLessThan(1e-12);
    });
  }

  it('limits: a pure power-law cusp rho ~ r^-gamma holding 2M inside r_inf has (3 - gamma) M / (2 pi r_inf^3), approached as the stellar mass grows (departure below (2M/M_s)^(1/(3-gamma))); gamma = 2 gives the isothermal sphere sigma^6 / (2 pi G^3 M^2) (Binney & Tremaine 2008), to 1e-9', () => {
    const m = 1e9 * M_SUN_KG;
    const sigma = dispersionOfMass(m);
    const r = isothermalInfluenceRadius(m, sigma);
    for (const g of [0, 1, 1.5]) {
      const cusp = ((3 - g) * m) / (2 * Math.PI * r ** 3); // 4 pi rho r^3 / (3 - gamma) = 2M for rho ~ r^-gamma
      const x = Math.pow(2e-12, 1 / (3 - g));
      expect(rel(dehnenInfluence(m, sigma, 1e12 * m, g).densityKgM3, cusp)).toBeLessThan(1.01 * x);
      expect(rel(dehnenInfluence(m, sigma, 1e6 * m, g).densityKgM3, cusp)).toBeGreaterThan(rel(dehnenInfluence(m, sigma, 1e12 * m, g).densityKgM3, cusp));
    }
    expect(rel(dehnenInfluence(m, sigma, 1e15 * m, 2).densityKgM3, isothermalDensity(r, sigma))).toBeLessThan(1e-9);
    expect(() => dehnenInfluence(m, sigma, m, 1)).toThrow(/outweigh/);
    expect(() => dehnenInfluence(m, sigma, 1e3 * m, 3)).toThrow(/gamma must lie in \[0, 3\)/);
  });
});

describe('friction and Dehnen hosts in the sheet', () => {
  const cells = {
    cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
    pop: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, 1e9 Msun, redshiftPowerExp(2, 1.5, 5), massRatioPowerLaw(-0.5, 0.05))',
    env: 'hostEnvironment(16)',
    slow: 'frictionPhase(env, 1 kpc, 5)',
    never: 'frictionPhase(env, 1 Mpc, 3)',
    cusp: 'dehnenHost(env, 1)',
  };

  it('environmentDensity, frictionTime and hardeningLifetime give the physics values', () => {
    const s = sheetOf({ ...cells, rho: 'environmentDensity(cusp, 1e9 Msun)', rhoIso: 'environmentDensity(env, 1e9 Msun)', tf: 'frictionTime(slow, 1e9 Msun, 0.5)', life: 'hardeningLifetime(slow, 1e9 Msun, 0.5)', life0: 'hardeningLifetime(env, 1e9 Msun, 0.5)' });
    const dehnen = fixture.dehnen.find((c) => c.M_sun === 1e9 && c.gamma === 1)!;
    expect(rel(siOf(valueOf(s, 'rho')), dehnen.rho_inf_msun_pc3 * MSUN_PC3)).toBeLessThan(1e-9);
    const m = 1e9 * M_SUN_KG;
    const sigma = dispersionOfMass(m);
    expect(rel(siOf(valueOf(s, 'rhoIso')), isothermalDensity(isothermalInfluenceRadius(m, sigma), sigma))).toBeLessThan(1e-12);
    const scipyFriction = fixture.friction.find((c) => c.kind === 'mass-scaled' && c.M_sun === 1e9)!;
    expect(rel(siOf(valueOf(s, 'tf')), scipyFriction.time_s)).toBeLessThan(1e-8);
    expect(rel(siOf(valueOf(s, 'life')) - siOf(valueOf(s, 'life0')), siOf(valueOf(s, 'tf')))).toBeLessThan(1e-9);
  });

  it('delayedPopulation with a friction phase longer than the age of the universe leaves no background and stalls every binary', () => {
    const s = sheetOf({ ...cells, gone: 'delayedPopulation(pop, never)', a: 'amplitudeAtYear(gone)', st: 'stalledFraction(pop, never)', d: 'delayedPopulation(pop, slow)' });
    expect(Number(valueOf(s, 'a'))).toBe(0);
    expect(Number(valueOf(s, 'st'))).toBe(1);
    expect(String((valueOf(s, 'd') as { describe(): string }).describe())).toMatch(/dynamical friction, then hardening/);
    expect(String((valueOf(s, 'slow') as { describe(): string }).describe())).toMatch(/dynamical friction from 1 kpc \(ln Lambda 5\)/);
  });

  it('errors name the built-in and the argument', () => {
    const s = sheetOf({ ...cells, e1: 'dehnenHost(env, 3)', e2: 'frictionPhase(env, -1 kpc, 5)', e3: 'frictionPhase(env, 1 kpc, 0)', e4: 'frictionTime(env, 1e9 Msun, 0.5)', e5: 'frictionTime(slow, 1e9 Msun, 2)', e6: 'environmentDensity(pop, 1e9 Msun)' });
    expect(errorOf(s, 'e1')).toMatch(/argument gamma of dehnenHost must be an inner slope in \[0, 3\)/);
    expect(errorOf(s, 'e2')).toMatch(/argument startRadius of frictionPhase must be a finite length >= 0/);
    expect(errorOf(s, 'e3')).toMatch(/argument coulombLog of frictionPhase must be a positive Coulomb logarithm/);
    expect(errorOf(s, 'e4')).toMatch(/argument environment of frictionTime has no friction phase/);
    expect(errorOf(s, 'e5')).toMatch(/argument q of frictionTime must be a mass ratio/);
    expect(errorOf(s, 'e6')).toMatch(/argument environment of environmentDensity/);
  });
});
