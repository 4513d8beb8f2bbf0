// One-dimensional Gaussian kernel density estimate (KDE) of posterior samples, evaluated directly
// (for checks) or tabulated once on an even grid and interpolated (for likelihoods in a tight loop).
//
// Bandwidth rules as scipy.stats.gaussian_kde (checked against it in test/statistics/kde.test.ts):
// kernel sd h = s * factor with s the sample standard deviation (n - 1 in the denominator) and
//   Scott:     factor = n^(-1/5)            (Scott 1992, Multivariate Density Estimation, Wiley; the rule scipy uses, d = 1)
//   Silverman: factor = (3n/4)^(-1/5)       (Silverman 1986, Density Estimation, Chapman & Hall; scipy's d-form)
// Tabulation: linear binning of the samples onto a grid of spacing at most h/TABLE_STEPS_PER_H, then
// a discrete convolution with the kernel truncated at KERNEL_REACH_H kernel widths (Wand & Jones 1995,
// Kernel Smoothing, Chapman & Hall: binned kernel estimators); relative error about (delta/h)^2 / 8.

export type BandwidthRule = 'scott' | 'silverman';

/** Grid points per kernel width h in a tabulated KDE (delta <= h / 20: error ~ 3e-4 in the bulk). */
export const TABLE_STEPS_PER_H = 20;
/** The table reaches this many kernel widths beyond the outermost samples; the kernel is cut there too. */
export const KERNEL_REACH_H = 6;
const MAX_TABLE_POINTS = 1 << 16;
const LN_SQRT_2PI = 0.5 * Math.log(2 * Math.PI);

export function bandwidthFactor(n: number, rule: BandwidthRule): number {
  return rule === 'scott' ? Math.pow(n, -1 / 5) : Math.pow((3 * n) / 4, -1 / 5);
}

export function sampleMeanSd(x: ArrayLike<number>): { mean: number; sd: number } {
  let m = 0;
  for (let i = 0; i < x.length; i++) m += x[i];
  m /= x.length;
  return { mean: m, sd: sdAbout(x, m) };
}

/** Sample standard deviation about the mean m (n - 1 in the denominator). */
function sdAbout(x: ArrayLike<number>, m: number): number {
  const n = x.length;
  let v = 0;
  for (let i = 0; i < n; i++) v += (x[i] - m) * (x[i] - m);
  return Math.sqrt(v / (n - 1));
}

/** Kernel width from the samples' standard deviation under the rule; refuses samples without spread. */
function widthOfSd(sd: number, n: number, rule: BandwidthRule): number {
  if (!(sd > 0)) throw new RangeError('all samples are equal: a KDE needs spread in the samples');
  return sd * bandwidthFactor(n, rule);
}

/** Kernel standard deviation h for the samples under the rule. Needs two distinct samples. */
export function kernelWidth(x: ArrayLike<number>, rule: BandwidthRule = 'scott'): number {
  if (x.length < 2) throw new RangeError(`a KDE needs at least 2 samples, got ${x.length}`);
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i])) throw new RangeError(`sample ${i + 1} is not a finite number (${x[i]})`);
  }
  return widthOfSd(sampleMeanSd(x).sd, x.length, rule);
}

/** ln of the KDE at t by direct summation over every sample (O(n); for checks and small data). */
export function kdeLogDensityDirect(x: ArrayLike<number>, h: number, t: number): number {
  // log-sum-exp over the kernels, so far tails stay finite.
  let maxE = -Infinity;
  for (let i = 0; i < x.length; i++) maxE = Math.max(maxE, -0.5 * ((t - x[i]) / h) ** 2);
  let s = 0;
  for (let i = 0; i < x.length; i++) s += Math.exp(-0.5 * ((t - x[i]) / h) ** 2 - maxE);
  return maxE + Math.log(s) - Math.log(x.length * h) - LN_SQRT_2PI;
}

export interface KdeTable {
  /** Grid start, spacing and number of points: x_i = x0 + i dx. A reflecting edge with samples within
   * reach of it is the first (x0) or last grid point; the density is zero off the table. */
  x0: number;
  dx: number;
  size: number;
  /** Kernel width used. */
  h: number;
  /** ln density at each grid point (-Infinity where the binned sum is 0). */
  logDensity: Float64Array;
  /** Cumulative probability at each grid point (trapezoid rule on the density from x0; ends at about 1). */
  cdf: Float64Array;
  /** Largest ln density on the grid. */
  logPeak: number;
}

export interface KdeTableOptions {
  rule?: BandwidthRule;
  /** Kernel width to use instead of the rule's. */
  h?: number;
  /** Samples are reflected at these edges (the support of the prior), and the table stops there. */
  lowerEdge?: number;
  upperEdge?: number;
}

