// Hardening of a bound binary by three-body scattering of stars (Quinlan 1996, New Astron. 1, 35):
//   da/dt = -G rho H a^2 / sigma,
// combined with GW emission through the residence time at each frequency:
//   dE/dln f_r = L_GW dt/dln f_r,  dt/dln f_r = 1 / [(dln f/dt)_GW + (dln f/dt)_stars].
// For circular orbits (dln f/dt)_stars / (dln f/dt)_GW = (f_t / f_r)^(10/3), which gives
//   dE/dln f_r = (dE/dln f_r)_GW / (1 + (f_t/f_r)^(10/3)),
// f_t being the GW frequency where the two hardening rates are equal.
import { C_SI, G_SI } from './constants';
import { eccentricityEnhancement } from './petersMathews';
import { keplerOrbitalFrequency } from './petersEvolution';
import { circularGwKernel } from './circularKernel';
import { bendShape, circularTimesShapeKernel } from './factoredKernel';
import type { EmissionKernel } from './populationTypes';
import type { ResidenceFactor } from './residenceFactor';
import type { EccentricityDistribution } from './eccentricKernel';
import { eccentricTables, type EccentricStart } from './eccentricKernel';

/** The stellar environment of a binary (SI). */
export interface StellarEnvironment {
  /** Stellar mass density rho around the binary, kg/m^3. */
  densityKgM3: number;
  /** One-dimensional stellar velocity dispersion sigma, m/s. */
  dispersionMS: number;
  /** Dimensionless hardening rate H (Quinlan 1996 finds about 15-20 for hard binaries). */
  hardeningRate: number;
}

export function checkEnvironment(env: StellarEnvironment): void {
  if (!(env.densityKgM3 > 0) || !Number.isFinite(env.densityKgM3)) throw new RangeError(`stellar density must be positive and finite, got ${env.densityKgM3} kg/m^3`);
  if (!(env.dispersionMS > 0) || !Number.isFinite(env.dispersionMS)) throw new RangeError(`velocity dispersion must be positive and finite, got ${env.dispersionMS} m/s`);
  if (!(env.hardeningRate > 0) || !Number.isFinite(env.hardeningRate)) throw new RangeError(`hardening rate H must be positive and finite, got ${env.hardeningRate}`);
}

/** da/dt by stellar scattering, m/s: -G rho H a^2 / sigma (Quinlan 1996, New Astron. 1, 35). */
export function stellarHardeningRate(aM: number, env: StellarEnvironment): number {
  return (-G_SI * env.densityKgM3 * env.hardeningRate * aM * aM) / env.dispersionMS;
}

/**
 * Semi-major axis where stellar and GW hardening rates are equal, m:
 * G rho H a^5 / sigma = (64/5) G^3 m1 m2 M F(e) / c^5 (Quinlan 1996; Peters 1964, eq. 5.6),
 * so a_t = [(64/5) G^2 m1 m2 M F(e) sigma / (c^5 rho H)]^(1/5). e = 0 unless given.
 */
export function stellarTransitionSemiMajorAxis(mKg: number, q: number, env: StellarEnvironment, e = 0): number {
  const m1 = mKg / (1 + q);
  const m2 = mKg - m1;
  const num = (64 / 5) * G_SI * G_SI * m1 * m2 * mKg * eccentricityEnhancement(e) * env.dispersionMS;
  const den = C_SI ** 5 * env.densityKgM3 * env.hardeningRate;
  return Math.pow(num / den, 0.2);
}

/** Rest-frame GW frequency of the transition for a circular orbit, f_t = 2 f_orb(a_t), Hz. */
export function stellarTransitionFrequency(mKg: number, q: number, env: StellarEnvironment): number {
  return 2 * keplerOrbitalFrequency(stellarTransitionSemiMajorAxis(mKg, q, env), mKg);
}

/** Factor on dE/dln f_r (and on h_c^2 of one binary): 1 / (1 + (f_t/f_r)^(10/3)). */
export function stellarSuppression(frHz: number, ftHz: number): number {
  return 1 / (1 + Math.pow(ftHz / frHz, 10 / 3));
}

