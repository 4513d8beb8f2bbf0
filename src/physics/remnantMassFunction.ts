// The black-hole mass function implied by a population's mergers at z = 0: every merger leaves a
// remnant of mass M = m1 + m2 (the population's total mass), and here each remnant is kept to today
// without further growth. phi_rem(M) = Int dz Int dq d^3n/(dz dlog10M dq), per dex (Phinney 2001,
// astro-ph/0108028: n counts remnants per comoving volume). A remnant that merges again is counted once
// per merger, and black holes that never merged are missing: compare with a local mass function as a
// consistency check, not as a fit.
import { checkPopulation } from './backgroundIntegral';
import { compositeNodes, type QuadratureRule } from './gaussLegendre';
import type { BinaryPopulation } from './populationTypes';

/** Quadrature of the sums: composite Gauss-Legendre panels x points. */
const Z_PANELS = 4;
const Q_PANELS = 4;
const MASS_PANELS_PER_DEX = 8;
const ORDER = 8;

/** The z and q rules of a population, and Int dq massRatio(q) on the q rule for a separable density. */
interface Rules {
  zr: QuadratureRule;
  qr: QuadratureRule;
  qIntegral: number;
  /** The limits the rules were laid out for. */
  limits: readonly number[];
  /** redshift(z) at each z node for a density that factorises in z and M too (populationTypes.ts), else undefined. */
  zFactors: Float64Array | undefined;
}

/** Rules per population object, laid out once for the many masses of an integral over M. */
const rulesOf = new WeakMap<BinaryPopulation, Rules>();

function rules(pop: BinaryPopulation): Rules {
  const limits = [pop.zMin, pop.zMax, pop.qMin, pop.qMax];
  let r = rulesOf.get(pop);
  if (!r || r.limits.some((x, i) => x !== limits[i])) {
    const qr = compositeNodes(pop.qMin, pop.qMax, Q_PANELS, ORDER);
    let qIntegral = NaN;
    if (pop.separable) {
      qIntegral = 0;
      for (let b = 0; b < qr.nodes.length; b++) qIntegral += qr.weights[b] * pop.separable.massRatio(qr.nodes[b]);
    }
    const zr = compositeNodes(pop.zMin, pop.zMax, Z_PANELS, ORDER);
    const redshift = pop.separable?.lnMass ? pop.separable.redshift : undefined;
    r = { zr, qr, qIntegral, limits, zFactors: redshift ? Float64Array.from(zr.nodes, (z) => redshift(z)) : undefined };
    rulesOf.set(pop, r);
  }
  return r;
}

/**
 * Remnant mass function per dex at log10 M (Msun), Mpc^-3: Int dz Int dq n(z, log10M, q). A separable
 * density's q integral is the same at every (z, M) node, so it is taken once (the same sum, reordered).
 */
export function remnantMassFunction(pop: BinaryPopulation, log10M: number): number {
  checkPopulation(pop);
  if (!(log10M >= pop.log10MMin && log10M <= pop.log10MMax)) return 0;
  const { zr, qr, qIntegral, zFactors } = rules(pop);
  const sep = pop.separable;
  let s = 0;
  if (zFactors && sep?.lnMass) {
    // zMass(z, M) = redshift(z) exp(lnMass(M)) (separablePopulation.ts): the z factors kept per population, one exp per mass
    const massFactor = Math.exp(sep.lnMass(log10M));
    for (let c = 0; c < zr.nodes.length; c++) s += zr.weights[c] * (zFactors[c] * massFactor);
    return s * qIntegral;
  }
  if (sep) {
    for (let c = 0; c < zr.nodes.length; c++) s += zr.weights[c] * sep.zMass(zr.nodes[c], log10M);
    return s * qIntegral;
  }
  for (let c = 0; c < zr.nodes.length; c++) {
    let inner = 0;
    for (let b = 0; b < qr.nodes.length; b++) inner += qr.weights[b] * pop.density(zr.nodes[c], log10M, qr.nodes[b]);
    s += zr.weights[c] * inner;
  }
  return s;
}

/**
 * Integral of a mass function per dex, phi(log10M), times M^power, from log10M0 to log10M1, by composite
 * Gauss-Legendre with about MASS_PANELS_PER_DEX panels per dex (at least 4).
 */
export function integrateMassFunction(phi: (log10M: number) => number, log10M0: number, log10M1: number, power = 0): number {
  if (!(log10M1 > log10M0)) return 0;
  const panels = Math.max(4, Math.ceil((log10M1 - log10M0) * MASS_PANELS_PER_DEX));
  const r = compositeNodes(log10M0, log10M1, panels, ORDER);
  let s = 0;
  for (let i = 0; i < r.nodes.length; i++) s += r.weights[i] * phi(r.nodes[i]) * (power === 0 ? 1 : Math.pow(10, power * r.nodes[i]));
  return s;
}

/** Number density of remnants with M above massMsun, Mpc^-3 (0 above the population's largest mass). */
export function remnantNumberAbove(pop: BinaryPopulation, massMsun: number): number {
  return integrateMassFunction((x) => remnantMassFunction(pop, x), Math.max(Math.log10(massMsun), pop.log10MMin), pop.log10MMax);
}

/** Number density above massMsun of a mass function per dex given up to log10MMax, Mpc^-3. */
export function numberAbove(phiPerDex: (massMsun: number) => number, massMsun: number, log10MMax: number): number {
  return integrateMassFunction((x) => phiPerDex(Math.pow(10, x)), Math.log10(massMsun), log10MMax);
}
