// What the phenomenological hardening model (phenomHardening.ts) does to the background and to the
// population. A circular binary at rest-frame GW frequency f_r = 2 f_orb spends
//   dt/dln f_r = (2/3) a / |da/dt|   (f_orb proportional to a^(-3/2), Kepler)
// there, and radiates L_GW dt/dln f_r, so with the environment the energy per ln f_r of one binary is the
// GW-driven one times (dt/dln f_r)_total / (dt/dln f_r)_GW = B / (A g(a/a_c) a^3 + B) (Phinney 2001,
// astro-ph/0108028; Sesana 2013, arXiv:1307.2600, whose journal reference CQG 30, 224014 is
// unverified); no energy is radiated below the frequency of a_0.
// The delay: each binary coalesces its lifetime (tau_f, phenomLifetime) after it forms, so the
// population is counted by coalescence redshift (massDependentDelay.ts, delayedPopulation.ts).
// Its emission at f_r is counted at the coalescence redshift: the remaining time from f_r to coalescence
// is taken as small against the age of the universe (see docs/orbits.md).
import { G_SI } from './constants';
import { circularGwKernel } from './circularKernel';
import type { FlatLambdaCdm } from './cosmology';
import { delayedPopulation, stalledFraction } from './delayedPopulation';
import { delayedPopulationByMass, stalledFractionByMass } from './massDependentDelay';
import {
  checkPhenomHardening,
  gwHardeningConstant,
  gwOnlyLifetime,
  LifetimeGrid,
  LifetimeIntegral,
  phenomLifetime,
  phenomNormalisation,
  type PhenomHardening,
} from './phenomHardening';
import type { BinaryPopulation, EmissionKernel } from './populationTypes';
import type { ResidenceFactor } from './residenceFactor';

/** Separation of a circular binary radiating at rest-frame GW frequency f_r: (G M / (pi f_r)^2)^(1/3), m (Kepler). */
export function separationAtGwFrequency(frHz: number, mKg: number): number {
  return Math.cbrt((G_SI * mKg) / (Math.PI * Math.PI * frHz * frHz));
}

/**
 * (dt/dln f_r)_total / (dt/dln f_r)_GW = B / (A g(a/a_c) a^3 + B) at f_r, for normalisation A (m/s);
 * 0 above the separation a_0 at formation.
 */
export function residenceRatio(frHz: number, mKg: number, q: number, norm: number, h: PhenomHardening): number {
  const a = separationAtGwFrequency(frHz, mKg);
  if (a > h.initialSeparationM) return 0;
  if (norm === 0) return 1;
  const B = gwHardeningConstant(mKg, q);
  const x = a / h.breakSeparationM;
  const env = norm * Math.pow(x, 1 - h.innerIndex) * Math.pow(1 + x, h.innerIndex - h.outerIndex) * a * a * a;
  return B / (env + B);
}

/** The normalisation of one binary (root solve of phenomNormalisation, with its nodes), m/s. */
export function normalisationOf(mKg: number, q: number, h: PhenomHardening): number {
  return phenomNormalisation(new LifetimeIntegral(mKg, h), q);
}

/** Chebyshev points per decade of mass in the normalisation table (17 with both ends). */
const TABLE_ORDER = 16;
const TABLE_X = Array.from({ length: TABLE_ORDER + 1 }, (_, j) => 0.5 + 0.5 * Math.cos((Math.PI * j) / TABLE_ORDER));
const TABLE_W = TABLE_X.map((_, j) => (j % 2 ? -1 : 1) * (j === 0 || j === TABLE_ORDER ? 0.5 : 1));

/** The inner map of `outer` at `key`, made when missing (the outer map emptied first past `cap` keys). */
function innerMap<V>(outer: Map<number, Map<number, V>>, key: number, cap: number): Map<number, V> {
  let inner = outer.get(key);
  if (!inner) {
    if (outer.size > cap) outer.clear();
    inner = new Map();
    outer.set(key, inner);
  }
  return inner;
}

/**
 * The normalisation A(M, q) for many binaries: for each mass ratio and each decade [k, k+1] of
 * log10(M/Msun) that is asked for, ln A at 17 Chebyshev points of the decade (root solves), then the
 * barycentric interpolant (Berrut & Trefethen 2004, SIAM Rev. 46, 501) between them. ln A is analytic in
 * log10 M, and the interpolant agrees with scipy's root solve to 1e-9 relative or better (test/physics/
 * phenomHardening.test.ts); a decade where GW emission alone is faster somewhere (A = 0), or where
 * tau_f = 0 (A infinite), is solved directly at every mass.
 */
export function normalisationTable(h: PhenomHardening, mSunKg: number): (mKg: number, q: number) => number {
  const grid = new LifetimeGrid(h);
  const solve = (mKg: number, q: number) => phenomNormalisation(new LifetimeIntegral(mKg, grid), q);
  const tables = new Map<number, Map<number, Float64Array | null>>();
  return (mKg, q) => {
    const s = Math.log10(mKg / mSunKg);
    const k = Math.floor(s);
    if (!Number.isFinite(k)) return solve(mKg, q);
    const byDecade = innerMap(tables, q, 256);
    let lnA = byDecade.get(k);
    if (lnA === undefined) {
      const values = new Float64Array(TABLE_ORDER + 1);
      let direct = false;
      for (let j = 0; j <= TABLE_ORDER && !direct; j++) {
        const A = solve(mSunKg * Math.pow(10, k + TABLE_X[j]), q);
        if (A > 0 && A < Infinity) values[j] = Math.log(A);
        else direct = true;
      }
      lnA = direct ? null : values;
      byDecade.set(k, lnA);
    }
    if (lnA === null) return solve(mKg, q);
    const x = s - k;
    let num = 0;
    let den = 0;
    for (let j = 0; j <= TABLE_ORDER; j++) {
      const d = x - TABLE_X[j];
      if (d === 0) return Math.exp(lnA[j]);
      const t = TABLE_W[j] / d;
      num += t * lnA[j];
      den += t;
    }
    return Math.exp(num / den);
  };
}

