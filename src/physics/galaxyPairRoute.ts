// The galaxy route with pair fraction and merger time-scale depending on mass, mass ratio and redshift
// (the parametrisation of Chen, Sesana & Conselice 2019, MNRAS 488, 401, section 2):
//   d^3n_G/(dt dlog10M_G dq_G) = Phi(M_G, z_p) f_pair(M_G, z_p) p(q_G) / tau(M_G, q_G, z_p),
//   f_pair = f0 (M_G/1e11)^alphaF (1+z_p)^betaF,  tau = tau0 (M_G/1e11)^alphaT (1+z_p)^betaT q_G^gammaT,
// M_G the primary galaxy's stellar mass, z_p the redshift of the pair, Phi the Schechter stellar mass
// function per dex of galaxyMergerPopulation.ts. The q_G^gammaF term of the paper's pair fraction is p(q_G)
// (a power law normalised on [q_G,min, 1] is theirs up to the normalisation of f0).
// Time shift (optional): the pair observed at z_p merges a time tau later, t(z_m) = t(z_p) + tau; counted
// per unit merger redshift, n(z_m) = R(z_p) |dt/dz|(z_m) / (dt_m/dt_p), dt_m/dt_p = 1 + dtau/dt_p (the
// same mergers, number conserved; Phinney 2001, astro-ph/0108028, n = rate x |dt/dz|).
// Black holes: each bulge (f_bulge M_G) hosts log10 m = a(z_m) + b log10(f_bulge M_G / 1e11) + eps, with
// a(z) = a + zetaA log10(1+z) (a normalisation evolving as (1+z)^zetaA; form ours, common practice, no
// source) at the coalescence redshift, and eps ~ N(0, sigma) drawn independently for each black hole
// (or once per merger, 'shared', as galaxyMergerPopulation.ts does).
// With independent draws the black hole of the secondary galaxy may be the heavier one; both orderings
// are summed. In (x1, x2) = (log10 m of primary galaxy's hole, of secondary's):
//   p(x1, x2) = Int deps1 deps2 N(eps1) N(eps2) n_G(y1, q_G) q_G ln10 / b^2,
//   y1 = 11 - log10 f_bulge + (x1 - a - eps1)/b,  log10 q_G = (x2 - x1 + eps1 - eps2)/b,
// and the density per (log10 M, q), M = m1 + m2, q = m_small/m_big, is [p(x_big, x_small) +
// p(x_small, x_big)] / (q ln10) (Jacobian of x_big = log10 M - log10(1+q), x_small = x_big + log10 q).
import { GYR_S } from './constants';
import type { FlatLambdaCdm } from './cosmology';
import type { BlackHoleBulgeRelation } from './blackHoleBulgeRelation';
import { gaussLegendreRule } from './gaussLegendre';
import type { StellarMassFunctionParams } from './galaxyMergerPopulation';
import { schechterPerDex } from './massFunctions';
import type { MassRatioDistribution } from './populationShapes';
import type { BinaryPopulation } from './populationTypes';
import { mergerShiftTable, type MergerShiftTable } from './mergerTimeShift';

export interface PairFractionParams {
  /** Pair fraction at M_G = 1e11 Msun, z = 0. */
  f0: number;
  /** Power of M_G / 1e11 Msun. */
  alpha: number;
  /** Power of 1 + z. */
  beta: number;
}

export interface MergerTimeParams {
  /** Time-scale at M_G = 1e11 Msun, q_G = 1, z = 0, Gyr. */
  tau0Gyr: number;
  /** Power of M_G / 1e11 Msun. */
  alpha: number;
  /** Power of 1 + z. */
  beta: number;
  /** Power of q_G. */
  gamma: number;
}

export interface GalaxyPairRouteParams {
  massFunction: StellarMassFunctionParams;
  pair: PairFractionParams;
  time: MergerTimeParams;
  galaxyMassRatio: MassRatioDistribution;
  bulgeFraction: number;
  relation: BlackHoleBulgeRelation;
  /** d a / d log10(1+z): the normalisation evolves as (1+z)^zeta. */
  relationZeta: number;
  /** Independent scatter draws for the two black holes, or one shared draw. */
  scatter: 'independent' | 'shared';
  /** Whether mergers happen tau after the pair (else at the pair's redshift). */
  timeShift: boolean;
  /** Largest pair redshift (and so largest merger redshift). */
  zMax: number;
  log10MMin: number;
  log10MMax: number;
  cosmology: FlatLambdaCdm;
}

