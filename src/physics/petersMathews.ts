// Power radiated in each orbital harmonic by an eccentric Keplerian binary, relative to a circular
// binary of the same semi-major axis (Peters & Mathews 1963, Phys. Rev. 131, 435).
import { besselJWindow } from './bessel';

/** F(e) = (1 + 73/24 e^2 + 37/96 e^4) / (1 - e^2)^(7/2) = sum_n g(n, e) (Peters & Mathews 1963, eq. 17). */
export function eccentricityEnhancement(e: number): number {
  const e2 = e * e;
  return (1 + (73 / 24) * e2 + (37 / 96) * e2 * e2) / Math.pow(1 - e2, 3.5);
}

const window5 = new Float64Array(5);

/**
 * g(n, e): fraction (relative to the total power of a circular orbit) radiated in harmonic n of the
 * orbital frequency, for integer n >= 1 and 0 <= e < 1 (Peters & Mathews 1963, eq. 20), x = n e:
 * g = n^4/32 {[J_{n-2} - 2e J_{n-1} + (2/n) J_n + 2e J_{n+1} - J_{n+2}]^2
 *            + (1-e^2) [J_{n-2} - 2 J_n + J_{n+2}]^2 + 4/(3 n^2) J_n^2}.
 */
export function harmonicPower(n: number, e: number): number {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`harmonicPower: harmonic n must be an integer >= 1, got ${n}`);
  if (!(e >= 0 && e < 1)) throw new RangeError(`harmonicPower: eccentricity must lie in [0, 1), got ${e}`);
  const x = n * e;
  let jm2: number, jm1: number, j0: number, jp1: number, jp2: number;
  if (n >= 2) {
    besselJWindow(n - 2, 5, x, window5);
    jm2 = window5[0];
    jm1 = window5[1];
    j0 = window5[2];
    jp1 = window5[3];
    jp2 = window5[4];
  } else {
    // n = 1: J_{-1} = -J_1 (Abramowitz & Stegun 1964, 9.1.5).
    besselJWindow(0, 4, x, window5);
    jm2 = -window5[1];
    jm1 = window5[0];
    j0 = window5[1];
    jp1 = window5[2];
    jp2 = window5[3];
  }
  const a = jm2 - 2 * e * jm1 + (2 / n) * j0 + 2 * e * jp1 - jp2;
  const b = jm2 - 2 * j0 + jp2;
  const n2 = n * n;
  return ((n2 * n2) / 32) * (a * a + (1 - e * e) * b * b + (4 / (3 * n2)) * j0 * j0);
}

/**
 * Kapteyn's bound |J_m(m z)| <= [z exp(sqrt(1-z^2)) / (1 + sqrt(1-z^2))]^m for 0 <= z < 1
 * (Kapteyn 1893, Ann. Sci. Ec. Norm. Sup. 10, 91; Watson 1944, Theory of Bessel Functions, 8.7;
 * unverified: volume, page and section, no copy of either being reachable). Derived here independently:
 * Cauchy's estimate on the generating function exp[(x/2)(t - 1/t)] = sum J_m(x) t^m over |t| = r > 1
 * gives |J_m(x)| <= r^(-m) exp[(x/2)(r - 1/r)], and r = (1 + s)/z, s = sqrt(1-z^2), x = m z makes the
 * exponent m s; the bound is also checked numerically in test/orbits. |J_m| <= 1 otherwise (A&S 9.1.60).
 */
export function kapteynBound(m: number, x: number): number {
  if (m <= 0 || x >= m) return 1;
  const z = x / m;
  const s = Math.sqrt(1 - z * z);
  return Math.min(1, Math.exp(m * (Math.log(z) + s - Math.log1p(s))));
}

/**
 * A rigorous upper bound on g(n, e) from Kapteyn's bound on each Bessel function (triangle
 * inequality in the Peters & Mathews 1963 form). Cheap (no recurrence); used to skip harmonics whose
 * power is below double-precision significance.
 */
export function harmonicPowerBound(n: number, e: number): number {
  const x = n * e;
  const km2 = n >= 2 ? kapteynBound(n - 2, x) : kapteynBound(1, x);
  const km1 = kapteynBound(n - 1, x);
  const k0 = kapteynBound(n, x);
  const kp1 = kapteynBound(n + 1, x);
  const kp2 = kapteynBound(n + 2, x);
  const a = km2 + 2 * e * km1 + (2 / n) * k0 + 2 * e * kp1 + kp2;
  const b = km2 + 2 * k0 + kp2;
  const n2 = n * n;
  return ((n2 * n2) / 32) * (a * a + (1 - e * e) * b * b + (4 / (3 * n2)) * k0 * k0);
}

/**
 * The last term of harmonicPowerBound alone, (n^4/32) (4/(3 n^2)) K_n^2 with K_n Kapteyn's bound on
 * J_n(n e): as computed, never above harmonicPowerBound(n, e) (its other terms are >= 0, and rounding
 * is monotone), so where it already exceeds a threshold the full bound does too. One Kapteyn bound
 * instead of five.
 */
export function harmonicPowerBoundPart(n: number, e: number): number {
  const k0 = kapteynBound(n, n * e);
  const n2 = n * n;
  return ((n2 * n2) / 32) * ((4 / (3 * n2)) * k0 * k0);
}

/** Harmonics needed so that the power fraction left out, 1 - sum_{n<=N} g(n,e)/F(e), is at most tol. */
export interface HarmonicCut {
  /** Highest harmonic kept, N. */
  nMax: number;
  /** Power fraction left out, from the sum rule sum_n g(n,e) = F(e) (Peters & Mathews 1963, eq. 17). */
  omittedFraction: number;
}

/** Hard cap on harmonics (cost grows as N^2): reached only for e above about 0.98. */
export const HARMONIC_LIMIT = 40_000;

/**
 * Smallest N with 1 - sum_{n<=N} g(n,e)/F(e) <= tol (the sum rule gives the omitted power exactly,
 * since every g(n,e) >= 0). Throws RangeError when HARMONIC_LIMIT is reached first.
 */
export function harmonicCut(e: number, tol: number): HarmonicCut {
  if (!(e >= 0 && e < 1)) throw new RangeError(`harmonicCut: eccentricity must lie in [0, 1), got ${e}`);
  if (!(tol > 0 && tol < 1)) throw new RangeError(`harmonicCut: tolerance must lie in (0, 1), got ${tol}`);
  const total = eccentricityEnhancement(e);
  let partial = 0;
  for (let n = 1; n <= HARMONIC_LIMIT; n++) {
    partial += harmonicPower(n, e);
    const omitted = 1 - partial / total;
    // Past the peak and the sum rule satisfied (the rounding floor of the sum is about n * 1e-16).
    if (n >= 2 && omitted <= tol) return { nMax: n, omittedFraction: Math.max(omitted, 0) };
  }
  throw new RangeError(`harmonicCut: more than ${HARMONIC_LIMIT} harmonics needed at e = ${e} for tolerance ${tol}`);
}
