// The cells of a population in each frequency bin of an array, prepared for drawing realisations.
// Bin k is centred on f_k with width 1/T (d ln f = 1/(f T)). The population is cut into cells: the
// composite Gauss-Legendre nodes in z, log10M and q, each node standing for a box as wide as its
// weight (boxes laid end to end, as in finiteBinaries.ts). In a bin, a cell holds on average
//   N = n w (dV_c/dz) |dz/dt_r| (dt_r/dln f_r) d ln f      (Sesana, Vecchio & Colacino 2008, MNRAS 390, 192)
// binaries, each with the sky- and polarisation-averaged strain h of that paper at f_r = (1+z) f_k.
// Cells past the ISCO (f_r > f_ISCO,gw(M)) hold none. The threshold K splits the cells of each bin by
// strain: the cells louder than h_K, the strain above which K binaries are expected (each holding
// fewer than K), are "sparse" and their binaries are drawn one by one (binaryRealisations.ts); all
// other cells are "dense" and enter a realisation as the sum of their expected h^2 plus a Gaussian
// fluctuation of variance sum N h^4 (compound Poisson moments). The work per bin is then about K
// binaries whether the bin holds 10 or 10^11. This split follows Becsy, Cornish &
// Kelley 2022 (ApJ, arXiv:2207.01607: brightest binaries individually, the rest as a background) and
// the variance of Lamb & Taylor 2024 (ApJL, doi:10.3847/2041-8213/ad654a); Sato-Polito & Zaldarriaga
// 2024 (arXiv:2406.17010) give the same per-bin distribution of h_c^2 analytically.
//
// Environment: given the residence factor R of a hardening model (residenceFactor.ts), each cell holds
// R times the GW-driven count (dt_r/dln f_r is the total residence time; Phinney 2001, astro-ph/0108028;
// Sesana 2013, arXiv:1307.2600) and its binaries keep their strain, so sum N h^2 is Phinney's h_c^2
// with the kernel circular x R.
//
// Residence time: the steady-state count N assumes that binaries have been passing f_r for at least
// their residence time dt_r/dln f_r. Cells where that time exceeds the age of the Universe at the
// cell's redshift (light binaries at the lowest frequencies) are flagged per bin; with
// dropLongResidence they are left out of the bin altogether.
import type { FlatLambdaCdm } from './cosmology';
import { circularResidenceTime, fillResidenceFactors, loudestExpected, singleBinaryStrain } from './finiteBinaries';
import { compositeNodes } from './gaussLegendre';
import { nodeRates } from './nodeRates';
import type { BinaryPopulation } from './populationTypes';
import { NO_TIME_CHECK, type TimeCheck } from './timeCheck';
import type { ResidenceFactor } from './residenceFactor';

export interface RealisationGrid {
  zPanels: number;
  log10MPanels: number;
  qPanels: number;
  order: number;
}

/** Default cells: 4 x 32 x 1 panels of 6 points (24 z x 192 log10M x 6 q), the grid of finiteBinaries.ts. */
export const REALISATION_DEFAULT_GRID: Readonly<RealisationGrid> = Object.freeze({ zPanels: 4, log10MPanels: 32, qPanels: 1, order: 6 });

/**
 * Default threshold K: in each bin, the cells louder than the strain h_K above which K binaries are
 * expected are drawn one by one (on average K binaries per bin and realisation, however many the bin holds).
 */
export const DEFAULT_SPARSE_THRESHOLD = 30;

export interface RealisationOptions {
  grid?: Partial<RealisationGrid>;
  /**
   * K >= 0: a cell is drawn binary by binary when fewer than K binaries are expected in it and in all
   * louder cells together (0: every cell smooth; Infinity: every cell drawn).
   */
  threshold?: number;
  /** Leave out the cells whose residence time exceeds the age of the Universe at their redshift. */
  dropLongResidence?: boolean;
  /**
   * An environment's residence factor R (residenceFactor.ts): each cell holds R times the GW-driven
   * count at its node, and its residence time is R times the GW one. Omitted: GW-driven throughout.
   */
  residence?: ResidenceFactor;
  /** Called once per redshift row of the set-up and once per bin (TimeCheck); default: nothing. */
  checkTime?: TimeCheck;
}

