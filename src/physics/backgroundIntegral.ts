// The characteristic-strain spectrum of a population of inspiralling binaries (Phinney 2001,
// astro-ph/0108028):
//   h_c^2(f) = 4G / (pi c^2 f^2) Int dz dlog10M dq  n(z, log10M, q) / (1+z)  dE/dln f_r |_{f_r = (1+z) f}
// with n = d^3n/(dz dlog10M dq) the comoving number density of remnants and dE/dln f_r an EmissionKernel.
//
// Scheme: composite Gauss-Legendre in z, log10M and q (panels x order points in each). The emission of
// each binary ends where f_r reaches cutFactor x f_ISCO,gw(M); since f_ISCO falls with M, that is an
// upper limit log10M_cut(f, z) on the mass integral, applied as the integration limit, never as a step
// in the integrand: the mass panels wholly below the cut keep their nodes (their values are computed
// once per z node and shared by all frequencies), and the panel the cut falls in is laid anew on
// [its lower edge, log10M_cut] (massPanels.ts). log10M_cut is a sum of logarithms (iscoCut.ts).
// The z panels are refined by error control where the z integrand is not smooth (adaptiveZRule.ts),
// and the kinks where log10M_cut crosses the mass limits become break points where they matter
// (zKinks.ts); all forms below share that z rule.
// Error: for smooth integrands composite Gauss-Legendre converges geometrically with order; the default
// resolution gives A_yr to better than 1e-4 relative for the demo and test populations (see
// test/physics/convergence.test.ts) and for kinked densities (test/physics/kinkedDensities.test.ts).
//
// Circular kernel fast path (circularStrainForm.ts): with M_c^(5/3) = M^(5/3) eta, h_c^2 =
// 4 G^(5/3) / (3 pi^(1/3) c^2) f^(-4/3) Int dz (1+z)^(-1/3) Int dlog10M M^(5/3) Int dq n eta
// (Phinney 2001); a separable population (separablePopulation.ts) has each factor's node values
// computed once per spectrum.
//
// Factored kernels (factoredKernel.ts: circular x shape(f_r / scale)) use the same strain form. With
// one scale for all binaries the factor depends on (f, z) only and multiplies the cached mass sums;
// with a scale per (M, q) the weighted values w_M w_q n eta M^(5/3) are cached per z node, the scales
// once per mass and mass-ratio node, and only shape(f_r / scale) is evaluated per frequency.
import { C_SI, G_SI, MPC_M, M_SUN_KG } from './constants';
import { symmetricMassRatio } from './binaryMasses';
import { circularGwKernel } from './circularKernel';
import { type QuadratureRule } from './gaussLegendre';
import { massRatioRule } from './massRatioRule';
import { circularStrainForm, spectrumZRule } from './circularStrainForm';
import type { PanelledRule } from './adaptiveZRule';
import { kinkRedshifts, withKinkBreaks } from './zKinks';
import { MassPanels } from './massPanels';
import { checkedValue, densityAt } from './densityChecks';
import { cutOffsetLog10 } from './iscoCut';
import { circularTimesShapeOf, type CircularTimesShape } from './factoredKernel';
import type { BinaryPopulation, EmissionKernel } from './populationTypes';
import type { Spectrum } from './spectrum';

export interface IntegrationResolution {
  /** Panels in z, in log10M and in q, and Gauss-Legendre points per panel. */
  zPanels: number;
  log10MPanels: number;
  qPanels: number;
  order: number;
}

/**
 * Default resolution: 2 x 4 x 1 panels of 6 points (12 z x 24 log10M x 6 q nodes); A_yr within 1e-4
 * of HIGH_RESOLUTION for the demo and test populations (test/physics/convergence.test.ts).
 */
export const DEFAULT_RESOLUTION: Readonly<IntegrationResolution> = Object.freeze({ zPanels: 2, log10MPanels: 4, qPanels: 1, order: 6 });

/** A high resolution used as the convergence reference: 16 x 24 x 8 panels of 10 points. */
export const HIGH_RESOLUTION: Readonly<IntegrationResolution> = Object.freeze({ zPanels: 16, log10MPanels: 24, qPanels: 8, order: 10 });

export interface BackgroundOptions {
  /** dE/dln f_r of one binary; default the circular GW-driven kernel. */
  kernel?: EmissionKernel;
  /**
   * The mass integral stops where f_r = cutFactor x f_ISCO,gw(M). Default 1 (circular orbits end at
   * the ISCO). Pass Infinity for a kernel that ends the inspiral itself (e.g. eccentric harmonics).
   */
  cutFactor?: number;
  resolution?: Partial<IntegrationResolution>;
}

