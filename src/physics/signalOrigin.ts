// Where a background comes from: the contributions to h_c^2(f) per unit redshift and per dex of chirp
// mass, from the energy form of Phinney 2001 (astro-ph/0108028) with the integral over the other
// variables left out, and the ranges that hold the central 50% and 90% of h_c^2.
import { C_SI, G_SI, MPC_M, M_SUN_KG } from './constants';
import { symmetricMassRatio } from './binaryMasses';
import { circularGwKernel, iscoTotalMassKg } from './circularKernel';
import { compositeNodes, compositeSum, gaussLegendreRule } from './gaussLegendre';
import { checkPopulation } from './backgroundIntegral';
import type { BinaryPopulation, EmissionKernel } from './populationTypes';

const ENERGY_FORM = (4 * G_SI) / (Math.PI * C_SI * C_SI);
const PER_MPC3 = 1 / (MPC_M * MPC_M * MPC_M);
const LOG10_MSUN = Math.log10(M_SUN_KG);

export interface OriginOptions {
  kernel?: EmissionKernel;
  /** As in BackgroundOptions: the mass integral stops at f_r = cutFactor x f_ISCO,gw(M). */
  cutFactor?: number;
  /** Points of the even grid the contributions are given on (default 80). */
  gridPoints?: number;
  /** Gauss-Legendre panels x 8 points in each integrated variable (default 2). */
  panels?: number;
}

export interface OriginProfile {
  /** Grid: redshift, or log10 chirp mass in Msun. */
  grid: Float64Array;
  /** d h_c^2 / d(grid variable) at each grid point. */
  density: Float64Array;
  /** Cumulative fraction of h_c^2 up to each grid point (trapezoid rule on the grid). */
  cumulative: Float64Array;
  /** h_c^2 from the profile (trapezoid integral of density over the grid). */
  total: number;
  median: number;
  /** Central ranges holding 50% (25% to 75%) and 90% (5% to 95%) of h_c^2. */
  range50: [number, number];
  range90: [number, number];
}

function xCutOf(frHz: number, cutFactor: number): number {
  return cutFactor === Infinity ? Infinity : Math.log10(iscoTotalMassKg(frHz / cutFactor)) - LOG10_MSUN;
}

/** d h_c^2 / dz at observed frequency fHz, on an even grid in z over the population's limits. */
export function redshiftOrigin(pop: BinaryPopulation, fHz: number, opts: OriginOptions = {}): OriginProfile {
  checkPopulation(pop);
  const kernel = opts.kernel ?? circularGwKernel;
  const cut = opts.cutFactor ?? 1;
  const n = opts.gridPoints ?? 80;
  const panels = opts.panels ?? 2;
  const qr = compositeNodes(pop.qMin, pop.qMax, panels, 8);
  const grid = evenGrid(pop.zMin, pop.zMax, n);
  const density = new Float64Array(n);
  // Circular kernel and a separable density: M_c^(5/3) = M^(5/3) eta, so the q integral
  // Int dq p(q) eta is done once (as in backgroundIntegral.ts; Phinney 2001 strain form).
  const sep = kernel === circularGwKernel ? pop.separable : undefined;
  let etaPdf = 0;
  if (sep) for (let b = 0; b < qr.nodes.length; b++) etaPdf += qr.weights[b] * Math.max(0, sep.massRatio(qr.nodes[b])) * symmetricMassRatio(qr.nodes[b]);
  for (let i = 0; i < n; i++) {
    const z = grid[i];
    const fr = (1 + z) * fHz;
    const hi = Math.min(pop.log10MMax, xCutOf(fr, cut));
    const mr = compositeNodes(pop.log10MMin, hi, panels, 8);
    let s = 0;
    if (sep) {
      for (let a = 0; a < mr.nodes.length; a++) {
        const zm = sep.zMass(z, mr.nodes[a]);
        if (zm > 0) s += mr.weights[a] * zm * etaPdf * circularGwKernel(fr, M_SUN_KG * Math.pow(10, mr.nodes[a]), 0, 0, z);
      }
      density[i] = ((ENERGY_FORM / (fHz * fHz)) * s * PER_MPC3) / (1 + z);
      continue;
    }
    for (let a = 0; a < mr.nodes.length; a++) {
      const mKg = M_SUN_KG * Math.pow(10, mr.nodes[a]);
      for (let b = 0; b < qr.nodes.length; b++) {
        const q = qr.nodes[b];
        const d = pop.density(z, mr.nodes[a], q);
        if (d > 0) s += mr.weights[a] * qr.weights[b] * d * kernel(fr, mKg * Math.pow(symmetricMassRatio(q), 0.6), mKg, q, z);
      }
    }
    density[i] = ((ENERGY_FORM / (fHz * fHz)) * s * PER_MPC3) / (1 + z);
  }
  return summarise(grid, density);
}

