// The strain form of the background integral for the circular kernel, or the circular kernel times
// shape(f_r / scaleHz) with one scale for all binaries (Phinney 2001, astro-ph/0108028; with
// M_c^(5/3) = M^(5/3) eta):
//   h_c^2(f) = 4 G^(5/3) / (3 pi^(1/3) c^2) f^(-4/3) Int dz (1+z)^(-1/3) shape((1+z) f / scaleHz)
//              Int^{x_cut(f, z)} dlog10M M^(5/3) Int dq n eta,
// with the composite Gauss-Legendre nodes of backgroundIntegral.ts. x_cut is a sum of logarithms
// (iscoCut.ts). The mass side (circularMassModels.ts) computes a separable density's factors once
// per spectrum. Accuracy where the z integrand is not smooth:
// - the z panels are refined by error control (adaptiveZRule.ts) on the integrand without the cut,
//   which finds powers z^a (a < 2) at z = 0 and other irregular z factors; smooth ones keep the
//   plain nodes;
// - at each frequency the z integrand has a kink where x_cut crosses log10MMax (and log10MMin), at a
//   known redshift; where it can cost more than KINK_TOL of h_c^2 it becomes a break point (zKinks.ts).
import { C_SI, G_SI, MPC_M, M_SUN_KG } from './constants';
import { adaptiveZRule, type PanelledRule } from './adaptiveZRule';
import { massModelOf, type MassModel } from './circularMassModels';
import { KINK_TOL, kinkRedshifts, withKinkBreaks } from './zKinks';
import { cutOffsetLog10 } from './iscoCut';
import { perNodeZStrainForm } from './perNodeZStrainForm';
import type { BinaryPopulation } from './populationTypes';
import type { IntegrationResolution } from './backgroundIntegral';

/** 4 G^(5/3) / (3 pi^(1/3) c^2) Msun^(5/3) Mpc^-3: the strain form with M in Msun and n in Mpc^-3. */
export const STRAIN_FORM_MSUN_MPC = (((4 * Math.pow(G_SI, 5 / 3)) / (3 * Math.pow(Math.PI, 1 / 3) * C_SI * C_SI)) * Math.pow(M_SUN_KG, 5 / 3)) / (MPC_M * MPC_M * MPC_M);
/** Error control of the z panels: a panel's estimated error relative to the whole z integral. */
export const Z_TOL = 1e-6;

/** A z rule laid out for an indicator scale x fn(z) (MassModel.indicatorKey) on a z range and resolution. */
interface KeptZRule {
  scale: number;
  zMin: number;
  zMax: number;
  panels: number;
  order: number;
  rule: PanelledRule;
}

/** The last z rules of each z factor (a function object, so a rule cannot go stale): populations that differ only in their mass terms share them. */
const keptZRules = new WeakMap<object, KeptZRule[]>();
const KEPT_PER_FACTOR = 4;

/**
 * The z rule of every form of the spectrum integral: the composite rule refined by error control on
 * the model's indicator. Read only by its callers; a rule kept for the same indicator is returned as
 * it is (the same numbers a new layout would give).
 */
export function spectrumZRule(pop: BinaryPopulation, res: IntegrationResolution, model: MassModel = massModelOf(pop, res)): PanelledRule {
  const key = model.indicatorKey;
  if (!key) return adaptiveZRule(pop.zMin, pop.zMax, res.zPanels, res.order, model.indicator, Z_TOL);
  let kept = keptZRules.get(key.fn);
  if (!kept) keptZRules.set(key.fn, (kept = []));
  for (const k of kept) if (k.scale === key.scale && k.zMin === pop.zMin && k.zMax === pop.zMax && k.panels === res.zPanels && k.order === res.order) return k.rule;
  const rule = adaptiveZRule(pop.zMin, pop.zMax, res.zPanels, res.order, model.indicator, Z_TOL);
  if (kept.length >= KEPT_PER_FACTOR) kept.shift();
  kept.push({ scale: key.scale, zMin: pop.zMin, zMax: pop.zMax, panels: res.zPanels, order: res.order, rule });
  return rule;
}

