// The population sums that take a separable density's q integral once (populationSanity.ts) and the
// stalled share with a mass-dependent lifetime (massDependentDelay.ts: its z sums taken of zMass, its
// stall redshift from the age table) against the sums they replaced: every (z, M, q) node of the same
// Gauss-Legendre rules summed through density(), and the stall redshift by Newton steps on the age
// integral (delayedPopulation.ts redshiftOfAge, Hogg 1999 eq. 30). The rules are the same, so only
// rounding (and the table inverse's 1e-11 in z) may differ.
import { describe, expect, it } from 'vitest';
import { GYR_S, KM_S_MPC_SI, M_SUN_KG } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { redshiftOfAge } from '../../src/physics/delayedPopulation';
import { compositeNodes, compositeSum } from '../../src/physics/gaussLegendre';
import { lifetimeFunction } from '../../src/physics/hardeningLifetime';
import { massScaledEnvironment, MCCONNELL_MA_2013_M_SIGMA } from '../../src/physics/hostEnvironment';
import { stalledFractionByMass, type LifetimeOf } from '../../src/physics/massDependentDelay';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import { mergedMassDensity, mergedNumberDensity, mergedNumberDensityBetween, mergerRateDensity } from '../../src/physics/populationSanity';
import type { BinaryPopulation } from '../../src/physics/populationTypes';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const cosmo = new FlatLambdaCdm({ hubbleSI: 69 * KM_S_MPC_SI, omegaM: 0.31 });
// An invented population (no published fit), shaped like the demo's.
const sep = phenomenologicalPopulation({
  rateNorm: 1.2e-3, alpha: 0.25, cutoffMass: 1.2e9, beta: 2.1, z0: 1.4, zMax: 5, log10MMin: 6, log10MMax: 11,
  massRatio: powerLawMassRatio(-0.4, 0.05), cosmology: cosmo,
});
/** The same density without its factors: the sums go through density() at every node. */
const general: BinaryPopulation = { zMin: sep.zMin, zMax: sep.zMax, log10MMin: sep.log10MMin, log10MMax: sep.log10MMax, qMin: sep.qMin, qMax: sep.qMax, density: (z, x, q) => sep.density(z, x, q) };

/** The stalled share as summed before: 32 x 32 (M, q) nodes, density() on 32 z nodes each, Newton's inverse of the age. */
function stalledByNewton(pop: BinaryPopulation, lifetimeOf: LifetimeOf): number {
  const now = cosmo.ageS(0);
  const rule = (a: number, b: number) => compositeNodes(a, b, 4, 8);
  const mr = rule(pop.log10MMin, pop.log10MMax);
  const qr = rule(pop.qMin, pop.qMax);
  const zSum = (lo: number, hi: number, x: number, q: number) => {
    const zr = rule(lo, hi);
    let s = 0;
    for (let c = 0; c < zr.nodes.length; c++) s += zr.weights[c] * pop.density(zr.nodes[c], x, q);
    return s;
  };
  let total = 0;
  let stalled = 0;
  for (let a = 0; a < mr.nodes.length; a++) {
    for (let b = 0; b < qr.nodes.length; b++) {
      const w = mr.weights[a] * qr.weights[b];
      const all = zSum(pop.zMin, pop.zMax, mr.nodes[a], qr.nodes[b]);
      total += w * all;
      const zStall = redshiftOfAge(cosmo, now - lifetimeOf(mr.nodes[a], qr.nodes[b]));
      if (Number.isNaN(zStall)) stalled += w * all;
      else if (Math.min(pop.zMax, zStall) > pop.zMin) stalled += w * zSum(pop.zMin, Math.min(pop.zMax, zStall), mr.nodes[a], qr.nodes[b]);
    }
  }
  return stalled / total;
}

describe('separable population sums equal the node-by-node sums', () => {
  it('has the factors this test relies on', () => {
    expect(sep.separable).toBeDefined();
  });
  it('number of mergers, merged mass, rate density at z = 0 and 2, mergers between z = 0.5 and 3: equal to 1e-13', () => {
    expect(rel(mergedNumberDensity(sep), mergedNumberDensity(general))).toBeLessThan(1e-13);
    expect(rel(mergedMassDensity(sep), mergedMassDensity(general))).toBeLessThan(1e-13);
    expect(rel(mergerRateDensity(sep, cosmo, 0), mergerRateDensity(general, cosmo, 0))).toBeLessThan(1e-13);
    expect(rel(mergerRateDensity(sep, cosmo, 2), mergerRateDensity(general, cosmo, 2))).toBeLessThan(1e-13);
    expect(rel(mergedNumberDensityBetween(sep, 0.5, 3), mergedNumberDensityBetween(general, 0.5, 3))).toBeLessThan(1e-13);
  });
});

describe('stalled share with a lifetime per (M, q)', () => {
  for (const H of [16, 1, 0.05]) {
    it(`hardening lifetimes with H = ${H}: separable = node by node to 1e-13; = the Newton-inverse sum to 1e-9`, () => {
      const lifetime = lifetimeFunction(massScaledEnvironment({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: H }), M_SUN_KG);
      const fast = stalledFractionByMass(sep, cosmo, lifetime);
      expect(fast).toBeGreaterThan(0);
      expect(rel(fast, stalledFractionByMass(general, cosmo, lifetime))).toBeLessThan(1e-13);
      expect(rel(fast, stalledByNewton(general, lifetime))).toBeLessThan(1e-9);
    });
  }
  it('a lifetime of 12 Gyr for the heavy half only: the stall redshift per node from the table, = the Newton-inverse sum to 1e-9', () => {
    const lifetime: LifetimeOf = (x) => (x > 8.5 ? 12 * GYR_S : 1 * GYR_S);
    expect(rel(stalledFractionByMass(sep, cosmo, lifetime), stalledByNewton(general, lifetime))).toBeLessThan(1e-9);
  });
});

describe('compositeSum (no arrays allocated) against the sum over compositeNodes', () => {
  it('is the same number bit for bit, and 0 on an empty interval', () => {
    const f = (x: number) => Math.exp(-x) * Math.pow(1 + x, 2.1);
    for (const [a, b, panels, order] of [[0, 5, 4, 8], [0.05, 1, 2, 8], [1.3, 1.30001, 1, 6], [-2, 7, 3, 10]]) {
      const r = compositeNodes(a, b, panels, order);
      let s = 0;
      for (let i = 0; i < r.nodes.length; i++) s += r.weights[i] * f(r.nodes[i]);
      expect(compositeSum(a, b, panels, order, f)).toBe(s);
    }
    expect(compositeSum(2, 2, 4, 8, f)).toBe(0);
  });
});
