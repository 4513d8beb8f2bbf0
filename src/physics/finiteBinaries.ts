// The finite number of binaries behind the background (Sesana, Vecchio & Colacino 2008, MNRAS 390, 192):
// expected binaries per frequency bin of width 1/T, the spectrum expected when the rare heaviest
// binaries are absent from a bin, and the strain of the loudest binary expected per bin.
// Circular binaries, with the ISCO cut of the circular integrator (f_r <= f_ISCO,gw(M);
// src/physics/circularKernel.ts). GW-driven residence times (below), or, given an environment's residence
// factor R (residenceFactor.ts), those times R: the count per ln f and h^2 summed over it are the
// GW-driven ones times R, the strain of one binary is unchanged (Phinney 2001; Sesana 2013).
//
// Scheme: composite Gauss-Legendre nodes in z, log10M and q (as src/physics/backgroundIntegral.ts).
// Each node carries the expected number of binaries in the bin and the strain of one such binary.
// For the mass where fewer than one binary is expected above it, each mass node's count (summed over
// z and q) is spread evenly over its cell (as wide as its weight), so the cumulative count from the
// top is piecewise linear; the cut falls where it reaches 1.
import { C_SI, G_SI } from './constants';
import type { FlatLambdaCdm } from './cosmology';
import { compositeNodes } from './gaussLegendre';
import type { BinaryPopulation } from './populationTypes';
import type { ResidenceFactor } from './residenceFactor';
import { LoudestSearch } from './loudestSearch';
import { LoudestSweep } from './loudestSweep';
import { nodeRates, type NodeSumsOverQ } from './nodeRates';
import { NO_TIME_CHECK, type TimeCheck } from './timeCheck';

/** dt_r/dln f_r = (5/96) (G M_c / c^3)^(-5/3) (pi f_r)^(-8/3), s (Peters 1964, Phys. Rev. 136, B1224; Sesana, Vecchio & Colacino 2008). */
export function circularResidenceTime(frHz: number, mcKg: number): number {
  return RESIDENCE * Math.pow(mcKg, -5 / 3) * Math.pow(frHz, -8 / 3);
}
// Module-level numbers (imported bindings are slower to read in hot loops).
const RESIDENCE = (5 / 96) * Math.pow(G_SI / C_SI ** 3, -5 / 3) * Math.pow(Math.PI, -8 / 3);
const STRAIN = (Math.sqrt(32 / 5) * Math.pow(G_SI, 5 / 3) * Math.pow(Math.PI, 2 / 3)) / C_SI ** 4;

/**
 * Sky- and polarisation-averaged strain of one circular binary,
 * h = sqrt(32/5) (G M_c)^(5/3) (pi f_r)^(2/3) / (c^4 D_C) (Sesana, Vecchio & Colacino 2008, MNRAS 390, 192).
 */
export function singleBinaryStrain(frHz: number, mcKg: number, comovingDistanceM: number): number {
  return (STRAIN * Math.pow(mcKg, 5 / 3) * Math.pow(frHz, 2 / 3)) / comovingDistanceM;
}

export interface FiniteResolution {
  zPanels: number;
  log10MPanels: number;
  qPanels: number;
  order: number;
}

/** Default: 4 x 32 x 1 panels of 6 points (24 z x 192 log10M x 6 q nodes); mass panels 1/32 of the mass range. */
export const FINITE_DEFAULT_RESOLUTION: Readonly<FiniteResolution> = Object.freeze({ zPanels: 4, log10MPanels: 32, qPanels: 1, order: 6 });

export interface FiniteBinaryResult {
  frequencyHz: Float64Array;
  /** Expected number of binaries in each bin [f - 1/(2T), f + 1/(2T)] (bin width 1/T, d ln f = 1/(f T)). */
  expectedPerBin: Float64Array;
  /** h_c of the whole population (sum of h^2 over the expected number per ln f: Phinney's h_c). */
  smoothHc: Float64Array;
  /** h_c with the binaries above cutLog10M left out. */
  thinnedHc: Float64Array;
  /** log10 of the total mass (Msun) above which fewer than one binary is expected in the bin. */
  cutLog10M: Float64Array;
  /** Strain h of the loudest binary expected in the bin (N(>h) = 1); 0 where fewer than one binary is expected. */
  loudestStrain: Float64Array;
  /** Of expectedPerBin, the binaries whose residence time dt_r/dln f_r exceeds the age of the Universe at their z. */
  longResidencePerBin: Float64Array;
}