/**
 * A / B of each binary (M, q), A from normalisationTable (0 where GW emission alone is faster), kept
 * per (M, q) so that repeated calls at the same binary cost a lookup.
 */
function ratioTable(h: PhenomHardening, mSunKg: number): (mKg: number, q: number) => number {
  const normOf = normalisationTable(h, mSunKg);
  const ratios = new Map<number, Map<number, number>>();
  return (mKg, q) => {
    const row = innerMap(ratios, mKg, 4096);
    let k = row.get(q);
    if (k === undefined) {
      const A = normOf(mKg, q);
      k = A === 0 ? 0 : A / gwHardeningConstant(mKg, q);
      row.set(q, k);
    }
    return k;
  };
}

/**
 * Emission kernel: the circular GW-driven kernel times residenceRatio, A from normalisationTable. Per
 * (M, q) node the kernel keeps A / B, so a call costs the separation and g(x):
 * factor = 1 / (1 + (A/B) g(x) a^3), a^3 = G M / (pi f_r)^2. Where A = 0 the factor is exactly 1.
 */
export function phenomEmissionKernel(h: PhenomHardening, mSunKg: number): EmissionKernel {
  checkPhenomHardening(h);
  const ratioOf = ratioTable(h, mSunKg);
  const a0 = h.initialSeparationM;
  const ac = h.breakSeparationM;
  const p1 = 1 - h.innerIndex;
  const p2 = h.innerIndex - h.outerIndex;
  return (fr, mc, m, q, z) => {
    const a3 = (G_SI * m) / (Math.PI * Math.PI * fr * fr);
    const a = Math.cbrt(a3);
    if (a > a0) return 0;
    const k = ratioOf(m, q);
    const base = circularGwKernel(fr, mc, m, q, z);
    if (k === 0) return base;
    const x = a / ac;
    return base / (1 + k * Math.pow(x, p1) * Math.pow(1 + x, p2) * a3);
  };
}

/**
 * The model's residence factor (residenceFactor.ts) for many binaries: residenceRatio with A from
 * normalisationTable, 1 / (1 + (A/B) g(x) a^3), 0 above a_0; the factor phenomEmissionKernel puts on
 * the circular kernel. For the counts per bin and the realisations.
 */
export function phenomResidenceFactor(h: PhenomHardening, mSunKg: number): ResidenceFactor {
  checkPhenomHardening(h);
  const ratioOf = ratioTable(h, mSunKg);
  const a0 = h.initialSeparationM;
  const ac = h.breakSeparationM;
  const p1 = 1 - h.innerIndex;
  const p2 = h.innerIndex - h.outerIndex;
  // The last binary's A / B: callers that run through the frequencies of one binary skip the lookup.
  let lastM = NaN;
  let lastQ = NaN;
  let lastK = 0;
  return (fr, m, q) => {
    const a3 = (G_SI * m) / (Math.PI * Math.PI * fr * fr);
    const a = Math.cbrt(a3);
    if (a > a0) return 0;
    if (m !== lastM || q !== lastQ) {
      lastK = ratioOf(m, q);
      lastM = m;
      lastQ = q;
    }
    const k = lastK;
    if (k === 0) return 1;
    const x = a / ac;
    return 1 / (1 + k * Math.pow(x, p1) * Math.pow(1 + x, p2) * a3);
  };
}

/** Lifetime of each binary, s, as a function of (log10 M/Msun, q). */
export function phenomLifetimeFunction(h: PhenomHardening, mSunKg: number): (log10M: number, q: number) => number {
  checkPhenomHardening(h);
  return (log10M, q) => phenomLifetime(Math.pow(10, log10M) * mSunKg, q, h);
}

/**
 * The population by coalescence redshift under the model. The GW time from a_0 falls with M and with q,
 * so when it exceeds tau_f at (M_max, q_max) every binary lives exactly tau_f: the fixed-lifetime map
 * (delayedPopulation, which keeps a separable base separable); otherwise each (M, q) has its own lifetime.
 */
export function phenomDelayedPopulation(base: BinaryPopulation, cosmo: FlatLambdaCdm, h: PhenomHardening, mSunKg: number): BinaryPopulation {
  if (everyLifetimeIsTau(base, h, mSunKg)) return delayedPopulation(base, cosmo, h.lifetimeS);
  return delayedPopulationByMass(base, cosmo, phenomLifetimeFunction(h, mSunKg));
}

/** Share of the population that stalls under the model (the fixed-lifetime count when every lifetime is tau_f). */
export function phenomStalledFraction(base: BinaryPopulation, cosmo: FlatLambdaCdm, h: PhenomHardening, mSunKg: number): number {
  if (everyLifetimeIsTau(base, h, mSunKg)) return stalledFraction(base, cosmo, h.lifetimeS);
  return stalledFractionByMass(base, cosmo, phenomLifetimeFunction(h, mSunKg));
}

function everyLifetimeIsTau(base: BinaryPopulation, h: PhenomHardening, mSunKg: number): boolean {
  checkPhenomHardening(h);
  return gwOnlyLifetime(Math.pow(10, base.log10MMax) * mSunKg, base.qMax, h) > h.lifetimeS;
}