/** 4 G / (pi c^2), for the energy form. */
const ENERGY_FORM = (4 * G_SI) / (Math.PI * C_SI * C_SI);
/** 4 G^(5/3) / (3 pi^(1/3) c^2), for the strain form. */
const STRAIN_FORM = (4 * Math.pow(G_SI, 5 / 3)) / (3 * Math.pow(Math.PI, 1 / 3) * C_SI * C_SI);
/** Mpc^-3 to m^-3. */
const PER_MPC3 = 1 / (MPC_M * MPC_M * MPC_M);
const LOG10_MSUN = Math.log10(M_SUN_KG);

/** Checks a population's limits, throwing RangeError naming the limit. */
export function checkPopulation(pop: BinaryPopulation): void {
  const ok = (x: number) => Number.isFinite(x);
  if (!(ok(pop.zMin) && ok(pop.zMax) && pop.zMin >= 0 && pop.zMax > pop.zMin)) throw new RangeError(`population redshift limits must satisfy 0 <= zMin < zMax, got [${pop.zMin}, ${pop.zMax}]`);
  if (!(ok(pop.log10MMin) && ok(pop.log10MMax) && pop.log10MMax > pop.log10MMin)) throw new RangeError(`population log10 mass limits must satisfy log10MMin < log10MMax, got [${pop.log10MMin}, ${pop.log10MMax}]`);
  if (!(pop.qMin > 0 && pop.qMax <= 1 && pop.qMax > pop.qMin)) throw new RangeError(`population mass-ratio limits must satisfy 0 < qMin < qMax <= 1, got [${pop.qMin}, ${pop.qMax}]`);
}

function resolved(r?: Partial<IntegrationResolution>): IntegrationResolution {
  if (r === undefined) return DEFAULT_RESOLUTION; // frozen and valid; no copy per spectrum
  const out = { ...DEFAULT_RESOLUTION, ...r };
  for (const [k, v] of Object.entries(out)) {
    if (!Number.isInteger(v) || v < 1 || v > 200) throw new RangeError(`resolution ${k} must be an integer in [1, 200], got ${v}`);
  }
  return out;
}

/** log10 of the largest total mass (Msun) still emitting at rest-frame frequency frHz. */
function log10CutMass(frHz: number, cutFactor: number): number {
  return cutOffsetLog10(cutFactor) - Math.log10(frHz);
}

/** h_c^2 at each frequency (observed GW frequency, Hz). */
export function characteristicStrainSquared(pop: BinaryPopulation, freqsHz: ArrayLike<number>, opts: BackgroundOptions = {}): Float64Array {
  checkPopulation(pop);
  for (let i = 0; i < freqsHz.length; i++) {
    if (!(freqsHz[i] > 0) || !Number.isFinite(freqsHz[i])) throw new RangeError(`frequency ${i + 1} must be positive and finite, got ${freqsHz[i]} Hz`);
  }
  const kernel = opts.kernel ?? circularGwKernel;
  const cutFactor = opts.cutFactor ?? 1;
  if (!(cutFactor > 0)) throw new RangeError(`cutFactor must be positive, got ${cutFactor}`);
  const res = resolved(opts.resolution);
  if (kernel === circularGwKernel) return circularStrainForm(pop, freqsHz, cutFactor, res);
  const factored = circularTimesShapeOf(kernel);
  if (factored && typeof factored.scaleHz === 'number') return circularStrainForm(pop, freqsHz, cutFactor, res, factored.shape, factored.scaleHz);
  if (factored) return factoredStrainForm(pop, freqsHz, factored, cutFactor, res);
  return energyForm(pop, freqsHz, kernel, cutFactor, res);
}

/** The spectrum h_c(f) on the given grid. */
export function backgroundSpectrum(pop: BinaryPopulation, freqsHz: ArrayLike<number>, opts: BackgroundOptions = {}): Spectrum {
  const hc2 = characteristicStrainSquared(pop, freqsHz, opts);
  const hc = new Float64Array(hc2.length);
  for (let i = 0; i < hc2.length; i++) hc[i] = Math.sqrt(hc2[i]);
  return { frequencyHz: Float64Array.from(freqsHz), hc };
}