/**
 * Tabulates the KDE of the samples. With edges, samples within reach of a finite edge are mirrored
 * about it so the estimate keeps its mass inside (reflection method, Silverman 1986, Density
 * Estimation, Chapman & Hall); the edge is a grid point, so the density is zero beyond it and the cdf
 * integrates over the inside only. Without edges the result is scipy's gaussian_kde on the table.
 */
export function tabulateKde(x: ArrayLike<number>, opts: KdeTableOptions = {}): KdeTable {
  const n = x.length;
  if (opts.h === undefined && n < 2) throw new RangeError(`a KDE needs at least 2 samples, got ${n}`);
  // Each pass over the samples or the grid is a function of its own, compiled on its own while cold.
  const { min, max, sum } = sampleRange(x);
  const h = opts.h ?? widthFromSum(x, sum, opts.rule ?? 'scott');
  if (!(h > 0 && Number.isFinite(h))) throw new RangeError(`kernel width must be positive and finite, got ${h}`);
  const a = opts.lowerEdge ?? -Infinity;
  const b = opts.upperEdge ?? Infinity;
  if (min < a || max > b) throw new RangeError(`samples run from ${min} to ${max}, outside the edges ${a} to ${b}`);
  const reach = KERNEL_REACH_H * h;
  // The table runs from L to H: from an edge that has samples within reach of it (so the edge is a
  // grid point, the density is zero beyond it and the cdf integrates from it), else from reach
  // beyond the outermost sample. Mirror images are binned on `pad` more points beyond each such edge.
  const lowEdge = min < a + reach;
  const highEdge = max > b - reach;
  const L = lowEdge ? a : min - reach;
  const H = highEdge ? b : max + reach;
  const { steps, dx, pad } = tableSteps(H - L, h, reach, lowEdge, highEdge);
  const padLo = lowEdge ? pad : 0;
  const size = steps + 1 + padLo + (highEdge ? pad : 0);
  const lo = L - padLo * dx;
  const counts = binSamples(x, lo, dx, size, a, b, reach);
  const m = Math.min(Math.ceil(reach / dx), size - 1);
  const span = { from: padLo, to: padLo + steps };
  const dens = convolve(counts, gaussianKernel(m, dx, h, 1 / (n * h * Math.sqrt(2 * Math.PI))), span);
  return { x0: L, dx, size: steps + 1, h, ...logAndCdf(dens.subarray(span.from, span.to + 1), dx) };
}

/**
 * Grid steps across a table of width w, their spacing dx <= h / TABLE_STEPS_PER_H (coarser only when
 * the grid would pass MAX_TABLE_POINTS, mirror-image points included) and the points `pad` the grid
 * reaches beyond an edge. With an upper edge, dx is nudged up until w / dx <= steps and w * (1 / dx) <= steps,
 * so the edge itself is read at most at the last grid point, not past it.
 */
function tableSteps(w: number, h: number, reach: number, lowEdge: boolean, highEdge: boolean): { steps: number; dx: number; pad: number } {
  const edges = (lowEdge ? 1 : 0) + (highEdge ? 1 : 0);
  let steps = Math.max(Math.ceil((w / h) * TABLE_STEPS_PER_H), 2);
  let dx = w / steps;
  // images lie within reach of their edge and within the table's width w of it
  let pad = Math.min(Math.ceil(reach / dx), steps + 1);
  if (steps + 1 + edges * pad > MAX_TABLE_POINTS) {
    // very wide spread against h: a coarser table (pad only shrinks as dx grows)
    steps = Math.max(MAX_TABLE_POINTS - 1 - edges * pad, 2);
    dx = w / steps;
    pad = Math.min(Math.ceil(reach / dx), steps + 1);
  }
  if (highEdge) while (w / dx > steps || w * (1 / dx) > steps) dx *= 1 + Number.EPSILON;
  return { steps, dx, pad };
}

/** Smallest and largest sample and their sum (in order); refuses a sample that is not a finite number. */
function sampleRange(x: ArrayLike<number>): { min: number; max: number; sum: number } {
  let min = Infinity;
  let max = -Infinity;
  let sum = 0;
  for (let i = 0; i < x.length; i++) {
    const v = x[i];
    if (!(v - v === 0)) throw new RangeError(`sample ${i + 1} is not a finite number (${v})`);
    if (v < min) min = v;
    if (v > max) max = v;
    sum += v;
  }
  return { min, max, sum };
}

/** kernelWidth(x, rule) given the sum of the finite samples x (the mean as sampleMeanSd takes it). */
function widthFromSum(x: ArrayLike<number>, sum: number, rule: BandwidthRule): number {
  return widthOfSd(sdAbout(x, sum / x.length), x.length, rule);
}

