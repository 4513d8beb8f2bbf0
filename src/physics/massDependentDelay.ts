// Binaries whose time from formation (the galaxy merger, at the population's redshift) to coalescence
// depends on their mass and mass ratio, e.g. the hardening lifetime of hardeningLifetime.ts. For each
// (M, q) the map z_f -> z_c is that of a fixed lifetime (delayedPopulation.ts): a binary formed when the
// universe was t(z_f) old coalesces at t(z_c) = t(z_f) + tau(M, q) (Hogg 1999 for t(z)), counted per unit
// coalescence redshift with dn/dz_c = dn/dz_f |dt/dz|(z_c) / |dt/dz|(z_f); those reaching past today stall.
import type { FlatLambdaCdm } from './cosmology';
import { redshiftOfAge } from './delayedPopulation';
import { ageAtRedshift, redshiftAtAge } from './ageInverse';
import { adaptiveZRule } from './adaptiveZRule';
import { compositeNodes, gaussLegendreRule } from './gaussLegendre';
import { cumulativeIntegral, panelledIntegral } from './panelledIntegral';
import { checkPopulation } from './backgroundIntegral';
import type { BinaryPopulation, ZRule } from './populationTypes';

/** Lifetime from formation to coalescence, s, of a binary of log10(M/Msun) and q. */
export type LifetimeOf = (log10M: number, q: number) => number;

/** The smallest and largest lifetime on a grid of 33 masses x 9 mass ratios spanning the population. */
export function lifetimeRange(base: BinaryPopulation, lifetimeOf: LifetimeOf): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i <= 32; i++) {
    const lg = base.log10MMin + ((base.log10MMax - base.log10MMin) * i) / 32;
    for (let j = 0; j <= 8; j++) {
      const q = base.qMin + ((base.qMax - base.qMin) * j) / 8;
      const t = lifetimeOf(lg, q);
      if (!(t >= 0 && Number.isFinite(t))) throw new RangeError(`lifetime must be finite and >= 0, got ${t} s at log10 M = ${lg}, q = ${q}`);
      min = Math.min(min, t);
      max = Math.max(max, t);
    }
  }
  return { min, max };
}

/** Panel edges of the base in formation redshift, and at the Gauss-Legendre nodes of each panel z, t(z) and the z factor. */
interface PanelNodes {
  rule: ZRule;
  edges: Float64Array;
  z: Float64Array;
  age: Float64Array;
  zFactor?: Float64Array;
}

/** Remembers the lifetime at each (log10M, q) node the integrators ask for (they reuse their nodes). */
function cachedLifetime(lifetimeOf: LifetimeOf): LifetimeOf {
  const cache = new Map<number, Map<number, number>>();
  return (lg, q) => {
    let row = cache.get(lg);
    if (!row) {
      if (cache.size > 2048) cache.clear();
      row = new Map();
      cache.set(lg, row);
    }
    let t = row.get(q);
    if (t === undefined) {
      t = lifetimeOf(lg, q);
      if (!(t >= 0 && Number.isFinite(t))) throw new RangeError(`lifetime must be finite and >= 0, got ${t} s at log10 M = ${lg}, q = ${q}`);
      row.set(q, t);
    }
    return t;
  };
}

/**
 * The population by coalescence redshift when each binary's lifetime is lifetimeOf(log10M, q). The
 * redshift range covers every coalescence (shortest lifetime from the earliest formation to the longest
 * from the latest); the density is 0 where a binary's formation redshift falls outside the base range, so
 * it has a step inside the range for each (M, q). Not separable even when the base is.
 */