/** The q at which eta(q) = e (root in (0, 1] of e q^2 + (2e - 1) q + e = 0), for 0 < e <= 1/4. */
function massRatioForEta(e: number): number {
  if (e >= 0.25) return 1;
  return (1 - 2 * e - Math.sqrt(1 - 4 * e)) / (2 * e);
}

/**
 * d h_c^2 / dlog10 M_c at observed frequency fHz, on an even grid in log10 chirp mass (Msun). At fixed
 * q, log10 M = log10 M_c - 0.6 log10 eta(q), so the q integral runs where that M is inside the
 * population's mass limits and below the ISCO cut; those are limits of integration in q.
 */
export function chirpMassOrigin(pop: BinaryPopulation, fHz: number, opts: OriginOptions = {}): OriginProfile {
  checkPopulation(pop);
  const kernel = opts.kernel ?? circularGwKernel;
  const cut = opts.cutFactor ?? 1;
  const n = opts.gridPoints ?? 80;
  const panels = opts.panels ?? 2;
  const lo = pop.log10MMin + 0.6 * Math.log10(symmetricMassRatio(pop.qMin));
  const hi = pop.log10MMax + 0.6 * Math.log10(symmetricMassRatio(pop.qMax));
  const grid = evenGrid(lo, hi, n);
  const zr = compositeNodes(pop.zMin, pop.zMax, panels, 8);
  // The top of the mass range at each z node (the ISCO cut does not depend on the grid point).
  const xTopOf = Float64Array.from(zr.nodes, (z) => Math.min(pop.log10MMax, xCutOf((1 + z) * fHz, cut)));
  const sep = pop.separable;
  const factored = kernel === circularGwKernel && sep?.redshift && sep.lnMass ? new FactoredQSum(sep.redshift, sep.lnMass, sep.massRatio, panels) : undefined;
  const density = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const y = grid[i];
    let s = 0;
    for (let c = 0; c < zr.nodes.length; c++) {
      const z = zr.nodes[c];
      const fr = (1 + z) * fHz;
      const xTop = xTopOf[c];
      if (xTop <= pop.log10MMin) continue;
      // eta decreases with x at fixed y: x <= xTop needs eta >= 10^((y - xTop)/0.6), x >= xMin needs eta <= 10^((y - xMin)/0.6).
      const etaLo = Math.pow(10, (y - xTop) / 0.6);
      const etaHi = Math.pow(10, (y - pop.log10MMin) / 0.6);
      if (etaLo > 0.25) continue;
      const qa = Math.max(pop.qMin, massRatioForEta(etaLo));
      const qb = Math.min(pop.qMax, massRatioForEta(Math.min(etaHi, 0.25)));
      if (!(qb > qa)) continue;
      if (factored) {
        s += (zr.weights[c] / (1 + z)) * factored.sum(y, qa, qb, z) * circularGwKernel(fr, M_SUN_KG * Math.pow(10, y), 0, 0, z);
        continue;
      }
      if (kernel === circularGwKernel) {
        // The circular kernel depends on M_c only (fixed here), so it multiplies the q integral of the
        // density (the sum over compositeNodes(qa, qb, panels, 8), without allocating it per point).
        const inner = compositeSum(qa, qb, panels, 8, (q) => {
          const d = pop.density(z, y - 0.6 * Math.log10(symmetricMassRatio(q)), q);
          return d > 0 ? d : 0;
        });
        s += (zr.weights[c] / (1 + z)) * inner * circularGwKernel(fr, M_SUN_KG * Math.pow(10, y), 0, 0, z);
        continue;
      }
      const qr = compositeNodes(qa, qb, panels, 8);
      let inner = 0;
      for (let b = 0; b < qr.nodes.length; b++) {
        const q = qr.nodes[b];
        const eta = symmetricMassRatio(q);
        const x = y - 0.6 * Math.log10(eta);
        const d = pop.density(z, x, q);
        if (d > 0) {
          const mKg = M_SUN_KG * Math.pow(10, x);
          inner += qr.weights[b] * d * kernel(fr, M_SUN_KG * Math.pow(10, y), mKg, q, z);
        }
      }
      s += (zr.weights[c] / (1 + z)) * inner;
    }
    density[i] = (ENERGY_FORM / (fHz * fHz)) * s * PER_MPC3;
  }
  return summarise(grid, density);
}

