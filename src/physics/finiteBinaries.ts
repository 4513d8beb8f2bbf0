// The finite number of binaries behind the background (Sesana, Vecchio & Colacino 2008, MNRAS 390, 192):
// expected binaries per frequency bin of width 1/T, the spectrum expected when the rare heaviest
// binaries are absent from a bin, and the strain of the loudest binary expected per bin.
// Circular GW-driven binaries throughout (residence time below), with the ISCO cut of the circular
// integrator (f_r <= f_ISCO,gw(M); src/physics/circularKernel.ts).
//
// Scheme: composite Gauss-Legendre nodes in z, log10M and q (as src/physics/backgroundIntegral.ts).
// Each node carries the expected number of binaries in the bin and the strain of one such binary.
// For the mass where fewer than one binary is expected above it, each mass node's count (summed over
// z and q) is spread evenly over its cell (as wide as its weight), so the cumulative count from the
// top is piecewise linear; the cut falls where it reaches 1.
import { C_SI, G_SI, MPC_M, M_SUN_KG } from './constants';
import { chirpMassFromTotal } from './binaryMasses';
import { iscoGwFrequencyHz } from './circularKernel';
import type { FlatLambdaCdm } from './cosmology';
import { compositeNodes } from './gaussLegendre';
import type { BinaryPopulation } from './populationTypes';

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
}

const PER_MPC3 = 1 / (MPC_M * MPC_M * MPC_M);

/**
 * Counts and strains per frequency bin for a population, a cosmology and an observing span T:
 * d^3N/(dz dlog10M dq dln f_r) = n(z, log10M, q) (dV_c/dz) |dz/dt_r| dt_r/dln f_r
 * (Sesana, Vecchio & Colacino 2008; Hogg 1999 for dV_c/dz and dt/dz), and
 * h_c^2(f) = Int dN/dln f h^2, which equals Phinney's h_c^2 (Phinney 2001) identically.
 */