export function delayedPopulationByMass(base: BinaryPopulation, cosmo: FlatLambdaCdm, lifetimeOf: LifetimeOf): BinaryPopulation {
  checkPopulation(base);
  const range = lifetimeRange(base, lifetimeOf);
  if (range.max === 0) return base; // no delay: the population unchanged
  // The range comes from a grid; widen it so that lifetimes between grid points stay inside the limits.
  const min = 0.95 * range.min;
  const max = 1.05 * range.max;
  const tau = cachedLifetime(lifetimeOf);
  const now = cosmo.ageS(0);
  const masses = { log10MMin: base.log10MMin, log10MMax: base.log10MMax, qMin: base.qMin, qMax: base.qMax, qBreaks: base.qBreaks };
  const tEarliest = cosmo.ageS(base.zMax) + min;
  if (!(tEarliest < now)) return { ...masses, zMin: base.zMin, zMax: base.zMax, density: () => 0 };
  const tLatest = cosmo.ageS(base.zMin) + max;
  const limits = { ...masses, zMin: tLatest < now ? redshiftOfAge(cosmo, tLatest) : 0, zMax: redshiftOfAge(cosmo, tEarliest) };
  // Panel edges in formation redshift for zIntegral: error control (adaptiveZRule.ts) on the base's z
  // factor, or on its density summed over one panel of (M, q) nodes, so that kinks of the base in z
  // (a power z^a at z = 0) get small panels; the steps that move with (M, q) are the limits of each
  // (M, q)'s integral and never fall inside a panel. At the nodes of each whole panel, the age t(z_f)
  // and (a base separable in z and M) the z factor are kept: every (M, q) whose range holds the panel
  // asks for the same ones.
  const sep = base.separable;
  const zFactorOf = sep?.redshift && sep.lnMass ? sep.redshift : undefined;
  let panelsFor: PanelNodes | undefined;
  const basePanels = (rule: ZRule): PanelNodes => {
    if (panelsFor && panelsFor.rule.panels === rule.panels && panelsFor.rule.order === rule.order && panelsFor.rule.tol === rule.tol) return panelsFor;
    const mr = compositeNodes(base.log10MMin, base.log10MMax, 1, rule.order);
    const qr = compositeNodes(base.qMin, base.qMax, 1, rule.order);
    const indicator = sep?.redshift ?? ((z: number) => {
      let s = 0;
      for (let a = 0; a < mr.nodes.length; a++) for (let b = 0; b < qr.nodes.length; b++) s += mr.weights[a] * qr.weights[b] * base.density(z, mr.nodes[a], qr.nodes[b]);
      return s;
    });
    const edges = adaptiveZRule(base.zMin, base.zMax, rule.panels, rule.order, indicator, rule.tol).edges;
    const unit = gaussLegendreRule(rule.order);
    const count = (edges.length - 1) * rule.order;
    const z = new Float64Array(count);
    const age = new Float64Array(count);
    const zFactor = zFactorOf ? new Float64Array(count) : undefined;
    for (let p = 0, k = 0; p + 1 < edges.length; p++) {
      const mid = 0.5 * (edges[p] + edges[p + 1]);
      const half = 0.5 * (edges[p + 1] - edges[p]);
      for (let i = 0; i < rule.order; i++, k++) {
        z[k] = mid + half * unit.nodes[i];
        age[k] = ageAtRedshift(cosmo, z[k]);
        if (zFactor) zFactor[k] = zFactorOf!(z[k]);
      }
    }
    panelsFor = { rule, edges, z, age, zFactor };
    return panelsFor;
  };
  // The integrators ask for every (M, q) at one z before moving on: remember t(z_c) and |dt/dz|(z_c).
  let lastZ = NaN;
  let lastAge = NaN;
  let lastDtdz = NaN;
  let ageLatest = NaN;
  let lastTop = NaN;
  let ageOfTop = NaN;
  return {
    ...limits,
    density: (zc, log10M, q) => {
      if (zc < limits.zMin || zc > limits.zMax) return 0;
      if (zc !== lastZ) {
        lastZ = zc;
        lastAge = cosmo.ageS(zc);
        lastDtdz = cosmo.dtdzS(zc);
      }
      const t = tau(log10M, q);
      const zf = t === 0 ? zc : redshiftAtAge(cosmo, lastAge - t);
      if (!(zf >= base.zMin && zf <= base.zMax)) return 0; // NaN (before the big bang) or outside the formation range
      return base.density(zf, log10M, q) * (lastDtdz / cosmo.dtdzS(zf));
    },
    zIntegral: (log10M, q, weight, zTop, rule) => {
      // Counted by formation redshift: n_c dz_c = n_f dz_f (dt_c = dt_f for a fixed lifetime), so the
      // integrand n_f(z_f) weight(z_c(z_f)) is smooth; z_c in [zMin, min(zTop, zMax)] bounds z_f.
      const t = tau(log10M, q);
      const top = Math.min(zTop, limits.zMax);
      if (!(top > limits.zMin)) return 0;
      // t(z_c) at the lower limit once, at the upper one once per top (most (M, q) share zMax)
      if (Number.isNaN(ageLatest)) ageLatest = Math.min(now, ageAtRedshift(cosmo, limits.zMin));
      if (top !== lastTop) {
        lastTop = top;
        ageOfTop = ageAtRedshift(cosmo, top);
      }
      const ageMin = ageLatest - t; // latest formation age counted
      const ageMax = ageOfTop - t; // earliest
      if (!(ageMin > 0)) return 0;
      const lo = Math.max(base.zMin, redshiftAtAge(cosmo, ageMin));
      const hi = ageMax > 0 ? Math.min(base.zMax, redshiftAtAge(cosmo, ageMax)) : base.zMax;
      if (!(hi > lo)) return 0;
      // the base's own panels (refined where the base is not smooth in z), clipped to [lo, hi]
      const nodes = basePanels(rule);
      const { edges, zFactor } = nodes;
      const order = rule.order;
      const unit = gaussLegendreRule(order);
      // density = redshift(z) exp(lnMass(M)) massRatio(q) (populationTypes.ts), as separablePopulation.ts multiplies
      const massFactor = zFactor ? Math.exp(sep!.lnMass!(log10M)) : NaN;
      const ratio = zFactor ? sep!.massRatio(q) : NaN;
      let sum = 0;
      for (let p = 0; p + 1 < edges.length; p++) {
        const a = Math.max(lo, edges[p]);
        const b = Math.min(hi, edges[p + 1]);
        if (!(b > a)) continue;
        const whole = a === edges[p] && b === edges[p + 1];
        const mid = 0.5 * (a + b);
        const half = 0.5 * (b - a);
        let s = 0;
        for (let i = 0, k = p * order; i < order; i++, k++) {
          // n_f(z_f) weight(z_c(z_f)): the integrand is smooth in z_f
          const zf = whole ? nodes.z[k] : mid + half * unit.nodes[i];
          const n = zFactor ? (whole ? zFactor[k] : zFactorOf!(zf)) * massFactor * ratio : base.density(zf, log10M, q);
          if (n === 0) continue;
          const zc = t === 0 ? zf : redshiftAtAge(cosmo, (whole ? nodes.age[k] : ageAtRedshift(cosmo, zf)) + t);
          s += unit.weights[i] * (n * weight(zc >= 0 ? zc : 0)); // NaN only by rounding at today's age
        }
        sum += half * s;
      }
      return sum;
    },
  };
}

