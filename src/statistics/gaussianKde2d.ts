// Two-dimensional Gaussian KDE as scipy.stats.gaussian_kde: kernel covariance = sample covariance
// (n - 1) times factor^2, Scott's factor n^(-1/6) for d = 2 (Scott 1992, Multivariate Density
// Estimation, Wiley). Samples are whitened by the Cholesky factor L of the sample covariance
// (z = L^-1 (x - mean)), where the kernel is isotropic with sd = factor and separable, then binned
// bilinearly onto a grid and convolved along each axis (binned KDE, Wand & Jones 1995, Kernel Smoothing).
// The density in x is the density in z divided by det L.

import { NO_TIME_CHECK, type TimeCheck } from '../physics/timeCheck';

export interface Kde2dTable {
  mean: [number, number];
  /** Lower-triangular Cholesky factor of the sample covariance: [l11, l21, l22]. */
  chol: [number, number, number];
  factor: number;
  /** z grid: start, spacing, points per axis (the same for both axes). */
  z0: [number, number];
  dz: number;
  size: number;
  /** The samples in whitened coordinates (as whiten()). */
  zs1: Float64Array;
  zs2: Float64Array;
  /**
   * Density in z at grid point (i, j) (i along z1). Each point is smoothed on its first read and kept:
   * a credible level reads only the points around the samples, not the whole grid.
   */
  densityAtNode(i: number, j: number): number;
}

export const KDE2D_GRID = 256;
const REACH = 5;

export function choleskyOfSamples(u: ArrayLike<number>, v: ArrayLike<number>) {
  const n = u.length;
  let mu = 0;
  let mv = 0;
  for (let i = 0; i < n; i++) {
    mu += u[i];
    mv += v[i];
  }
  mu /= n;
  mv /= n;
  let suu = 0;
  let suv = 0;
  let svv = 0;
  for (let i = 0; i < n; i++) {
    const a = u[i] - mu;
    const b = v[i] - mv;
    suu += a * a;
    suv += a * b;
    svv += b * b;
  }
  suu /= n - 1;
  suv /= n - 1;
  svv /= n - 1;
  const l11 = Math.sqrt(suu);
  const l21 = suv / l11;
  const l22sq = svv - l21 * l21;
  if (!(l11 > 0 && l22sq > 1e-14 * svv)) throw new RangeError('the samples lie on a line: a 2-D density needs spread in both directions');
  return { mean: [mu, mv] as [number, number], chol: [l11, l21, Math.sqrt(l22sq)] as [number, number, number] };
}

/** Whitened coordinates of the point (u, v). */
export function whiten(t: Pick<Kde2dTable, 'mean' | 'chol'>, u: number, v: number): [number, number] {
  const [l11, l21, l22] = t.chol;
  const z1 = (u - t.mean[0]) / l11;
  const z2 = (v - t.mean[1] - l21 * z1) / l22;
  return [z1, z2];
}

/** `checkTime` is called once per grid row of the row pass (TimeCheck). */
export function tabulateKde2d(u: ArrayLike<number>, v: ArrayLike<number>, size = KDE2D_GRID, checkTime: TimeCheck = NO_TIME_CHECK): Kde2dTable {
  const n = u.length;
  if (n < 3 || v.length !== n) throw new RangeError(`a 2-D KDE needs at least 3 pairs of samples, got ${Math.min(n, v.length)}`);
  const { mean, chol } = choleskyOfSamples(u, v);
  const factor = Math.pow(n, -1 / 6);
  // Each pass is a function of its own, compiled on its own while the cell runs cold.
  const w = whitenAll(u, v, mean, chol);
  const lo = Math.min(w.lo1, w.lo2) - REACH * factor;
  const hi = Math.max(w.hi1, w.hi2) + REACH * factor;
  const dz = (hi - lo) / (size - 1);
  const counts = binPairs(w.zs1, w.zs2, lo, dz, size);
  const m = Math.min(Math.ceil((REACH * factor) / dz), size - 1);
  const kern = new Float64Array(m + 1);
  for (let j = 0; j <= m; j++) kern[j] = Math.exp(-0.5 * ((j * dz) / factor) ** 2);
  // Rows and columns of the grid that hold binned samples (bilinear binning fills index and index + 1).
  const first = (z: number) => Math.min(Math.floor((z - lo) / dz), size - 2);
  const rows = { from: first(w.lo2), to: first(w.hi2) + 1 };
  const cols = { from: first(w.lo1), to: first(w.hi1) + 1 };
  const smoothed = smoothRows(counts, kern, size, rows, cols, checkTime);
  const nodes = new Float64Array(size * size).fill(NaN);
  const norm = 1 / (n * 2 * Math.PI * factor * factor);
  return {
    mean,
    chol,
    factor,
    z0: [lo, lo],
    dz,
    size,
    zs1: w.zs1,
    zs2: w.zs2,
    densityAtNode(i, j) {
      const at = j * size + i;
      const d = nodes[at];
      if (d === d) return d;
      return (nodes[at] = smoothColumnAt(smoothed, kern, size, norm, i, j));
    },
  };
}

