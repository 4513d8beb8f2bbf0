// Population built-ins: binary masses, the shapes of a merger density, the phenomenological density
// (Middleton et al. 2016), a user's own density, the galaxy-merger route (Sesana 2013; Chen, Sesana &
// Conselice 2019), mass functions, and sanity sums. Densities are d^3n/(dz dlog10M dq) in Mpc^-3 with M
// the total mass in Msun (src/physics/populationTypes.ts).
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { isUnit, quantity } from '../sheet/mathInstance';
import { GYR_S, MPC_M, M_SUN_KG } from '../physics/constants';
import { chirpMassFromTotal, symmetricMassRatio } from '../physics/binaryMasses';
import { phenomenologicalPopulation } from '../physics/phenomenologicalPopulation';
import { customMassRatio, powerLawMassRatio, redshiftShape, type MassRatioDistribution } from '../physics/populationShapes';
import { doubleSchechterPerDex, massDensityOf, schechterPerDex } from '../physics/massFunctions';
import { KORMENDY_HO_2013, MCCONNELL_MA_2013, medianLog10BlackHoleMass, type BlackHoleBulgeRelation } from '../physics/blackHoleBulgeRelation';
import { galaxyMergerPopulation, type StellarMassFunctionParams } from '../physics/galaxyMergerPopulation';
import { mergedMassDensity, mergedNumberDensity, mergerRateDensity } from '../physics/populationSanity';
import type { BinaryPopulation } from '../physics/populationTypes';
import type { Unit } from 'mathjs';
import type { SheetObject } from '../sheet/sheetObject';
import { dimensionOf, functionOf, objectOf, requireRange, scalarSI, where } from './args';
import { PopulationValue, ShapeValue } from './populationValue';
import { cosmologyArg, elementwise, nonNegativeSI, populationArg, positiveSI, redshiftValue } from './physicsArgs';

const MIDDLETON = 'Middleton, Del Pozzo, Farr, Sesana & Vecchio 2016, MNRAS 455, L72 (arXiv:1507.00992, abstract checked; volume and page unverified); mass-ratio term of Chen, Sesana & Del Pozzo 2017, arXiv:1612.00455 (the form of their q term unverified: not in their abstract)';
const GALAXY_ROUTE = 'Sesana 2013, MNRAS 433, L1; Chen, Sesana & Conselice 2019, MNRAS 488, 401';
const DEFAULT_MIN_MASS = 1e6;
const DEFAULT_MAX_MASS = 1e11;
/** Mpc^-3 from a number density in m^-3. */
const TO_PER_MPC3 = MPC_M ** 3;

interface RedshiftShape {
  weight: (z: number) => number;
  zMax: number;
}

function massMsun(v: unknown, fn: string, arg: string): number {
  return positiveSI(v, 'mass', fn, arg) / M_SUN_KG;
}

function optionalMassMsun(v: unknown, fallback: number, fn: string, arg: string): number {
  return v === undefined ? fallback : massMsun(v, fn, arg);
}

export function massLimits(minMass: unknown, maxMass: unknown, fn: string): [number, number] {
  const lo = optionalMassMsun(minMass, DEFAULT_MIN_MASS, fn, 'minMass');
  const hi = optionalMassMsun(maxMass, DEFAULT_MAX_MASS, fn, 'maxMass');
  if (!(hi > lo)) throw new BuiltinError(`${where(fn, 'maxMass')} must exceed minMass (${lo} Msun), got ${hi} Msun`);
  return [Math.log10(lo), Math.log10(hi)];
}

export function zMaxArg(v: unknown, fn: string): number {
  const z = scalarSI(v, 'dimensionless', fn, 'zMax');
  if (!(z > 0) || z > 1e4) throw new BuiltinError(`${where(fn, 'zMax')} must be a redshift in (0, 10000], got ${z}`);
  return z;
}

function qMinArg(v: unknown, fn: string): number {
  const q = scalarSI(v, 'dimensionless', fn, 'qMin');
  return requireRange(q, fn, 'qMin', 0, 1, { loOpen: true, hiOpen: true });
}

/** A mass ratio q in (0, 1]. */
function qArg(x: number, fn: string, arg: string): number {
  return requireRange(x, fn, arg, 0, 1, { loOpen: true });
}