export function finiteBinaryBins(
  pop: BinaryPopulation,
  cosmo: FlatLambdaCdm,
  freqsHz: ArrayLike<number>,
  spanS: number,
  resolution: Partial<FiniteResolution> = {},
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

  // Frequency-independent parts per node, index (iz * nm + im) * nq + iq:
  // weight x n x dV/dz x |dz/dt| (binaries per second of rest-frame time), chirp mass, distance.
  const rate = new Float64Array(size);
  const mc53 = new Float64Array(nm * nq); // M_c^(5/3), kg^(5/3)
  const fIsco = new Float64Array(nm);
  for (let im = 0; im < nm; im++) {
    const mKg = M_SUN_KG * Math.pow(10, mr.nodes[im]);
    fIsco[im] = iscoGwFrequencyHz(mKg);
    for (let iq = 0; iq < nq; iq++) mc53[im * nq + iq] = Math.pow(chirpMassFromTotal(mKg, qr.nodes[iq]), 5 / 3);
  }
  // A separable density (populationTypes.ts) gives its factors: one density call per (z, M) node.
  const sep = pop.separable;
  const qFactor = Float64Array.from(qr.nodes, (q) => (sep ? sep.massRatio(q) : 0));
  const dc = new Float64Array(nz);
  for (let iz = 0; iz < nz; iz++) {
    const z = zr.nodes[iz];
    dc[iz] = cosmo.comovingDistanceM(z);
    const volumePerTime = (cosmo.comovingVolumeElementM3(z) / cosmo.dtdzS(z)) * PER_MPC3;
    for (let im = 0; im < nm; im++) {
      const zMass = sep ? sep.zMass(z, mr.nodes[im]) : 0;
      for (let iq = 0; iq < nq; iq++) {
        const n = sep ? zMass * qFactor[iq] : pop.density(z, mr.nodes[im], qr.nodes[iq]);
        if (!(n >= 0) || n === Infinity) throw new RangeError(`population density is ${n} at z = ${z}, log10M = ${mr.nodes[im]}, q = ${qr.nodes[iq]}; it must be finite and >= 0`);
        rate[(iz * nm + im) * nq + iq] = zr.weights[iz] * mr.weights[im] * qr.weights[iq] * n * volumePerTime;
      }
    }
  }

  const nf = freqsHz.length;
  const out: FiniteBinaryResult = {
    frequencyHz: Float64Array.from(freqsHz),
    expectedPerBin: new Float64Array(nf),
    smoothHc: new Float64Array(nf),
    thinnedHc: new Float64Array(nf),
    cutLog10M: new Float64Array(nf),
    loudestStrain: new Float64Array(nf),
  };
  const perLnF = new Float64Array(size); // dN/dln f per node
  const strain = new Float64Array(size);
  const nodeCount = new Float64Array(nm); // per mass node, summed over z and q
  const nodeH2 = new Float64Array(nm);
  // Cell of each mass node: as wide as its quadrature weight, cells laid end to end (each node lies in
  // its own cell: the separation theorem of Chebyshev, Markov and Stieltjes, Szego 1939, Orthogonal
  // Polynomials, 3.41; section from memory), so a node's count spread over its cell keeps the density it stands for.
  const edges = new Float64Array(nm + 1);
  edges[0] = pop.log10MMin;
  for (let im = 0; im < nm; im++) edges[im + 1] = edges[im] + mr.weights[im];
  const histogram = new Float64Array(HISTOGRAM_BINS);
  for (let k = 0; k < nf; k++) {
    const f = freqsHz[k];
    if (!(f > 0) || !Number.isFinite(f)) throw new RangeError(`frequency ${k + 1} must be positive and finite, got ${f} Hz`);
    const dlnf = 1 / (f * spanS);
    nodeCount.fill(0);
    nodeH2.fill(0);
    let count = 0;
    let h2Total = 0;
    for (let iz = 0; iz < nz; iz++) {
      const fr = (1 + zr.nodes[iz]) * f;
      // The residence time and the strain above, factored into frequency and chirp-mass parts.
      const tauF = RESIDENCE * Math.pow(fr, -8 / 3);
      const hF = (STRAIN * Math.pow(fr, 2 / 3)) / dc[iz];
      for (let im = 0; im < nm; im++) {
        if (fr > fIsco[im]) {
          // Past the ISCO: merged, no longer emitting.
          for (let iq = 0; iq < nq; iq++) {
            perLnF[(iz * nm + im) * nq + iq] = 0;
            strain[(iz * nm + im) * nq + iq] = 0;
          }
          continue;
        }
        for (let iq = 0; iq < nq; iq++) {
          const idx = (iz * nm + im) * nq + iq;
          const m53 = mc53[im * nq + iq];
          const dN = (rate[idx] * tauF) / m53;
          const h = hF * m53;
          perLnF[idx] = dN;
          strain[idx] = dN === 0 ? 0 : h;
          count += dN * dlnf;
          h2Total += dN * h * h;
          nodeCount[im] += dN * dlnf;
          nodeH2[im] += dN * h * h;
        }
      }
    }
    out.expectedPerBin[k] = count;
    out.smoothHc[k] = Math.sqrt(h2Total);

    // Cut: walk mass cells from the top until one or more binaries are expected above.
    // With fewer than one binary in the whole bin nothing is expected: cut at the bottom, h_c = 0.
    let cut = pop.log10MMin;
    let h2AboveCut = h2Total;
    if (count >= 1) {
      let above = 0;
      let h2Above = 0;
      for (let im = nm - 1; im >= 0; im--) {
        if (above + nodeCount[im] >= 1) {
          const frac = (1 - above) / nodeCount[im];
          cut = edges[im + 1] - frac * (edges[im + 1] - edges[im]);
          h2AboveCut = h2Above + frac * nodeH2[im];
          break;
        }
        above += nodeCount[im];
        h2Above += nodeH2[im];
      }
    }
    out.cutLog10M[k] = cut;
    out.thinnedHc[k] = Math.sqrt(Math.max(0, h2Total - h2AboveCut));

    // Loudest expected binary: accumulate nodes by decreasing strain until one binary is expected.
    if (count < 1) {
      out.loudestStrain[k] = 0;
      continue;
    }
    out.loudestStrain[k] = loudestExpected(perLnF, strain, dlnf, histogram);
  }
  return out;
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
  const words = new Uint32Array(strain.buffer, strain.byteOffset, strain.length * 2);
  let lo = 0xffffffff;
  let hi = 0;
  for (let i = 0; i < strain.length; i++) {
    if (perLnF[i] === 0) continue;
    const w = words[2 * i + HIGH_WORD];
    if (w < lo) lo = w;
    if (w > hi) hi = w;
  }
  if (!(hi >= lo)) return 0;
  const bins = histogram.length;
  let shift = 0;
  while ((hi - lo) / 2 ** shift >= bins) shift++;
  const scale = 1 / 2 ** shift;
  histogram.fill(0);
  for (let i = 0; i < strain.length; i++) {
    const n = perLnF[i];
    if (n !== 0) histogram[Math.floor((words[2 * i + HIGH_WORD] - lo) * scale)] += n * dlnf;
  }
  let cum = 0;
  let b = bins - 1;
  for (; b >= 0; b--) {
    if (cum + histogram[b] >= 1) break;
    cum += histogram[b];
  }
  if (b < 0) return 0;
  const members: number[] = [];
  for (let i = 0; i < strain.length; i++) if (perLnF[i] !== 0 && Math.floor((words[2 * i + HIGH_WORD] - lo) * scale) === b) members.push(i);
  members.sort((x, y) => strain[y] - strain[x]);
  for (const i of members) {
    const n = perLnF[i] * dlnf;
    if (cum + n >= 1) return strain[i];
    cum += n;
  }
  return strain[members[members.length - 1]];
}
