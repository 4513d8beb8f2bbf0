// Black-hole binaries from galaxy mergers (the route of Sesana 2013, MNRAS 433, L1 and Chen, Sesana &
// Conselice 2019, MNRAS 488, 401; the form with mass- and ratio-dependent pairs, a time shift and a scatter
// draw for each hole is galaxyPairRoute.ts):
//   galaxy merger density  d^3n_G/(dz dlog10M_G dq_G) = Phi(M_G, z) f_pair(z) p(q_G) / tau(z) |dt_r/dz|,
// with Phi a Schechter stellar mass function per dex whose log10 Phi* and alpha move linearly with z,
// f_pair(z) = f0 (1+z)^beta_pair, tau(z) = tau0 (1+z)^beta_tau (the forms of Chen, Sesana & Conselice
// 2019 simplified to no mass dependence; unverified: only their abstract (arXiv:1810.04184, searched again
// 2026-12-02), which names the ingredients but gives no formula, was reachable, so their pivots and powers
// are not compared). Each galaxy's bulge (a fraction f_bulge of its
// stellar mass) hosts a black hole on a black-hole-bulge relation with log-normal scatter.
// Our simplification: one scatter draw eps serves both black holes of a merger, so q_BH = q_G^b and
// M = 10^(a + eps) (f_bulge M_G / 1e11)^b (1 + q_G^b). The density in (log10 M, q) is then
//   Int deps N(eps; 0, sigma) d^3n_G(z, log10M_G, q_G) / (b^2 q_G^(b-1)),
//   q_G = q^(1/b), log10M_G = 11 - log10 f_bulge + (log10M - a - eps - log10(1+q)) / b,
// the eps integral by 20-point Gauss-Legendre over +-6 sigma.
import { GYR_S } from './constants';
import type { FlatLambdaCdm } from './cosmology';
import type { BlackHoleBulgeRelation } from './blackHoleBulgeRelation';
import { gaussLegendreRule } from './gaussLegendre';
import type { BinaryPopulation } from './populationTypes';
import type { MassRatioDistribution } from './populationShapes';
import { schechterPerDex } from './massFunctions';

export interface StellarMassFunctionParams {
  /** log10 Phi* at z = 0, Phi* in Mpc^-3 (per dex once multiplied by ln10 in the Schechter form). */
  log10PhiStar0: number;
  /** d log10 Phi* / dz. */
  log10PhiStarSlope: number;
  /** Break mass M*, Msun. */
  mStar: number;
  alpha0: number;
  /** d alpha / dz. */
  alphaSlope: number;
}

export interface GalaxyMergerParams {
  massFunction: StellarMassFunctionParams;
  /** Pair fraction at z = 0 and its evolution (1+z)^betaPair. */
  pairFraction0: number;
  betaPair: number;
  /** Merger time-scale at z = 0, Gyr, and its evolution (1+z)^betaTau. */
  mergerTime0Gyr: number;
  betaTau: number;
  /** Distribution of the galaxies' stellar mass ratio q_G. */
  galaxyMassRatio: MassRatioDistribution;
  /** Bulge fraction of the stellar mass, in (0, 1]. */
  bulgeFraction: number;
  relation: BlackHoleBulgeRelation;
  zMax: number;
  /** Black-hole total-mass range of the integral, log10 Msun. */
  log10MMin: number;
  log10MMax: number;
  cosmology: FlatLambdaCdm;
}

/** Galaxy stellar mass function per dex at z (Schechter per dex, parameters moving linearly in z). */
export function stellarMassFunctionPerDex(p: StellarMassFunctionParams, mass: number, z: number): number {
  return schechterPerDex(mass, Math.pow(10, p.log10PhiStar0 + p.log10PhiStarSlope * z), p.mStar, p.alpha0 + p.alphaSlope * z);
}