/** One bin's cells, split into the dense sum and the sparse cells to draw from. */
export interface BinCells {
  frequencyHz: number;
  /** f T: h_c^2 = f T x sum of h^2 over the bin's binaries (Sesana, Vecchio & Colacino 2008). */
  hc2PerH2: number;
  /** Expected binaries in the bin, all cells. */
  expectedCount: number;
  /** Expected sum of h^2 and its variance sum N h^4, all cells. */
  meanH2: number;
  varianceH2: number;
  /** Fourth cumulant of the sum of h^2, sum N h^8 (for the Monte Carlo error of a sample variance). */
  fourthCumulantH2: number;
  /** Dense cells: sum N h^2 and sum N h^4, and the loudest dense cell (index into the node arrays, -1 if none). */
  denseH2: number;
  denseH4: number;
  denseLoudest: number;
  denseLoudestStrain: number;
  /** Sparse cells: node index and cumulative expected count (ascending; the last entry is the sparse total). */
  sparseNode: Int32Array;
  sparseCumulative: Float64Array;
  /** Strain of one binary at each sparse cell's node. */
  sparseStrain: Float64Array;
  /** Expected count and h^2 of the cells whose residence time exceeds the age of the Universe at their z (whether dropped or not). */
  longResidenceCount: number;
  longResidenceH2: number;
}

/** The population's cells in every bin, with what a draw needs to place a binary inside its cell. */
export interface RealisationCells {
  bins: BinCells[];
  spanS: number;
  threshold: number;
  dropLongResidence: boolean;
  /** Node coordinates and box edges: z per z node; log10M (Msun) per mass node; q per q node. */
  z: Float64Array;
  log10M: Float64Array;
  log10MLow: Float64Array;
  log10MHigh: Float64Array;
  q: Float64Array;
  qLow: Float64Array;
  qHigh: Float64Array;
  nm: number;
  nq: number;
}

/** Box edges of composite-rule nodes: widths equal to the weights, laid end to end from `lo`. */
function boxEdges(lo: number, weights: Float64Array): Float64Array {
  const e = new Float64Array(weights.length + 1);
  e[0] = lo;
  for (let i = 0; i < weights.length; i++) e[i + 1] = e[i] + weights[i];
  return e;
}

