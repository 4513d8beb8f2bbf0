// The Hellings & Downs correlation of timing residuals between two pulsars induced by an isotropic,
// unpolarised gravitational-wave background, and its expectation over isotropic pulsar positions.

import { gaussLegendreRule } from './gaussLegendre';

/**
 * Correlation for two distinct pulsars an angle `separationRad` apart (Earth terms only):
 * Gamma = (3/2) x ln x - x/4 + 1/2 with x = (1 - cos zeta)/2 (Hellings & Downs 1983, ApJ 265, L39),
 * normalised so that Gamma -> 1/2 as zeta -> 0 (the pulsar-term auto-correlation that would make a
 * pulsar's correlation with itself 1 is left out: it concerns the same pulsar, not a pair).
 */
export function hellingsDowns(separationRad: number): number {
  return hellingsDownsOfX((1 - Math.cos(separationRad)) / 2);
}

/** The same correlation as a function of x = (1 - cos zeta)/2 in [0, 1] (Hellings & Downs 1983). */
export function hellingsDownsOfX(x: number): number {
  // x ln x -> 0 as x -> 0: the limit 1/2 at zero separation.
  const xLogX = x > 0 ? x * Math.log(x) : 0;
  return 1.5 * xLogX - x / 4 + 0.5;
}

/** Angle between two directions on the sky given as right ascension and declination, radians. */
export function angularSeparation(ra1: number, dec1: number, ra2: number, dec2: number): number {
  // Haversine form (Sinnott 1984, Sky & Telescope 68 (2), 159): accurate at small separations.
  const sdDec = Math.sin((dec2 - dec1) / 2);
  const sdRa = Math.sin((ra2 - ra1) / 2);
  const h = sdDec * sdDec + Math.cos(dec1) * Math.cos(dec2) * sdRa * sdRa;
  return 2 * Math.asin(Math.min(1, Math.sqrt(h)));
}

/**
 * Nodes and weights for the expectation over isotropic pulsar positions. For two independent
 * isotropic directions cos zeta is uniform on [-1, 1], so x = (1 - cos zeta)/2 is uniform on [0, 1]
 * (the probability density of zeta is sin(zeta)/2). The expectation of any function of Gamma is then
 * Int_0^1 g(Gamma(x)) dx. Gamma has an x ln x term, so the rule substitutes x = u^2, which makes
 * the integrand smooth enough for Gauss-Legendre (Abramowitz & Stegun 1964, 25.4.29) to converge fast.
 */
export interface SkyAverageRule {
  /** Hellings & Downs correlation at each node. */
  gamma: Float64Array;
  /** Weights summing to 1 (the probability of each node). */
  weight: Float64Array;
}

let cachedRule: SkyAverageRule | null = null;

/** The rule used for sky averages: 48 Gauss-Legendre points in u = sqrt(x) on [0, 1]. */
export function skyAverageRule(): SkyAverageRule {
  if (cachedRule) return cachedRule;
  const n = 48;
  const { nodes, weights } = gaussLegendreRule(n);
  const gamma = new Float64Array(n);
  const weight = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const u = (nodes[i] + 1) / 2; // map [-1, 1] to [0, 1]
    const x = u * u;
    gamma[i] = hellingsDownsOfX(x);
    weight[i] = (weights[i] / 2) * 2 * u; // dx = 2u du, du = dt/2
  }
  cachedRule = { gamma, weight };
  return cachedRule;
}

/** Expectation of g(Gamma) for a pair of pulsars at independent isotropic positions. */
export function skyAverage(g: (gamma: number) => number): number {
  const { gamma, weight } = skyAverageRule();
  let s = 0;
  for (let i = 0; i < gamma.length; i++) s += weight[i] * g(gamma[i]);
  return s;
}