/**
 * The q integral of chirpMassOrigin's circular path for a density redshift(z) exp(lnMass(x)) massRatio(q)
 * (populationTypes.ts: the product zMass(z, x) massRatio(q) of separablePopulation.ts, in its order), at
 * x = y - 0.6 log10 eta(q): the same sum as compositeSum(qa, qb, panels, 8, q => max(0, density(z, x, q))),
 * with each node's weight, exp(lnMass(x)) and massRatio(q) kept while (y, qa, qb) stay (below the ISCO
 * cut they are the same at every z).
 */
class FactoredQSum {
  private y = NaN;
  private qa = NaN;
  private qb = NaN;
  private readonly weight: Float64Array;
  private readonly massFactor: Float64Array;
  private readonly ratio: Float64Array;
  constructor(
    private readonly redshift: (z: number) => number,
    private readonly lnMass: (x: number) => number,
    private readonly massRatio: (q: number) => number,
    private readonly panels: number,
  ) {
    this.weight = new Float64Array(panels * 8);
    this.massFactor = new Float64Array(panels * 8);
    this.ratio = new Float64Array(panels * 8);
  }

  sum(y: number, qa: number, qb: number, z: number): number {
    if (y !== this.y || qa !== this.qa || qb !== this.qb) this.lay(y, qa, qb);
    const zFactor = this.redshift(z);
    const { weight, massFactor, ratio } = this;
    let s = 0;
    for (let i = 0; i < weight.length; i++) {
      const d = zFactor * massFactor[i] * ratio[i];
      s += weight[i] * (d > 0 ? d : 0);
    }
    return s;
  }

  /** Nodes and weights as compositeSum lays them (gaussLegendre.ts), and the mass and q factors there. */
  private lay(y: number, qa: number, qb: number): void {
    this.y = y;
    this.qa = qa;
    this.qb = qb;
    const rule = gaussLegendreRule(8);
    const h = (qb - qa) / this.panels;
    for (let p = 0; p < this.panels; p++) {
      const mid = qa + (p + 0.5) * h;
      for (let i = 0; i < 8; i++) {
        const q = mid + 0.5 * h * rule.nodes[i];
        this.weight[p * 8 + i] = 0.5 * h * rule.weights[i];
        this.massFactor[p * 8 + i] = Math.exp(this.lnMass(y - 0.6 * Math.log10(symmetricMassRatio(q))));
        this.ratio[p * 8 + i] = this.massRatio(q);
      }
    }
  }
}

function evenGrid(a: number, b: number, n: number): Float64Array {
  if (!Number.isInteger(n) || n < 3 || n > 10_000) throw new RangeError(`grid points must be an integer in [3, 10000], got ${n}`);
  const g = new Float64Array(n);
  for (let i = 0; i < n; i++) g[i] = a + ((b - a) * i) / (n - 1);
  return g;
}

function summarise(grid: Float64Array, density: Float64Array): OriginProfile {
  const n = grid.length;
  const cumulative = new Float64Array(n);
  for (let i = 1; i < n; i++) cumulative[i] = cumulative[i - 1] + 0.5 * (density[i] + density[i - 1]) * (grid[i] - grid[i - 1]);
  const total = cumulative[n - 1];
  if (total > 0) for (let i = 0; i < n; i++) cumulative[i] /= total;
  const at = (p: number) => quantile(grid, cumulative, p);
  return { grid, density, cumulative, total, median: at(0.5), range50: [at(0.25), at(0.75)], range90: [at(0.05), at(0.95)] };
}

/** Grid value where the cumulative fraction reaches p (linear between grid points). */
function quantile(grid: Float64Array, cum: Float64Array, p: number): number {
  if (!(cum[cum.length - 1] > 0)) return NaN;
  let i = 1;
  while (i < cum.length - 1 && cum[i] < p) i++;
  const c0 = cum[i - 1];
  const c1 = cum[i];
  const t = c1 > c0 ? (p - c0) / (c1 - c0) : 0;
  return grid[i - 1] + t * (grid[i] - grid[i - 1]);
}