const SCATTER_SIGMAS = 6;
/** 20 as galaxyMergerPopulation.ts; with the time shift the mass function held beyond zMax puts a kink in the scatter integral. */
const SHARED_NODES = 20;
const SHARED_NODES_SHIFTED = 48;
const OUTER_NODES = 24;
const INNER_NODES = 8;
const TABLE_CACHE = 512;
const LN_LN10 = Math.log(Math.LN10);
/** With the time shift, pairs up to this redshift may merge inside the population's range. */
const PAIR_Z_LIMIT = 30;

interface Rule {
  nodes: number[];
  weights: number[];
}

/** Gauss-Legendre nodes on [lo, hi] with weights times the normal density N(.; 0, sigma). */
function gaussianRule(n: number, lo: number, hi: number, sigma: number): Rule {
  const r = gaussLegendreRule(n);
  const half = 0.5 * (hi - lo);
  const mid = 0.5 * (hi + lo);
  const nodes: number[] = [];
  const weights: number[] = [];
  for (let i = 0; i < n; i++) {
    const e = mid + half * r.nodes[i];
    nodes.push(e);
    weights.push((half * r.weights[i] * Math.exp((-0.5 * e * e) / (sigma * sigma))) / (Math.sqrt(2 * Math.PI) * sigma));
  }
  return { nodes, weights };
}

interface RedshiftState {
  /** Relation normalisation at the merger redshift. */
  a: number;
  /** |dt/dz| at the merger redshift, Gyr. */
  dtdzGyr: number;
  /** Without the time shift: Phi*, alpha of the mass function and (1+z)^(betaF - betaT) at z. */
  phiStar: number;
  alphaMf: number;
  zFactor: number;
  table: MergerShiftTable | null;
}

