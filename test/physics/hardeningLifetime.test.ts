// Physically motivated delays: the time from the hard-binary separation to coalescence under stellar
// hardening (Quinlan 1996, New Astron. 1, 35) and GW emission (Peters 1964, Phys. Rev. 136, B1224), against
// closed forms and scipy.integrate.quad (test/reference/hardening_lifetime.json); fed into the population as
// a mass-dependent lifetime, checked against the fixed-lifetime machinery and by counting.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/hardening_lifetime.json';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { C_SI, G_SI, GYR_S, KM_S_MPC_SI, M_SUN_KG, PC_M } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { delayedPopulation, redshiftOfAge, stalledFraction } from '../../src/physics/delayedPopulation';
import { hardBinaryLifetime, hardeningIntegral, hardeningTime, hardSeparation, lifetimeFunction } from '../../src/physics/hardeningLifetime';
import { massScaledEnvironment, MCCONNELL_MA_2013_M_SIGMA } from '../../src/physics/hostEnvironment';
import { delayedPopulationByMass, stalledFractionByMass } from '../../src/physics/massDependentDelay';
import { compositeNodes } from '../../src/physics/gaussLegendre';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import type { StellarEnvironment } from '../../src/physics/stellarHardening';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const MSUN_PC3 = M_SUN_KG / PC_M ** 3;
const cosmo = new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 });
// An invented population (no published fit).
const base = phenomenologicalPopulation({
  rateNorm: 1e-3, alpha: 0.2, cutoffMass: 3e9, beta: 2, z0: 1.5, zMax: 5, log10MMin: 6, log10MMax: 11,
  massRatio: powerLawMassRatio(0, 0.05), cosmology: cosmo,
});

describe('hardening lifetime against scipy.integrate.quad of the two rates in physical units', () => {
  for (const c of fixture.cases) {
    it(`${c.kind}: M = ${c.M_sun} Msun, q = ${c.q}: T = ${(c.T_s / GYR_S).toPrecision(4)} Gyr to 1e-10`, () => {
      const env: StellarEnvironment = { densityKgM3: c.rho_msun_pc3 * MSUN_PC3, dispersionMS: c.sigma_kms * 1e3, hardeningRate: c.H };
      const m = c.M_sun * M_SUN_KG;
      expect(rel(hardSeparation(m - m / (1 + c.q), env.dispersionMS), c.a_h_m)).toBeLessThan(1e-12);
      const T = hardBinaryLifetime(m, c.q, env);
      expect(rel(T, c.T_s), `expected ${c.T_s}, got ${T}`).toBeLessThan(1e-10);
      if (c.kind === 'mass-scaled') {
        const scaled = lifetimeFunction(massScaledEnvironment({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: c.H }), M_SUN_KG)(Math.log10(c.M_sun), c.q);
        expect(rel(scaled, c.T_s), `expected ${c.T_s}, got ${scaled}`).toBeLessThan(1e-10);
      }
    });
  }
});

describe('hardening lifetime: closed forms', () => {
  const env: StellarEnvironment = { densityKgM3: 300 * MSUN_PC3, dispersionMS: 220e3, hardeningRate: 16 };
  const m = 2e9 * M_SUN_KG;
  const q = 0.4;
  const m1 = m / (1 + q);
  const B = ((64 / 5) * G_SI ** 3 * m1 * (m - m1) * m) / C_SI ** 5;
  const A = (G_SI * env.densityKgM3 * env.hardeningRate) / env.dispersionMS;
  const aT = Math.pow(B / A, 0.2);

  it('GW-dominated start (a0 = a_t / 1000): T = a0^4 / (4 B), the integral of Peters 1964 eq. 5.6, to 1e-12', () => {
    const a0 = aT / 1000;
    expect(rel(hardeningTime(m, q, env, a0), a0 ** 4 / (4 * B))).toBeLessThan(1e-12);
  });

  it('stellar-dominated stretch (a from 1e6 a_t down to 1e3 a_t): Delta T = (1/A)(1/a1 - 1/a0), the integral of Quinlan 1996 da/dt = -A a^2, to 1e-12', () => {
    const a0 = 1e6 * aT;
    const a1 = 1e3 * aT;
    const dT = hardeningTime(m, q, env, a0) - hardeningTime(m, q, env, a1);
    expect(rel(dT, (1 / A) * (1 / a1 - 1 / a0))).toBeLessThan(1e-9);
  });

  it('from far out: I(X) -> pi / (5 sin(4 pi / 5)) - 1/X, the Beta-function integral Int_0^inf x^3/(1+x^5) dx = pi/(5 sin(4pi/5)) (common practice, no source), to 1e-14', () => {
    const X = 1e8;
    expect(Math.abs(hardeningIntegral(X) - (Math.PI / (5 * Math.sin((4 * Math.PI) / 5)) - 1 / X))).toBeLessThan(1e-14);
    expect(hardeningIntegral(0)).toBe(0);
    expect(() => hardeningIntegral(-1)).toThrow(/X >= 0/);
  });
});