/**
 * Counts and strains per frequency bin for a population, a cosmology and an observing span T:
 * d^3N/(dz dlog10M dq dln f_r) = n(z, log10M, q) (dV_c/dz) |dz/dt_r| dt_r/dln f_r
 * (Sesana, Vecchio & Colacino 2008; Hogg 1999 for dV_c/dz and dt/dz), and
 * h_c^2(f) = Int dN/dln f h^2, which equals Phinney's h_c^2 (Phinney 2001) identically.
 * With `residence`, dt_r/dln f_r is the total residence time, the GW one times R(f_r, M, q, z), and
 * h_c^2 equals Phinney's h_c^2 with the emission kernel circular x R; a binary is long-residence when
 * that total time exceeds the age. Without it every number is the GW-driven one, computed as before.
 * `checkTime` is called once per redshift row of the set-up and once per bin (TimeCheck), and GW-driven
 * once per bin again by each group of fields computed when first read (cuts and thinned h_c, loudest binaries).
 */
export function finiteBinaryBins(
  pop: BinaryPopulation,
  cosmo: FlatLambdaCdm,
  freqsHz: ArrayLike<number>,
  spanS: number,
  resolution: Partial<FiniteResolution> = {},
  residence?: ResidenceFactor,
  checkTime: TimeCheck = NO_TIME_CHECK,
): FiniteBinaryResult {
  if (!(spanS > 0) || !Number.isFinite(spanS)) throw new RangeError(`observing span must be positive and finite, got ${spanS} s`);
  const res = { ...FINITE_DEFAULT_RESOLUTION, ...resolution };
  for (const [k, v] of Object.entries(res)) if (!Number.isInteger(v) || v < 1 || v > 200) throw new RangeError(`resolution ${k} must be an integer in [1, 200], got ${v}`);
  const zr = compositeNodes(pop.zMin, pop.zMax, res.zPanels, res.order);
  const mr = compositeNodes(pop.log10MMin, pop.log10MMax, res.log10MPanels, res.order);
  const qr = compositeNodes(pop.qMin, pop.qMax, res.qPanels, res.order);
  const nz = zr.nodes.length;
  const nm = mr.nodes.length;
  const nq = qr.nodes.length;
  const size = nz * nm * nq;

  // GW-driven: the sums over q are filled in the pass over the nodes that computes the rates.
  const overQ = residence ? undefined : { perMc53: new Float64Array(nz * nm), timesMc53: new Float64Array(nz * nm), perMc53ByQ: new Float64Array(nz * nq * (nm + 1)) };
  const { rate, mc53, massKg, fIsco, dc, age } = nodeRates(pop, cosmo, zr, mr, qr, checkTime, overQ);

  const nf = freqsHz.length;
  const out: FiniteBinaryResult = {
    frequencyHz: Float64Array.from(freqsHz),
    expectedPerBin: new Float64Array(nf),
    smoothHc: new Float64Array(nf),
    thinnedHc: new Float64Array(nf),
    cutLog10M: new Float64Array(nf),
    loudestStrain: new Float64Array(nf),
    longResidencePerBin: new Float64Array(nf),
  };
  // Without a residence factor the node sums do not depend on the frequency: built once. With one,
  // each node's rate is scaled by the factor at the bin's f_r and the sums are rebuilt per bin.
  const scaled = residence ? new Float64Array(size) : rate;
  const factor = residence ? new Float64Array(size) : undefined;
  let sums = overQ ? sumsBelow(overQ, nz, nm) : undefined;
  // With a residence factor the rates change per bin: a search per bin. Without one, one walk for all bins (loudestSweep.ts) after the loop.
  let loud: LoudestSearch | undefined;
  const perBin: PerBin | undefined = residence ? undefined : { tau: new Float64Array(nf * nz), hF: new Float64Array(nf * nz), emitting: new Int32Array(nf * nz), h2Total: new Float64Array(nf) };
  // Cell of each mass node: as wide as its quadrature weight, cells laid end to end (each node lies in
  // its own cell: the separation theorem of Chebyshev, Markov and Stieltjes, Szego 1939, Orthogonal
  // Polynomials, 3.41; section number unverified, no copy of the book reachable with the search tool; the
  // property itself is checked on the project's composite rules in test/physics/quadratureCells.test.ts), so a node's count spread over its cell keeps the density it stands for.
  const edges = new Float64Array(nm + 1);
  edges[0] = pop.log10MMin;
  for (let im = 0; im < nm; im++) edges[im + 1] = edges[im] + mr.weights[im];
  const bin: BinScratch = { tauOf: new Float64Array(nz), hFOf: new Float64Array(nz), emitting: new Int32Array(nz), count: 0, h2Total: 0, longCount: 0 };
  for (let k = 0; k < nf; k++) {
    checkTime();
    const f = freqsHz[k];
    if (!(f > 0) || !Number.isFinite(f)) throw new RangeError(`frequency ${k + 1} must be positive and finite, got ${f} Hz`);
    const dlnf = 1 / (f * spanS);
    if (residence && factor) {
      fillResidenceFactors(residence, f, zr.nodes, massKg, qr.nodes, factor, rate, scaled);
      sums = nodeSums(scaled, mc53, nz, nm, nq);
      if (loud) loud.useRates(scaled);
      else loud = new LoudestSearch(scaled, mc53, nz, nm, nq);
    }
    // Each loop over the nodes is a function of its own: compiled on its own while the cell runs cold.
    binTotals(bin, sums as NodeSums, zr.nodes, f, dlnf, dc, age, fIsco, mc53, nm, nq, factor, scaled);
    const { count, h2Total } = bin;
    out.expectedPerBin[k] = count;
    out.longResidencePerBin[k] = bin.longCount;
    out.smoothHc[k] = Math.sqrt(h2Total);
    if (perBin) {
      // GW-driven: the cuts and the loudest binaries are computed when first read (below), from these.
      perBin.tau.set(bin.tauOf, k * nz);
      perBin.hF.set(bin.hFOf, k * nz);
      perBin.emitting.set(bin.emitting, k * nz);
      perBin.h2Total[k] = h2Total;
      continue;
    }
    // With fewer than one binary in the whole bin nothing is expected: cut at the bottom, h_c = 0.
    const cut = count >= 1 ? massCut(bin, sums as NodeSums, dlnf, edges, nm) : { log10M: pop.log10MMin, h2Above: h2Total };
    out.cutLog10M[k] = cut.log10M;
    out.thinnedHc[k] = Math.sqrt(Math.max(0, h2Total - cut.h2Above));
    // Loudest expected binary: nodes by decreasing strain until one binary is expected.
    out.loudestStrain[k] = count < 1 ? 0 : (loud as LoudestSearch).search(bin.tauOf, bin.hFOf, bin.emitting, dlnf);
  }
  if (perBin) {
    const gwSums = sums as NodeSums;
    computedOnFirstRead(out, ['cutLog10M', 'thinnedHc'], () => cutsOfBins(out.frequencyHz, out.expectedPerBin, perBin, gwSums, edges, nz, nm, spanS, checkTime));
    computedOnFirstRead(out, ['loudestStrain'], () => ({ loudestStrain: loudestBySweep(out.frequencyHz, out.expectedPerBin, perBin, new LoudestSweep(rate, mc53, zr.nodes, dc, nm, nq), nz, spanS, checkTime) }));
  }
  return out;
}

