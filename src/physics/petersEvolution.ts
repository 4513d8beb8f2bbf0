// Orbital decay of an eccentric binary by gravitational radiation alone (Peters 1964, Phys. Rev. 136,
// B1224): the rates da/dt and de/dt, and the closed form a(e) they imply, which with Kepler's third law
// maps an eccentricity e0 at orbital frequency f0 to the eccentricity at any other orbital frequency.
// The map depends only on f/f0 and e0, not on the masses.
import { C_SI, G_SI } from './constants';

/**
 * ln of the Peters 1964 shape a(e)/c0 = e^(12/19) / (1 - e^2) * (1 + 121/304 e^2)^(870/2299)
 * (Peters 1964, eq. 5.11), for 0 < e < 1.
 */
export function petersShapeLog(e: number): number {
  const e2 = e * e;
  return (12 / 19) * Math.log(e) - Math.log1p(-e2) + (870 / 2299) * Math.log1p((121 / 304) * e2);
}

/** d ln(a/c0) / de of the shape above. */
function petersShapeLogSlope(e: number): number {
  const e2 = e * e;
  return 12 / (19 * e) + (2 * e) / (1 - e2) + ((870 / 2299) * (242 / 304) * e) / (1 + (121 / 304) * e2);
}

/**
 * Eccentricity at orbital frequency f, given e0 at orbital frequency f0, under GW-driven decay:
 * Kepler (a^3 proportional to 1/f^2 at fixed mass) and the Peters 1964 a(e) give
 * ln a(e)/c0 = ln a(e0)/c0 - (2/3) ln(f/f0). Valid for any ratio f/f0 > 0 (ratios below 1 run
 * the orbit backwards in time). Solved by Newton's method in s = ln(e/(1-e)), safeguarded by bisection;
 * guess (optional) is an eccentricity near the answer, e.g. the solution at a nearby ratio.
 */
export function eccentricityAtOrbitalFrequency(e0: number, frequencyRatio: number, guess?: number): number {
  if (!(e0 >= 0 && e0 < 1)) throw new RangeError(`eccentricity e0 must lie in [0, 1), got ${e0}`);
  checkRatio(frequencyRatio);
  return e0 === 0 ? 0 : eccentricityFromShape(e0, petersShapeLog(e0), frequencyRatio, guess);
}

function checkRatio(frequencyRatio: number): void {
  if (!(frequencyRatio > 0) || !Number.isFinite(frequencyRatio)) {
    throw new RangeError(`orbital frequency ratio f/f0 must be positive and finite, got ${frequencyRatio}`);
  }
}

/**
 * eccentricityAtOrbitalFrequency for 0 < e0 < 1 given shapeLog0 = petersShapeLog(e0) (computed once
 * by a caller that solves for many ratios at one e0).
 */
export function eccentricityFromShape(e0: number, shapeLog0: number, frequencyRatio: number, guess?: number): number {
  checkRatio(frequencyRatio);
  if (frequencyRatio === 1) return e0;
  const target = shapeLog0 - (2 / 3) * Math.log(frequencyRatio);
  // Bracket in s = logit(e). At s = -745 e underflows; at s = 37, 1 - e underflows.
  let lo = -745;
  let hi = 37;
  // Start from a nearby solution if the caller has one, else from the small-e law
  // e ~ e0 (f/f0)^(-19/18) (Peters 1964, eq. 5.11 at small e) capped below 1.
  const start = guess !== undefined && guess > 0 && guess < 1 ? guess : Math.min(e0 * Math.pow(frequencyRatio, -19 / 18), 1 - 1e-12);
  let s = Math.log(start) - Math.log1p(-start);
  if (!(s > lo && s < hi)) s = 0.5 * (lo + hi);
  const tol = 2e-15 * (Math.abs(target) + 1);
  for (let iter = 0; iter < 200; iter++) {
    const e = 1 / (1 + Math.exp(-s));
    const residual = petersShapeLog(e) - target;
    if (Math.abs(residual) <= tol) break;
    if (residual > 0) hi = s;
    else lo = s;
    const slope = petersShapeLogSlope(e) * e * (1 - e);
    let next = s - residual / slope;
    if (!(next > lo && next < hi) || !Number.isFinite(next)) next = 0.5 * (lo + hi);
    if (next === s) break;
    s = next;
  }
  return 1 / (1 + Math.exp(-s));
}

/** da/dt = -(64/5) G^3 m1 m2 M / (c^5 a^3 (1-e^2)^(7/2)) (1 + 73/24 e^2 + 37/96 e^4), m/s (Peters 1964, eq. 5.6). */
export function gwSemiMajorAxisRate(aM: number, e: number, m1Kg: number, m2Kg: number): number {
  const e2 = e * e;
  const G3 = G_SI * G_SI * G_SI;
  const c5 = C_SI ** 5;
  return (
    (-(64 / 5) * G3 * m1Kg * m2Kg * (m1Kg + m2Kg) * (1 + (73 / 24) * e2 + (37 / 96) * e2 * e2)) /
    (c5 * aM ** 3 * Math.pow(1 - e2, 3.5))
  );
}

/** de/dt = -(304/15) e G^3 m1 m2 M / (c^5 a^4 (1-e^2)^(5/2)) (1 + 121/304 e^2), 1/s (Peters 1964, eq. 5.7). */
export function gwEccentricityRate(aM: number, e: number, m1Kg: number, m2Kg: number): number {
  const e2 = e * e;
  const G3 = G_SI * G_SI * G_SI;
  const c5 = C_SI ** 5;
  return (-(304 / 15) * e * G3 * m1Kg * m2Kg * (m1Kg + m2Kg) * (1 + (121 / 304) * e2)) / (c5 * aM ** 4 * Math.pow(1 - e2, 2.5));
}

/** Orbital frequency of a Keplerian orbit, f_orb = sqrt(G M / a^3) / (2 pi), Hz (Kepler's third law). */
export function keplerOrbitalFrequency(aM: number, mKg: number): number {
  return Math.sqrt((G_SI * mKg) / (aM * aM * aM)) / (2 * Math.PI);
}

/** Semi-major axis for an orbital frequency, a = (G M / (2 pi f_orb)^2)^(1/3), m (Kepler's third law). */
export function keplerSemiMajorAxis(fOrbHz: number, mKg: number): number {
  const w = 2 * Math.PI * fOrbHz;
  return Math.cbrt((G_SI * mKg) / (w * w));
}
