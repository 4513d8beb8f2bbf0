// The strain form of the background integral for the circular kernel, or the circular kernel times
// shape(f_r / scaleHz) with one scale for all binaries (Phinney 2001, astro-ph/0108028; with
// M_c^(5/3) = M^(5/3) eta):
//   h_c^2(f) = 4 G^(5/3) / (3 pi^(1/3) c^2) f^(-4/3) Int dz (1+z)^(-1/3) shape((1+z) f / scaleHz)
//              Int^{x_cut(f, z)} dlog10M M^(5/3) Int dq n eta,
// with the composite Gauss-Legendre nodes of backgroundIntegral.ts. x_cut is a sum of logarithms
// (iscoCut.ts). Work per spectrum:
// - every density: the q integral folded into the mass integrand; per z node the cumulative sums over
//   the whole mass panels (shared by all frequencies); per (f, z) pair one partial panel at the cut.
// - a density factorised as redshift(z) exp(lnMass(log10M)) massRatio(q) (separablePopulation.ts):
//   each factor's node values once per spectrum, the whole-panel mass sums once for all z, and per
//   node of a partial panel one exp(lnMass + (5/3) ln10 log10M).
import { C_SI, G_SI, MPC_M, M_SUN_KG } from './constants';
import { symmetricMassRatio } from './binaryMasses';
import { compositeNodes } from './gaussLegendre';
import { MassPanels } from './massPanels';
import { checkedLog, checkedValue, densityAt } from './densityChecks';
import { cutOffsetLog10 } from './iscoCut';
import type { BinaryPopulation } from './populationTypes';
import type { IntegrationResolution } from './backgroundIntegral';


/** 4 G^(5/3) / (3 pi^(1/3) c^2) Msun^(5/3) Mpc^-3: the strain form with M in Msun and n in Mpc^-3. */
const STRAIN_FORM_MSUN_MPC = ((4 * Math.pow(G_SI, 5 / 3)) / (3 * Math.pow(Math.PI, 1 / 3) * C_SI * C_SI)) * Math.pow(M_SUN_KG, 5 / 3) / (MPC_M * MPC_M * MPC_M);
/** (M / Msun)^(5/3) = exp(FIVE_THIRDS_LN10 log10M). */
const FIVE_THIRDS_LN10 = (5 / 3) * Math.LN10;

/** Mass integral up to the cut at z node iz: Int^{min(xCut, log10MMax)} dlog10M M^(5/3) Int dq n eta, times the node's z factor. */
type MassUpTo = (iz: number, xCut: number) => number;

/** h_c^2 at each frequency (Hz); see the file comment. */
export function circularStrainForm(pop: BinaryPopulation, freqsHz: ArrayLike<number>, cutFactor: number, res: IntegrationResolution, shape?: (ratio: number) => number, scaleHz = 1): Float64Array {
  const zr = compositeNodes(pop.zMin, pop.zMax, res.zPanels, res.order);
  const nz = zr.nodes.length;
  const log1pz = new Float64Array(nz);
  const zWeight = new Float64Array(nz); // w_z (1+z)^(-1/3)
  for (let iz = 0; iz < nz; iz++) {
    log1pz[iz] = Math.log10(1 + zr.nodes[iz]);
    zWeight[iz] = zr.weights[iz] * Math.pow(1 + zr.nodes[iz], -1 / 3);
  }
  const mp = new MassPanels(pop.log10MMin, pop.log10MMax, res.log10MPanels, res.order);
  const sep = pop.separable;
  const massUpTo = sep?.redshift && sep.lnMass ? factoredMass(pop, zr.nodes, mp, res) : generalMass(pop, zr.nodes, mp, res);
  const x0 = cutOffsetLog10(cutFactor);

  const out = new Float64Array(freqsHz.length);
  for (let k = 0; k < freqsHz.length; k++) {
    const f = freqsHz[k];
    const xf = x0 - Math.log10(f);
    let total = 0;
    for (let iz = 0; iz < nz; iz++) {
      const xCut = xf - log1pz[iz];
      if (xCut <= mp.lo) continue;
      const factor = shape ? shape(((1 + zr.nodes[iz]) * f) / scaleHz) : 1;
      if (factor === 0) continue;
      total += zWeight[iz] * factor * massUpTo(iz, xCut);
    }
    out[k] = STRAIN_FORM_MSUN_MPC * Math.pow(f, -4 / 3) * total;
    if (!Number.isFinite(out[k])) throw new RangeError(`h_c^2 is not finite at f = ${f} Hz${shape ? ' (the emission factor returned a non-finite value?)' : ''}`);
  }
  return out;
}