/** h_c^2 at each frequency (Hz); see the file comment. */
export function circularStrainForm(pop: BinaryPopulation, freqsHz: ArrayLike<number>, cutFactor: number, res: IntegrationResolution, shape?: (ratio: number) => number, scaleHz = 1): Float64Array {
  // a density with steps in z that move with (M, q): z integrated inside each (M, q)
  if (pop.zIntegral) return perNodeZStrainForm(pop, freqsHz, cutFactor, res, shape, scaleHz);
  const model = massModelOf(pop, res);
  const zr = spectrumZRule(pop, res, model);
  const nz = zr.nodes.length;
  const log1pz = new Float64Array(nz);
  const zWeight = new Float64Array(nz); // w_z (1+z)^(-1/3)
  for (let iz = 0; iz < nz; iz++) {
    log1pz[iz] = Math.log10(1 + zr.nodes[iz]);
    zWeight[iz] = zr.weights[iz] * Math.pow(1 + zr.nodes[iz], -1 / 3);
  }
  const lo = pop.log10MMin;
  const nodeMass = model.nodeMass(zr.nodes, zr.values, freqsHz.length * nz);
  const hi = pop.log10MMax;
  const x0 = cutOffsetLog10(cutFactor);

  // The kinks of the cut (zKinks.ts) and cheap bounds on J h^2 / 2 there, with (1+z)^(-4/3) <= 1 and
  // at(z, x) <= atMost(x), so that kinks that cannot matter cost no evaluation.
  let widest = 0;
  for (let p = 0; p + 1 < zr.edges.length; p++) widest = Math.max(widest, zr.edges[p + 1] - zr.edges[p]);
  const kinks = {
    uMin: Math.log10(1 + pop.zMin),
    uMax: Math.log10(1 + pop.zMax),
    hiBound: (0.5 * widest * widest * model.atMost(hi, zr.values)) / Math.LN10,
    loBound: (0.5 * widest * widest * model.atMost(lo, zr.values)) / Math.LN10,
  };

  const out = new Float64Array(freqsHz.length);
  for (let k = 0; k < freqsHz.length; k++) {
    const f = freqsHz[k];
    const xf = x0 - Math.log10(f);
    let total = 0;
    for (let iz = 0; iz < nz; iz++) {
      const xCut = xf - log1pz[iz];
      if (xCut <= lo) continue;
      if (shape) {
        const factor = shape(((1 + zr.nodes[iz]) * f) / scaleHz);
        if (factor !== 0) total += zWeight[iz] * factor * nodeMass(iz, xCut);
      } else total += zWeight[iz] * nodeMass(iz, xCut);
    }
    // a kink inside the z range whose bound is not negligible (any kink with an emission factor)
    const uHi = xf - hi;
    const uLo = xf - lo;
    const bar = KINK_TOL * Math.abs(total);
    const check = (uHi > kinks.uMin && uHi < kinks.uMax && (shape || kinks.hiBound > bar)) || (uLo > kinks.uMin && uLo < kinks.uMax && (shape || kinks.loBound > bar));
    if (check) {
      const factorAt = (z: number) => (shape ? shape(((1 + z) * f) / scaleHz) : 1);
      total = withKinkBreaks(total, zr, res.order, kinkRedshifts(xf, lo, hi, pop.zMin, pop.zMax), {
        at: (z) => {
          const xCut = xf - Math.log10(1 + z);
          return xCut <= lo ? 0 : Math.pow(1 + z, -1 / 3) * factorAt(z) * model.massAt(z, xCut);
        },
        edge: (z, x) => Math.pow(1 + z, -1 / 3) * factorAt(z) * model.at(z, x),
        panelSum: (p) => panelSum(p, zr, zWeight, log1pz, nodeMass, f, xf, lo, shape, scaleHz),
      });
    }
    out[k] = STRAIN_FORM_MSUN_MPC * Math.pow(f, -4 / 3) * total;
    if (!Number.isFinite(out[k])) throw new RangeError(`h_c^2 is not finite at f = ${f} Hz${shape ? ' (the emission factor returned a non-finite value?)' : ''}`);
  }
  return out;
}

/** Panel p's share of the z integral at one frequency (the sum of circularStrainForm's loop over its nodes). */
function panelSum(p: number, zr: PanelledRule, zWeight: Float64Array, log1pz: Float64Array, nodeMass: (iz: number, xCut: number) => number, f: number, xf: number, lo: number, shape: ((r: number) => number) | undefined, scaleHz: number): number {
  let s = 0;
  for (let iz = zr.starts[p]; iz < zr.starts[p + 1]; iz++) {
    const xCut = xf - log1pz[iz];
    const factor = shape ? shape(((1 + zr.nodes[iz]) * f) / scaleHz) : 1;
    if (xCut > lo && factor !== 0) s += zWeight[iz] * factor * nodeMass(iz, xCut);
  }
  return s;
}

/**
 * The z integral `total` at frequency f with each panel that holds a significant kink of the cut,
 * x_cut(z) = xf - log10(1+z) = log10MMax or log10MMin, integrated again with the kinks as break points.
 */
