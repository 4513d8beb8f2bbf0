// Environments scaled by mass: sigma from the M-sigma relation of McConnell & Ma 2013 (ApJ 764, 184),
// density at the influence radius of a singular isothermal sphere, the stellar transition of Quinlan 1996
// (New Astron. 1, 35) moving with mass.
import { describe, expect, it } from 'vitest';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { circularGwKernel } from '../../src/physics/circularKernel';
import { C_SI, G_SI, M_SUN_KG } from '../../src/physics/constants';
import { integrate } from '../../src/physics/gaussLegendre';
import {
  dispersionOfMass,
  environmentOfMass,
  isothermalDensity,
  isothermalInfluenceRadius,
  massScaledEnvironment,
  MCCONNELL_MA_2013_M_SIGMA,
  type MassScaledEnvironment,
} from '../../src/physics/hostEnvironment';
import { gwSemiMajorAxisRate } from '../../src/physics/petersEvolution';
import {
  stellarEccentricKernel,
  stellarEmissionKernel,
  stellarHardeningRate,
  stellarTransitionFrequency,
  stellarTransitionSemiMajorAxis,
  transitionFrequencyFunction,
} from '../../src/physics/stellarHardening';
import { smoothPopulation } from './populations';

const scaled: MassScaledEnvironment = { mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: 16 };
const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('M-sigma relation (McConnell & Ma 2013, ApJ 764, 184: log10 M = 8.32 + 5.64 log10(sigma / 200 km/s), full sample)', () => {
  it('gives 200 km/s at 10^8.32 Msun and 300 km/s at 10^(8.32 + 5.64 log10 1.5) Msun, to 1e-14', () => {
    expect(rel(dispersionOfMass(Math.pow(10, 8.32) * M_SUN_KG), 200e3)).toBeLessThan(1e-14);
    expect(rel(dispersionOfMass(Math.pow(10, 8.32 + 5.64 * Math.log10(1.5)) * M_SUN_KG), 300e3)).toBeLessThan(1e-14);
  });
});

describe('isothermal sphere at the influence radius', () => {
  it('the stellar mass inside r_inf = G M / sigma^2 is 2M: Int 4 pi r^2 rho dr by Gauss-Legendre (an independent quadrature), to 1e-12', () => {
    for (const mSun of [1e6, 1e9, 3e10]) {
      const m = mSun * M_SUN_KG;
      const sigma = dispersionOfMass(m);
      const r = isothermalInfluenceRadius(m, sigma);
      const enclosed = integrate((x) => 4 * Math.PI * x * x * isothermalDensity(x, sigma), 0, r, 4, 16);
      expect(rel(enclosed, 2 * m), `M = ${mSun} Msun`).toBeLessThan(1e-12);
    }
  });

  it('a 1e9 Msun binary: sigma about 264 km/s, rho_inf of a few hundred Msun/pc^3 (order of magnitude of nuclei of massive ellipticals, common practice, no source)', () => {
    const env = environmentOfMass(1e9 * M_SUN_KG, scaled);
    expect(env.dispersionMS / 1e3).toBeGreaterThan(250);
    expect(env.dispersionMS / 1e3).toBeLessThan(280);
    const msunPc3 = env.densityKgM3 / (M_SUN_KG / Math.pow(3.0856775814913673e16, 3));
    expect(msunPc3).toBeGreaterThan(100);
    expect(msunPc3).toBeLessThan(3000);
  });
});

