// Realisations of a finite population in each frequency bin: in realisation r and bin k,
//   h_c^2(f_k) = f_k T sum_i h_i^2      (Sesana, Vecchio & Colacino 2008, MNRAS 390, 192)
// over the binaries i in the bin. Sparse cells (expected count below the threshold,
// realisationCells.ts) are drawn binary by binary: the number in all sparse cells together is one
// Poisson deviate of their summed mean, each binary falls in a cell with probability proportional to
// the cell's expected count (a Poisson process split by independent marks; Kingman 1993, Poisson
// Processes, Oxford Studies in Probability: the book checked; unverified: the section number), and inside its cell it takes log10M and q uniformly over the
// cell's box (its redshift stays at the cell's node, so the nearest redshift node acts as the
// population's lowest redshift and the variance stays finite). Dense cells add their expected h^2 plus
// sqrt(sum N h^4) times a standard normal deviate (clipped at zero), the Gaussian limit of their
// compound Poisson sum (Lamb & Taylor 2024, ApJL, doi:10.3847/2041-8213/ad654a).
//
// Random streams: realisation r draws from stream r of the run's seed (indexedStreams.ts), so any
// split of the realisations into chunks, on any number of workers, gives the same numbers.
import { M_SUN_KG } from './constants';
import { symmetricMassRatio } from './binaryMasses';
import type { RealisationCells } from './realisationCells';
import { indexedStream } from '../statistics/indexedStreams';
import { poissonDeviate } from '../statistics/poisson';

/** Realisations first .. first + count - 1 of a run; arrays indexed [r * bins + k] (r counted from first). */
export interface RealisationDraws {
  first: number;
  count: number;
  bins: number;
  hc: Float64Array;
  /** The loudest binary of each realisation and bin: strain, chirp mass (kg), redshift, mass ratio (0s when the bin is empty). */
  loudestStrain: Float64Array;
  loudestChirpMassKg: Float64Array;
  loudestRedshift: Float64Array;
  loudestMassRatio: Float64Array;
  /** 1 when the loudest binary's h^2 exceeds the sum of h^2 of all the other binaries of its bin, else 0 (Float64Array: plain data for part files). */
  outshines: Float64Array;
  /** Binaries drawn one by one (a measure of the work done). */
  drawnBinaries: number;
}

const LN10_5_3 = (5 / 3) * Math.LN10;

export const MAX_REALISATIONS = 1_000_000;

/** Draws realisations first .. first + count - 1 of the run seeded with `seed`. */
export function drawRealisations(cells: RealisationCells, seed: number, first: number, count: number, onRealisation?: (done: number) => void): RealisationDraws {
  if (!Number.isSafeInteger(first) || first < 0) throw new RangeError(`first realisation must be a whole number >= 0, got ${first}`);
  if (!Number.isSafeInteger(count) || count < 0 || first + count > MAX_REALISATIONS) throw new RangeError(`realisations must be a whole number with first + count <= ${MAX_REALISATIONS}, got ${count} from ${first}`);
  const nb = cells.bins.length;
  const size = count * nb;
  const out: RealisationDraws = {
    first,
    count,
    bins: nb,
    hc: new Float64Array(size),
    loudestStrain: new Float64Array(size),
    loudestChirpMassKg: new Float64Array(size),
    loudestRedshift: new Float64Array(size),
    loudestMassRatio: new Float64Array(size),
    outshines: new Float64Array(size),
    drawnBinaries: 0,
  };
  const { nm, nq, log10M, log10MLow, log10MHigh, q, qLow, qHigh, z } = cells;
  const etaNode = Float64Array.from(q, symmetricMassRatio);
  const mWidth = Float64Array.from(log10MLow, (lo, i) => log10MHigh[i] - lo);
  const qWidth = Float64Array.from(qLow, (lo, i) => qHigh[i] - lo);
  let drawn = 0;
  for (let r = 0; r < count; r++) {
    const rng = indexedStream(seed, first + r);
    for (let k = 0; k < nb; k++) {
      const bin = cells.bins[k];
      const cum = bin.sparseCumulative;
      const cellsInBin = cum.length;
      const total = cellsInBin > 0 ? cum[cellsInBin - 1] : 0;
      let sum = 0;
      let loud = 0;
      let loudX = 0;
      let loudQ = 0;
      let loudNode = -1;
      const n = total > 0 ? poissonDeviate(total, rng) : 0;
      drawn += n;
      for (let j = 0; j < n; j++) {
        // The cell: first cumulative count >= u (binary search).
        const u = rng.uniform() * total;
        let lo = 0;
        let hi = cellsInBin - 1;
        while (lo < hi) {
          const mid = (lo + hi) >>> 1;
          if (cum[mid] < u) lo = mid + 1;
          else hi = mid;
        }
        const node = bin.sparseNode[lo];
        const iq = node % nq;
        const im = ((node - iq) / nq) % nm;
        // Given the cell, u's position inside the cell's share of [0, total) is uniform on [0, 1)
        // and independent of the choice: it places log10M; a fresh uniform places q.
        const below = lo > 0 ? cum[lo - 1] : 0;
        const x = log10MLow[im] + ((u - below) / (cum[lo] - below)) * mWidth[im];
        const qq = qLow[iq] + rng.uniform() * qWidth[iq];
        // h scales as M^(5/3) eta(q) at fixed f_r and distance.
        const h = bin.sparseStrain[lo] * Math.exp(LN10_5_3 * (x - log10M[im])) * (symmetricMassRatio(qq) / etaNode[iq]);
        sum += h * h;
        if (h > loud) {
          loud = h;
          loudX = x;
          loudQ = qq;
          loudNode = node;
        }
      }
      if (bin.denseH2 > 0) {
        const g = bin.denseH2 + Math.sqrt(bin.denseH4) * rng.normal();
        if (g > 0) sum += g;
        if (bin.denseLoudestStrain > loud) {
          loud = bin.denseLoudestStrain;
          loudNode = bin.denseLoudest;
          const iq = loudNode % nq;
          loudX = log10M[((loudNode - iq) / nq) % nm];
          loudQ = q[iq];
        }
      }
      const at = r * nb + k;
      out.hc[at] = Math.sqrt(bin.hc2PerH2 * sum);
      if (loudNode >= 0) {
        out.loudestStrain[at] = loud;
        out.loudestChirpMassKg[at] = M_SUN_KG * Math.pow(10, loudX) * Math.pow(symmetricMassRatio(loudQ), 0.6);
        out.loudestRedshift[at] = z[Math.floor(loudNode / (nq * nm))];
        out.loudestMassRatio[at] = loudQ;
        out.outshines[at] = loud * loud > sum - loud * loud ? 1 : 0;
      }
    }
    onRealisation?.(r + 1);
  }
  out.drawnBinaries = drawn;
  return out;
}