/** Whitened samples and the smallest and largest whitened coordinate along each axis. */
function whitenAll(u: ArrayLike<number>, v: ArrayLike<number>, mean: [number, number], chol: [number, number, number]) {
  const n = u.length;
  const [l11, l21, l22] = chol;
  const zs1 = new Float64Array(n);
  const zs2 = new Float64Array(n);
  let lo1 = Infinity;
  let hi1 = -Infinity;
  let lo2 = Infinity;
  let hi2 = -Infinity;
  for (let i = 0; i < n; i++) {
    // as whiten()
    const a = (u[i] - mean[0]) / l11;
    const b = (v[i] - mean[1] - l21 * a) / l22;
    zs1[i] = a;
    zs2[i] = b;
    if (a < lo1) lo1 = a;
    if (a > hi1) hi1 = a;
    if (b < lo2) lo2 = b;
    if (b > hi2) hi2 = b;
  }
  return { zs1, zs2, lo1, hi1, lo2, hi2 };
}

/** Bilinear binning of the whitened samples onto the size x size grid from lo, spacing dz. */
function binPairs(zs1: Float64Array, zs2: Float64Array, lo: number, dz: number, size: number): Float64Array {
  const counts = new Float64Array(size * size);
  for (let i = 0; i < zs1.length; i++) {
    const a = (zs1[i] - lo) / dz;
    const b = (zs2[i] - lo) / dz;
    const ia = Math.min(Math.floor(a), size - 2);
    const ib = Math.min(Math.floor(b), size - 2);
    const wa = a - ia;
    const wb = b - ib;
    counts[ib * size + ia] += (1 - wa) * (1 - wb);
    counts[ib * size + ia + 1] += wa * (1 - wb);
    counts[(ib + 1) * size + ia] += (1 - wa) * wb;
    counts[(ib + 1) * size + ia + 1] += wa * wb;
  }
  return counts;
}

interface Span {
  from: number;
  to: number;
}

/**
 * Convolution of each grid row with the kernel (cut at m = kern.length - 1 points), over the rows and
 * columns that hold counts (all others are zero). Every output point gets its terms in order of i.
 */
function smoothRows(counts: Float64Array, kern: Float64Array, size: number, rows: Span, cols: Span, checkTime: TimeCheck): Float64Array {
  const m = kern.length - 1;
  const last = size - 1;
  const out = new Float64Array(size * size);
  for (let r = rows.from; r <= rows.to; r++) {
    checkTime();
    const row = r * size;
    for (let i = cols.from; i <= cols.to; i++) {
      const c = counts[row + i];
      if (c === 0) continue;
      // bounds computed before they are compared (see smoothColumnAt)
      const left = i - m;
      const right = i + m;
      const jLo = left > 0 ? left : 0;
      const jHi = right < last ? right : last;
      for (let j = jLo; j < i; j++) out[row + j] += c * kern[i - j];
      for (let j = i; j <= jHi; j++) out[row + j] += c * kern[j - i];
    }
  }
  return out;
}

/**
 * Convolution of grid column i with the kernel at row j, times norm: the terms in order of the row r,
 * each norm * value * kernel (as a pass adding every row r to rows r - m .. r + m would give).
 */
function smoothColumnAt(smoothed: Float64Array, kern: Float64Array, size: number, norm: number, i: number, j: number): number {
  const m = kern.length - 1;
  // Each bound is computed before it is compared, so optimised code compiled while every point so
  // far was far from the grid's edges has seen every operation (no deoptimisation near an edge).
  const last = size - 1;
  const below = j - m;
  const above = j + m;
  const rLo = below > 0 ? below : 0;
  const rHi = above < last ? above : last;
  let s = 0;
  let at = rLo * size + i;
  for (let r = rLo; r < j; r++, at += size) s += norm * smoothed[at] * kern[j - r];
  for (let r = j; r <= rHi; r++, at += size) s += norm * smoothed[at] * kern[r - j];
  return s;
}

/** Density in z at whitened point (z1, z2) by bilinear interpolation; 0 off the grid. */
export function densityAtZ(t: Kde2dTable, z1: number, z2: number): number {
  const a = (z1 - t.z0[0]) / t.dz;
  const b = (z2 - t.z0[1]) / t.dz;
  const last = t.size - 1;
  if (!(a >= 0 && a <= last && b >= 0 && b <= last)) return 0;
  const ia = Math.min(a | 0, last - 1);
  const ib = Math.min(b | 0, last - 1);
  const wa = a - ia;
  const wb = b - ib;
  return (
    (1 - wb) * ((1 - wa) * t.densityAtNode(ia, ib) + wa * t.densityAtNode(ia + 1, ib)) +
    wb * ((1 - wa) * t.densityAtNode(ia, ib + 1) + wa * t.densityAtNode(ia + 1, ib + 1))
  );
}

/** Density in the original coordinates (u, v). */
export function kde2dDensity(t: Kde2dTable, u: number, v: number): number {
  const [z1, z2] = whiten(t, u, v);
  return densityAtZ(t, z1, z2) / (t.chol[0] * t.chol[2]);
}