/** What the GW-driven bins keep for the fields computed when first read: each bin's per-z factors, ISCO cuts and h^2 total. */
interface PerBin {
  tau: Float64Array;
  hF: Float64Array;
  emitting: Int32Array;
  h2Total: Float64Array;
}

/**
 * Makes out[key] for each key a value computed on first read (all keys by one call of compute), so that
 * a caller asking for the counts only does not pay for the cuts or the loudest binaries.
 */
function computedOnFirstRead<T extends object, K extends keyof T>(out: T, keys: K[], compute: () => Pick<T, K>): void {
  let values: Pick<T, K> | undefined;
  for (const key of keys) Object.defineProperty(out, key, { enumerable: true, configurable: true, get: () => (values ??= compute())[key] });
}

/** The mass cut and thinned h_c of every GW-driven bin (massCut on the kept factors; sums the same for every bin). */
function cutsOfBins(f: Float64Array, counts: Float64Array, perBin: PerBin, sums: NodeSums, edges: Float64Array, nz: number, nm: number, spanS: number, checkTime: TimeCheck): { cutLog10M: Float64Array; thinnedHc: Float64Array } {
  const cutLog10M = new Float64Array(f.length);
  const thinnedHc = new Float64Array(f.length);
  for (let k = 0; k < f.length; k++) {
    checkTime();
    const at = k * nz;
    const h2Total = perBin.h2Total[k];
    const bin: BinScratch = { tauOf: perBin.tau.subarray(at, at + nz), hFOf: perBin.hF.subarray(at, at + nz), emitting: perBin.emitting.subarray(at, at + nz), count: counts[k], h2Total, longCount: 0 };
    // With fewer than one binary in the whole bin nothing is expected: cut at the bottom, h_c = 0.
    const cut = counts[k] >= 1 ? massCut(bin, sums, 1 / (f[k] * spanS), edges, nm) : { log10M: edges[0], h2Above: h2Total };
    cutLog10M[k] = cut.log10M;
    thinnedHc[k] = Math.sqrt(Math.max(0, h2Total - cut.h2Above));
  }
  return { cutLog10M, thinnedHc };
}