/** Calls a function cell with numbers and reads a finite number >= 0 back, naming the call on failure. */
function callNumber(f: (...xs: unknown[]) => unknown, args: number[], fn: string, arg: string, perUnit?: 'numberDensity'): number {
  let r: unknown;
  try {
    r = f(...args);
  } catch (e) {
    throw new BuiltinError(`${where(fn, arg)} failed at (${args.map((a) => a.toPrecision(6)).join(', ')}): ${(e as Error).message}`, 'eval');
  }
  let x: number;
  if (typeof r === 'number') x = r;
  else if (perUnit && isUnit(r)) {
    const found = dimensionOf(r as Unit);
    if (found !== 'numberDensity') {
      const at = args.map((a) => a.toPrecision(4)).join(', ');
      const shown = (r as Unit).formatUnits() || 'no unit';
      throw new BuiltinError(`${where(fn, arg)} must return a number density in Mpc^-3 (length^-3; a plain number is read as Mpc^-3), got ${shown}${found ? ` (a ${found} quantity)` : ''} at (z, log10M, q) = (${at})`, 'unit');
    }
    x = scalarSI(r, 'numberDensity', fn, `the value of ${arg}`) * TO_PER_MPC3;
  }
  else if (isUnit(r)) x = scalarSI(r, 'dimensionless', fn, `the value of ${arg}`);
  else throw new BuiltinError(`${where(fn, arg)} must return a number${perUnit ? ' or a quantity of length^-3' : ''}, got ${typeof r} at (${args.join(', ')})`);
  if (!(x >= 0) || !Number.isFinite(x)) throw new BuiltinError(`${where(fn, arg)} returned ${x} at (${args.map((a) => a.toPrecision(6)).join(', ')}); it must be finite and >= 0`);
  return x;
}

function redshiftShapeArg(v: unknown, fn: string): RedshiftShape {
  return objectOf<ShapeValue<RedshiftShape>>(v, 'redshiftShape', fn, 'zShape').shape;
}

export function massRatioArg(v: unknown, fn: string, arg = 'qShape'): MassRatioDistribution {
  return objectOf<ShapeValue<MassRatioDistribution>>(v, 'massRatio', fn, arg).shape;
}

export class RelationValue implements SheetObject {
  readonly kind = 'bulgeRelation';
  constructor(readonly relation: BlackHoleBulgeRelation) {}
  describe(): string {
    const r = this.relation;
    return `log10 M_BH = ${r.a.toFixed(3)} + ${r.b} log10(M_bulge / 1e11 Msun), scatter ${r.scatterDex} dex (${r.source})`;
  }
  toJSON(): unknown {
    return { kind: this.kind, ...this.relation };
  }
}

export class MassFunctionValue implements SheetObject {
  readonly kind = 'massFunction';
  constructor(readonly params: StellarMassFunctionParams) {}
  describe(): string {
    const p = this.params;
    return `stellar mass function: Schechter per dex, Phi* = 10^(${p.log10PhiStar0} + ${p.log10PhiStarSlope} z) Mpc^-3, M* = ${p.mStar.toExponential(2)} Msun, alpha = ${p.alpha0} + ${p.alphaSlope} z`;
  }
  toJSON(): unknown {
    return { kind: this.kind, ...this.params };
  }
}

const limitsArgs = [
  { name: 'minMass', unit: 'Msun', description: `lowest total mass (default ${DEFAULT_MIN_MASS.toExponential(0)} Msun)`, optional: true },
  { name: 'maxMass', unit: 'Msun', description: `highest total mass (default ${DEFAULT_MAX_MASS.toExponential(0)} Msun)`, optional: true },
];

