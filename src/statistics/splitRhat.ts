// Rank-normalised split-R-hat (Vehtari, Gelman, Simpson, Carpenter & Buerkner 2021, Bayesian
// Analysis 16, 667): each chain is split in two halves, all draws are replaced by normal scores of
// their ranks, and the classic potential scale reduction is computed on those; the same on the
// ranks of |x - median| (folded) detects differences in scale. R-hat = max(bulk, folded).
import { normalQuantile } from './normal';

/** Normal scores z = Phi^-1((r - 3/8) / (S + 1/4)) of average ranks r (Blom's offset, as in Vehtari et al. 2021, sec. 4.1). */
export function rankNormalise(values: Float64Array): Float64Array {
  const S = values.length;
  const order = Array.from({ length: S }, (_, i) => i).sort((a, b) => values[a] - values[b]);
  const z = new Float64Array(S);
  let i = 0;
  while (i < S) {
    let j = i;
    while (j + 1 < S && values[order[j + 1]] === values[order[i]]) j++;
    const r = (i + j) / 2 + 1; // average rank of ties, 1-based
    const score = normalQuantile((r - 3 / 8) / (S + 1 / 4));
    for (let k = i; k <= j; k++) z[order[k]] = score;
    i = j + 1;
  }
  return z;
}

/** Classic R-hat of equal-length chains: sqrt(var+ / W), var+ = (N-1)/N W + B/N (Gelman et al. 2013, Bayesian Data Analysis, 3rd ed., sec. 11.4). */
export function classicRhat(chains: Float64Array[]): number {
  const m = chains.length;
  const n = chains[0].length;
  if (m < 2 || n < 2) return NaN;
  const means = chains.map((c) => c.reduce((s, x) => s + x, 0) / n);
  const grand = means.reduce((s, x) => s + x, 0) / m;
  const B = (n / (m - 1)) * means.reduce((s, x) => s + (x - grand) ** 2, 0);
  const W = chains.reduce((s, c, k) => s + c.reduce((a, x) => a + (x - means[k]) ** 2, 0) / (n - 1), 0) / m;
  if (!(W > 0)) return NaN;
  const varPlus = ((n - 1) / n) * W + B / n;
  return Math.sqrt(varPlus / W);
}

function splitChains(chains: Float64Array[]): Float64Array[] {
  const n = Math.floor(chains[0].length / 2);
  const out: Float64Array[] = [];
  for (const c of chains) {
    // With an odd length the middle draw is dropped (Vehtari et al. 2021, sec. 4.1).
    out.push(c.slice(0, n), c.slice(c.length - n));
  }
  return out;
}

function regroup(flat: Float64Array, m: number, n: number): Float64Array[] {
  return Array.from({ length: m }, (_, k) => flat.slice(k * n, (k + 1) * n));
}

export interface SplitRhat {
  rhat: number;
  bulk: number;
  folded: number;
}

/** Rank-normalised split-R-hat of chains of equal length (at least 4 draws each). */
export function rankNormalisedSplitRhat(chains: Float64Array[]): SplitRhat {
  if (chains.length < 1 || chains[0].length < 4) return { rhat: NaN, bulk: NaN, folded: NaN };
  for (const c of chains) if (c.length !== chains[0].length) throw new RangeError('all chains must have the same length');
  const split = splitChains(chains);
  const m = split.length;
  const n = split[0].length;
  const flat = new Float64Array(m * n);
  split.forEach((c, k) => flat.set(c, k * n));
  const bulk = classicRhat(regroup(rankNormalise(flat), m, n));
  const sorted = Float64Array.from(flat).sort();
  const median = n * m % 2 ? sorted[(m * n - 1) / 2] : 0.5 * (sorted[m * n / 2 - 1] + sorted[m * n / 2]);
  const folded = classicRhat(regroup(rankNormalise(flat.map((x) => Math.abs(x - median))), m, n));
  return { rhat: Math.max(bulk, folded), bulk, folded };
}