/**
 * Nodes per dimension for the stalled share: 4 panels of 8 Gauss-Legendre points in log10M and q, and in z
 * for the whole range; the stalled part up to z_stall on 8 fixed panels of the z range (panelledIntegral.ts).
 */
const PANELS = 4;
const ORDER = 8;
const STALL_PANELS = 8;

/**
 * Share (by number) of the base population's binaries whose lifetime carries them past today: for each
 * (M, q) those formed below z_stall = z(t_0 - tau(M, q)), all of them when tau exceeds the age t_0.
 */
export function stalledFractionByMass(base: BinaryPopulation, cosmo: FlatLambdaCdm, lifetimeOf: LifetimeOf): number {
  checkPopulation(base);
  const now = cosmo.ageS(0);
  const mr = compositeNodes(base.log10MMin, base.log10MMax, PANELS, ORDER);
  const qr = compositeNodes(base.qMin, base.qMax, PANELS, ORDER);
  const zAll = compositeNodes(base.zMin, base.zMax, PANELS, ORDER);
  // A separable base, density = zMass(z, M) massRatio(q): the z sums are taken of zMass and multiplied
  // by massRatio(q) (the same sums of products, reordered), so the full-range sum is one per mass node.
  // The stalled parts, on panels fixed whatever z_stall, then need the z factor's whole panels once:
  // zMass = redshift(z) exp(lnMass(M)) (separablePopulation.ts).
  const sep = base.separable;
  const zFactorUpTo = sep?.redshift && sep.lnMass ? cumulativeIntegral(sep.redshift, base.zMin, base.zMax, STALL_PANELS, ORDER) : undefined;
  const zSum = (zr: { nodes: Float64Array; weights: Float64Array }, lg: number, q: number): number => {
    let s = 0;
    if (sep) for (let c = 0; c < zr.nodes.length; c++) s += zr.weights[c] * sep.zMass(zr.nodes[c], lg);
    else for (let c = 0; c < zr.nodes.length; c++) s += zr.weights[c] * base.density(zr.nodes[c], lg, q);
    return s;
  };
  let total = 0;
  let stalled = 0;
  for (let a = 0; a < mr.nodes.length; a++) {
    const lg = mr.nodes[a];
    const allOfMass = sep ? zSum(zAll, lg, NaN) : NaN;
    const massFactor = zFactorUpTo && sep?.lnMass ? Math.exp(sep.lnMass(lg)) : NaN;
    for (let b = 0; b < qr.nodes.length; b++) {
      const q = qr.nodes[b];
      const w = mr.weights[a] * qr.weights[b];
      const ratio = sep ? sep.massRatio(q) : 1;
      const all = sep ? allOfMass * ratio : zSum(zAll, lg, q);
      total += w * all;
      const t = lifetimeOf(lg, q);
      if (!(t >= 0 && Number.isFinite(t))) throw new RangeError(`lifetime must be finite and >= 0, got ${t} s at log10 M = ${lg}, q = ${q}`);
      if (t === 0) continue;
      // the age table's inverse (ageInverse.ts, relative error in z below 1e-11)
      const zStall = redshiftAtAge(cosmo, now - t);
      if (Number.isNaN(zStall)) {
        stalled += w * all; // the lifetime exceeds the age of the universe
        continue;
      }
      const hi = Math.min(base.zMax, zStall);
      if (!(hi > base.zMin)) continue;
      const part = zFactorUpTo
        ? massFactor * zFactorUpTo(hi)
        : sep
          ? panelledIntegral((z) => sep.zMass(z, lg), base.zMin, base.zMax, STALL_PANELS, ORDER, hi)
          : panelledIntegral((z) => base.density(z, lg, q), base.zMin, base.zMax, STALL_PANELS, ORDER, hi);
      stalled += w * (sep ? part * ratio : part);
    }
  }
  if (!(total > 0)) return 0;
  return Math.min(1, stalled / total);
}