/** The loudest binary of each bin holding one or more, by one walk over the bins in increasing f (LoudestSweep). */
function loudestBySweep(f: Float64Array, counts: Float64Array, perBin: PerBin, sweep: LoudestSweep, nz: number, spanS: number, checkTime: TimeCheck): Float64Array {
  const loudest = new Float64Array(f.length);
  const byF = Array.from(f.keys()).sort((a, b) => f[a] - f[b] || a - b);
  for (const k of byF) {
    checkTime();
    if (counts[k] < 1) continue;
    const at = k * nz;
    loudest[k] = sweep.loudest(f[k], perBin.tau.subarray(at, at + nz), perBin.hF.subarray(at, at + nz), perBin.emitting.subarray(at, at + nz), 1 / (f[k] * spanS));
  }
  return loudest;
}

/** One bin's per-z residence and strain factors, ISCO cuts and totals (filled by binTotals). */
interface BinScratch {
  tauOf: Float64Array;
  hFOf: Float64Array;
  emitting: Int32Array;
  count: number;
  h2Total: number;
  longCount: number;
}

/** Count, h^2 and long-residence count of the bin at observed frequency f, summed over the z nodes. */
function binTotals(bin: BinScratch, sums: NodeSums, z: Float64Array, f: number, dlnf: number, dc: Float64Array, age: Float64Array, fIsco: Float64Array, mc53: Float64Array, nm: number, nq: number, factor: Float64Array | undefined, scaled: Float64Array): void {
  const { perMc53ByQ, perMc53Below, timesMc53Below } = sums;
  const { tauOf, hFOf, emitting } = bin;
  let count = 0;
  let h2Total = 0;
  let longCount = 0;
  for (let iz = 0; iz < z.length; iz++) {
    const fr = (1 + z[iz]) * f;
    // The residence time and the strain above, factored into frequency and chirp-mass parts.
    const tauF = RESIDENCE * Math.pow(fr, -8 / 3);
    const hF = (STRAIN * Math.pow(fr, 2 / 3)) / dc[iz];
    tauOf[iz] = tauF;
    hFOf[iz] = hF;
    // Masses rise with the node index and f_ISCO falls: nodes from the first past the ISCO on have merged.
    const im = firstPastIsco(fIsco, fr);
    count += perMc53Below[iz * (nm + 1) + im] * tauF * dlnf;
    h2Total += timesMc53Below[iz * (nm + 1) + im] * tauF * hF * hF;
    emitting[iz] = im;
    // Long residence: total residence time (the GW time times the factor) above the age at z.
    const long = factor ? longResidenceScaled(scaled, factor, mc53, iz, nm, nq, im, tauF, age[iz]) : longResidenceCount(perMc53ByQ, mc53, iz, nm, nq, im, tauF / age[iz]);
    longCount += long * tauF * dlnf;
  }
  bin.count = count;
  bin.h2Total = h2Total;
  bin.longCount = longCount;
}