export const populationBuiltins: Builtin[] = [
  {
    name: 'chirpMass',
    category: 'population',
    summary: 'Chirp mass M_c = M q^(3/5) / (1+q)^(6/5) of a binary of total mass M and mass ratio q.',
    args: [
      { name: 'totalMass', unit: 'Msun', description: 'total mass m1 + m2 > 0 (or a list)' },
      { name: 'q', unit: 'dimensionless', description: 'mass ratio m2/m1 in (0, 1]' },
    ],
    returns: { unit: 'Msun', description: 'chirp mass' },
    source: 'Finn & Chernoff 1993, PRD 47, 2198 (definition)',
    example: 'chirpMass(2e9 Msun, 1) gives 8.7e8 Msun',
    fn: (totalMass: unknown, q: unknown) => {
      const qq = qArg(scalarSI(q, 'dimensionless', 'chirpMass', 'q'), 'chirpMass', 'q');
      return elementwise(totalMass, 'mass', 'chirpMass', 'totalMass', (m, arg) => {
        if (!(m > 0)) throw new BuiltinError(`${where('chirpMass', arg)} must be positive, got ${m / M_SUN_KG} Msun`);
        return quantity(chirpMassFromTotal(m, qq), 'Msun');
      });
    },
  },
  {
    name: 'symmetricMassRatio',
    category: 'population',
    summary: 'Symmetric mass ratio eta = m1 m2 / M^2 = q / (1+q)^2.',
    args: [{ name: 'q', unit: 'dimensionless', description: 'mass ratio m2/m1 in (0, 1] (or a list)' }],
    returns: { unit: 'dimensionless', description: 'eta, at most 1/4' },
    source: 'definition (q = m2/m1, eta = m1 m2 / (m1 + m2)^2)',
    example: 'symmetricMassRatio(1) gives 0.25',
    fn: (q: unknown) => elementwise(q, 'dimensionless', 'symmetricMassRatio', 'q', (x, arg) => symmetricMassRatio(qArg(x, 'symmetricMassRatio', arg))),
  },
  {
    name: 'redshiftPowerExp',
    category: 'population',
    summary: 'Redshift shape (1+z)^beta e^(-z/z0) of a merger rate, up to zMax.',
    args: [
      { name: 'beta', unit: 'dimensionless', description: 'power of (1+z)' },
      { name: 'z0', unit: 'dimensionless', description: 'e-folding redshift, > 0' },
      { name: 'zMax', unit: 'dimensionless', description: 'largest redshift of the population, > 0' },
    ],
    returns: { unit: 'redshiftShape', description: 'a redshift shape for mergerPopulation' },
    source: 'Middleton et al. 2016, MNRAS 455, L72',
    example: 'redshiftPowerExp(2, 1.5, 5)',
    fn: (beta: unknown, z0: unknown, zMax: unknown) => {
      const fn = 'redshiftPowerExp';
      const b = scalarSI(beta, 'dimensionless', fn, 'beta');
      const z0v = scalarSI(z0, 'dimensionless', fn, 'z0');
      if (!(z0v > 0)) throw new BuiltinError(`${where(fn, 'z0')} must be positive, got ${z0v}`);
      const zm = zMaxArg(zMax, fn);
      const shape: RedshiftShape = { weight: (z) => redshiftShape(z, b, z0v), zMax: zm };
      return new ShapeValue('redshiftShape', shape, `(1+z)^${b} e^(-z/${z0v}), z to ${zm}`, { beta: b, z0: z0v, zMax: zm });
    },
  },
  {
    name: 'redshiftCustom',
    category: 'population',
    summary: "A redshift shape given by the user's function cell w(z) >= 0, up to zMax.",
    args: [
      { name: 'weight', unit: 'function(z)', description: 'function cell of one argument returning a number >= 0' },
      { name: 'zMax', unit: 'dimensionless', description: 'largest redshift, > 0' },
    ],
    returns: { unit: 'redshiftShape', description: 'a redshift shape for mergerPopulation' },
    source: 'common practice, no source (replaces the shape of Middleton et al. 2016)',
    example: 'w(z) = (1+z)^2 / (1 + (z/2)^4), then redshiftCustom(w, 6)',
    fn: (weight: unknown, zMax: unknown) => {
      const fn = 'redshiftCustom';
      const f = functionOf(weight, 1, fn, 'weight');
      const zm = zMaxArg(zMax, fn);
      const shape: RedshiftShape = { weight: (z) => callNumber(f, [z], fn, 'weight'), zMax: zm };
      return new ShapeValue('redshiftShape', shape, `user redshift shape, z to ${zm}`, { zMax: zm });
    },
  },
  {
    name: 'massRatioPowerLaw',
    category: 'population',
    summary: 'Mass-ratio distribution p(q) proportional to q^gammaQ on [qMin, 1], normalised to 1.',
    args: [
      { name: 'gammaQ', unit: 'dimensionless', description: 'power of q' },
      { name: 'qMin', unit: 'dimensionless', description: 'smallest mass ratio, in (0, 1)' },
    ],
    returns: { unit: 'massRatio', description: 'a mass-ratio distribution' },
    source: 'Chen, Sesana & Del Pozzo 2017, arXiv:1612.00455 (power-law q term; normalisation ours)',
    example: 'massRatioPowerLaw(-0.5, 0.05)',
    fn: (gammaQ: unknown, qMin: unknown) => {
      const fn = 'massRatioPowerLaw';
      const g = scalarSI(gammaQ, 'dimensionless', fn, 'gammaQ');
      const qm = qMinArg(qMin, fn);
      return new ShapeValue('massRatio', powerLawMassRatio(g, qm), `p(q) proportional to q^${g} on [${qm}, 1]`, { gammaQ: g, qMin: qm });
    },
  },
  {
    name: 'massRatioCustom',
    category: 'population',
    summary: "Mass-ratio distribution proportional to the user's function cell w(q) >= 0 on [qMin, 1], normalised numerically.",
    args: [
      { name: 'weight', unit: 'function(q)', description: 'function cell of one argument returning a number >= 0' },
      { name: 'qMin', unit: 'dimensionless', description: 'smallest mass ratio, in (0, 1)' },
    ],
    returns: { unit: 'massRatio', description: 'a mass-ratio distribution' },
    source: 'common practice, no source',
    example: 'w(q) = exp(-(q - 0.6)^2 / 0.08), then massRatioCustom(w, 0.1)',
    fn: (weight: unknown, qMin: unknown) => {
      const fn = 'massRatioCustom';
      const f = functionOf(weight, 1, fn, 'weight');
      const qm = qMinArg(qMin, fn);
      let dist: MassRatioDistribution;
      try {
        dist = customMassRatio((q) => callNumber(f, [q], fn, 'weight'), qm);
      } catch (e) {
        if (e instanceof BuiltinError) throw e;
        throw new BuiltinError(`${where(fn, 'weight')}: ${(e as Error).message}`);
      }
      return new ShapeValue('massRatio', dist, `user mass-ratio distribution on [${qm}, 1]`, { qMin: qm });
    },
  },
  {
    name: 'mergerPopulation',
    category: 'population',
    summary: 'Phenomenological merger density d^3n/(dz dlog10M dq) = rateNorm (M/1e7 Msun)^(-alpha) e^(-M/cutoffMass) zShape(z) |dt/dz| p(q), M the total mass.',
    args: [
      { name: 'cosmology', unit: 'cosmology', description: 'gives |dt_r/dz|, turning the rate into a density per unit z' },
      { name: 'rateNorm', unit: 'Mpc^-3 Gyr^-1', description: 'merger-rate normalisation ndot0 (per dex of total mass, per unit z-shape), >= 0' },
      { name: 'alpha', unit: 'dimensionless', description: 'mass slope: (M / 1e7 Msun)^(-alpha)' },
      { name: 'cutoffMass', unit: 'Msun', description: 'exponential cutoff mass M*, > 0' },
      { name: 'zShape', unit: 'redshiftShape', description: 'from redshiftPowerExp or redshiftCustom' },
      { name: 'qShape', unit: 'massRatio', description: 'from massRatioPowerLaw or massRatioCustom' },
      ...limitsArgs,
    ],
    returns: { unit: 'population', description: 'a binary population for strainSpectrum and the sanity built-ins' },
    source: `${MIDDLETON} (here M is the total mass)`,
    example: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, 1e9 Msun, redshiftPowerExp(2, 1.5, 5), massRatioPowerLaw(-0.5, 0.05))',
    fn: (cosmology: unknown, rateNorm: unknown, alpha: unknown, cutoffMass: unknown, zShape: unknown, qShape: unknown, minMass?: unknown, maxMass?: unknown) => {
      const fn = 'mergerPopulation';
      const cosmo = cosmologyArg(cosmology, fn).model;
      const rate = nonNegativeSI(rateNorm, 'rateDensity', fn, 'rateNorm') * TO_PER_MPC3 * GYR_S;
      const a = scalarSI(alpha, 'dimensionless', fn, 'alpha');
      const mStar = massMsun(cutoffMass, fn, 'cutoffMass');
      const zs = redshiftShapeArg(zShape, fn);
      const qs = massRatioArg(qShape, fn);
      const [x0, x1] = massLimits(minMass, maxMass, fn);
      const pop = phenomenologicalPopulation({ rateNorm: rate, alpha: a, cutoffMass: mStar, beta: 0, z0: 1, redshiftWeight: zs.weight, zMax: zs.zMax, log10MMin: x0, log10MMax: x1, massRatio: qs, cosmology: cosmo });
      return new PopulationValue(pop, 'phenomenological merger density', { rateNorm_Mpc3_Gyr: rate, alpha: a, cutoffMass_Msun: mStar }, cosmo);
    },
  },
  {
    name: 'customPopulation',
    category: 'population',
    summary: "A population from the user's function cell density(z, log10M, q) = d^3n/(dz dlog10M dq), M the total mass in Msun.",
    args: [
      { name: 'density', unit: 'function(z, log10M, q)', description: 'function cell of three arguments returning Mpc^-3 (a plain number is taken as Mpc^-3; a quantity must be length^-3), >= 0; called once in the middle of the ranges when the population is made, so a wrong unit is an error here' },
      { name: 'zMax', unit: 'dimensionless', description: 'largest redshift (default 5)', optional: true },
      ...limitsArgs,
      { name: 'qMin', unit: 'dimensionless', description: 'smallest mass ratio, in (0, 1) (default 0.01)', optional: true },
      { name: 'cosmology', unit: 'cosmology', description: 'needed only by mergerRateDensityAt and for Omega_gw', optional: true },
    ],
    returns: { unit: 'population', description: 'a binary population' },
    source: 'Phinney 2001, astro-ph/0108028 (n is a comoving number density of remnants)',
    example: 'n(z, lm, q) = 1e-4 * exp(-(lm - 8.5)^2 / 0.5) * (1+z)^2 * exp(-z), then customPopulation(n, 4)',
    fn: (density: unknown, zMax?: unknown, minMass?: unknown, maxMass?: unknown, qMin?: unknown, cosmology?: unknown) => {
      const fn = 'customPopulation';
      const f = functionOf(density, 3, fn, 'density');
      const zm = zMax === undefined ? 5 : zMaxArg(zMax, fn);
      const [x0, x1] = massLimits(minMass, maxMass, fn);
      const qm = qMin === undefined ? 0.01 : qMinArg(qMin, fn);
      const cosmo = cosmology === undefined ? undefined : cosmologyArg(cosmology, fn).model;
      // One call in the middle of the ranges: a density of the wrong dimension (or one that fails or
      // is negative there) is an error here, at the population cell, not in a spectrum downstream.
      callNumber(f, [zm / 2, (x0 + x1) / 2, Math.sqrt(qm)], fn, 'density', 'numberDensity');
      const pop: BinaryPopulation = { zMin: 0, zMax: zm, log10MMin: x0, log10MMax: x1, qMin: qm, qMax: 1, density: (z, x, q) => callNumber(f, [z, x, q], fn, 'density', 'numberDensity') };
      return new PopulationValue(pop, 'user density', { zMax: zm, qMin: qm }, cosmo);
    },
  },
  {
    name: 'schechterPerDex',
    category: 'population',
    summary: 'Schechter mass function per dex, ln10 Phi* (M/M*)^(1+alpha) e^(-M/M*) (for galaxies or black holes).',
    args: [
      { name: 'mass', unit: 'Msun', description: 'mass > 0 (or a list)' },
      { name: 'phiStar', unit: 'Mpc^-3', description: 'normalisation Phi*, >= 0' },
      { name: 'breakMass', unit: 'Msun', description: 'break mass M*, > 0' },
      { name: 'alpha', unit: 'dimensionless', description: 'low-mass slope' },
    ],
    returns: { unit: 'Mpc^-3', description: 'number density per dex of mass' },
    source: 'Schechter 1976, ApJ 203, 297 (written per dex)',
    example: 'schechterPerDex(1e11 Msun, 1e-3 Mpc^-3, 1e11 Msun, -1.2)',
    fn: (mass: unknown, phiStar: unknown, breakMass: unknown, alpha: unknown) => {
      const fn = 'schechterPerDex';
      const phi = nonNegativeSI(phiStar, 'numberDensity', fn, 'phiStar') * TO_PER_MPC3;
      const ms = massMsun(breakMass, fn, 'breakMass');
      const a = scalarSI(alpha, 'dimensionless', fn, 'alpha');
      return elementwise(mass, 'mass', fn, 'mass', (m, arg) => {
        if (!(m > 0)) throw new BuiltinError(`${where(fn, arg)} must be positive`);
        return quantity(schechterPerDex(m / M_SUN_KG, phi, ms, a) / TO_PER_MPC3, 'Mpc^-3');
      });
    },
  },
  {
    name: 'doubleSchechterPerDex',
    category: 'population',
    summary: 'Double Schechter mass function per dex with one break mass: ln10 e^(-M/M*) [Phi1 (M/M*)^(1+alpha1) + Phi2 (M/M*)^(1+alpha2)].',
    args: [
      { name: 'mass', unit: 'Msun', description: 'mass > 0 (or a list)' },
      { name: 'phi1', unit: 'Mpc^-3', description: 'first normalisation, >= 0' },
      { name: 'alpha1', unit: 'dimensionless', description: 'first slope' },
      { name: 'phi2', unit: 'Mpc^-3', description: 'second normalisation, >= 0' },
      { name: 'alpha2', unit: 'dimensionless', description: 'second slope' },
      { name: 'breakMass', unit: 'Msun', description: 'break mass M*, > 0' },
    ],
    returns: { unit: 'Mpc^-3', description: 'number density per dex of mass' },
    source: 'Baldry et al. 2012, MNRAS 421, 621 (written per dex)',
    example: 'doubleSchechterPerDex(1e10 Msun, 4e-3 Mpc^-3, -0.35, 6e-4 Mpc^-3, -1.47, 5e10 Msun)',
    fn: (mass: unknown, phi1: unknown, alpha1: unknown, phi2: unknown, alpha2: unknown, breakMass: unknown) => {
      const fn = 'doubleSchechterPerDex';
      const p1 = nonNegativeSI(phi1, 'numberDensity', fn, 'phi1') * TO_PER_MPC3;
      const p2 = nonNegativeSI(phi2, 'numberDensity', fn, 'phi2') * TO_PER_MPC3;
      const a1 = scalarSI(alpha1, 'dimensionless', fn, 'alpha1');
      const a2 = scalarSI(alpha2, 'dimensionless', fn, 'alpha2');
      const ms = massMsun(breakMass, fn, 'breakMass');
      return elementwise(mass, 'mass', fn, 'mass', (m, arg) => {
        if (!(m > 0)) throw new BuiltinError(`${where(fn, arg)} must be positive`);
        return quantity(doubleSchechterPerDex(m / M_SUN_KG, p1, a1, p2, a2, ms) / TO_PER_MPC3, 'Mpc^-3');
      });
    },
  },
  {
    name: 'schechterMassDensity',
    category: 'population',
    summary: 'Mass density Int M phi(M) dlog10M of a Schechter mass function per dex between two masses (e.g. a black-hole mass function, to compare with the local black-hole mass density).',
    args: [
      { name: 'phiStar', unit: 'Mpc^-3', description: 'normalisation Phi*, >= 0' },
      { name: 'breakMass', unit: 'Msun', description: 'break mass M*, > 0' },
      { name: 'alpha', unit: 'dimensionless', description: 'low-mass slope' },
      { name: 'minMass', unit: 'Msun', description: `lowest mass (default ${DEFAULT_MIN_MASS.toExponential(0)} Msun)`, optional: true },
      { name: 'maxMass', unit: 'Msun', description: `highest mass (default ${DEFAULT_MAX_MASS.toExponential(0)} Msun)`, optional: true },
    ],
    returns: { unit: 'Msun/Mpc^3', description: 'mass density' },
    source: 'Schechter 1976, ApJ 203, 297 (over all masses: Phi* M* Gamma(2 + alpha))',
    example: 'schechterMassDensity(1e-3 Mpc^-3, 1e9 Msun, -1.2)',
    fn: (phiStar: unknown, breakMass: unknown, alpha: unknown, minMass?: unknown, maxMass?: unknown) => {
      const fn = 'schechterMassDensity';
      const phi = nonNegativeSI(phiStar, 'numberDensity', fn, 'phiStar') * TO_PER_MPC3;
      const ms = massMsun(breakMass, fn, 'breakMass');
      const a = scalarSI(alpha, 'dimensionless', fn, 'alpha');
      const [x0, x1] = massLimits(minMass, maxMass, fn);
      return quantity((massDensityOf((m) => schechterPerDex(m, phi, ms, a), x0, x1) * M_SUN_KG) / TO_PER_MPC3, 'Msun/Mpc^3');
    },
  },
  {
    name: 'bulgeRelation',
    category: 'population',
    summary: 'A black-hole-bulge relation log10 M_BH = a + b log10(M_bulge / 1e11 Msun) with log-normal scatter.',
    args: [
      { name: 'a', unit: 'dimensionless', description: 'log10 M_BH (Msun) at M_bulge = 1e11 Msun' },
      { name: 'b', unit: 'dimensionless', description: 'slope, > 0' },
      { name: 'scatterDex', unit: 'dimensionless', description: 'intrinsic scatter in dex, >= 0' },
    ],
    returns: { unit: 'bulgeRelation', description: 'a relation for galaxyMergerPopulation and blackHoleMassOfBulge' },
    source: 'form of McConnell & Ma 2013, ApJ 764, 184 and Kormendy & Ho 2013, ARA&A 51, 511',
    example: 'bulgeRelation(8.5, 1.1, 0.3)',
    fn: (a: unknown, b: unknown, scatterDex: unknown) => {
      const fn = 'bulgeRelation';
      const av = scalarSI(a, 'dimensionless', fn, 'a');
      const bv = scalarSI(b, 'dimensionless', fn, 'b');
      if (!(bv > 0)) throw new BuiltinError(`${where(fn, 'b')} must be positive, got ${bv}`);
      const s = scalarSI(scatterDex, 'dimensionless', fn, 'scatterDex');
      if (!(s >= 0 && s <= 3)) throw new BuiltinError(`${where(fn, 'scatterDex')} must lie in [0, 3] dex, got ${s}`);
      return new RelationValue({ a: av, b: bv, scatterDex: s, source: 'user' });
    },
  },
  {
    name: 'mcConnellMaRelation',
    category: 'population',
    summary: 'Preset black-hole-bulge relation: a = 8.46, b = 1.05 (the full-sample fit of their abstract, arXiv:1211.2816, checked), scatter 0.34 dex (unverified: their abstract gives no scatter and their Table 2 was not reachable; 0.34 dex is the value another code quotes from that table).',
    args: [],
    returns: { unit: 'bulgeRelation', description: 'the preset relation' },
    source: 'McConnell & Ma 2013, ApJ 764, 184',
    example: 'mcConnellMaRelation()',
    fn: () => new RelationValue(MCCONNELL_MA_2013),
  },
  {
    name: 'kormendyHoRelation',
    category: 'population',
    summary: 'Preset black-hole-bulge relation: M_BH / 1e9 Msun = 0.49 (M_bulge / 1e11 Msun)^1.17, scatter 0.28 dex (their eq. 10; unverified: only the title and abstract of arXiv:1304.7762 were reachable, and the abstract gives no numbers; the values are those independent implementations quote, some of which quote 1.16 and 0.29 dex instead; the preset had 1.16 and 0.29 dex before 2026-12-02).',
    args: [],
    returns: { unit: 'bulgeRelation', description: 'the preset relation' },
    source: 'Kormendy & Ho 2013, ARA&A 51, 511, eq. 10',
    example: 'kormendyHoRelation()',
    fn: () => new RelationValue(KORMENDY_HO_2013),
  },
  {
    name: 'blackHoleMassOfBulge',
    category: 'population',
    summary: 'Median black-hole mass of a bulge of the given stellar mass, on a black-hole-bulge relation.',
    args: [
      { name: 'relation', unit: 'bulgeRelation', description: 'from bulgeRelation or a preset' },
      { name: 'bulgeMass', unit: 'Msun', description: 'bulge stellar mass > 0 (or a list)' },
    ],
    returns: { unit: 'Msun', description: 'median M_BH' },
    source: 'McConnell & Ma 2013, ApJ 764, 184; Kormendy & Ho 2013, ARA&A 51, 511 (form)',
    example: 'blackHoleMassOfBulge(kormendyHoRelation(), 1e11 Msun) gives 4.9e8 Msun',
    fn: (relation: unknown, bulgeMass: unknown) => {
      const fn = 'blackHoleMassOfBulge';
      const r = objectOf<RelationValue>(relation, 'bulgeRelation', fn, 'relation').relation;
      return elementwise(bulgeMass, 'mass', fn, 'bulgeMass', (m, arg) => {
        if (!(m > 0)) throw new BuiltinError(`${where(fn, arg)} must be positive`);
        return quantity(Math.pow(10, medianLog10BlackHoleMass(r, m / M_SUN_KG)) * M_SUN_KG, 'Msun');
      });
    },
  },
  {
    name: 'stellarMassFunction',
    category: 'population',
    summary: 'Galaxy stellar mass function: Schechter per dex with log10 Phi* and alpha moving linearly in z.',
    args: [
      { name: 'phiStar0', unit: 'Mpc^-3', description: 'Phi* at z = 0, > 0' },
      { name: 'log10PhiStarPerZ', unit: 'dimensionless', description: 'd log10 Phi* / dz' },
      { name: 'breakMass', unit: 'Msun', description: 'break mass M*, > 0' },
      { name: 'alpha0', unit: 'dimensionless', description: 'low-mass slope at z = 0' },
      { name: 'alphaPerZ', unit: 'dimensionless', description: 'd alpha / dz' },
    ],
    returns: { unit: 'massFunction', description: 'a mass function for galaxyMergerPopulation' },
    source: 'Chen, Sesana & Conselice 2019, MNRAS 488, 401, arXiv:1810.04184 (parametrisation simplified; unverified: only their abstract was reachable, which names the ingredients but gives no formula)',
    example: 'stellarMassFunction(1e-3 Mpc^-3, -0.3, 1e11 Msun, -1.1, -0.1)',
    fn: (phiStar0: unknown, log10PhiStarPerZ: unknown, breakMass: unknown, alpha0: unknown, alphaPerZ: unknown) => {
      const fn = 'stellarMassFunction';
      const phi = positiveSI(phiStar0, 'numberDensity', fn, 'phiStar0') * TO_PER_MPC3;
      return new MassFunctionValue({
        log10PhiStar0: Math.log10(phi),
        log10PhiStarSlope: scalarSI(log10PhiStarPerZ, 'dimensionless', fn, 'log10PhiStarPerZ'),
        mStar: massMsun(breakMass, fn, 'breakMass'),
        alpha0: scalarSI(alpha0, 'dimensionless', fn, 'alpha0'),
        alphaSlope: scalarSI(alphaPerZ, 'dimensionless', fn, 'alphaPerZ'),
      });
    },
  },
  {
    name: 'galaxyMergerPopulation',
    category: 'population',
    summary: 'Black-hole binaries from galaxy mergers: stellar mass function x pair fraction / merger time x |dt/dz|, bulges, black-hole-bulge relation with scatter.',
    args: [
      { name: 'cosmology', unit: 'cosmology', description: 'gives |dt_r/dz|' },
      { name: 'massFunction', unit: 'massFunction', description: 'from stellarMassFunction' },
      { name: 'pairFraction0', unit: 'dimensionless', description: 'pair fraction at z = 0, in [0, 1]' },
      { name: 'betaPair', unit: 'dimensionless', description: 'pair fraction grows as (1+z)^betaPair' },
      { name: 'mergerTime0', unit: 'Gyr', description: 'merger time-scale at z = 0, > 0' },
      { name: 'betaTau', unit: 'dimensionless', description: 'merger time-scale goes as (1+z)^betaTau' },
      { name: 'galaxyQ', unit: 'massRatio', description: 'distribution of the galaxies stellar mass ratio' },
      { name: 'bulgeFraction', unit: 'dimensionless', description: 'bulge share of the stellar mass, in (0, 1]' },
      { name: 'relation', unit: 'bulgeRelation', description: 'black-hole-bulge relation' },
      { name: 'zMax', unit: 'dimensionless', description: 'largest redshift (default 5)', optional: true },
      ...limitsArgs,
    ],
    returns: { unit: 'population', description: 'a binary population (one scatter draw serves both black holes of a merger)' },
    source: GALAXY_ROUTE,
    example: 'galaxyMergerPopulation(cosmo, smf, 0.03, 0.8, 1 Gyr, -0.5, massRatioPowerLaw(0, 0.25), 0.6, kormendyHoRelation())',
    fn: (cosmology: unknown, massFunction: unknown, pairFraction0: unknown, betaPair: unknown, mergerTime0: unknown, betaTau: unknown, galaxyQ: unknown, bulgeFraction: unknown, relation: unknown, zMax?: unknown, minMass?: unknown, maxMass?: unknown) => {
      const fn = 'galaxyMergerPopulation';
      const cosmo = cosmologyArg(cosmology, fn).model;
      const mf = objectOf<MassFunctionValue>(massFunction, 'massFunction', fn, 'massFunction').params;
      const f0 = requireRange(scalarSI(pairFraction0, 'dimensionless', fn, 'pairFraction0'), fn, 'pairFraction0', 0, 1);
      const tau = positiveSI(mergerTime0, 'time', fn, 'mergerTime0') / GYR_S;
      const fb = requireRange(scalarSI(bulgeFraction, 'dimensionless', fn, 'bulgeFraction'), fn, 'bulgeFraction', 0, 1, { loOpen: true });
      const rel = objectOf<RelationValue>(relation, 'bulgeRelation', fn, 'relation').relation;
      const zm = zMax === undefined ? 5 : zMaxArg(zMax, fn);
      const [x0, x1] = massLimits(minMass, maxMass, fn);
      const pop = galaxyMergerPopulation({
        massFunction: mf,
        pairFraction0: f0,
        betaPair: scalarSI(betaPair, 'dimensionless', fn, 'betaPair'),
        mergerTime0Gyr: tau,
        betaTau: scalarSI(betaTau, 'dimensionless', fn, 'betaTau'),
        galaxyMassRatio: massRatioArg(galaxyQ, fn, 'galaxyQ'),
        bulgeFraction: fb,
        relation: rel,
        zMax: zm,
        log10MMin: x0,
        log10MMax: x1,
        cosmology: cosmo,
      });
      return new PopulationValue(pop, 'galaxy-merger route', { pairFraction0: f0, mergerTime0_Gyr: tau, bulgeFraction: fb }, cosmo);
    },
  },
  {
    name: 'mergerRateDensityAt',
    category: 'population',
    summary: 'Merger-rate density at redshift z, Int n dlog10M dq / |dt_r/dz| (rest-frame time; z = 0 for today).',
    args: [
      { name: 'population', unit: 'population', description: 'a population that knows its cosmology' },
      { name: 'z', unit: 'dimensionless', description: 'redshift inside the population (default 0)', optional: true },
    ],
    returns: { unit: 'Mpc^-3 Gyr^-1', description: 'mergers per comoving volume per rest-frame time' },
    source: 'Phinney 2001, astro-ph/0108028 (n = rate x |dt/dz|); Hogg 1999, astro-ph/9905116',
    example: 'mergerRateDensityAt(pop, 0)',
    fn: (population: unknown, z?: unknown) => {
      const fn = 'mergerRateDensityAt';
      const p = populationArg(population, fn);
      if (!p.cosmology) throw new BuiltinError(`${where(fn, 'population')} has no cosmology (give customPopulation a cosmology argument)`);
      const zz = z === undefined ? 0 : redshiftValue(scalarSI(z, 'dimensionless', fn, 'z'), fn, 'z', p.population.zMax);
      return quantity(mergerRateDensity(p.population, p.cosmology, zz) / (TO_PER_MPC3 * GYR_S), 'Mpc^-3 Gyr^-1');
    },
  },
  {
    name: 'mergedNumberDensity',
    category: 'population',
    summary: 'Comoving number density of all mergers in the population, Int n dz dlog10M dq.',
    args: [{ name: 'population', unit: 'population', description: 'any population' }],
    returns: { unit: 'Mpc^-3', description: 'mergers per comoving volume' },
    source: 'Phinney 2001, astro-ph/0108028 (n is a comoving number density)',
    example: 'mergedNumberDensity(pop)',
    fn: (population: unknown) => quantity(mergedNumberDensity(populationArg(population, 'mergedNumberDensity').population) / TO_PER_MPC3, 'Mpc^-3'),
  },
  {
    name: 'mergedMassDensity',
    category: 'population',
    summary: 'Mass density of the black holes that merged, Int n M dz dlog10M dq: an upper bound on the mass density of the merger remnants (a hole that merges twice is counted twice); compare with the local black-hole mass density, 4.6 (+1.9, -1.4) x 1e5 Msun/Mpc^3 for h = 0.7.',
    args: [{ name: 'population', unit: 'population', description: 'any population' }],
    returns: { unit: 'Msun/Mpc^3', description: 'merged mass per comoving volume (upper bound on the remnants\' mass density)' },
    source: 'Marconi et al. 2004, MNRAS 351, 169 (local density 4.6 (+1.9, -1.4) x 1e5 Msun/Mpc^3); Shankar, Weinberg & Miralda-Escude 2009, ApJ 690, 20 (estimates span 3-5.5e5 Msun/Mpc^3)',
    example: 'mergedMassDensity(pop)',
    fn: (population: unknown) => quantity((mergedMassDensity(populationArg(population, 'mergedMassDensity').population) * M_SUN_KG) / TO_PER_MPC3, 'Msun/Mpc^3'),
  },
];
