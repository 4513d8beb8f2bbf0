// Emission kernels for eccentric binaries that start GW-driven decay at orbital frequency f0 with
// eccentricity e0 (one value or a distribution over the population):
//   dE/dln f_r = (dE/dln f_r)_circular * Phi(f_r / f0; e0)   (Enoki & Nagashima 2007, PTP 117, 241)
// with Phi the harmonic-sum factor of src/physics/eccentricHarmonicSum.ts.
import { gaussLegendreRule } from './gaussLegendre';
import { HarmonicSumTable, type HarmonicSumTableOptions } from './eccentricHarmonicSum';
import { circularGwKernel } from './circularKernel';
import { circularTimesShapeKernel } from './factoredKernel';
import type { EmissionKernel } from './populationTypes';

/**
 * Highest e0 an eccentric spectrum accepts. Cost grows steeply with e0 (about 1100 harmonics at
 * 0.95, and the harmonic count scales as (1 - e^2)^(-3/2), Peters & Mathews 1963); the table for
 * e0 = 0.95 takes about half a second, so 0.95 keeps every sheet evaluation bounded.
 */
export const ECCENTRIC_SPECTRUM_E0_LIMIT = 0.95;

/** A distribution of initial eccentricity over the population: a density on [lo, hi] (need not be normalised). */
export interface EccentricityDistribution {
  lo: number;
  hi: number;
  density: (e: number) => number;
  /** Short description for messages and the value column. */
  label: string;
}

/** Uniform e0 on [lo, hi]. */
export function uniformEccentricity(lo: number, hi: number): EccentricityDistribution {
  checkSupport(lo, hi);
  return { lo, hi, density: () => 1, label: `uniform e0 on [${lo}, ${hi}]` };
}

/** Normal density of e0 with the given mean and standard deviation, truncated to [lo, hi]. */
export function truncatedNormalEccentricity(mean: number, sd: number, lo = 0, hi = ECCENTRIC_SPECTRUM_E0_LIMIT): EccentricityDistribution {
  checkSupport(lo, hi);
  if (!(sd > 0) || !Number.isFinite(sd)) throw new RangeError(`standard deviation of e0 must be positive, got ${sd}`);
  if (!Number.isFinite(mean)) throw new RangeError(`mean e0 must be finite, got ${mean}`);
  return { lo, hi, density: (e) => Math.exp(-0.5 * ((e - mean) / sd) ** 2), label: `normal e0 (mean ${mean}, sd ${sd}) truncated to [${lo}, ${hi}]` };
}

function checkSupport(lo: number, hi: number): void {
  if (!(lo >= 0 && hi > lo && hi <= ECCENTRIC_SPECTRUM_E0_LIMIT)) {
    throw new RangeError(`e0 support [lo, hi] must satisfy 0 <= lo < hi <= ${ECCENTRIC_SPECTRUM_E0_LIMIT}, got [${lo}, ${hi}]`);
  }
}

/** Quadrature in e0: composite Gauss-Legendre nodes on [lo, hi] and weights p(e_k) w_k / sum, summing to 1. */
export function eccentricityNodes(dist: EccentricityDistribution, panels = 2, order = 6): { values: Float64Array; weights: Float64Array } {
  const rule = gaussLegendreRule(order);
  const values = new Float64Array(panels * order);
  const weights = new Float64Array(panels * order);
  const h = (dist.hi - dist.lo) / panels;
  let total = 0;
  for (let p = 0; p < panels; p++) {
    for (let i = 0; i < order; i++) {
      const k = p * order + i;
      const e = dist.lo + (p + 0.5) * h + 0.5 * h * rule.nodes[i];
      const d = dist.density(e);
      if (!(d >= 0) || !Number.isFinite(d)) throw new RangeError(`e0 density must be finite and >= 0; it is ${d} at e0 = ${e}`);
      values[k] = e;
      weights[k] = 0.5 * h * rule.weights[i] * d;
      total += weights[k];
    }
  }
  if (!(total > 0)) throw new RangeError(`e0 density is zero everywhere on [${dist.lo}, ${dist.hi}]`);
  for (let k = 0; k < weights.length; k++) weights[k] /= total;
  return { values, weights };
}