/**
 * Cut of a bin holding one or more binaries: walk mass cells from the top until one binary is
 * expected above; log10 M of the cut and the h^2 above it.
 */
function massCut(bin: BinScratch, sums: NodeSums, dlnf: number, edges: Float64Array, nm: number): { log10M: number; h2Above: number } {
  const { perMc53, timesMc53 } = sums;
  const { tauOf, hFOf, emitting } = bin;
  const nz = tauOf.length;
  let above = 0;
  let h2Above = 0;
  for (let im = nm - 1; im >= 0; im--) {
    // This mass node's count and h^2, summed over the z where it still emits (only the nodes walked are summed).
    let nodeCount = 0;
    let nodeH2 = 0;
    for (let iz = 0; iz < nz; iz++) {
      if (im >= emitting[iz]) continue;
      nodeCount += perMc53[iz * nm + im] * tauOf[iz] * dlnf;
      nodeH2 += timesMc53[iz * nm + im] * tauOf[iz] * hFOf[iz] * hFOf[iz];
    }
    if (above + nodeCount >= 1) {
      const frac = (1 - above) / nodeCount;
      return { log10M: edges[im + 1] - frac * (edges[im + 1] - edges[im]), h2Above: h2Above + frac * nodeH2 };
    }
    above += nodeCount;
    h2Above += nodeH2;
  }
  return { log10M: edges[0], h2Above: bin.h2Total };
}

