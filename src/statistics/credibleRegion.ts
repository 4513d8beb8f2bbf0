// Credible regions on a grid by highest posterior density: sort the normalised cell
// probabilities in decreasing order and accumulate until the requested mass is reached
// (e.g. Gelman et al. 2013, Bayesian Data Analysis, 3rd ed., sec. 2.3, highest posterior density).

export type AxisPrior = 'uniform' | 'log-uniform';

export interface GridAxis {
  values: Float64Array;
  /** Whether the grid is evenly spaced in log x (true) or x (false). */
  log: boolean;
  prior: AxisPrior;
}

/**
 * Prior probability mass of each grid point along an axis: the prior density times the cell width.
 * Evenly spaced in log with a log-uniform prior, or evenly spaced in x with a uniform prior: equal
 * weights. Mixed cases get a weight of x (log grid, uniform prior) or 1/x (linear grid, log prior).
 */
export function axisPriorWeights(axis: GridAxis): Float64Array {
  const n = axis.values.length;
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = axis.values[i];
    if (axis.log === (axis.prior === 'log-uniform')) w[i] = 1;
    else if (axis.log) w[i] = x; // d x = x d ln x
    else w[i] = 1 / x; // d ln x = dx / x
  }
  return w;
}

export interface HpdResult {
  /** The normalised posterior mass per grid cell (sums to 1), row-major [iy * nx + ix]. */
  posterior: Float64Array;
  /** For each requested level, the posterior-mass threshold: cells with mass >= threshold form the region. */
  thresholds: number[];
  /** The mass actually enclosed at each threshold (>= level, by at most one cell). */
  enclosed: number[];
}

/**
 * Highest-posterior-density thresholds for a grid of unnormalised posterior masses.
 * Non-finite or negative masses are refused.
 */
export function hpdThresholds(mass: Float64Array, levels: number[]): HpdResult {
  let total = 0;
  for (let i = 0; i < mass.length; i++) {
    const v = mass[i];
    if (!(Number.isFinite(v) && v >= 0)) throw new RangeError(`grid cell ${i} has posterior mass ${v}: must be finite and not negative`);
    total += v;
  }
  if (!(total > 0)) throw new RangeError('the posterior is zero on the whole grid: no credible region can be drawn');
  const posterior = new Float64Array(mass.length);
  for (let i = 0; i < mass.length; i++) posterior[i] = mass[i] / total;
  const order = Float64Array.from(posterior).sort().reverse();
  const thresholds: number[] = [];
  const enclosed: number[] = [];
  for (const level of levels) {
    if (!(level > 0 && level < 1)) throw new RangeError(`credible level must lie in (0, 1), got ${level}`);
    let acc = 0;
    let k = 0;
    while (k < order.length && acc < level) acc += order[k++];
    thresholds.push(order[Math.max(0, k - 1)]);
    enclosed.push(acc);
  }
  return { posterior, thresholds, enclosed };
}