export function realisationCells(pop: BinaryPopulation, cosmo: FlatLambdaCdm, freqsHz: ArrayLike<number>, spanS: number, options: RealisationOptions = {}): RealisationCells {
  if (!(spanS > 0) || !Number.isFinite(spanS)) throw new RangeError(`observing span must be positive and finite, got ${spanS} s`);
  const threshold = options.threshold ?? DEFAULT_SPARSE_THRESHOLD;
  if (!(threshold >= 0)) throw new RangeError(`threshold must be a count >= 0, got ${threshold}`);
  const grid = { ...REALISATION_DEFAULT_GRID, ...options.grid };
  for (const [k, v] of Object.entries(grid)) if (!Number.isInteger(v) || v < 1 || v > 200) throw new RangeError(`grid ${k} must be an integer in [1, 200], got ${v}`);
  const drop = options.dropLongResidence ?? false;
  const residence = options.residence;
  const checkTime = options.checkTime ?? NO_TIME_CHECK;
  const zr = compositeNodes(pop.zMin, pop.zMax, grid.zPanels, grid.order);
  const mr = compositeNodes(pop.log10MMin, pop.log10MMax, grid.log10MPanels, grid.order);
  const qr = compositeNodes(pop.qMin, pop.qMax, grid.qPanels, grid.order);
  const nz = zr.nodes.length;
  const nm = mr.nodes.length;
  const nq = qr.nodes.length;
  const mEdges = boxEdges(pop.log10MMin, mr.weights);
  const qEdges = boxEdges(pop.qMin, qr.weights);

  // Per node (iz, im, iq), index (iz * nm + im) * nq + iq: binaries per second of rest-frame time, and
  // M_c^(5/3) per (im, iq) (nodeRates.ts).
  const { rate, mc53, massKg, fIsco, dc, age } = nodeRates(pop, cosmo, zr, mr, qr, checkTime);

  const bins: BinCells[] = [];
  const nodeCount = new Float64Array(nz * nm * nq);
  const nodeStrain = new Float64Array(nz * nm * nq);
  const residenceFactor = residence ? new Float64Array(nz * nm * nq) : undefined;
  const histogram = new Float64Array(4096);
  for (let k = 0; k < freqsHz.length; k++) {
    checkTime();
    const f = freqsHz[k];
    if (!(f > 0) || !Number.isFinite(f)) throw new RangeError(`frequency ${k + 1} must be positive and finite, got ${f} Hz`);
    const dlnf = 1 / (f * spanS);
    if (residence && residenceFactor) fillResidenceFactors(residence, f, zr.nodes, massKg, qr.nodes, residenceFactor, rate);
    let expectedCount = 0;
    let meanH2 = 0;
    let varianceH2 = 0;
    let kappa4 = 0;
    let longCount = 0;
    let longH2 = 0;
    for (let iz = 0; iz < nz; iz++) {
      const fr = (1 + zr.nodes[iz]) * f;
      // Residence time and strain factored into frequency and chirp-mass parts (M_c = 1 kg here).
      const tauF = circularResidenceTime(fr, 1);
      const hF = singleBinaryStrain(fr, 1, dc[iz]);
      for (let im = 0; im < nm; im++) {
        const emitting = !(fr > fIsco[im]);
        for (let iq = 0; iq < nq; iq++) {
          const i = (iz * nm + im) * nq + iq;
          const m53 = mc53[im * nq + iq];
          // With a residence factor R, the count and the residence time are the GW-driven ones times R.
          const r = residenceFactor ? residenceFactor[i] : 1;
          const count = emitting ? (residence ? (rate[i] * r * tauF * dlnf) / m53 : (rate[i] * tauF * dlnf) / m53) : 0;
          const h = hF * m53;
          const long = (residence ? tauF * r : tauF) / m53 > age[iz];
          if (long && count > 0) {
            longCount += count;
            longH2 += count * h * h;
          }
          const kept = count > 0 && !(drop && long);
          nodeCount[i] = kept ? count : 0;
          nodeStrain[i] = h;
          if (!kept) continue;
          expectedCount += count;
          meanH2 += count * h * h;
          varianceH2 += count * h * h * h * h;
          kappa4 += count * h * h * h * h * h * h * h * h;
        }
      }
    }
    // The strain h_K above which `threshold` binaries are expected: cells louder than it are sparse.
    const hK = threshold === 0 ? Infinity : expectedCount <= threshold ? 0 : loudestExpected(nodeCount, nodeStrain, 1 / threshold, histogram);
    let denseH2 = 0;
    let denseH4 = 0;
    let denseLoudest = -1;
    let sparseCells = 0;
    for (let i = 0; i < nodeCount.length; i++) {
      const c = nodeCount[i];
      if (!(c > 0)) continue;
      const h = nodeStrain[i];
      if (h > hK) {
        sparseCells++;
        continue;
      }
      denseH2 += c * h * h;
      denseH4 += c * h * h * h * h;
      if (denseLoudest < 0 || h > nodeStrain[denseLoudest]) denseLoudest = i;
    }
    const sparseNode = new Int32Array(sparseCells);
    const sparseCumulative = new Float64Array(sparseCells);
    const sparseStrain = new Float64Array(sparseCells);
    let j = 0;
    let cum = 0;
    for (let i = 0; i < nodeCount.length; i++) {
      const c = nodeCount[i];
      if (c > 0 && nodeStrain[i] > hK) {
        cum += c;
        sparseNode[j] = i;
        sparseCumulative[j] = cum;
        sparseStrain[j] = nodeStrain[i];
        j++;
      }
    }
    bins.push({
      frequencyHz: f,
      hc2PerH2: f * spanS,
      expectedCount,
      meanH2,
      varianceH2,
      fourthCumulantH2: kappa4,
      denseH2,
      denseH4,
      denseLoudest,
      denseLoudestStrain: denseLoudest >= 0 ? nodeStrain[denseLoudest] : 0,
      sparseNode,
      sparseCumulative,
      sparseStrain,
      longResidenceCount: longCount,
      longResidenceH2: longH2,
    });
  }
  return {
    bins,
    spanS,
    threshold,
    dropLongResidence: drop,
    z: Float64Array.from(zr.nodes),
    log10M: Float64Array.from(mr.nodes),
    log10MLow: mEdges.slice(0, nm),
    log10MHigh: mEdges.slice(1),
    q: Float64Array.from(qr.nodes),
    qLow: qEdges.slice(0, nq),
    qHigh: qEdges.slice(1),
    nm,
    nq,
  };
}
