// Stellar hardening (Quinlan 1996, New Astron. 1, 35) combined with GW emission, and the generic bend
// (Sampson, Cornish & McWilliams 2015, PRD 91, 084055).
import { describe, expect, it } from 'vitest';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { circularGwKernel } from '../../src/physics/circularKernel';
import { M_SUN_KG, PC_M, F_YR_HZ } from '../../src/physics/constants';
import { gwSemiMajorAxisRate, keplerOrbitalFrequency, keplerSemiMajorAxis } from '../../src/physics/petersEvolution';
import { eccentricityEnhancement } from '../../src/physics/petersMathews';
import {
  stellarEccentricKernel,
  stellarEmissionKernel,
  stellarHardeningRate,
  stellarSuppression,
  stellarTransitionFrequency,
  stellarTransitionSemiMajorAxis,
  transitionFrequencyFunction,
  type StellarEnvironment,
} from '../../src/physics/stellarHardening';
import { bendEmissionKernel, bentPowerLawStrain, BEND_INDEX } from '../../src/physics/bendSpectrum';
import { boxPopulation } from './populations';

// An invented galactic nucleus: 300 Msun/pc^3, sigma 180 km/s, H = 16 (Quinlan 1996 quotes H of about 15-20).
const env: StellarEnvironment = { densityKgM3: (300 * M_SUN_KG) / PC_M ** 3, dispersionMS: 180e3, hardeningRate: 16 };
const M = 2e9 * M_SUN_KG;
const q = 0.5;
const m1 = M / (1 + q);
const m2 = M - m1;

describe('stellar transition', () => {
  it('at a_t the stellar rate G rho H a^2/sigma equals the Peters 1964 GW rate (eq. 5.6), circular and eccentric, to 1e-12', () => {
    for (const e of [0, 0.6]) {
      const a = stellarTransitionSemiMajorAxis(M, q, env, e);
      const stars = stellarHardeningRate(a, env);
      const gw = gwSemiMajorAxisRate(a, e, m1, m2);
      expect(Math.abs(stars / gw - 1)).toBeLessThan(1e-12);
    }
    // F(e) enters as the fifth root: a_t(e) / a_t(0) = F(e)^(1/5).
    const ratio = stellarTransitionSemiMajorAxis(M, q, env, 0.6) / stellarTransitionSemiMajorAxis(M, q, env, 0);
    expect(Math.abs(ratio / Math.pow(eccentricityEnhancement(0.6), 0.2) - 1)).toBeLessThan(1e-14);
  });

  it('the suppression 1/(1 + (f_t/f)^(10/3)) equals the residence-time ratio built from the two rates, dln f/dt = -(3/2) da/dt / a (Kepler)', () => {
    const ft = stellarTransitionFrequency(M, q, env);
    for (const ratio of [0.01, 0.3, 1, 3, 100]) {
      const f = ratio * ft;
      const a = keplerSemiMajorAxis(f / 2, M);
      const gw = -1.5 * (gwSemiMajorAxisRate(a, 0, m1, m2) / a);
      const stars = -1.5 * (stellarHardeningRate(a, env) / a);
      expect(Math.abs(stellarSuppression(f, ft) / (gw / (gw + stars)) - 1), `f/f_t = ${ratio}`).toBeLessThan(1e-12);
    }
  });

  it('a binary of 2e9 Msun in this invented nucleus turns over in the nanohertz band (order of magnitude, common practice, no source): 0.1 to 10 nHz', () => {
    const ft = stellarTransitionFrequency(M, q, env);
    expect(ft).toBeGreaterThan(1e-10);
    expect(ft).toBeLessThan(1e-8);
  });
});

