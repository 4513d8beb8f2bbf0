// The mass side of the circular strain form (circularStrainForm.ts; Phinney 2001 with
// M_c^(5/3) = M^(5/3) eta): at redshift z, the z factor times
//   Int_{log10MMin}^{min(xCut, log10MMax)} dlog10M (M/Msun)^(5/3) Int dq n eta,
// on the composite mass rule of massPanels.ts (whole panels cached, one partial panel at the cut).
import { symmetricMassRatio } from './binaryMasses';
import { massRatioRule } from './massRatioRule';
import { MassPanels } from './massPanels';
import { CutMassTable } from './cutMassTable';
import { checkedLog, checkedValue, densityAt } from './densityChecks';
import type { BinaryPopulation } from './populationTypes';
import type { IntegrationResolution } from './backgroundIntegral';

/** Reads of a factored model's nodeMass from which its cut integral is tabulated (cutMassTable.ts). */
export const TABLE_FROM_READS = 200;

/** (M / Msun)^(5/3) = exp(FIVE_THIRDS_LN10 log10M). */
export const FIVE_THIRDS_LN10 = (5 / 3) * Math.LN10;

export interface MassModel {
  /**
   * A function of z whose smoothness is that of the z integrand without the cut (the z factor for a
   * factored density, the whole mass integral otherwise), for the error control of the z panels.
   */
  indicator(z: number): number;
  /**
   * For the given z nodes (with the indicator's values there): the mass integral up to xCut at z
   * node iz, times the z factor. `reads`: about how many times the result will be called (a
   * factored model tabulates the cut integral for many reads).
   */
  nodeMass(zNodes: Float64Array, indicatorValues: Float64Array, reads?: number): (iz: number, xCut: number) => number;
  /** The same at any z. */
  massAt(z: number, xCut: number): number;
  /** The mass integrand (M/Msun)^(5/3) Int dq n eta at log10M = x, times the z factor. */
  at(z: number, x: number): number;
  /**
   * A generous estimate of the largest at(z, x) over the z range, given the indicator's values at the
   * z nodes (10 x the largest node value times the mass part for a factored density; Infinity when
   * there is no cheap estimate). Used to skip kink checks that cannot matter.
   */
  atMost(x: number, indicatorValues: Float64Array): number;
  /**
   * Optional: the indicator is scale x fn(z) for this function object, so that a z rule laid out for
   * it can be used again for another population with the same fn and scale (circularStrainForm.ts).
   */
  indicatorKey?: { fn: object; scale: number };
}

/** The mass model of a population: factored (redshift x exp(lnMass) x massRatio) or general. */
export function massModelOf(pop: BinaryPopulation, res: IntegrationResolution): MassModel {
  const sep = pop.separable;
  if (sep?.redshift && sep.lnMass) return factoredModel(pop, factoredPanels(pop.log10MMin, pop.log10MMax, res.log10MPanels, res.order), res);
  return generalModel(pop, new MassPanels(pop.log10MMin, pop.log10MMax, res.log10MPanels, res.order), res);
}

/** The mass panels of the last factored model (which reads only their rules, never their scratch panel), laid out again only for other limits. */
let lastFactoredPanels: MassPanels | undefined;

function factoredPanels(lo: number, hi: number, panels: number, order: number): MassPanels {
  const m = lastFactoredPanels;
  if (m && m.lo === lo && m.hi === hi && m.panels === panels && m.order === order) return m;
  return (lastFactoredPanels = new MassPanels(lo, hi, panels, order));
}

/** Int dq p(q) eta(q) on the q rule (the q factor of a separable density, once per spectrum). */
function etaIntegral(pop: BinaryPopulation, massRatio: (q: number) => number, res: IntegrationResolution): number {
  const kept = etaIntegrals.get(massRatio);
  const breaks = pop.qBreaks ?? [];
  if (kept && kept.qMin === pop.qMin && kept.qMax === pop.qMax && kept.panels === res.qPanels && kept.order === res.order && sameList(kept.breaks, breaks)) return kept.value;
  const qr = massRatioRule(pop, res.qPanels, res.order);
  let s = 0;
  for (let j = 0; j < qr.nodes.length; j++) s += qr.weights[j] * symmetricMassRatio(qr.nodes[j]) * checkedValue(massRatio(qr.nodes[j]), 'mass-ratio factor', qr.nodes[j]);
  etaIntegrals.set(massRatio, { qMin: pop.qMin, qMax: pop.qMax, panels: res.qPanels, order: res.order, breaks: breaks.slice(), value: s });
  return s;
}

/** The last q integral of each mass-ratio factor (a function object, so values cannot go stale), with its rule. */
const etaIntegrals = new WeakMap<object, { qMin: number; qMax: number; panels: number; order: number; breaks: readonly number[]; value: number }>();

