// The numbers of a corner plot of posterior draws: per parameter a 1-D histogram and the median; per
// pair a 2-D histogram with the highest-posterior-density thresholds of 68.27% and 95.45%
// (the fullest cells first until the level of ALL kept draws is enclosed, as in credibleRegion.ts;
// draws outside the plotted box count towards the total). Parameters sampled in ln x are binned evenly in log10 x.
import { sortedQuantile, ONE_SIGMA_LEVEL, TWO_SIGMA_LEVEL } from './sampleSummary';

export interface CornerAxis {
  name: string;
  unit: string;
  log: boolean;
  /** Bin edges in the plotted coordinate (log10 x when log). */
  edges: Float64Array;
  /** Counts per bin. */
  counts: Float64Array;
  /** Median in the plotted coordinate. */
  median: number;
}

export interface CornerPair {
  /** Indices into axes: x = i, y = j (i < j). */
  i: number;
  j: number;
  /** Counts, row-major [iy * bins + ix]. */
  counts: Float64Array;
  /** Count thresholds enclosing 68.27% and 95.45% of the draws (highest density first). */
  thresholds: [number, number];
}

export interface CornerModel {
  axes: CornerAxis[];
  pairs: CornerPair[];
  bins: number;
  levels: [number, number];
}

/** Histograms of draws (finite ones; log axes keep positive ones), `bins` bins between the 0.5% and 99.5% quantiles. */
export function cornerModel(params: Array<{ name: string; unit: string; log: boolean; draws: ArrayLike<number> }>, bins = 30): CornerModel {
  if (!Number.isInteger(bins) || bins < 4) throw new RangeError(`a corner plot needs at least 4 bins, got ${bins}`);
  const n = params[0]?.draws.length ?? 0;
  const coords = params.map((p) => Float64Array.from({ length: n }, (_, k) => (p.log ? Math.log10(p.draws[k]) : p.draws[k])));
  const keep = Array.from({ length: n }, (_, k) => coords.every((c) => Number.isFinite(c[k])));
  const axes: CornerAxis[] = params.map((p, a) => {
    const vals = Float64Array.from(coords[a].filter((_, k) => keep[k])).sort();
    let lo = sortedQuantile(vals, 0.005);
    let hi = sortedQuantile(vals, 0.995);
    if (!(hi > lo)) {
      lo -= 0.5;
      hi += 0.5;
    }
    const edges = Float64Array.from({ length: bins + 1 }, (_, b) => lo + ((hi - lo) * b) / bins);
    const counts = new Float64Array(bins);
    for (const v of vals) {
      const b = Math.floor(((v - lo) / (hi - lo)) * bins);
      if (b >= 0 && b < bins) counts[b]++;
    }
    return { name: p.name, unit: p.unit, log: p.log, edges, counts, median: sortedQuantile(vals, 0.5) };
  });
  const kept = keep.filter(Boolean).length;
  const pairs: CornerPair[] = [];
  for (let j = 1; j < axes.length; j++) {
    for (let i = 0; i < j; i++) {
      const counts = new Float64Array(bins * bins);
      const [xl, xh] = [axes[i].edges[0], axes[i].edges[bins]];
      const [yl, yh] = [axes[j].edges[0], axes[j].edges[bins]];
      for (let k = 0; k < n; k++) {
        if (!keep[k]) continue;
        const bx = Math.floor(((coords[i][k] - xl) / (xh - xl)) * bins);
        const by = Math.floor(((coords[j][k] - yl) / (yh - yl)) * bins);
        if (bx >= 0 && bx < bins && by >= 0 && by < bins) counts[by * bins + bx]++;
      }
      pairs.push({ i, j, counts, thresholds: [densityThreshold(counts, ONE_SIGMA_LEVEL * kept), densityThreshold(counts, TWO_SIGMA_LEVEL * kept)] });
    }
  }
  return { axes, pairs, bins, levels: [ONE_SIGMA_LEVEL, TWO_SIGMA_LEVEL] };
}

/** The count of the last cell needed, taking the fullest cells first, to hold `target` draws. */
function densityThreshold(counts: Float64Array, target: number): number {
  const order = Float64Array.from(counts).sort().reverse();
  let acc = 0;
  for (const c of order) {
    acc += c;
    if (acc >= target) return c;
  }
  return order[order.length - 1] ?? NaN;
}