/** The first index i with fr > fIsco[i] (fIsco non-increasing), or fIsco.length: a binary search. */
export function firstPastIsco(fIsco: Float64Array, fr: number): number {
  let lo = 0;
  let hi = fIsco.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (fr > fIsco[mid]) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/** Sums over the nodes of rate / M_c^(5/3) (counts) and rate x M_c^(5/3) (h^2) that the bins read. */
interface NodeSums {
  /** Per (z, mass node): sum over q of rate / M_c^(5/3) and of rate x M_c^(5/3). */
  perMc53: Float64Array;
  timesMc53: Float64Array;
  /** Per (z, q): running sums over the mass nodes of rate / M_c^(5/3). */
  perMc53ByQ: Float64Array;
  /** Per z: running sums over the mass nodes of perMc53 and timesMc53. */
  perMc53Below: Float64Array;
  timesMc53Below: Float64Array;
}

function nodeSums(rate: Float64Array, mc53: Float64Array, nz: number, nm: number, nq: number): NodeSums {
  const overQ = { perMc53: new Float64Array(nz * nm), timesMc53: new Float64Array(nz * nm), perMc53ByQ: new Float64Array(nz * nq * (nm + 1)) };
  sumsOverQ(rate, mc53, nz, nm, nq, overQ.perMc53, overQ.timesMc53, overQ.perMc53ByQ);
  return sumsBelow(overQ, nz, nm);
}

/** The node sums from the sums over q (nodeRates.ts fills them in its pass, or sumsOverQ): adds the running sums over mass. */
function sumsBelow(overQ: NodeSumsOverQ, nz: number, nm: number): NodeSums {
  const { perMc53, timesMc53, perMc53ByQ } = overQ;
  const perMc53Below = new Float64Array(nz * (nm + 1));
  const timesMc53Below = new Float64Array(nz * (nm + 1));
  runningSumsOverMass(perMc53, timesMc53, nz, nm, perMc53Below, timesMc53Below);
  return { perMc53, timesMc53, perMc53ByQ, perMc53Below, timesMc53Below };
}

/**
 * Sums over q per (z, mass node) for the counts and h^2 (dN h^2 = rate tau_F h_F^2 M_c^(5/3)), and per
 * (z, q) the running sums over the mass nodes of rate / M_c^(5/3) (with a residence factor, per bin;
 * GW-driven, nodeRates.ts fills the same sums in its pass). M_c rises with the mass index at fixed
 * q, so the nodes with residence time tau_F / M_c^(5/3) above the age are a prefix.
 */
function sumsOverQ(rate: Float64Array, mc53: Float64Array, nz: number, nm: number, nq: number, perMc53: Float64Array, timesMc53: Float64Array, perMc53ByQ: Float64Array): void {
  let i = 0; // node (iz * nm + im) * nq + iq
  for (let iz = 0; iz < nz; iz++) {
    for (let im = 0; im < nm; im++) {
      let a = 0;
      let b = 0;
      for (let iq = 0; iq < nq; iq++, i++) {
        const r = rate[i];
        const m53 = mc53[im * nq + iq];
        const per = r / m53;
        a += per;
        b += r * m53;
        const base = (iz * nq + iq) * (nm + 1) + im;
        perMc53ByQ[base + 1] = perMc53ByQ[base] + per;
      }
      perMc53[iz * nm + im] = a;
      timesMc53[iz * nm + im] = b;
    }
  }
}

/** Running sums over the mass nodes of each z of perMc53 and timesMc53: the totals below a z's ISCO cut in one lookup. */
function runningSumsOverMass(perMc53: Float64Array, timesMc53: Float64Array, nz: number, nm: number, perMc53Below: Float64Array, timesMc53Below: Float64Array): void {
  for (let iz = 0; iz < nz; iz++) {
    for (let im = 0; im < nm; im++) {
      perMc53Below[iz * (nm + 1) + im + 1] = perMc53Below[iz * (nm + 1) + im] + perMc53[iz * nm + im];
      timesMc53Below[iz * (nm + 1) + im + 1] = timesMc53Below[iz * (nm + 1) + im] + timesMc53[iz * nm + im];
    }
  }
}

/**
 * factor[i] = R at node i for observed frequency f (one binary (M, q) at a time, through the redshifts:
 * the order the factors of phenomHardeningSpectrum.ts and stellarHardening.ts cache for), and
 * scaled[i] = rate[i] x factor[i] (when given). Nodes of rate 0 get factor 0 without a call.
 */
export function fillResidenceFactors(residence: ResidenceFactor, f: number, z: ArrayLike<number>, massKg: ArrayLike<number>, q: ArrayLike<number>, factor: Float64Array, rate?: Float64Array, scaled?: Float64Array): void {
  const nz = z.length;
  const nm = massKg.length;
  const nq = q.length;
  for (let im = 0; im < nm; im++) {
    for (let iq = 0; iq < nq; iq++) {
      for (let iz = 0; iz < nz; iz++) {
        const i = (iz * nm + im) * nq + iq;
        if (rate && rate[i] === 0) {
          // No binaries at this node: its factor multiplies nothing.
          factor[i] = 0;
          if (scaled) scaled[i] = 0;
          continue;
        }
        const fr = (1 + z[iz]) * f;
        const x = residence(fr, massKg[im], q[iq], z[iz]);
        if (!(x >= 0) || x === Infinity) throw new RangeError(`residence factor is ${x} at f_r = ${fr} Hz, M = ${massKg[im]} kg, q = ${q[iq]}, z = ${z[iz]}; it must be finite and >= 0`);
        factor[i] = x;
        if (rate && scaled) scaled[i] = rate[i] * x;
      }
    }
  }
}

/**
 * Sum over the emitting nodes (mass index < emitting) of redshift node iz of scaled rate / M_c^(5/3)
 * where the total residence time tau_F x factor / M_c^(5/3) exceeds the age (no longer a prefix in mass).
 */
function longResidenceScaled(scaled: Float64Array, factor: Float64Array, mc53: Float64Array, iz: number, nm: number, nq: number, emitting: number, tauF: number, age: number): number {
  let sum = 0;
  for (let im = 0; im < emitting; im++) {
    for (let iq = 0; iq < nq; iq++) {
      const i = (iz * nm + im) * nq + iq;
      const m53 = mc53[im * nq + iq];
      if ((tauF * factor[i]) / m53 > age) sum += scaled[i] / m53;
    }
  }
  return sum;
}

/**
 * Sum over q of rate / M_c^(5/3) for the emitting mass nodes (index < emitting) of redshift node iz
 * whose M_c^(5/3) lies below mc53Limit (residence time tau_F / M_c^(5/3) longer than the age): a
 * binary search per q in the rising M_c^(5/3) of the mass nodes.
 */
function longResidenceCount(perMc53ByQ: Float64Array, mc53: Float64Array, iz: number, nm: number, nq: number, emitting: number, mc53Limit: number): number {
  let sum = 0;
  for (let iq = 0; iq < nq; iq++) {
    let lo = 0;
    let hi = emitting;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (mc53[mid * nq + iq] < mc53Limit) lo = mid + 1;
      else hi = mid;
    }
    sum += perMc53ByQ[(iz * nq + iq) * (nm + 1) + lo];
  }
  return sum;
}

