// The redshift of a galaxy pair that merges at a given redshift z_m after a time-scale
// tau = K (1+z_p)^beta (Chen, Sesana & Conselice 2019, MNRAS 488, 401: the pair observed at z_p merges at
// t(z_m) = t(z_p) + tau). For one z_m, K -> z_p is one monotone function: it is tabulated once in
// delta = ln(1+z_p) - ln(1+z_m), from the merger redshift to zMax, and inverted by cubic Hermite
// interpolation of ln delta against ln K with exact slopes.
//   ln K(delta) = ln(t_m - t_p) - beta u_p,  t_m - t_p = Int_{u_m}^{u_p} du / (H0 E(z))   (Hogg 1999, eq. 30, u = ln(1+z))
import { GYR_S } from './constants';
import type { FlatLambdaCdm } from './cosmology';
import { gaussLegendreRule } from './gaussLegendre';

export interface ShiftedPair {
  /** Redshift of the pair and ln(1 + zPair). */
  zPair: number;
  lnOnePlusZ: number;
  /** dt_m/dt_p = 1 + dtau/dt_p at that pair (> 0). */
  dtMergerPerDtPair: number;
}

export interface MergerShiftTable {
  /** The pair that merges at z_m after tau = kGyr (1+z_p)^beta, or null when it would pair beyond zMax. */
  pairRedshift(kGyr: number): ShiftedPair | null;
}

const POINTS = 200;
/** The smallest tabulated delta is e^-SPAN of the largest. */
const SPAN = 20;
const rule16 = gaussLegendreRule(16);
export const MIN_JACOBIAN = 0.05;

/** Time between z(u0) and z(u1), Gyr: 16-point Gauss-Legendre of 1/(H0 E) in u = ln(1+z). */
function timeBetween(cosmo: FlatLambdaCdm, u0: number, u1: number): number {
  const h = 0.5 * (u1 - u0);
  const m = 0.5 * (u1 + u0);
  let s = 0;
  for (let i = 0; i < 16; i++) {
    const z = Math.expm1(m + h * rule16.nodes[i]);
    s += rule16.weights[i] * (1 + z) * cosmo.dtdzS(z);
  }
  return (h * s) / GYR_S;
}

/** d ln K / d ln delta at delta, given t_m - t_p = d (Gyr). */
function slope(cosmo: FlatLambdaCdm, um: number, delta: number, d: number, beta: number): number {
  const z = Math.expm1(um + delta);
  return delta * (((1 + z) * cosmo.dtdzS(z)) / GYR_S / d - beta);
}

export function mergerShiftTable(cosmo: FlatLambdaCdm, zMerger: number, zMax: number, beta: number): MergerShiftTable {
  const um = Math.log1p(zMerger);
  const range = Math.log1p(zMax) - um;
  if (!(range > 0)) return { pairRedshift: () => null };
  const lnDelta = new Float64Array(POINTS);
  const lnK = new Float64Array(POINTS);
  const dydx = new Float64Array(POINTS);
  const lnRange = Math.log(range);
  // With beta > 0 the time-scale can grow with the pair's redshift faster than cosmic time runs back:
  // beyond the first such pair, earlier pairs would merge after later ones (dt_merger/dt_pair <= 0).
  // The table, and so the population, stops where dt_merger/dt_pair falls below MIN_JACOBIAN (before the
  // density's 1/(dt_merger/dt_pair) grows without bound): those earliest pairs are left out.
  let n = 0;
  for (let j = 0; j < POINTS; j++) {
    const ld = lnRange - SPAN + (SPAN * j) / (POINTS - 1);
    const delta = Math.exp(ld);
    const d = timeBetween(cosmo, um, um + delta);
    const k = slope(cosmo, um, delta, d, beta);
    const z = Math.expm1(um + delta);
    if (!(k > 0) || !(1 - (beta * d * GYR_S) / ((1 + z) * cosmo.dtdzS(z)) >= MIN_JACOBIAN)) break;
    lnDelta[j] = ld;
    lnK[j] = Math.log(d) - beta * (um + delta);
    dydx[j] = 1 / k;
    n = j + 1;
  }
  if (n < 2) return { pairRedshift: () => null };
  const dtdzM = (1 + zMerger) * cosmo.dtdzS(zMerger) / GYR_S; // d t / d u at z_m, Gyr
  return {
    pairRedshift(kGyr) {
      const x = Math.log(kGyr);
      if (!(x <= lnK[n - 1])) return null;
      let delta: number;
      if (x < lnK[0]) {
        delta = (kGyr * Math.exp(beta * um)) / dtdzM; // tau so short that t_p - t_m is linear in delta
      } else {
        let lo = 0;
        let hi = n - 1;
        while (hi - lo > 1) {
          const mid = (lo + hi) >> 1;
          if (lnK[mid] <= x) lo = mid;
          else hi = mid;
        }
        const h = lnK[hi] - lnK[lo];
        const t = (x - lnK[lo]) / h;
        const t2 = t * t;
        const t3 = t2 * t;
        const y = (2 * t3 - 3 * t2 + 1) * lnDelta[lo] + (t3 - 2 * t2 + t) * h * dydx[lo] + (-2 * t3 + 3 * t2) * lnDelta[hi] + (t3 - t2) * h * dydx[hi];
        delta = Math.exp(y);
      }
      const u = um + delta;
      const zPair = Math.expm1(u);
      const tau = kGyr * Math.exp(beta * u);
      const dtMergerPerDtPair = 1 - (beta * tau * GYR_S) / ((1 + zPair) * cosmo.dtdzS(zPair));
      if (!(dtMergerPerDtPair >= MIN_JACOBIAN)) return null;
      return { zPair, lnOnePlusZ: u, dtMergerPerDtPair };
    },
  };
}
