// A violin: the density of one bin's posterior samples drawn as a closed outline around the bin's
// frequency (density on the vertical axis, mirrored horizontally). The density is the same Gaussian
// KDE the free-spectrum likelihood uses (src/statistics/gaussianKde1d.ts: scipy's bandwidth rules,
// reflected at the prior's edges), so the plot shows what the comparison reads.
import { tableLogDensity, tabulateKde, type BandwidthRule } from '../../src/statistics/gaussianKde1d';

/** Points along each violin's outline (per side). */
export const VIOLIN_POINTS = 96;
/** The outline stops where the density falls below this fraction of its peak. */
export const VIOLIN_TRIM = 1e-3;

export interface ViolinDensity {
  /** Grid of log10 of the plotted quantity, increasing. */
  log10Y: Float64Array;
  /** Density per dex of the plotted quantity at each grid point (integrates to about 1 over the grid). */
  density: Float64Array;
}

export interface ViolinOptions {
  /** Reflecting edges of the prior on the sampled quantity (as the likelihood uses). */
  lowerEdge?: number;
  upperEdge?: number;
  rule?: BandwidthRule;
  points?: number;
  trim?: number;
}

/**
 * The KDE of samples s (log10 of the sampled quantity) mapped to the plotted quantity
 * log10 y = scale * s + shift (scale > 0): density per dex of y = p_s(s) / scale.
 */
export function violinDensity(samples: ArrayLike<number>, scale: number, shift: number, opts: ViolinOptions = {}): ViolinDensity {
  if (!(scale > 0 && Number.isFinite(scale) && Number.isFinite(shift))) throw new RangeError(`a violin needs a positive scale and a finite shift, got ${scale} and ${shift}`);
  const t = tabulateKde(samples, { rule: opts.rule, lowerEdge: opts.lowerEdge, upperEdge: opts.upperEdge });
  const trim = Math.log(opts.trim ?? VIOLIN_TRIM);
  // The range where the density is above the trim level (the table is unimodal or not: take the outermost points).
  let first = -1;
  let last = -1;
  for (let i = 0; i < t.size; i++) {
    if (t.logDensity[i] - t.logPeak >= trim) {
      if (first < 0) first = i;
      last = i;
    }
  }
  // The outline ends at a prior edge (the density there is not zero: reflection keeps the mass inside),
  // which is the table's first or last grid point.
  const a = opts.lowerEdge ?? -Infinity;
  const b = opts.upperEdge ?? Infinity;
  const lo = Math.max(a, t.x0 + Math.max(0, first - 1) * t.dx);
  const hi = Math.min(b, t.x0 + Math.min(t.size - 1, last + 1) * t.dx);
  const n = Math.max(3, opts.points ?? VIOLIN_POINTS);
  const log10Y = new Float64Array(n);
  const density = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = Math.min(hi, lo + ((hi - lo) * i) / (n - 1));
    log10Y[i] = scale * s + shift;
    const p = Math.exp(tableLogDensity(t, s));
    density[i] = Number.isFinite(p) ? p / scale : 0;
  }
  return { log10Y, density };
}

/**
 * The outline of a violin at frequency fHz on a log frequency axis: half-width in dex of frequency
 * = density * dexPerDensity. Returned as one closed ring (right side up, left side down, back to the
 * start) in axis units (Hz, plotted quantity).
 */
export function violinOutline(v: ViolinDensity, fHz: number, dexPerDensity: number): { x: number[]; y: number[] } {
  const x: number[] = [];
  const y: number[] = [];
  const n = v.log10Y.length;
  for (let i = 0; i < n; i++) {
    x.push(fHz * 10 ** (v.density[i] * dexPerDensity));
    y.push(10 ** v.log10Y[i]);
  }
  for (let i = n - 1; i >= 0; i--) {
    x.push(fHz * 10 ** (-v.density[i] * dexPerDensity));
    y.push(10 ** v.log10Y[i]);
  }
  x.push(x[0]);
  y.push(y[0]);
  return { x, y };
}

/** Widest half-width (dex of frequency) a violin at index k may take: 45% of the gap to its nearer neighbour. */
export function violinRoom(frequencyHz: ArrayLike<number>, k: number): number {
  const n = frequencyHz.length;
  const gaps: number[] = [];
  if (k > 0) gaps.push(Math.log10(frequencyHz[k] / frequencyHz[k - 1]));
  if (k < n - 1) gaps.push(Math.log10(frequencyHz[k + 1] / frequencyHz[k]));
  return 0.45 * (gaps.length ? Math.min(...gaps) : 0.3);
}