/**
 * Strain form for circular x shape(f_r / scale(M, q)): per z node the values w_M w_q n eta M^(5/3) on
 * the whole mass panels are cached, the scales are computed once per (M, q) node, and each frequency
 * sums those values times shape(f_r / scale) (Phinney 2001 strain form, as circularStrainForm).
 */
function factoredStrainForm(pop: BinaryPopulation, freqsHz: ArrayLike<number>, desc: CircularTimesShape, cutFactor: number, res: IntegrationResolution): Float64Array {
  const scaleOf = desc.scaleHz as (mKg: number, q: number) => number;
  const shape = desc.shape;
  const zr = spectrumZRule(pop, res);
  const qr = massRatioRule(pop, res.qPanels, res.order);
  const nq = qr.nodes.length;
  const etaW = new Float64Array(nq);
  for (let j = 0; j < nq; j++) etaW[j] = qr.weights[j] * symmetricMassRatio(qr.nodes[j]);
  const mp = new MassPanels(pop.log10MMin, pop.log10MMax, res.log10MPanels, res.order);
  const sep = pop.separable;
  const qFactor = new Float64Array(nq);
  if (sep) for (let j = 0; j < nq; j++) qFactor[j] = etaW[j] * checkedValue(sep.massRatio(qr.nodes[j]), 'mass-ratio factor', qr.nodes[j]);

  // Per (mass node, q node) of mr: 1 / scale, or scale^kappa for a bend shape 1 / (1 + r^(-kappa)).
  // With scale = mass(M) x ratio(q) the q factors (and their powers) are computed once here.
  const kappa = desc.bendIndex;
  const factors = desc.scaleFactors;
  const ratioPart = new Float64Array(nq);
  if (factors) for (let j = 0; j < nq; j++) ratioPart[j] = kappa === undefined ? 1 / factors.ratio(qr.nodes[j]) : Math.pow(factors.ratio(qr.nodes[j]), kappa);
  const badScale = (s: number, x: number, q: number) => new RangeError(`emission scale frequency is ${s} Hz at log10M = ${x}, q = ${q}; it must be positive and finite`);
  const nodeScales = (mr: QuadratureRule, into: Float64Array): Float64Array => {
    for (let i = 0; i < mr.nodes.length; i++) {
      const mKg = M_SUN_KG * Math.pow(10, mr.nodes[i]);
      if (factors) {
        const sm = factors.mass(mKg);
        const massPart = kappa === undefined ? 1 / sm : Math.pow(sm, kappa);
        for (let j = 0; j < nq; j++) {
          const v = massPart * ratioPart[j];
          if (!(v > 0) || v === Infinity) throw badScale(sm * factors.ratio(qr.nodes[j]), mr.nodes[i], qr.nodes[j]);
          into[i * nq + j] = v;
        }
        continue;
      }
      for (let j = 0; j < nq; j++) {
        const s = scaleOf(mKg, qr.nodes[j]);
        if (!(s > 0) || s === Infinity) throw badScale(s, mr.nodes[i], qr.nodes[j]);
        into[i * nq + j] = kappa === undefined ? 1 / s : Math.pow(s, kappa);
      }
    }
    return into;
  };
  // w_M w_q n eta M^(5/3) (M in kg) at each (mass node, q node) of mr.
  const weightedValues = (z: number, mr: QuadratureRule, into: Float64Array): Float64Array => {
    for (let i = 0; i < mr.nodes.length; i++) {
      const wm = mr.weights[i] * Math.pow(10, (5 / 3) * (mr.nodes[i] + LOG10_MSUN));
      if (sep) {
        const zm = wm * checkedValue(sep.zMass(z, mr.nodes[i]), 'density', z, mr.nodes[i]);
        for (let j = 0; j < nq; j++) into[i * nq + j] = zm * qFactor[j];
      } else {
        for (let j = 0; j < nq; j++) into[i * nq + j] = wm * etaW[j] * densityAt(pop, z, mr.nodes[i], qr.nodes[j]);
      }
    }
    return into;
  };
  // Sum of the values times shape(f_r / scale) over the first `count` entries.
  const sum = (fr: number, wv: Float64Array, sc: Float64Array, count: number): number => {
    let s = 0;
    if (kappa !== undefined) {
      const frPow = Math.pow(fr, -kappa);
      for (let i = 0; i < count; i++) s += wv[i] / (1 + sc[i] * frPow);
      return s;
    }
    for (let i = 0; i < count; i++) {
      const w = wv[i];
      if (w !== 0) s += w * shape(fr * sc[i]);
    }
    return s;
  };

  const baseScales = nodeScales(mp.base, new Float64Array(mp.base.nodes.length * nq));
  const cache: (Float64Array | undefined)[] = new Array(zr.nodes.length);
  const partScales = new Float64Array(res.order * nq);
  const partValues = new Float64Array(res.order * nq);
  // The z integrand (1+z)^(-1/3) Int dlog10M Int dq ... at z (iz: its node, or -1), frequency f.
  const zValue = (z: number, iz: number, f: number): number => {
    const fr = (1 + z) * f;
    const xCut = log10CutMass(fr, cutFactor);
    if (xCut <= pop.log10MMin) return 0;
    const wv = iz >= 0 ? (cache[iz] ??= weightedValues(z, mp.base, new Float64Array(mp.base.nodes.length * nq))) : weightedValues(z, mp.base, new Float64Array(mp.base.nodes.length * nq));
    let s = sum(fr, wv, baseScales, mp.wholePanels(xCut) * mp.order * nq);
    const part = mp.partialPanel(xCut);
    if (part.nodes.length > 0) s += sum(fr, weightedValues(z, part, partValues), nodeScales(part, partScales), part.nodes.length * nq);
    return Math.pow(1 + z, -1 / 3) * s;
  };
  // The same integrand per unit log10M at log10M = x (for the kinks of the cut).
  const edgeValue = (z: number, x: number, f: number): number => {
    const one: QuadratureRule = { nodes: Float64Array.of(x), weights: Float64Array.of(1) };
    return Math.pow(1 + z, -1 / 3) * sum((1 + z) * f, weightedValues(z, one, new Float64Array(nq)), nodeScales(one, new Float64Array(nq)), nq);
  };
  const out = new Float64Array(freqsHz.length);
  for (let k = 0; k < freqsHz.length; k++) {
    const f = freqsHz[k];
    const total = zIntegral(zr, res.order, (z, iz) => zValue(z, iz, f), (z, x) => edgeValue(z, x, f), kinksAt(pop, f, cutFactor));
    out[k] = STRAIN_FORM * Math.pow(f, -4 / 3) * total * PER_MPC3;
    if (!Number.isFinite(out[k])) throw new RangeError(`h_c^2 is not finite at f = ${f} Hz (the emission factor returned a non-finite value?)`);
  }
  return out;
}

