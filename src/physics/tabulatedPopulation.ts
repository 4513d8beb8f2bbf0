// A population given as a table of d^3n/(dz dlog10M dq) (Mpc^-3, M the total mass in Msun) on a grid
// of z, log10 M and q nodes, e.g. rates from semi-analytic or hydrodynamic models. Between the nodes the
// density is trilinear in ln n when every value is positive (a density falling exponentially, as a
// mass function past its break, is then followed closely), else trilinear in n; outside the grid it is 0.
// Interpolation error: for trilinear interpolation of a smooth g, |error| <= (1/8) sum_i h_i^2 max |d^2g/dx_i^2|
// per cell (common practice, no source).
import type { BinaryPopulation } from './populationTypes';

export interface DensityTable {
  z: Float64Array;
  log10M: Float64Array;
  q: Float64Array;
  /**
   * Values at (z[i], log10M[j], q[k]) at index (i * log10M.length + j) * q.length + k, Mpc^-3; when
   * `binned`, the axes are bin edges and the values are the mean density of each bin (one fewer per axis).
   */
  density: Float64Array;
  binned?: boolean;
}

/** Problems of a table's shape and values, or undefined when it is a valid grid. */
export function tableProblem(t: DensityTable): string | undefined {
  for (const [name, axis] of [['z', t.z], ['log10M', t.log10M], ['q', t.q]] as const) {
    if (axis.length < 2) return `the ${name} axis needs at least 2 nodes, got ${axis.length}`;
    for (let i = 0; i < axis.length; i++) {
      if (!Number.isFinite(axis[i])) return `${name} node ${i + 1} is ${axis[i]}`;
      if (i > 0 && !(axis[i] > axis[i - 1])) return `${name} nodes must increase: node ${i + 1} (${axis[i]}) follows ${axis[i - 1]}`;
    }
  }
  if (!(t.z[0] >= 0)) return `redshifts must be >= 0, got ${t.z[0]}`;
  if (!(t.q[0] > 0 && t.q[t.q.length - 1] <= 1)) return `mass ratios must lie in (0, 1], got ${t.q[0]} to ${t.q[t.q.length - 1]}`;
  const d = t.binned ? 1 : 0;
  const n = (t.z.length - d) * (t.log10M.length - d) * (t.q.length - d);
  if (t.density.length !== n) return `the grid has ${n} ${t.binned ? 'bins' : 'nodes'} but ${t.density.length} values`;
  for (let i = 0; i < n; i++) if (!(t.density[i] >= 0 && t.density[i] < Infinity)) return `value ${i + 1} is ${t.density[i]}; densities must be finite and >= 0`;
  return undefined;
}

/** Index i with axis[i] <= x <= axis[i + 1] (x inside the axis). */
function cellOf(axis: Float64Array, x: number): number {
  let lo = 0;
  let hi = axis.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (axis[mid] <= x) lo = mid;
    else hi = mid;
  }
  return lo;
}

export function tabulatedPopulation(t: DensityTable): BinaryPopulation {
  const problem = tableProblem(t);
  if (problem) throw new RangeError(problem);
  if (t.binned) return binnedPopulation(t);
  const logMode = t.density.every((v) => v > 0);
  const g = logMode ? t.density.map(Math.log) : t.density;
  const nm = t.log10M.length;
  const nq = t.q.length;
  const { z, log10M, q } = t;
  return {
    zMin: z[0],
    zMax: z[z.length - 1],
    log10MMin: log10M[0],
    log10MMax: log10M[nm - 1],
    qMin: q[0],
    qMax: q[nq - 1],
    density(zz, x, qq) {
      if (!(zz >= z[0] && zz <= z[z.length - 1] && x >= log10M[0] && x <= log10M[nm - 1] && qq >= q[0] && qq <= q[nq - 1])) return 0;
      const i = cellOf(z, zz);
      const j = cellOf(log10M, x);
      const k = cellOf(q, qq);
      const tz = (zz - z[i]) / (z[i + 1] - z[i]);
      const tm = (x - log10M[j]) / (log10M[j + 1] - log10M[j]);
      const tq = (qq - q[k]) / (q[k + 1] - q[k]);
      const at = (a: number, b: number, c: number) => g[(a * nm + b) * nq + c];
      const alongQ = (a: number, b: number) => at(a, b, k) + tq * (at(a, b, k + 1) - at(a, b, k));
      const alongM = (a: number) => alongQ(a, j) + tm * (alongQ(a, j + 1) - alongQ(a, j));
      const v = alongM(i) + tz * (alongM(i + 1) - alongM(i));
      return logMode ? Math.exp(v) : v;
    },
  };
}

/** A histogram: the density is constant inside each bin (its mean), 0 outside the edges. */
function binnedPopulation(t: DensityTable): BinaryPopulation {
  const { z, log10M, q } = t;
  const nm = log10M.length - 1;
  const nq = q.length - 1;
  const last = (a: Float64Array) => a[a.length - 1];
  const bin = (a: Float64Array, x: number) => Math.min(cellOf(a, x), a.length - 2);
  return {
    zMin: z[0],
    zMax: last(z),
    log10MMin: log10M[0],
    log10MMax: last(log10M),
    qMin: q[0],
    qMax: last(q),
    density(zz, x, qq) {
      if (!(zz >= z[0] && zz <= last(z) && x >= log10M[0] && x <= last(log10M) && qq >= q[0] && qq <= last(q))) return 0;
      return t.density[(bin(z, zz) * nm + bin(log10M, x)) * nq + bin(q, qq)];
    },
  };
}