/** The black-hole binary population of the galaxy route with mass-, ratio- and redshift-dependent pairs. */
export function galaxyPairRoutePopulation(p: GalaxyPairRouteParams): BinaryPopulation {
  const { b, scatterDex: sigma } = p.relation;
  const cosmo = p.cosmology;
  const mf = p.massFunction;
  const qgMin = p.galaxyMassRatio.qMin;
  const log10QgMin = Math.log10(qgMin);
  const yShift = 11 - Math.log10(p.bulgeFraction);
  const lnMStar = Math.log(mf.mStar);
  const independent = p.scatter === 'independent' && sigma > 0;
  const half = SCATTER_SIGMAS * sigma;
  const shared: Rule = sigma > 0 ? gaussianRule(p.timeShift ? SHARED_NODES_SHIFTED : SHARED_NODES, -half, half, sigma) : { nodes: [0], weights: [1] };
  const outer: Rule = independent ? gaussianRule(OUTER_NODES, -half, half, sigma) : shared;
  const inner = gaussLegendreRule(INNER_NODES);
  const normal = (e: number) => Math.exp((-0.5 * e * e) / (sigma * sigma)) / (Math.sqrt(2 * Math.PI) * sigma);

  const states = new Map<number, RedshiftState>();
  const stateAt = (z: number): RedshiftState => {
    let s = states.get(z);
    if (!s) {
      s = {
        a: p.relation.a + p.relationZeta * Math.log10(1 + z),
        dtdzGyr: cosmo.dtdzS(z) / GYR_S,
        phiStar: Math.pow(10, mf.log10PhiStar0 + mf.log10PhiStarSlope * z),
        alphaMf: mf.alpha0 + mf.alphaSlope * z,
        zFactor: Math.pow(1 + z, p.pair.beta) / Math.pow(1 + z, p.time.beta),
        table: p.timeShift ? mergerShiftTable(cosmo, z, PAIR_Z_LIMIT, p.time.beta) : null,
      };
      if (states.size >= TABLE_CACHE) states.clear();
      states.set(z, s);
    }
    return s;
  };

  /** The parts of n_G that depend on the primary's mass only (y1 = log10 M_G). */
  interface MassPart {
    y1: number;
    /** tau0 (M_G/1e11)^alphaT, Gyr. */
    tauMass: number;
    /** f0 (M_G/1e11)^alphaF / (tau0 (M_G/1e11)^alphaT) x |dt/dz|(z_m), Gyr^0, and Phi at z_m when not shifted. */
    pairOverTau: number;
    phiHere: number;
    /** ln(M_G / M*) and M_G / M*. */
    lnR: number;
    r: number;
  }
  const massPart = (st: RedshiftState, y1: number): MassPart => {
    const lnM = (y1 - 11) * Math.LN10;
    const tauMass = p.time.tau0Gyr * Math.exp(p.time.alpha * lnM);
    const pairOverTau = (p.pair.f0 * Math.exp(p.pair.alpha * lnM) * st.dtdzGyr) / tauMass;
    const phiHere = st.table ? NaN : schechterPerDex(Math.pow(10, y1), st.phiStar, mf.mStar, st.alphaMf);
    const lnR = y1 * Math.LN10 - lnMStar;
    return { y1, tauMass, pairOverTau, phiHere, lnR, r: Math.exp(lnR) };
  };

  /** n_G per dex of M_G per unit q_G per unit merger redshift z, Mpc^-3. */
  const galaxyDensity = (st: RedshiftState, m: MassPart, qg: number): number => {
    const pq = p.galaxyMassRatio.pdf(qg);
    if (pq === 0) return 0;
    const qTerm = p.time.gamma === 0 ? 1 : Math.pow(qg, p.time.gamma);
    if (!st.table) return (m.phiHere * m.pairOverTau * st.zFactor * pq) / qTerm;
    const shifted = st.table.pairRedshift(m.tauMass * qTerm);
    if (shifted === null) return 0;
    // Beyond zMax the mass function and pair fraction keep their zMax values (no extrapolation).
    // Schechter per dex (massFunctions.ts), pair fraction's and time-scale's z terms in one exp.
    const zc = Math.min(shifted.zPair, p.zMax);
    const lnOnePc = shifted.zPair <= p.zMax ? shifted.lnOnePlusZ : Math.log1p(zc);
    const lnPart = LN_LN10 + Math.LN10 * (mf.log10PhiStar0 + mf.log10PhiStarSlope * zc) + (1 + mf.alpha0 + mf.alphaSlope * zc) * m.lnR - m.r + p.pair.beta * lnOnePc - p.time.beta * shifted.lnOnePlusZ;
    return (Math.exp(lnPart) * m.pairOverTau * pq) / (qTerm * shifted.dtMergerPerDtPair);
  };

  /** Shared draw: q_G = q^(1/b), Jacobian 1 / (b^2 q_G^(b-1)) (as galaxyMergerPopulation.ts). */
  const sharedDensity = (st: RedshiftState, log10M: number, q: number): number => {
    const qg = Math.pow(q, 1 / b);
    if (qg < qgMin) return 0;
    const xBig = log10M - Math.log10(1 + q);
    let s = 0;
    for (let i = 0; i < shared.nodes.length; i++) s += shared.weights[i] * galaxyDensity(st, massPart(st, yShift + (xBig - st.a - shared.nodes[i]) / b), qg);
    return s / (b * b * Math.pow(qg, b - 1));
  };

  /** p(x1, x2) of the header for independent draws. */
  const pairOfHoles = (st: RedshiftState, x1: number, x2: number): number => {
    let s = 0;
    for (let i = 0; i < outer.nodes.length; i++) {
      const e1 = outer.nodes[i];
      const m = massPart(st, yShift + (x1 - st.a - e1) / b);
      // eps2 keeps q_G in [q_G,min, 1]: eps2 in [d, d - b log10 q_G,min], d = x2 - x1 + eps1.
      const d = x2 - x1 + e1;
      const lo = Math.max(d, -half);
      const hi = Math.min(d - b * log10QgMin, half);
      if (!(hi > lo)) continue;
      const h = 0.5 * (hi - lo);
      const mid = 0.5 * (hi + lo);
      let t = 0;
      for (let j = 0; j < INNER_NODES; j++) {
        const e2 = mid + h * inner.nodes[j];
        const qg = Math.pow(10, (d - e2) / b);
        const n = galaxyDensity(st, m, qg);
        if (n !== 0) t += inner.weights[j] * normal(e2) * n * qg;
      }
      s += outer.weights[i] * h * t;
    }
    return (s * Math.LN10) / (b * b);
  };

  // Independent draws spread log10 q by sigma sqrt(2) about b log10 q_G: 6 sigma below the smallest q_G^b
  // (4.2 of that spread) the density is negligible.
  const qFloor = independent ? Math.max(1e-6, Math.pow(qgMin, b) * Math.pow(10, -half)) : Math.pow(qgMin, b);
  return {
    zMin: 0,
    zMax: p.zMax,
    log10MMin: p.log10MMin,
    log10MMax: p.log10MMax,
    qMin: Math.min(qFloor, 0.999),
    qMax: 1,
    density(z, log10M, q) {
      if (z > p.zMax) return 0;
      const st = stateAt(z);
      if (!independent) return sharedDensity(st, log10M, q);
      const xBig = log10M - Math.log10(1 + q);
      const xSmall = xBig + Math.log10(q);
      return (pairOfHoles(st, xBig, xSmall) + pairOfHoles(st, xSmall, xBig)) / (q * Math.LN10);
    },
  };
}