const HISTOGRAM_BINS = 4096;

/** Index of the high 32-bit word of a float64 in a Uint32Array view of its buffer. */
const HIGH_WORD = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;

/**
 * The strain h* with one binary expected above it: nodes accumulated by decreasing strain until the
 * count reaches 1. Exactly what a full sort gives, in linear time: counts are first binned by the
 * high 32 bits of each strain (for positive IEEE 754 doubles a non-decreasing function of the value,
 * IEEE 754-2019 section 3.4, so the bins keep the order of a sort; exponent and top mantissa bits
 * make the bins close to logarithmic), and only the nodes of the bin where the cumulative count
 * crosses 1 are sorted.
 */
export function loudestExpected(perLnF: Float64Array, strain: Float64Array, dlnf: number, histogram: Float64Array): number {
  let lo = Infinity;
  let hi = 0;
  for (let i = 0; i < strain.length; i++) {
    if (perLnF[i] === 0) continue;
    if (strain[i] < lo) lo = strain[i];
    if (strain[i] > hi) hi = strain[i];
  }
  if (!(hi >= lo)) return 0;
  const words = new Uint32Array(strain.buffer, strain.byteOffset, strain.length * 2);
  const bins = strainBins(lo, hi, histogram.length);
  histogram.fill(0);
  for (let i = 0; i < strain.length; i++) {
    const n = perLnF[i];
    if (n !== 0) histogram[binOf(words[2 * i + HIGH_WORD], bins, histogram.length)] += n * dlnf;
  }
  return loudestFromHistogram(perLnF, strain, words, dlnf, histogram, bins);
}

/** Histogram bins on the high words of positive strains in [lo, hi]: bin = floor((word - low word) x scale). */
interface StrainBins {
  lowWord: number;
  scale: number;
}

const boundValue = new Float64Array(1);
const boundWords = new Uint32Array(boundValue.buffer);

function strainBins(lo: number, hi: number, count: number): StrainBins {
  boundValue[0] = lo;
  const lowWord = boundWords[HIGH_WORD];
  boundValue[0] = hi;
  const highWord = boundWords[HIGH_WORD];
  let shift = 0;
  while ((highWord - lowWord) / 2 ** shift >= count) shift++;
  return { lowWord, scale: 1 / 2 ** shift };
}

/** The bin of a high word, clamped to the histogram (clamping keeps the order). */
function binOf(word: number, bins: StrainBins, count: number): number {
  const b = Math.floor((word - bins.lowWord) * bins.scale);
  return b < 0 ? 0 : b >= count ? count - 1 : b;
}

/** From a filled histogram: the bin where the count from the top crosses 1, then its nodes sorted by strain. */
function loudestFromHistogram(perLnF: Float64Array, strain: Float64Array, words: Uint32Array, dlnf: number, histogram: Float64Array, bins: StrainBins): number {
  let cum = 0;
  let b = histogram.length - 1;
  for (; b >= 0; b--) {
    if (cum + histogram[b] >= 1) break;
    cum += histogram[b];
  }
  if (b < 0) return 0;
  const members: number[] = [];
  for (let i = 0; i < strain.length; i++) if (perLnF[i] !== 0 && binOf(words[2 * i + HIGH_WORD], bins, histogram.length) === b) members.push(i);
  members.sort((x, y) => strain[y] - strain[x]);
  for (const i of members) {
    const n = perLnF[i] * dlnf;
    if (cum + n >= 1) return strain[i];
    cum += n;
  }
  return strain[members[members.length - 1]];
}
