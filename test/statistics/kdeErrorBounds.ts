// Error bounds of a linearly binned Gaussian KDE on a grid of step d (Wand & Jones 1995, Kernel
// Smoothing, Chapman & Hall: binned kernel estimators), and the exact reflected KDE they are checked
// against (reflection method, Silverman 1986, Density Estimation, Chapman & Hall).
// Linear binning puts each sample y (or mirror image) on its two grid neighbours with weights that
// make the binned kernel at a grid point g the straight-line interpolation of K_h(g - y) between
// them, so its error is at most d^2/8 max|K_h''| = d^2 / (8 sqrt(2 pi) h^3) per binned point (the
// error of linear interpolation, Abramowitz & Stegun 1964, Handbook of Mathematical Functions, 25.2.4).
import { KERNEL_REACH_H } from '../../src/statistics/gaussianKde1d';

const SQRT_2PI = Math.sqrt(2 * Math.PI);
/** Kernel value at the cut, phi(KERNEL_REACH_H), and the Gaussian tail mass beyond it (A&S 1964, 26.2.12, an upper bound). */
const PHI_CUT = Math.exp(-0.5 * KERNEL_REACH_H ** 2) / SQRT_2PI;
const TAIL_CUT = PHI_CUT / KERNEL_REACH_H;

/** Exact reflected KDE at t: sum over the samples and their images 2a - x, 2b - x (every one), / (n h); and its slope. */
export function reflectedKde(x: ArrayLike<number>, h: number, a: number, b: number, t: number): { density: number; slope: number } {
  let f = 0;
  let df = 0;
  const add = (c: number) => {
    const u = (t - c) / h;
    const k = Math.exp(-0.5 * u * u);
    f += k;
    df -= u * k;
  };
  for (let i = 0; i < x.length; i++) {
    add(x[i]);
    if (Number.isFinite(a)) add(2 * a - x[i]);
    if (Number.isFinite(b)) add(2 * b - x[i]);
  }
  const norm = 1 / (x.length * h * SQRT_2PI);
  return { density: f * norm, slope: (df * norm) / h };
}

/** Points binned per sample: the sample, plus its image about each edge it lies within `reach` of. */
export function binnedPointsPerSample(x: ArrayLike<number>, a: number, b: number, reach: number): number {
  let m = x.length;
  for (let i = 0; i < x.length; i++) {
    if (x[i] - a < reach) m++;
    if (b - x[i] < reach) m++;
  }
  return m / x.length;
}

/**
 * Bound on |binned - exact| density at a grid point: d^2 / (8 sqrt(2 pi) h^3) per binned point, plus
 * the kernel cut at KERNEL_REACH_H h (phi there / h per point, and as much for images not binned).
 */
export function nodeDensityErrorBound(d: number, h: number, pointsPerSample: number): number {
  return (pointsPerSample * d * d) / (8 * SQRT_2PI * h ** 3) + (2 * pointsPerSample * PHI_CUT) / h;
}

/**
 * Bound on interpolating linearly in ln p between grid values f1, f2 instead of linearly in p: the
 * chord of the convex exp minus the curve is at most max|second derivative| / 8 = ln(f2/f1)^2 max(f1, f2) / 8.
 */
export function interpolationErrorBound(f1: number, f2: number): number {
  return (Math.log(f2 / f1) ** 2 * Math.max(f1, f2)) / 8;
}

/**
 * Bound on the table's cdf against the exact one, given max|f'| of the estimate:
 * binning, d^2/8 max|K_h'| per binned point (as above, for the kernel's cdf: max|K_h'| = e^(-1/2) / (sqrt(2 pi) h^2));
 * trapezoid rule from the edge, d^2/12 |f'(t) - f'(a)| <= d^2/6 max|f'| (leading Euler-Maclaurin term,
 * A&S 1964, 23.1.30); linear interpolation of the cdf between grid points, d^2/8 max|f'| (A&S 1964, 25.2.4);
 * and the kernel's tail mass beyond the cut.
 */
export function cdfErrorBound(d: number, h: number, pointsPerSample: number, maxSlope: number): number {
  const binning = (pointsPerSample * d * d * Math.exp(-0.5)) / (8 * SQRT_2PI * h * h);
  return binning + d * d * maxSlope * (1 / 6 + 1 / 8) + 2 * pointsPerSample * TAIL_CUT;
}