/** An environment that depends on the binary's total mass only (the host scalings of hostEnvironment.ts). */
export interface MassEnvironment {
  ofMass: (mKg: number) => StellarEnvironment;
  /** Optional: the mass factor of f_t in closed form, for F(e) = enhancement (the same as from ofMass, fewer operations). */
  transitionMassFactor?: (enhancement: number) => (mKg: number) => number;
}

/** An environment for each binary: one for all, one per total mass, or a function of (total mass kg, q, z). */
export type EnvironmentOf = StellarEnvironment | MassEnvironment | ((mKg: number, q: number, z: number) => StellarEnvironment);

function isMassEnvironment(env: StellarEnvironment | MassEnvironment): env is MassEnvironment {
  return typeof (env as MassEnvironment).ofMass === 'function';
}

const C_FIFTH = C_SI ** 5;

/** The environment part of a_t^5 = k eta M^3: k = (64/5) G^2 F(e) sigma / (c^5 rho H) (equal rates, as above); enhancement = F(e). */
function transitionConstant(env: StellarEnvironment, enhancement: number): number {
  return ((64 / 5) * G_SI * G_SI * enhancement * env.dispersionMS) / (C_FIFTH * env.densityKgM3 * env.hardeningRate);
}

/**
 * f_t for many binaries in one environment: the environment's part of a_t^5 is computed once.
 * Same formula as stellarTransitionFrequency (a_t from equal rates, f_t = 2 f_orb(a_t)).
 */
export function transitionFrequencyFunction(env: StellarEnvironment | MassEnvironment, e = 0): (mKg: number, q: number) => number {
  return transitionFrequencyParts(env, e).of;
}

/**
 * f_t and its factors: with m1 m2 = eta M^2, a_t = (k eta M^3)^(1/5) and f_t = sqrt(G M / a_t^3) / pi
 * = [sqrt(G M) (k M^3)^(-3/10) / pi] x eta^(-3/10): a factor of the total mass times one of q.
 */
export function transitionFrequencyParts(env: StellarEnvironment | MassEnvironment, e = 0): { of: (mKg: number, q: number) => number; mass: (mKg: number) => number; ratio: (q: number) => number } {
  const ratio = (q: number): number => Math.pow(q / ((1 + q) * (1 + q)), -0.3);
  const enhancement = eccentricityEnhancement(e);
  if (isMassEnvironment(env)) {
    // k depends on M through sigma(M) and rho(M); the factorisation in M and q still holds.
    const perMass = (mKg: number): number => {
      const local = env.ofMass(mKg);
      checkEnvironment(local);
      return (Math.sqrt(G_SI * mKg) * Math.pow(transitionConstant(local, enhancement) * mKg * mKg * mKg, -0.3)) / Math.PI;
    };
    // the closed form where the environment has one; where it is not positive and finite, the
    // per-mass environment (whose checks say why)
    const closed = env.transitionMassFactor?.(enhancement);
    const mass = closed
      ? (mKg: number): number => {
          const v = closed(mKg);
          return v > 0 && v < Infinity ? v : perMass(mKg);
        }
      : perMass;
    return { of: (mKg, q) => mass(mKg) * ratio(q), mass, ratio };
  }
  const of = transitionFrequencyOf(env, e);
  const k = transitionConstant(env, enhancement);
  return {
    of,
    mass: (mKg) => (Math.sqrt(G_SI * mKg) * Math.pow(k * mKg * mKg * mKg, -0.3)) / Math.PI,
    ratio,
  };
}

function transitionFrequencyOf(env: StellarEnvironment, e: number): (mKg: number, q: number) => number {
  checkEnvironment(env);
  const k = transitionConstant(env, eccentricityEnhancement(e));
  const g = G_SI;
  return (mKg, q) => {
    const m1 = mKg / (1 + q);
    const aT = Math.pow(k * m1 * (mKg - m1) * mKg, 0.2);
    return Math.sqrt((g * mKg) / (aT * aT * aT)) / Math.PI;
  };
}