function sameList(a: readonly number[], b: readonly number[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** redshift(z) exp(lnMass(x)) massRatio(q): z factors per z node, mass sums once for all z, one exp per partial-panel node. */
function factoredModel(pop: BinaryPopulation, mp: MassPanels, res: IntegrationResolution): MassModel {
  const sep = pop.separable!;
  const redshift = sep.redshift!;
  const lnMass = sep.lnMass!;
  const etaPdf = etaIntegral(pop, sep.massRatio, res);
  const zFactorAt = (z: number) => etaPdf * checkedValue(redshift(z), 'redshift factor', z);
  // w (M/Msun)^(5/3) exp(lnMass) summed over whole panels, cumulatively.
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
  /** Int_a^x dx' w (M/Msun)^(5/3) exp(lnMass) on the partial panel [a, x], one exp per node. */
  const partial = (a: number, xCut: number): number => {
    const mid = 0.5 * (a + xCut);
    const half = 0.5 * (xCut - a);
    let s = 0;
    for (let i = 0; i < order; i++) {
      const x = mid + half * u[i];
      s += w[i] * Math.exp(lnMass(x) + FIVE_THIRDS_LN10 * x);
    }
    // NaN or +Infinity from lnMass: find the node for the message (checked here, not per node)
    if (!(s < Infinity)) for (let i = 0; i < order; i++) checkedLog(lnMass(mid + half * u[i]), mid + half * u[i]);
    return half * s;
  };
  /** Int^{min(xCut, hi)} dx w (M/Msun)^(5/3) exp(lnMass): the whole panels' sum plus the partial panel. */
  const upToCut = (xCut: number): number => {
    if (xCut >= hi) return cumulative[panels];
    const p = Math.min(panels, Math.max(0, Math.floor((xCut - lo) / width)));
    const a = lo + p * width;
    if (p === panels || !(xCut > a)) return cumulative[p];
    return cumulative[p] + partial(a, xCut);
  };
  return {
    indicator: zFactorAt,
    indicatorKey: { fn: redshift, scale: etaPdf },
    // the indicator is the z factor; many reads share one table of the cut integral (cutMassTable.ts)
    nodeMass: (_zNodes, zFactor, reads = 0) => {
      if (reads < TABLE_FROM_READS) return (iz, xCut) => zFactor[iz] * upToCut(xCut);
      const table = new CutMassTable(lo, hi, width, panels, cumulative, partial);
      return (iz, xCut) => zFactor[iz] * table.value(xCut);
    },
    massAt: (z, xCut) => zFactorAt(z) * upToCut(xCut),
    at: (z, x) => {
      // the mass part first: a heaviest-binary integrand of 0 (an exponential cutoff) needs no z factor
      const m = Math.exp(checkedLog(lnMass(x), x) + FIVE_THIRDS_LN10 * x);
      return m === 0 ? 0 : zFactorAt(z) * m;
    },
    atMost: (x, zFactor) => {
      let top = 0;
      for (let i = 0; i < zFactor.length; i++) top = Math.max(top, zFactor[i]);
      return 10 * top * Math.exp(checkedLog(lnMass(x), x) + FIVE_THIRDS_LN10 * x);
    },
  };
}

/** Any density: the q integral per (z, M) node (once per z node for zMass x massRatio), whole-panel sums cached per z node. */
function generalModel(pop: BinaryPopulation, mp: MassPanels, res: IntegrationResolution): MassModel {
  const qr = massRatioRule(pop, res.qPanels, res.order);
  const etaW = Float64Array.from(qr.nodes, (q, j) => qr.weights[j] * symmetricMassRatio(q));
  const sep = pop.separable;
  const etaPdf = sep ? etaIntegral(pop, sep.massRatio, res) : 0;
  // Int dq n eta at (z, x)
  const inner = (z: number, x: number): number => {
    if (sep) return etaPdf * checkedValue(sep.zMass(z, x), 'density', z, x);
    let s = 0;
    for (let j = 0; j < etaW.length; j++) s += etaW[j] * densityAt(pop, z, x, qr.nodes[j]);
    return s;
  };
  const m53 = Float64Array.from(mp.base.nodes, (x) => Math.exp(FIVE_THIRDS_LN10 * x));
  const cumulativeSums = (z: number): Float64Array => {
    const c = new Float64Array(mp.panels + 1);
    for (let p = 0; p < mp.panels; p++) {
      let s = 0;
      for (let i = p * mp.order; i < (p + 1) * mp.order; i++) s += mp.base.weights[i] * inner(z, mp.base.nodes[i]) * m53[i];
      c[p + 1] = c[p] + s;
    }
    return c;
  };
  const memo = new Map<number, Float64Array>();
  const sumsAt = (z: number): Float64Array => {
    let c = memo.get(z);
    if (c === undefined) memo.set(z, (c = cumulativeSums(z)));
    return c;
  };
  const upTo = (z: number, sums: Float64Array, xCut: number): number => {
    let m = sums[mp.wholePanels(xCut)];
    const part = mp.partialPanel(xCut);
    for (let i = 0; i < part.nodes.length; i++) m += part.weights[i] * inner(z, part.nodes[i]) * Math.exp(FIVE_THIRDS_LN10 * part.nodes[i]);
    return m;
  };
  return {
    indicator: (z) => sumsAt(z)[mp.panels],
    nodeMass: (zNodes) => {
      const nodeSums = Array.from(zNodes, sumsAt);
      memo.clear();
      return (iz, xCut) => upTo(zNodes[iz], nodeSums[iz], xCut);
    },
    massAt: (z, xCut) => upTo(z, cumulativeSums(z), xCut),
    at: (z, x) => inner(z, x) * Math.exp(FIVE_THIRDS_LN10 * x),
    atMost: () => Infinity,
  };
}