describe('transition frequency scaled by mass: closed form', () => {
  // Equal rates G rho H a^5 / sigma = (64/5) G^3 eta M^3 / c^5 (Quinlan 1996; Peters 1964 eq. 5.6) with
  // rho = sigma^6 / (2 pi G^3 M^2) give a_t = (G M / (c sigma)) (128 pi eta / (5 H))^(1/5) and
  // f_t = (c sigma)^(3/2) / (pi G M) (5 H / (128 pi eta))^(3/10), sigma from M-sigma: f_t proportional to M^(3/(2 x 5.64) - 1).
  const closedForm = (mKg: number, q: number, H: number) => {
    const eta = q / ((1 + q) * (1 + q));
    const cs = C_SI * dispersionOfMass(mKg);
    return (Math.pow(cs, 1.5) / (Math.PI * G_SI * mKg)) * Math.pow((5 * H) / (128 * Math.PI * eta), 0.3);
  };
  const env = massScaledEnvironment(scaled);
  const ft = transitionFrequencyFunction(env);

  it('equals the closed form for M = 1e6 to 3e10 Msun, q = 1, 0.3, 0.05, to 1e-12 (fast path and per-binary environment)', () => {
    for (const mSun of [1e6, 1e8, 1e9, 3e10]) {
      for (const q of [1, 0.3, 0.05]) {
        const m = mSun * M_SUN_KG;
        const expected = closedForm(m, q, 16);
        expect(rel(ft(m, q), expected), `M ${mSun}, q ${q}`).toBeLessThan(1e-12);
        expect(rel(stellarTransitionFrequency(m, q, environmentOfMass(m, scaled)), expected)).toBeLessThan(1e-12);
      }
    }
  });

  it('with F(e) of Peters & Mathews 1963 (eq. 17) written out, e = 0.4: f_t(e) = f_t(0) F(e)^(-3/10) for M = 1e6 to 3e10 Msun, to 1e-12', () => {
    // a_t^5 is proportional to F(e) (equal rates, Peters 1964 eq. 5.6), f_t to a_t^(-3/2)
    const e = 0.4;
    const F = (1 + (73 / 24) * e * e + (37 / 96) * e ** 4) / Math.pow(1 - e * e, 3.5);
    const ftE = transitionFrequencyFunction(env, e);
    for (const mSun of [1e6, 1e8, 1e9, 3e10]) {
      const m = mSun * M_SUN_KG;
      expect(rel(ftE(m, 0.3), closedForm(m, 0.3, 16) * Math.pow(F, -0.3)), `M ${mSun}`).toBeLessThan(1e-12);
    }
  });

  it('where the power law in M overflows, the per-mass environment says why (its density is not finite)', () => {
    const steep = transitionFrequencyFunction(massScaledEnvironment({ mSigma: { norm: 8.32, slope: 0.004 }, hardeningRate: 16 }));
    expect(() => steep(1e12 * M_SUN_KG, 0.5)).toThrow(/stellar density must be positive and finite/);
  });

  it('follows M^(3/(2 slope) - 1) = M^(-0.734): the ratio over each decade from 1e6 to 1e10 Msun, to 1e-12', () => {
    const exponent = 3 / (2 * MCCONNELL_MA_2013_M_SIGMA.slope) - 1;
    for (let lg = 6; lg < 10; lg++) {
      const r = ft(Math.pow(10, lg + 1) * M_SUN_KG, 0.5) / ft(Math.pow(10, lg) * M_SUN_KG, 0.5);
      expect(rel(r, Math.pow(10, exponent))).toBeLessThan(1e-12);
    }
  });

  it('at a_t = (G M / (c sigma)) (128 pi eta / (5 H))^(1/5) the stellar rate equals the Peters 1964 eq. 5.6 GW rate, to 1e-12', () => {
    const m = 2e9 * M_SUN_KG;
    const q = 0.4;
    const e = environmentOfMass(m, scaled);
    const eta = q / ((1 + q) * (1 + q));
    const aT = ((G_SI * m) / (C_SI * e.dispersionMS)) * Math.pow((128 * Math.PI * eta) / (5 * 16), 0.2);
    expect(rel(stellarTransitionSemiMajorAxis(m, q, e), aT)).toBeLessThan(1e-12);
    const m1 = m / (1 + q);
    expect(rel(stellarHardeningRate(aT, e), gwSemiMajorAxisRate(aT, 0, m1, m - m1))).toBeLessThan(1e-12);
  });

  it('a 1e9 Msun equal-mass binary turns over near 1.6 nHz (closed form above) and a 1e7 Msun one near 46 nHz', () => {
    expect(ft(1e9 * M_SUN_KG, 1) * 1e9).toBeGreaterThan(1.4);
    expect(ft(1e9 * M_SUN_KG, 1) * 1e9).toBeLessThan(1.8);
    expect(ft(1e7 * M_SUN_KG, 1) * 1e9).toBeGreaterThan(40);
    expect(ft(1e7 * M_SUN_KG, 1) * 1e9).toBeLessThan(52);
  });
});

describe('spectra with the mass-scaled environment', () => {
  const pop = smoothPopulation();
  const freqs = [1e-9, 3e-9, 1e-8, 3e-8, 1e-7];
  const env = massScaledEnvironment(scaled);
  const perBinary = (m: number) => environmentOfMass(m, scaled);

  it('the integrator fast path (factor of M times factor of q) equals the generic per-binary path, circular and eccentric (e0 = 0.5), to 1e-9', () => {
    const fast = characteristicStrainSquared(pop, freqs, { kernel: stellarEmissionKernel(circularGwKernel, env) });
    const slow = characteristicStrainSquared(pop, freqs, { kernel: stellarEmissionKernel(circularGwKernel, (m) => perBinary(m)) });
    const eFast = characteristicStrainSquared(pop, freqs, { kernel: stellarEccentricKernel(circularGwKernel, env, 0.5) });
    const eSlow = characteristicStrainSquared(pop, freqs, { kernel: stellarEccentricKernel(circularGwKernel, (m) => perBinary(m), 0.5) });
    for (let k = 0; k < freqs.length; k++) {
      expect(rel(fast[k], slow[k]), `circular f = ${freqs[k]}`).toBeLessThan(1e-9);
      expect(rel(eFast[k], eSlow[k]), `eccentric f = ${freqs[k]}`).toBeLessThan(1e-9);
    }
  });

  it('rejects a non-positive slope or hardening rate', () => {
    expect(() => massScaledEnvironment({ mSigma: { norm: 8.32, slope: 0 }, hardeningRate: 16 })).toThrow(/M-sigma slope must be positive/);
    expect(() => massScaledEnvironment({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: -1 })).toThrow(/hardening rate H must be positive/);
  });
});