describe('stellar spectrum slopes through the integrator (one kind of binary near z = 0)', () => {
  const pop = boxPopulation(1e-2, 0.01, Math.log10(2e9), 0.5);
  const ft = stellarTransitionFrequency(M, q, env) / 1.01; // observed, for the box at z = 0.01
  const slope = (kernel: typeof circularGwKernel, f: number) => {
    const [a, b] = characteristicStrainSquared(pop, [f, f * 1.001], { kernel });
    return (0.5 * Math.log(b / a)) / Math.log(1.001);
  };
  const kernel = stellarEmissionKernel(circularGwKernel, env);

  it('h_c proportional to f well below the transition (f = f_t/30) and to f^(-2/3) well above (f = 30 f_t), slopes within 1e-3 (Quinlan 1996 residence time; Phinney 2001)', () => {
    expect(Math.abs(slope(kernel, ft / 30) - 1)).toBeLessThan(1e-3);
    expect(Math.abs(slope(kernel, ft * 30) + 2 / 3)).toBeLessThan(1e-3);
  });

  it('the stellar spectrum equals the generic bend with kappa = 10/3 and f_bend = f_t (Sampson, Cornish & McWilliams 2015 identify 10/3 with stars)', () => {
    const freqs = [ft / 10, ft / 2, ft, 2 * ft, 10 * ft];
    const stellar = characteristicStrainSquared(pop, freqs, { kernel });
    const circular = characteristicStrainSquared(pop, freqs);
    // Rest-frame bend at the box's f_t: the kernel factor at the node redshifts is within 1e-4 of z = 0.01.
    const bent = characteristicStrainSquared(pop, freqs, { kernel: bendEmissionKernel(circularGwKernel, ft * 1.01, BEND_INDEX.stellar) });
    for (let k = 0; k < freqs.length; k++) {
      const generic = Math.pow(bentPowerLawStrain(freqs[k], 1, ft, 10 / 3) / bentPowerLawStrain(freqs[k], 1, 0, 10 / 3), 2);
      expect(Math.abs(stellar[k] / circular[k] / generic - 1), `f/f_t = ${freqs[k] / ft}`).toBeLessThan(2e-3);
      expect(Math.abs(bent[k] / stellar[k] - 1)).toBeLessThan(2e-3);
    }
  });

  it('eccentric decoupling at the transition with e0 = 0 is the sharp cut at f_t (no GW emission counted below f0 = f_t/2), documented in docs/orbits.md', () => {
    const sharp = stellarEccentricKernel(circularGwKernel, env, 0);
    const ftRest = stellarTransitionFrequency(M, q, env);
    expect(sharp(ftRest * 0.999, 1, M, q, 0)).toBe(0);
    expect(sharp(ftRest * 1.001, 1, M, q, 0)).toBe(circularGwKernel(ftRest * 1.001, 1, M, q, 0));
  });
});

describe('generic bend (Sampson, Cornish & McWilliams 2015)', () => {
  it('h_c = A (f/f_yr)^(-2/3) [1 + (f_bend/f)^kappa]^(-1/2): 1/sqrt(2) of the power law at f_bend, the power law far above, slope -2/3 + kappa/2 far below', () => {
    const A = 2.4e-15;
    const fb = 4e-9;
    expect(Math.abs(bentPowerLawStrain(fb, A, fb, 7 / 3) / (A * Math.pow(fb / F_YR_HZ, -2 / 3) * Math.SQRT1_2) - 1)).toBeLessThan(1e-14);
    expect(Math.abs(bentPowerLawStrain(1e4 * fb, A, fb, 10 / 3) / (A * Math.pow((1e4 * fb) / F_YR_HZ, -2 / 3)) - 1)).toBeLessThan(1e-12);
    for (const kappa of [7 / 3, 10 / 3]) {
      const f = fb / 1e4;
      const s = Math.log(bentPowerLawStrain(1.001 * f, A, fb, kappa) / bentPowerLawStrain(f, A, fb, kappa)) / Math.log(1.001);
      expect(Math.abs(s - (-2 / 3 + kappa / 2))).toBeLessThan(1e-6);
    }
    expect(bentPowerLawStrain(F_YR_HZ, A, 0, 10 / 3)).toBe(A); // A_yr by definition with no bend
  });

  it('rejects a bend index <= 0 and a negative bend frequency', () => {
    expect(() => bendEmissionKernel(circularGwKernel, 1e-9, 0)).toThrow(/bend index kappa must be positive/);
    expect(() => bendEmissionKernel(circularGwKernel, -1e-9, 10 / 3)).toThrow(/bend frequency must be finite and >= 0/);
    expect(() => stellarEmissionKernel(circularGwKernel, { ...env, densityKgM3: -1 })).toThrow(/stellar density must be positive/);
    expect(() => stellarEmissionKernel(circularGwKernel, { ...env, dispersionMS: 0 })).toThrow(/velocity dispersion must be positive/);
    expect(() => stellarEmissionKernel(circularGwKernel, { ...env, hardeningRate: 0 })).toThrow(/hardening rate H must be positive/);
  });
});

describe('transition frequency for many binaries', () => {
  it('the precomputed form equals stellarTransitionFrequency (same formula, environment factor hoisted) to 1e-14, and with e0 gives twice the orbital start frequency used by the eccentric kernel', async () => {
    const { transitionFrequencyFunction } = await import('../../src/physics/stellarHardening');
    const { keplerOrbitalFrequency } = await import('../../src/physics/petersEvolution');
    const ft = transitionFrequencyFunction(env);
    for (const [m, qq] of [[1e8, 1], [2e9, 0.5], [3e10, 0.05]]) {
      expect(Math.abs(ft(m * M_SUN_KG, qq) / stellarTransitionFrequency(m * M_SUN_KG, qq, env) - 1)).toBeLessThan(1e-14);
      const f0 = keplerOrbitalFrequency(stellarTransitionSemiMajorAxis(m * M_SUN_KG, qq, env, 0.4), m * M_SUN_KG);
      expect(Math.abs(transitionFrequencyFunction(env, 0.4)(m * M_SUN_KG, qq) / (2 * f0) - 1)).toBeLessThan(1e-14);
    }
  });
});