/** Circular binaries hardened by stars then by GW emission: base kernel times the suppression. */
export function stellarEmissionKernel(base: EmissionKernel, envOf: EnvironmentOf): EmissionKernel {
  if (typeof envOf !== 'function') {
    const parts = transitionFrequencyParts(envOf);
    const ft = parts.of;
    // circular x 1 / (1 + (f_r / f_t)^(-10/3)) with f_t per (M, q): the integrator's fast path.
    if (base === circularGwKernel) return circularTimesShapeKernel({ scaleHz: ft, shape: bendShape(10 / 3), bendIndex: 10 / 3, scaleFactors: parts });
    return (fr, mc, m, q, z) => base(fr, mc, m, q, z) * stellarSuppression(fr, ft(m, q));
  }
  return (fr, mc, m, q, z) => base(fr, mc, m, q, z) * stellarSuppression(fr, stellarTransitionFrequency(m, q, envOf(m, q, z)));
}

/**
 * The residence factor (residenceFactor.ts) of circular binaries hardened by stars then by GW emission:
 * with hardening times a/|da/dt| proportional to 1/a (stars) and a^4 (GW), the total time per ln f_r
 * over the GW time is 1 / (1 + (a/a_t)^5) = stellarSuppression(f_r, f_t) (Quinlan 1996, New Astron. 1, 35;
 * Peters 1964). One environment for all binaries, or one per total mass (the host scalings).
 */
export function stellarResidenceFactor(env: StellarEnvironment | MassEnvironment): ResidenceFactor {
  const ft = transitionFrequencyFunction(env);
  // The last binary's f_t: callers that run through the frequencies of one binary compute it once.
  let lastM = NaN;
  let lastQ = NaN;
  let lastFt = 0;
  return (fr, m, q) => {
    if (m !== lastM || q !== lastQ) {
      lastFt = ft(m, q);
      lastM = m;
      lastQ = q;
    }
    return stellarSuppression(fr, lastFt);
  };
}

/**
 * Eccentric binaries whose GW-driven phase starts where the environment lets go: f0 is the orbital
 * frequency at which stellar hardening and GW hardening (enhanced by F(e0)) are equal, and e0 is the
 * eccentricity there. Below f0 the binary is taken to move on quickly (no GW emission counted); above
 * it the decay is GW-only (Peters 1964) with harmonics as in Enoki & Nagashima 2007.
 * See docs/orbits.md for this assumption.
 */
export function stellarEccentricKernel(base: EmissionKernel, envOf: EnvironmentOf, e0: number | EccentricityDistribution, opts: Omit<EccentricStart, 'e0' | 'f0OrbitalHz'> = {}): EmissionKernel {
  if (typeof envOf !== 'function' && !isMassEnvironment(envOf)) checkEnvironment(envOf);
  const { tables, weights, e0: nodes } = eccentricTables({ ...opts, e0, f0OrbitalHz: 1 });
  if (typeof envOf !== 'function') {
    if (base === circularGwKernel) {
      // f0_k = f_t(e_k) / 2 and f_t(e) = f_t(0) F(e)^(-3/10) (a_t^5 is proportional to F(e), f_orb to
      // a^(-3/2)), so f_r / f0_k = (f_r / f_t(0)) 2 F(e_k)^(3/10): one scale per (M, q), the fast path.
      const parts = transitionFrequencyParts(envOf);
      const ft0 = parts.of;
      const stretch = Array.from(nodes, (e) => 2 * Math.pow(eccentricityEnhancement(e), 0.3));
      const shape = (r: number): number => {
        let s = 0;
        for (let k = 0; k < tables.length; k++) s += weights[k] * tables[k].at(r * stretch[k]);
        return s;
      };
      return circularTimesShapeKernel({ scaleHz: ft0, shape, scaleFactors: parts });
    }
    // f0 = f_t(e0) / 2 per e0 node, from the precomputed environment factor.
    const ftOf = Array.from(nodes, (e) => transitionFrequencyFunction(envOf, e));
    return (fr, mc, m, q, z) => {
      let s = 0;
      for (let k = 0; k < tables.length; k++) s += weights[k] * tables[k].at(fr / (0.5 * ftOf[k](m, q)));
      return base(fr, mc, m, q, z) * s;
    };
  }
  return (fr, mc, m, q, z) => {
    const env = envOf(m, q, z);
    let s = 0;
    for (let k = 0; k < tables.length; k++) {
      const f0 = keplerOrbitalFrequency(stellarTransitionSemiMajorAxis(m, q, env, nodes[k]), m);
      s += weights[k] * tables[k].at(fr / f0);
    }
    return base(fr, mc, m, q, z) * s;
  };
}
