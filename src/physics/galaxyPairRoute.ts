// The galaxy route with pair fraction and merger time-scale depending on mass, mass ratio and redshift
// (after Chen, Sesana & Conselice 2019, MNRAS 488, 401, arXiv:1810.04184; unverified: only their abstract
// was reachable, so the pivots, the q_G term and which galaxy mass they use are ours, docs/galaxyRoute.md):
//   d^3n_G/(dt dlog10M_G dq_G) = Phi(M_G, z_p) f_pair(M_G, z_p) p(q_G) / tau(M_G, q_G, z_p),
//   f_pair = f0 (M_G/1e11)^alphaF (1+z_p)^betaF,  tau = tau0 (M_G/1e11)^alphaT (1+z_p)^betaT q_G^gammaT,
// M_G the primary galaxy's stellar mass, z_p the redshift of the pair, Phi the Schechter stellar mass
// function per dex of galaxyMergerPopulation.ts. A q_G^gammaF term in the pair fraction is p(q_G) here
// (a power law normalised on [q_G,min, 1], equal to such a term up to the normalisation of f0).
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
// Numerics (docs/galaxyRoute.md): with u1 = a + b (y1 - 11 + log10 f_bulge) and t = b log10 q_G,
//   p(x1, x2) = (1/b^2) Int du1 dt N(x1 - u1) N(x2 - u1 - t) n_G q_G ln10,
// summed on one grid of step h: u1 = j h (trapezoid), t = -k h, k = 0..K, t_K = b log10 q_G,min
// (Boole's rule), so x2 - u1 - t = x2 - (j - k) h; n_G with its weights is kept per redshift and row j.
// One draw with the time shift: a trapezoid sum over u1 with n_G kept per (z, q).
import { GYR_S } from './constants';
import type { FlatLambdaCdm } from './cosmology';
import type { BlackHoleBulgeRelation } from './blackHoleBulgeRelation';
import { gaussLegendreRule } from './gaussLegendre';
import { booleWeights, gaussianOnGrid } from './gaussianOnGrid';
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
  /** Grid steps per sigma of the scatter sums (default 4; a larger value for a converged reference). */
  scatterStepsPerSigma?: number;
}