/** Galaxy merger density d^3n_G/(dz dlog10M_G dq_G), Mpc^-3 (Sesana 2013, MNRAS 433, L1, arXiv:1211.5375, DOI 10.1093/mnrasl/slt034: the arXiv abstract, checked 2026-12-02, derives galaxy merger rates from galaxy mass functions and close-pair fractions and populates them with black holes by black hole-host relations; unverified: the equation itself, which is beyond the reachable abstract). */
export function galaxyMergerDensity(p: GalaxyMergerParams, z: number, log10Mg: number, qg: number): number {
  const phi = stellarMassFunctionPerDex(p.massFunction, Math.pow(10, log10Mg), z);
  const pair = p.pairFraction0 * Math.pow(1 + z, p.betaPair);
  const tauGyr = p.mergerTime0Gyr * Math.pow(1 + z, p.betaTau);
  return ((phi * pair * p.galaxyMassRatio.pdf(qg)) / tauGyr) * (p.cosmology.dtdzS(z) / GYR_S);
}

const SCATTER_NODES = 20;
const SCATTER_SIGMAS = 6;

/** The black-hole binary population of the galaxy route, as a BinaryPopulation. */
export function galaxyMergerPopulation(p: GalaxyMergerParams): BinaryPopulation {
  const { a, b, scatterDex: sigma } = p.relation;
  const rule = gaussLegendreRule(SCATTER_NODES);
  const eps: number[] = [];
  const w: number[] = [];
  if (sigma > 0) {
    const half = SCATTER_SIGMAS * sigma;
    for (let i = 0; i < SCATTER_NODES; i++) {
      const e = half * rule.nodes[i];
      eps.push(e);
      w.push((half * rule.weights[i] * Math.exp((-0.5 * e * e) / (sigma * sigma))) / (Math.sqrt(2 * Math.PI) * sigma));
    }
  } else {
    eps.push(0);
    w.push(1);
  }
  const log10Fb = Math.log10(p.bulgeFraction);
  const shift = Float64Array.from(eps, (e) => Math.pow(10, -e / b));
  const weightedShift = new Float64Array(eps.length);
  let lastZ = NaN;
  let zPart = 0;
  let slope = 0;
  return {
    zMin: 0,
    zMax: p.zMax,
    log10MMin: p.log10MMin,
    log10MMax: p.log10MMax,
    qMin: Math.pow(p.galaxyMassRatio.qMin, b),
    qMax: 1,
    density(z, log10M, q) {
      if (z !== lastZ) {
        const mf = p.massFunction;
        zPart = (Math.LN10 * Math.pow(10, mf.log10PhiStar0 + mf.log10PhiStarSlope * z) * p.pairFraction0 * Math.pow(1 + z, p.betaPair) * (p.cosmology.dtdzS(z) / GYR_S)) / (p.mergerTime0Gyr * Math.pow(1 + z, p.betaTau));
        slope = 1 + mf.alpha0 + mf.alphaSlope * z;
        for (let i = 0; i < eps.length; i++) weightedShift[i] = w[i] * Math.pow(shift[i], slope);
        lastZ = z;
      }
      const qg = Math.pow(q, 1 / b);
      const pq = p.galaxyMassRatio.pdf(qg);
      if (pq === 0) return 0;
      const jacobian = b * b * Math.pow(qg, b - 1);
      const base = 11 - log10Fb + (log10M - a - Math.log10(1 + q)) / b;
      // Schechter per dex (as stellarMassFunctionPerDex) at each scatter node, z factors hoisted.
      // r_i = R c_i with c_i = 10^(-eps_i / b), so r_i^slope = R^slope c_i^slope: one power per call,
      // the c_i^slope (with the weights) once per z.
      const R = Math.pow(10, base) / p.massFunction.mStar;
      let s = 0;
      for (let i = 0; i < eps.length; i++) s += weightedShift[i] * Math.exp(-R * shift[i]);
      if (s === 0) return 0; // every node far past the break (keeps 0 x Infinity out)
      return (zPart * pq * Math.pow(R, slope) * s) / jacobian;
    },
  };
}