/** The kinks of the cut inside the population's z range at frequency f (zKinks.ts). */
function kinksAt(pop: BinaryPopulation, f: number, cutFactor: number): [number, number][] {
  return cutFactor === Infinity ? [] : kinkRedshifts(cutOffsetLog10(cutFactor) - Math.log10(f), pop.log10MMin, pop.log10MMax, pop.zMin, pop.zMax);
}

/** Int dz value(z) on rule zr, with the kinks as break points where they matter (zKinks.ts). */
function zIntegral(zr: PanelledRule, order: number, value: (z: number, iz: number) => number, edge: (z: number, x: number) => number, kinks: [number, number][]): number {
  let total = 0;
  for (let iz = 0; iz < zr.nodes.length; iz++) total += zr.weights[iz] * value(zr.nodes[iz], iz);
  if (kinks.length === 0) return total;
  const panelSum = (p: number): number => {
    let s = 0;
    for (let iz = zr.starts[p]; iz < zr.starts[p + 1]; iz++) s += zr.weights[iz] * value(zr.nodes[iz], iz);
    return s;
  };
  return withKinkBreaks(total, zr, order, kinks, { at: (z) => value(z, -1), edge, panelSum });
}

/** Energy form with an arbitrary kernel; weighted densities and masses on the whole mass panels are cached per z node. */
function energyForm(pop: BinaryPopulation, freqsHz: ArrayLike<number>, kernel: EmissionKernel, cutFactor: number, res: IntegrationResolution): Float64Array {
  const zr = spectrumZRule(pop, res);
  const qr = massRatioRule(pop, res.qPanels, res.order);
  const nq = qr.nodes.length;
  const eta06 = new Float64Array(nq);
  for (let j = 0; j < nq; j++) eta06[j] = Math.pow(symmetricMassRatio(qr.nodes[j]), 0.6);
  const mp = new MassPanels(pop.log10MMin, pop.log10MMax, res.log10MPanels, res.order);
  const nb = mp.base.nodes.length;
  // Total and chirp masses (kg) at each (mass node, q node) of the whole panels; the same for every z.
  const baseM = new Float64Array(nb);
  const baseMc = new Float64Array(nb * nq);
  for (let i = 0; i < nb; i++) {
    baseM[i] = M_SUN_KG * Math.pow(10, mp.base.nodes[i]);
    for (let j = 0; j < nq; j++) baseMc[i * nq + j] = baseM[i] * eta06[j];
  }
  const cache: (Float64Array | undefined)[] = new Array(zr.nodes.length);
  const partM = new Float64Array(res.order);
  const partMc = new Float64Array(res.order * nq);

  // A separable density gives w_q p(q) once per q node.
  const sep = pop.separable;
  const qFactor = new Float64Array(nq);
  if (sep) for (let j = 0; j < nq; j++) qFactor[j] = qr.weights[j] * checkedValue(sep.massRatio(qr.nodes[j]), 'mass-ratio factor', qr.nodes[j]);
  // w_M w_q n at each node of mr.
  const weightedDensities = (z: number, mr: QuadratureRule): Float64Array => {
    const d = new Float64Array(mr.nodes.length * nq);
    for (let i = 0; i < mr.nodes.length; i++) {
      if (sep) {
        const zm = mr.weights[i] * checkedValue(sep.zMass(z, mr.nodes[i]), 'density', z, mr.nodes[i]);
        for (let j = 0; j < nq; j++) d[i * nq + j] = zm * qFactor[j];
      } else {
        for (let j = 0; j < nq; j++) d[i * nq + j] = mr.weights[i] * qr.weights[j] * densityAt(pop, z, mr.nodes[i], qr.nodes[j]);
      }
    }
    return d;
  };
  // Sum of w n K over the first `count` mass nodes.
  const sum = (fr: number, z: number, wd: Float64Array, m: Float64Array, mc: Float64Array, count: number): number => {
    let s = 0;
    for (let i = 0; i < count; i++) {
      const mKg = m[i];
      for (let j = 0; j < nq; j++) {
        const w = wd[i * nq + j];
        if (w !== 0) s += w * kernel(fr, mc[i * nq + j], mKg, qr.nodes[j], z);
      }
    }
    return s;
  };

  // The z integrand Int dlog10M Int dq n K / (1+z) at z (iz: its node, or -1), frequency f.
  const zValue = (z: number, iz: number, f: number): number => {
    const fr = (1 + z) * f;
    const xCut = log10CutMass(fr, cutFactor);
    if (xCut <= pop.log10MMin) return 0;
    const wd = iz >= 0 ? (cache[iz] ??= weightedDensities(z, mp.base)) : weightedDensities(z, mp.base);
    let s = sum(fr, z, wd, baseM, baseMc, mp.wholePanels(xCut) * mp.order);
    const part = mp.partialPanel(xCut);
    if (part.nodes.length > 0) {
      for (let i = 0; i < part.nodes.length; i++) {
        partM[i] = M_SUN_KG * Math.pow(10, part.nodes[i]);
        for (let j = 0; j < nq; j++) partMc[i * nq + j] = partM[i] * eta06[j];
      }
      s += sum(fr, z, weightedDensities(z, part), partM, partMc, part.nodes.length);
    }
    return s / (1 + z);
  };
  // The same integrand per unit log10M at log10M = x (for the kinks of the cut).
  const edgeValue = (z: number, x: number, f: number): number => {
    const one: QuadratureRule = { nodes: Float64Array.of(x), weights: Float64Array.of(1) };
    const m = Float64Array.of(M_SUN_KG * Math.pow(10, x));
    return sum((1 + z) * f, z, weightedDensities(z, one), m, Float64Array.from(eta06, (e) => m[0] * e), 1) / (1 + z);
  };
  const out = new Float64Array(freqsHz.length);
  for (let k = 0; k < freqsHz.length; k++) {
    const f = freqsHz[k];
    const total = zIntegral(zr, res.order, (z, iz) => zValue(z, iz, f), (z, x) => edgeValue(z, x, f), kinksAt(pop, f, cutFactor));
    out[k] = (ENERGY_FORM / (f * f)) * total * PER_MPC3;
    if (!Number.isFinite(out[k])) throw new RangeError(`h_c^2 is not finite at f = ${f} Hz (kernel returned a non-finite value?)`);
  }
  return out;
}