/**
 * Linear binning of the samples (and their mirror images within reach of an edge) onto the grid
 * lo + i dx: each sample adds 1 - w and w to the points either side of it, then its images do.
 */
function binSamples(x: ArrayLike<number>, lo: number, dx: number, size: number, a: number, b: number, reach: number): Float64Array {
  const counts = new Float64Array(size);
  const last = size - 1;
  for (let i = 0; i < x.length; i++) {
    const v = x[i];
    // Both images are computed for every sample, so the optimised code has seen their arithmetic
    // even when the first samples have none within reach.
    const va = 2 * a - v;
    const vb = 2 * b - v;
    // the sample, then its image about a, then about b (images that fall on the table are kept)
    for (let image = 0; image < 3; image++) {
      let y = v;
      if (image === 1) {
        if (!(v - a < reach)) continue;
        y = va;
      } else if (image === 2) {
        if (!(b - v < reach)) continue;
        y = vb;
      }
      const t = (y - lo) / dx;
      if (t < 0 || t > last) continue;
      const j = t < last - 1 ? Math.floor(t) : last - 1;
      const w = t - j;
      counts[j] += 1 - w;
      counts[j + 1] += w;
    }
  }
  return counts;
}

/** norm x exp(-(j dx / h)^2 / 2) for j = 0 .. m. */
function gaussianKernel(m: number, dx: number, h: number, norm: number): Float64Array {
  const kernel = new Float64Array(m + 1);
  for (let j = 0; j <= m; j++) kernel[j] = norm * Math.exp(-0.5 * ((j * dx) / h) ** 2);
  return kernel;
}

interface Span {
  from: number;
  to: number;
}

/**
 * Discrete convolution of the binned counts with the kernel cut at m = kernel.length - 1 points, at
 * the grid points of `span` (zero elsewhere). Each point's terms are added in order of the count's
 * index, over the counts that are not zero, as a pass adding each count to its 2m + 1 neighbours
 * would add them.
 */
function convolve(counts: Float64Array, kernel: Float64Array, span: Span): Float64Array {
  const size = counts.length;
  const m = kernel.length - 1;
  let first = 0;
  while (first < size && counts[first] === 0) first++;
  let last = size - 1;
  while (last > first && counts[last] === 0) last--;
  const dens = new Float64Array(size);
  // Points farther than m from every count stay zero. Each bound is computed before it is compared,
  // so optimised code compiled early in a call has seen every operation (no deoptimisation later).
  const from = first - m;
  const to = last + m;
  const jHi = to < span.to ? to : span.to;
  for (let j = from > span.from ? from : span.from; j <= jHi; j++) {
    const left = j - m;
    const right = j + m;
    const iLo = left > first ? left : first;
    const iHi = right < last ? right : last;
    let s = 0;
    for (let i = iLo; i < j && i <= iHi; i++) s += counts[i] * kernel[j - i];
    for (let i = j > iLo ? j : iLo; i <= iHi; i++) s += counts[i] * kernel[i - j];
    dens[j] = s;
  }
  return dens;
}

/** ln density, trapezoid cdf and peak of the convolved density. */
function logAndCdf(dens: Float64Array, dx: number): { logDensity: Float64Array; cdf: Float64Array; logPeak: number } {
  const size = dens.length;
  const logDensity = new Float64Array(size);
  const cdf = new Float64Array(size);
  let logPeak = -Infinity;
  for (let i = 0; i < size; i++) {
    logDensity[i] = Math.log(dens[i]);
    if (logDensity[i] > logPeak) logPeak = logDensity[i];
    if (i > 0) cdf[i] = cdf[i - 1] + 0.5 * (dens[i] + dens[i - 1]) * dx;
  }
  return { logDensity, cdf, logPeak };
}

/** ln density from the table by linear interpolation in ln p; -Infinity off the table. */
export function tableLogDensity(t: KdeTable, x: number): number {
  const u = (x - t.x0) / t.dx;
  if (!(u >= 0 && u <= t.size - 1)) return -Infinity;
  const j = Math.min(Math.floor(u), t.size - 2);
  const w = u - j;
  const a = t.logDensity[j];
  const b = t.logDensity[j + 1];
  if (a === -Infinity || b === -Infinity) return w < 0.5 ? a : b;
  return a + w * (b - a);
}

/** Cumulative probability from the table (0 below it, its last value above it). */
export function tableCdf(t: KdeTable, x: number): number {
  const u = (x - t.x0) / t.dx;
  if (!(u > 0)) return 0;
  if (u >= t.size - 1) return t.cdf[t.size - 1];
  const j = Math.floor(u);
  return t.cdf[j] + (u - j) * (t.cdf[j + 1] - t.cdf[j]);
}