/** Int dq p(q) eta(q) on the q rule (the q factor of a separable density, once per spectrum). */
function etaIntegral(pop: BinaryPopulation, massRatio: (q: number) => number, res: IntegrationResolution): number {
  const qr = compositeNodes(pop.qMin, pop.qMax, res.qPanels, res.order);
  let s = 0;
  for (let j = 0; j < qr.nodes.length; j++) s += qr.weights[j] * symmetricMassRatio(qr.nodes[j]) * checkedValue(massRatio(qr.nodes[j]), 'mass-ratio factor', qr.nodes[j]);
  return s;
}

/** redshift(z) exp(lnMass(x)) massRatio(q): z factors per z node, mass sums once for all z. */
function factoredMass(pop: BinaryPopulation, zNodes: Float64Array, mp: MassPanels, res: IntegrationResolution): MassUpTo {
  const sep = pop.separable!;
  const redshift = sep.redshift!;
  const lnMass = sep.lnMass!;
  const etaPdf = etaIntegral(pop, sep.massRatio, res);
  const zFactor = Float64Array.from(zNodes, (z) => etaPdf * checkedValue(redshift(z), 'redshift factor', z));
  // w M^(5/3) exp(lnMass) summed over whole panels, cumulatively.
  const cumulative = new Float64Array(mp.panels + 1);
  for (let p = 0; p < mp.panels; p++) {
    let s = 0;
    for (let i = p * mp.order; i < (p + 1) * mp.order; i++) {
      const x = mp.base.nodes[i];
      s += mp.base.weights[i] * Math.exp(checkedLog(lnMass(x), x) + FIVE_THIRDS_LN10 * x);
    }
    cumulative[p + 1] = cumulative[p] + s;
  }
  const { lo, hi, width, panels, order } = mp;
  const u = mp.unit.nodes;
  const w = mp.unit.weights;
  return (iz, xCut) => {
    if (xCut >= hi) return zFactor[iz] * cumulative[panels];
    const p = Math.min(panels, Math.max(0, Math.floor((xCut - lo) / width)));
    let m = cumulative[p];
    const a = lo + p * width;
    if (p < panels && xCut > a) {
      // the partial panel [a, xCut]: one exp per node
      const mid = 0.5 * (a + xCut);
      const half = 0.5 * (xCut - a);
      let s = 0;
      for (let i = 0; i < order; i++) {
        const x = mid + half * u[i];
        s += w[i] * Math.exp(lnMass(x) + FIVE_THIRDS_LN10 * x);
      }
      // NaN or +Infinity from lnMass: find the node for the message (checked here, not per node)
      if (!(s < Infinity)) for (let i = 0; i < order; i++) checkedLog(lnMass(mid + half * u[i]), mid + half * u[i]);
      m += half * s;
    }
    return zFactor[iz] * m;
  };
}

/** Any density: the q integral per (z, M) node (once per z node for zMass x massRatio), whole-panel sums cached per z node. */
function generalMass(pop: BinaryPopulation, zNodes: Float64Array, mp: MassPanels, res: IntegrationResolution): MassUpTo {
  const qr = compositeNodes(pop.qMin, pop.qMax, res.qPanels, res.order);
  const etaW = Float64Array.from(qr.nodes, (q, j) => qr.weights[j] * symmetricMassRatio(q));
  const sep = pop.separable;
  const etaPdf = sep ? etaIntegral(pop, sep.massRatio, res) : 0;
  // M^(5/3) exp-free q-folded integrand at (z, x)
  const inner = (z: number, x: number): number => {
    if (sep) return etaPdf * checkedValue(sep.zMass(z, x), 'density', z, x);
    let s = 0;
    for (let j = 0; j < etaW.length; j++) s += etaW[j] * densityAt(pop, z, x, qr.nodes[j]);
    return s;
  };
  const m53 = Float64Array.from(mp.base.nodes, (x) => Math.exp(FIVE_THIRDS_LN10 * x));
  const panelSums: (Float64Array | undefined)[] = new Array(zNodes.length);
  const cumulativeSums = (z: number): Float64Array => {
    const c = new Float64Array(mp.panels + 1);
    for (let p = 0; p < mp.panels; p++) {
      let s = 0;
      for (let i = p * mp.order; i < (p + 1) * mp.order; i++) s += mp.base.weights[i] * inner(z, mp.base.nodes[i]) * m53[i];
      c[p + 1] = c[p] + s;
    }
    return c;
  };
  return (iz, xCut) => {
    const z = zNodes[iz];
    const sums = (panelSums[iz] ??= cumulativeSums(z));
    let m = sums[mp.wholePanels(xCut)];
    const part = mp.partialPanel(xCut);
    for (let i = 0; i < part.nodes.length; i++) m += part.weights[i] * inner(z, part.nodes[i]) * Math.exp(FIVE_THIRDS_LN10 * part.nodes[i]);
    return m;
  };
}