const SCATTER_SIGMAS = 6;
/** 20 as galaxyMergerPopulation.ts (one draw, no time shift: that route to rounding). */
const SHARED_NODES = 20;
/** Grid steps per sigma of the scatter sums (the grid route): A_yr within 1e-5 of 12 steps (docs/galaxyRoute.md). */
const STEPS_PER_SIGMA = 3;
/** Fewest Boole intervals across the galaxy mass ratios (4 leave 1.7e-4 in A_yr at sigma = 0.5). */
const MIN_T_STEPS = 8;
const TABLE_CACHE = 512;
/** Rows of one draw kept per redshift (one per distinct q). */
const SHARED_ROWS = 64;
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
  /** Grid route, independent draws: rows j (u1 = j h) of weighted n_G at the K + 1 values of t, filled on demand. */
  grid: Float64Array | null;
  filled: Uint8Array | null;
  /** Grid route, one draw: per q, n_G at each u1 = j h (NaN until computed). */
  sharedRows: Map<number, Float64Array>;
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
  // The grid route (header): independent draws, or one draw with the time shift.
  const sharedGrid = !independent && sigma > 0 && p.timeShift;
  const shared: Rule = sigma > 0 ? gaussianRule(SHARED_NODES, -half, half, sigma) : { nodes: [0], weights: [1] };
  // t = b log10 q_G on [-span, 0] in K steps of h (Boole's rule), u1 on the same step h (trapezoid).
  const span = -b * log10QgMin;
  if (independent && !(span > 0)) throw new RangeError(`the galaxy mass-ratio distribution must start below 1, got qMin = ${qgMin}`);
  const steps = p.scatterStepsPerSigma ?? STEPS_PER_SIGMA;
  if (!(steps >= 1 && steps <= 64)) throw new RangeError(`scatterStepsPerSigma must be in [1, 64], got ${steps}`);
  const K = independent ? Math.max(MIN_T_STEPS, 4 * Math.ceil((span * steps) / (4 * sigma))) : 0;
  const h = independent ? span / K : sigma / steps;
  const tWeights = independent ? booleWeights(K, h) : new Float64Array(0);
  const qNodes = Float64Array.from({ length: K + 1 }, (_, k) => (k === 0 ? 1 : k === K ? qgMin : Math.pow(10, (-k * h) / b)));
  const rowScale = (h * Math.LN10) / (b * b);
  const bufferSize = sigma > 0 ? Math.ceil((2 * half) / h) + 2 : 0;
  const w1 = new Float64Array(bufferSize);
  const w2 = new Float64Array(bufferSize);

  // Grid rows: u1 = j h for j in [jLo, jLo + nJ), wide enough for every (log10M, q) of the population.
  // Independent draws spread log10 q by sigma sqrt(2) about b log10 q_G: 6 sigma below the smallest q_G^b
  // (4.2 of that spread) the density is negligible.
  const qFloor = independent ? Math.max(1e-6, Math.pow(qgMin, b) * Math.pow(10, -half)) : Math.pow(qgMin, b);
  const qLow = Math.min(qFloor, 0.999);
  const jLo = sigma > 0 ? Math.floor((p.log10MMin + Math.log10(qLow / (1 + qLow)) - half) / h) - 1 : 0;
  const nJ = sigma > 0 ? Math.ceil((p.log10MMax + half) / h) + 2 - jLo : 0;
  const uToY = (st: RedshiftState, j: number) => yShift + (j * h - st.a) / b;

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
        grid: independent ? new Float64Array(nJ * (K + 1)) : null,
        filled: independent ? new Uint8Array(nJ) : null,
        sharedRows: new Map(),
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

  /** One draw without the time shift: q_G = q^(1/b), Jacobian 1 / (b^2 q_G^(b-1)) (as galaxyMergerPopulation.ts). */
  const sharedDensity = (st: RedshiftState, log10M: number, q: number): number => {
    const qg = Math.pow(q, 1 / b);
    if (qg < qgMin) return 0;
    const xBig = log10M - Math.log10(1 + q);
    let s = 0;
    for (let i = 0; i < shared.nodes.length; i++) s += shared.weights[i] * galaxyDensity(st, massPart(st, yShift + (xBig - st.a - shared.nodes[i]) / b), qg);
    return s / (b * b * Math.pow(qg, b - 1));
  };


  /** One draw with the time shift: the eps integral as a trapezoid sum over u1 = j h, n_G kept per (z, q). */
  const sharedOnGrid = (st: RedshiftState, log10M: number, q: number): number => {
    const qg = Math.pow(q, 1 / b);
    if (qg < qgMin) return 0;
    const xBig = log10M - Math.log10(1 + q);
    let row = st.sharedRows.get(q);
    if (!row) {
      if (st.sharedRows.size >= SHARED_ROWS) st.sharedRows.clear();
      row = new Float64Array(nJ).fill(NaN);
      st.sharedRows.set(q, row);
    }
    const jA = Math.ceil((xBig - half) / h);
    const jB = Math.floor((xBig + half) / h);
    gaussianOnGrid(xBig, h, jA, jB - jA + 1, sigma, w1);
    let s = 0;
    for (let j = jA; j <= jB; j++) {
      const i = j - jLo;
      const inside = i >= 0 && i < nJ;
      let v = inside ? row[i] : NaN;
      if (Number.isNaN(v)) {
        v = galaxyDensity(st, massPart(st, uToY(st, j)), qg);
        if (inside) row[i] = v;
      }
      s += w1[j - jA] * v;
    }
    return (h * s) / (b * b * Math.pow(qg, b - 1));
  };

  /** Fills row i = j - jLo of the independent-draw grid: h w_k ln10 q_G n_G(y(j h), q_G,k) / b^2 at t_k = -k h. */
  const fillRow = (st: RedshiftState, i: number): void => {
    const grid = st.grid!;
    const m = massPart(st, uToY(st, jLo + i));
    for (let k = 0; k <= K; k++) {
      const n = galaxyDensity(st, m, qNodes[k]);
      grid[i * (K + 1) + k] = n === 0 ? 0 : rowScale * tWeights[k] * qNodes[k] * n;
    }
    st.filled![i] = 1;
  };

  /** Gaussian weights N(x - j h) for j in [j0, j0 + n) (n = 0 when the window is empty), refilled in place. */
  interface Window { x: number; j0: number; n: number; w: Float64Array }
  const bigWindow: Window = { x: 0, j0: 0, n: 0, w: w1 };
  const smallWindow: Window = { x: 0, j0: 0, n: 0, w: w2 };
  const fillWindow = (win: Window, x: number): Window => {
    win.x = x;
    win.j0 = Math.ceil((x - half) / h);
    win.n = Math.max(0, Math.floor((x + half) / h) - win.j0 + 1);
    gaussianOnGrid(x, h, win.j0, win.n, sigma, win.w);
    return win;
  };

  /** p(x1, x2) of the header for independent draws: Sum_j N(x1 - j h) Sum_k row_j[k] N(x2 - (j - k) h). */
  const pairOfHoles = (st: RedshiftState, a: Window, c: Window): number => {
    if (a.n === 0 || c.n === 0) return 0;
    const grid = st.grid!;
    const filled = st.filled!;
    const w1 = a.w;
    const w2 = c.w;
    // Rows outside the grid (a density asked for outside the population's limits) count as 0.
    const iA = Math.max(0, a.j0 - jLo);
    const iB = Math.min(nJ - 1, a.j0 + a.n - 1 - jLo);
    let s = 0;
    for (let i = iA; i <= iB; i++) {
      // m = j - k runs over c's window: k in [j - (c.j0 + c.n - 1), j - c.j0] within [0, K].
      const j = jLo + i;
      const kLo = Math.max(0, j - (c.j0 + c.n - 1));
      const kHi = Math.min(K, j - c.j0);
      if (kLo > kHi) continue;
      if (filled[i] === 0) fillRow(st, i);
      const base = i * (K + 1);
      const off = j - c.j0;
      let t = 0;
      for (let k = kLo; k <= kHi; k++) t += grid[base + k] * w2[off - k];
      s += w1[j - a.j0] * t;
    }
    return s;
  };

  return {
    zMin: 0,
    zMax: p.zMax,
    log10MMin: p.log10MMin,
    log10MMax: p.log10MMax,
    qMin: Math.min(qFloor, 0.999),
    qMax: 1,
    // Independent draws: below q_G,min^b only the scatter tails remain, so the density in q turns there.
    qBreaks: independent ? [Math.pow(qgMin, b)] : undefined,
    density(z, log10M, q) {
      if (z > p.zMax) return 0;
      // The grid rows cover the population's limits only; outside them the density is 0 (the contract).
      const outside = log10M < p.log10MMin || log10M > p.log10MMax || q < qLow || q > 1;
      if ((independent || sharedGrid) && outside) return 0;
      const st = stateAt(z);
      if (!independent) return sharedGrid ? sharedOnGrid(st, log10M, q) : sharedDensity(st, log10M, q);
      const xBig = log10M - Math.log10(1 + q);
      const big = fillWindow(bigWindow, xBig);
      const small = fillWindow(smallWindow, xBig + Math.log10(q));
      return (pairOfHoles(st, big, small) + pairOfHoles(st, small, big)) / (q * Math.LN10);
    },
  };
}