/** Number of coalescences: Int n dz dlog10M dq over the population with many z panels (steps inside). */
function coalescing(pop: BinaryPopulation): number {
  const zr = compositeNodes(pop.zMin, pop.zMax, 100, 4);
  const mr = compositeNodes(pop.log10MMin, pop.log10MMax, 4, 8);
  const qr = compositeNodes(pop.qMin, pop.qMax, 4, 8);
  let s = 0;
  for (let c = 0; c < zr.nodes.length; c++)
    for (let a = 0; a < mr.nodes.length; a++)
      for (let b = 0; b < qr.nodes.length; b++) s += zr.weights[c] * mr.weights[a] * qr.weights[b] * pop.density(zr.nodes[c], mr.nodes[a], qr.nodes[b]);
  return s;
}

describe('a lifetime that depends on mass and mass ratio, fed into the population', () => {
  it('a constant lifetime gives the fixed-lifetime population (delayedPopulation, checked against astropy) to 1e-9 (the fast age inverse is good to 1e-11 in z) and its stalled share to 1e-12', () => {
    const tau = 3 * GYR_S;
    const byMass = delayedPopulationByMass(base, cosmo, () => tau);
    const fixed = delayedPopulation(base, cosmo, tau);
    for (const [z, lg, q] of [[0.1, 8, 0.5], [1, 9.5, 0.1], [0.5, 7, 1]]) {
      expect(fixed.density(z, lg, q)).toBeGreaterThan(0);
      expect(rel(byMass.density(z, lg, q), fixed.density(z, lg, q))).toBeLessThan(1e-9);
    }
    expect(rel(stalledFractionByMass(base, cosmo, () => tau), stalledFraction(base, cosmo, tau))).toBeLessThan(1e-12);
  });

  it('a lifetime of 0 leaves the spectrum unchanged; one longer than the age of the universe removes the population (stalled share 1)', () => {
    const freqs = [2e-9, 3.17e-8];
    expect(delayedPopulationByMass(base, cosmo, () => 0)).toBe(base);
    const same = characteristicStrainSquared(delayedPopulationByMass(base, cosmo, () => 0), freqs);
    const original = characteristicStrainSquared(base, freqs);
    for (let k = 0; k < freqs.length; k++) expect(rel(same[k], original[k])).toBeLessThan(1e-12);
    const gone = delayedPopulationByMass(base, cosmo, () => 20 * GYR_S);
    expect(gone.density(0.1, 9, 0.5)).toBe(0);
    expect(stalledFractionByMass(base, cosmo, () => 20 * GYR_S)).toBe(1);
  });

  it('the hardening lifetime (H = 0.05, a nearly empty loss cone: lifetimes of Gyr): binaries that coalesce = binaries formed x (1 - stalled share), to 2e-3 (a change of variables)', () => {
    const lifetime = lifetimeFunction(massScaledEnvironment({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: 0.05 }), M_SUN_KG);
    const delayed = delayedPopulationByMass(base, cosmo, lifetime);
    const stalled = stalledFractionByMass(base, cosmo, lifetime);
    expect(stalled).toBeGreaterThan(0.05);
    expect(stalled).toBeLessThan(0.95);
    const formed = coalescing(base);
    const err = rel(coalescing(delayed), formed * (1 - stalled));
    expect(err, `stalled ${stalled}`).toBeLessThan(2e-3);
  });

  it('with H = 16 (a full loss cone) the lifetimes are 0.03 to 0.3 Gyr (fixture) and few binaries stall; lowering H raises the stalled share', () => {
    const share = (H: number) => stalledFractionByMass(base, cosmo, lifetimeFunction(massScaledEnvironment({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: H }), M_SUN_KG));
    const full = share(16);
    expect(full).toBeGreaterThan(0);
    expect(full).toBeLessThan(0.05);
    expect(share(1)).toBeGreaterThan(full);
    expect(share(0.05)).toBeGreaterThan(share(1));
  });

  it('the stalled share with hardening lifetimes (H = 1) equals a converged sum to 1e-12: the same (M, q) nodes, each z integral by 64 panels of 16 Gauss-Legendre points of the density, z_stall by the Newton inverse redshiftOfAge', () => {
    const lifetime = lifetimeFunction(massScaledEnvironment({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: 1 }), M_SUN_KG);
    const mr = compositeNodes(base.log10MMin, base.log10MMax, 4, 8);
    const qr = compositeNodes(base.qMin, base.qMax, 4, 8);
    const zIntegral = (lg: number, q: number, hi: number) => {
      const zr = compositeNodes(base.zMin, hi, 64, 16);
      let s = 0;
      for (let c = 0; c < zr.nodes.length; c++) s += zr.weights[c] * base.density(zr.nodes[c], lg, q);
      return s;
    };
    let total = 0;
    let stalled = 0;
    for (let a = 0; a < mr.nodes.length; a++) {
      for (let b = 0; b < qr.nodes.length; b++) {
        const w = mr.weights[a] * qr.weights[b];
        total += w * zIntegral(mr.nodes[a], qr.nodes[b], base.zMax);
        const zStall = redshiftOfAge(cosmo, cosmo.ageS(0) - lifetime(mr.nodes[a], qr.nodes[b]));
        const hi = Number.isNaN(zStall) ? base.zMax : Math.min(base.zMax, zStall);
        if (hi > base.zMin) stalled += w * zIntegral(mr.nodes[a], qr.nodes[b], hi);
      }
    }
    const share = stalledFractionByMass(base, cosmo, lifetime);
    expect(share).toBeGreaterThan(0.01);
    expect(rel(share, stalled / total), `converged ${stalled / total}, got ${share}`).toBeLessThan(1e-12);
  });

  it('rejects a negative or non-finite lifetime, naming the mass and mass ratio', () => {
    expect(() => delayedPopulationByMass(base, cosmo, () => -1)).toThrow(/lifetime must be finite and >= 0, got -1 s at log10 M = 6/);
    expect(() => stalledFractionByMass(base, cosmo, () => NaN)).toThrow(/lifetime must be finite/);
  });
});

describe('fast inverse of the age (table with exact slopes, cubic Hermite)', () => {
  it('equals the bracketed Newton inverse redshiftOfAge (checked against astropy z_at_value) to 1e-11 from 1e-5 of the age to today', async () => {
    const { redshiftAtAge } = await import('../../src/physics/ageInverse');
    const { redshiftOfAge } = await import('../../src/physics/delayedPopulation');
    const now = cosmo.ageS(0);
    let worst = 0;
    for (let k = 0; k <= 2000; k++) {
      const age = now * Math.pow(10, -5 + (5 * k) / 2000);
      const z = redshiftOfAge(cosmo, age);
      if (z === 0) expect(redshiftAtAge(cosmo, age)).toBe(0);
      else worst = Math.max(worst, rel(redshiftAtAge(cosmo, age), z));
    }
    expect(worst).toBeLessThan(1e-11);
    expect(redshiftAtAge(cosmo, 2 * now)).toBeNaN();
    expect(redshiftAtAge(cosmo, 1)).toBe(Infinity); // one second after the big bang lies beyond z = 1e4
  });
});