// Tables are costly (tens to hundreds of ms) and universal, so they are kept by e0 and options.
const tableCache = new Map<string, HarmonicSumTable>();
const TABLE_CACHE_SIZE = 64;

/** The harmonic-sum table of one e0, from a small cache (least recently used dropped first). */
export function harmonicSumTableFor(e0: number, opts: HarmonicSumTableOptions = {}): HarmonicSumTable {
  if (!(e0 >= 0 && e0 <= ECCENTRIC_SPECTRUM_E0_LIMIT)) throw new RangeError(`eccentricity e0 must lie in [0, ${ECCENTRIC_SPECTRUM_E0_LIMIT}], got ${e0}`);
  const key = JSON.stringify([e0, opts.harmonicTolerance, opts.pointsPerUnit, opts.integerRegionEnd, opts.pointsPerDecade]);
  let t = tableCache.get(key);
  if (t) {
    tableCache.delete(key);
  } else {
    t = new HarmonicSumTable(e0, opts);
    if (tableCache.size >= TABLE_CACHE_SIZE) tableCache.delete(tableCache.keys().next().value as string);
  }
  tableCache.set(key, t);
  return t;
}

/** Clears the table cache (benchmarks measure cold and warm evaluations). */
export function clearHarmonicSumTables(): void {
  tableCache.clear();
}

/** Initial conditions: a single e0 or a distribution, and the start frequency f0. */
export interface EccentricStart {
  e0: number | EccentricityDistribution;
  /** Orbital frequency (rest frame) where GW-driven decay starts, Hz; one value or per binary. */
  f0OrbitalHz: number | ((mcKg: number, mKg: number, q: number, z: number) => number);
  /** e0 quadrature for a distribution: composite Gauss-Legendre panels x order. Default 2 x 6. */
  e0Panels?: number;
  e0Order?: number;
  table?: HarmonicSumTableOptions;
}

/** The tables and weights an EccentricStart needs: one table per e0 node. */
export function eccentricTables(start: EccentricStart): { tables: HarmonicSumTable[]; weights: Float64Array; e0: Float64Array } {
  if (typeof start.e0 === 'number') return { tables: [harmonicSumTableFor(start.e0, start.table)], weights: Float64Array.of(1), e0: Float64Array.of(start.e0) };
  const nodes = eccentricityNodes(start.e0, start.e0Panels, start.e0Order);
  return { tables: Array.from(nodes.values, (e) => harmonicSumTableFor(e, start.table)), weights: nodes.weights, e0: nodes.values };
}

/**
 * dE/dln f_r of eccentric binaries: base(f_r, ...) * sum_k w_k Phi_k(f_r / f0) (Enoki & Nagashima 2007).
 * base is the circular kernel (its own limits, e.g. an ISCO cut in the integrator, still apply).
 */
export function eccentricEmissionKernel(base: EmissionKernel, start: EccentricStart): EmissionKernel {
  const { tables, weights } = eccentricTables(start);
  const f0 = start.f0OrbitalHz;
  if (typeof f0 === 'number' && !(f0 > 0 && Number.isFinite(f0))) throw new RangeError(`start orbital frequency f0 must be positive and finite, got ${f0} Hz`);
  const factor = (x: number): number => {
    let s = 0;
    for (let k = 0; k < tables.length; k++) s += weights[k] * tables[k].at(x);
    return s;
  };
  // The circular base with one f0 is circular x Phi(f_r / f0): the integrator's fast path.
  if (typeof f0 === 'number' && base === circularGwKernel) return circularTimesShapeKernel({ scaleHz: f0, shape: factor });
  if (typeof f0 === 'number') return (fr, mc, m, q, z) => base(fr, mc, m, q, z) * factor(fr / f0);
  return (fr, mc, m, q, z) => {
    const start0 = f0(mc, m, q, z);
    return base(fr, mc, m, q, z) * factor(fr / start0);
  };
}
