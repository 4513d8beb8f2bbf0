// The standard normal distribution: cdf, complementary cdf, quantile and density, written from
// handbook formulas so that tests can check it against jstat and scipy independently.

const SQRT2 = Math.SQRT2;
const TWO_OVER_SQRT_PI = 2 / Math.sqrt(Math.PI);
const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

/** erf(x) by its Maclaurin series (Abramowitz & Stegun 1964, eq. 7.1.5); used for |x| < 2. */
function erfSeries(x: number): number {
  const x2 = x * x;
  let term = x; // (-1)^n x^(2n+1) / n!
  let sum = x;
  for (let n = 1; n < 200; n++) {
    term *= -x2 / n;
    const add = term / (2 * n + 1);
    sum += add;
    if (Math.abs(add) < 1e-17 * Math.abs(sum)) break;
  }
  return TWO_OVER_SQRT_PI * sum;
}

/**
 * erfc(x) for x >= 2 by its continued fraction (Abramowitz & Stegun 1964, eq. 7.1.14),
 * evaluated with the modified Lentz method (Lentz 1976, Appl. Opt. 15, 668).
 * erfc x = exp(-x^2)/sqrt(pi) * 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + 2/(x + ...))))).
 */
function erfcContinuedFraction(x: number): number {
  const tiny = 1e-300;
  let f = x;
  let c = x;
  let d = 0;
  for (let k = 1; k < 500; k++) {
    const a = k / 2;
    d = x + a * d;
    d = Math.abs(d) < tiny ? tiny : d;
    c = x + a / c;
    c = Math.abs(c) < tiny ? tiny : c;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-x * x) / Math.sqrt(Math.PI) / f;
}

/** Complementary error function for any real x. */
export function erfc(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x >= 2) return erfcContinuedFraction(x);
  if (x <= -2) return 2 - erfcContinuedFraction(-x);
  return 1 - erfSeries(x);
}

/** Standard normal density phi(z). */
export function normalDensity(z: number): number {
  return INV_SQRT_2PI * Math.exp(-0.5 * z * z);
}

/** Standard normal cdf Phi(z) = erfc(-z/sqrt 2)/2 (Abramowitz & Stegun 1964, eq. 26.2.29). */
export function normalCdf(z: number): number {
  return 0.5 * erfc(-z / SQRT2);
}

/** Upper tail Q(z) = 1 - Phi(z), accurate far into the tail. */
export function normalUpperTail(z: number): number {
  return 0.5 * erfc(z / SQRT2);
}

/**
 * Standard normal quantile Phi^-1(p) for p in (0,1): starting value from the rational
 * approximation of Abramowitz & Stegun 1964, eq. 26.2.23 (|error| < 4.5e-4), then Halley
 * iterations on the tail probability (Halley's method, e.g. Press et al. 2007, Numerical
 * Recipes 3rd ed., sec. 6.14.1) to full double precision.
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) {
    if (p === 0) return -Infinity;
    if (p === 1) return Infinity;
    return NaN;
  }
  const lower = p < 0.5;
  const q = lower ? p : 1 - p; // tail probability in (0, 0.5]
  const t = Math.sqrt(-2 * Math.log(q));
  let z = t - (2.515517 + 0.802853 * t + 0.010328 * t * t) / (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t);
  // Solve Q(z) = q for z >= 0 (upper tail), then mirror.
  for (let i = 0; i < 6; i++) {
    const err = normalUpperTail(z) - q;
    const dens = normalDensity(z);
    if (dens === 0) break;
    const u = err / dens; // Newton step for Q (Q' = -phi)
    const step = u / (1 - 0.5 * z * u); // Halley correction (Q'' = z phi)
    z += step;
    if (Math.abs(step) < 1e-15 * Math.max(1, Math.abs(z))) break;
  }
  return lower ? -z : z;
}

/** Half-width in sigma of the central interval holding probability `level`: Phi^-1((1+level)/2). */
export function centralIntervalSigmas(level: number): number {
  return normalQuantile(0.5 + 0.5 * level);
}

/** Probability inside the central interval of +-k sigma: erf(k / sqrt 2) (A&S 1964, eq. 26.2.7 context). */
export function probabilityWithinSigmas(k: number): number {
  return 1 - erfc(k / SQRT2);
}
