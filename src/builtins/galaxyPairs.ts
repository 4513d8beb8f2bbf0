// Built-ins of the completed galaxy route (src/physics/galaxyPairRoute.ts): a pair fraction and a merger
// time-scale that depend on the galaxy's mass, mass ratio and redshift (Chen, Sesana & Conselice 2019,
// MNRAS 488, 401), a time shift from pair to merger, an evolving black-hole-bulge normalisation, and
// scatter drawn for each black hole.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import type { SheetObject } from '../sheet/sheetObject';
import { GYR_S } from '../physics/constants';
import { galaxyPairRoutePopulation, type MergerTimeParams, type PairFractionParams } from '../physics/galaxyPairRoute';
import { objectOf, requireRange, scalarSI, where } from './args';
import { cosmologyArg, positiveSI } from './physicsArgs';
import { MassFunctionValue, RelationValue, massLimits, massRatioArg, zMaxArg } from './population';
import { PopulationValue } from './populationValue';
import { threeSignificant as g } from './threeSignificant';

const CSC19 = 'Chen, Sesana & Conselice 2019, MNRAS 488, 401 (form of the pair fraction and merger time-scale; pivot mass ours)';

class PairFractionValue implements SheetObject {
  readonly kind = 'pairFraction';
  constructor(readonly params: PairFractionParams) {}
  describe(): string {
    const p = this.params;
    return `pair fraction ${g(p.f0)} (M_G / 1e11 Msun)^${g(p.alpha)} (1+z)^${g(p.beta)}`;
  }
  toJSON(): unknown {
    return { kind: this.kind, ...this.params };
  }
}

class MergerTimeValue implements SheetObject {
  readonly kind = 'mergerTimeScale';
  constructor(readonly params: MergerTimeParams) {}
  describe(): string {
    const p = this.params;
    return `merger time-scale ${g(p.tau0Gyr)} Gyr (M_G / 1e11 Msun)^${g(p.alpha)} (1+z)^${g(p.beta)} q_G^${g(p.gamma)}`;
  }
  toJSON(): unknown {
    return { kind: this.kind, ...this.params };
  }
}

function flagArg(v: unknown, fallback: boolean, fn: string, arg: string): boolean {
  if (v === undefined) return fallback;
  if (typeof v === 'boolean') return v;
  if (v === 0 || v === 1) return v === 1;
  throw new BuiltinError(`${where(fn, arg)} must be true or false, got ${typeof v === 'number' ? v : typeof v}`);
}

function slopeArg(v: unknown, fn: string, arg: string): number {
  const x = scalarSI(v, 'dimensionless', fn, arg);
  if (!(Math.abs(x) <= 10)) throw new BuiltinError(`${where(fn, arg)} must be a power in [-10, 10], got ${x}`);
  return x;
}

export const galaxyPairBuiltins: Builtin[] = [
  {
    name: 'pairFraction',
    category: 'population',
    summary: 'Galaxy pair fraction f0 (M_G / 1e11 Msun)^massSlope (1+z)^zSlope, M_G the primary galaxy\'s stellar mass (its q_G dependence is the galaxyQ distribution of galaxyPairPopulation).',
    args: [
      { name: 'f0', unit: 'dimensionless', description: 'pair fraction at M_G = 1e11 Msun and z = 0, in [0, 1]' },
      { name: 'massSlope', unit: 'dimensionless', description: 'power of M_G / 1e11 Msun' },
      { name: 'zSlope', unit: 'dimensionless', description: 'power of 1 + z' },
    ],
    returns: { unit: 'pairFraction', description: 'a pair fraction for galaxyPairPopulation' },
    source: CSC19,
    example: 'pairFraction(0.025, 0.2, 1)',
    fn: (f0: unknown, massSlope: unknown, zSlope: unknown) => {
      const fn = 'pairFraction';
      const f = requireRange(scalarSI(f0, 'dimensionless', fn, 'f0'), fn, 'f0', 0, 1);
      return new PairFractionValue({ f0: f, alpha: slopeArg(massSlope, fn, 'massSlope'), beta: slopeArg(zSlope, fn, 'zSlope') });
    },
  },
  {
    name: 'mergerTimeScale',
    category: 'population',
    summary: 'Galaxy merger time-scale tau0 (M_G / 1e11 Msun)^massSlope (1+z)^zSlope q_G^qSlope, the time from an observed pair to its merger.',
    args: [
      { name: 'tau0', unit: 'Gyr', description: 'time-scale at M_G = 1e11 Msun, q_G = 1, z = 0, > 0' },
      { name: 'massSlope', unit: 'dimensionless', description: 'power of M_G / 1e11 Msun' },
      { name: 'zSlope', unit: 'dimensionless', description: 'power of 1 + z' },
      { name: 'qSlope', unit: 'dimensionless', description: 'power of the galaxies\' mass ratio q_G' },
    ],
    returns: { unit: 'mergerTimeScale', description: 'a merger time-scale for galaxyPairPopulation' },
    source: CSC19,
    example: 'mergerTimeScale(0.8 Gyr, -0.3, -0.3, -0.5)',
    fn: (tau0: unknown, massSlope: unknown, zSlope: unknown, qSlope: unknown) => {
      const fn = 'mergerTimeScale';
      const t = positiveSI(tau0, 'time', fn, 'tau0') / GYR_S;
      return new MergerTimeValue({ tau0Gyr: t, alpha: slopeArg(massSlope, fn, 'massSlope'), beta: slopeArg(zSlope, fn, 'zSlope'), gamma: slopeArg(qSlope, fn, 'qSlope') });
    },
  },
  {
    name: 'galaxyPairPopulation',
    category: 'population',
    summary: 'Black-hole binaries from galaxy pairs: stellar mass function x pair fraction / merger time-scale (both depending on M_G, q_G, z), merging a time-scale after the pair (time shift), bulges on a black-hole-bulge relation whose normalisation evolves as (1+z)^relationZeta, scatter drawn for each black hole.',
    args: [
      { name: 'cosmology', unit: 'cosmology', description: 'gives cosmic time and |dt/dz|' },
      { name: 'massFunction', unit: 'massFunction', description: 'from stellarMassFunction' },
      { name: 'pairFraction', unit: 'pairFraction', description: 'from pairFraction' },
      { name: 'mergerTime', unit: 'mergerTimeScale', description: 'from mergerTimeScale' },
      { name: 'galaxyQ', unit: 'massRatio', description: 'distribution of the galaxies\' stellar mass ratio (the q_G term of the pair fraction)' },
      { name: 'bulgeFraction', unit: 'dimensionless', description: 'bulge share of the stellar mass, in (0, 1]' },
      { name: 'relation', unit: 'bulgeRelation', description: 'black-hole-bulge relation (its scatter is drawn for each hole)' },
      { name: 'relationZeta', unit: 'dimensionless', description: 'normalisation a + zeta log10(1+z) at the merger redshift (default 0)', optional: true },
      { name: 'independentScatter', unit: 'true/false', description: 'draw the scatter for each black hole (default true) or once per merger', optional: true },
      { name: 'timeShift', unit: 'true/false', description: 'merge a time-scale after the pair (default true) or at the pair\'s redshift', optional: true },
      { name: 'zMax', unit: 'dimensionless', description: 'largest merger redshift (default 5); with the time shift pairs up to z = 30 merge inside it, the mass function and pair fraction held at their zMax values beyond zMax', optional: true },
      { name: 'minMass', unit: 'Msun', description: 'lowest total black-hole mass (default 1e6 Msun)', optional: true },
      { name: 'maxMass', unit: 'Msun', description: 'highest total black-hole mass (default 1e11 Msun)', optional: true },
    ],
    returns: { unit: 'population', description: 'a binary population by merger redshift' },
    source: `${CSC19}; time shift t(z_merger) = t(z_pair) + tau (same paper); Hogg 1999, astro-ph/9905116 (cosmic time); choices and limits in docs/galaxyRoute.md`,
    example: 'galaxyPairPopulation(cosmo, smf, pairFraction(0.025, 0.2, 1), mergerTimeScale(0.8 Gyr, -0.3, -0.3, -0.5), massRatioPowerLaw(-0.5, 0.2), 0.6, kormendyHoRelation(), 0.5)',
    fn: (cosmology: unknown, massFunction: unknown, pairFraction: unknown, mergerTime: unknown, galaxyQ: unknown, bulgeFraction: unknown, relation: unknown, relationZeta?: unknown, independentScatter?: unknown, timeShift?: unknown, zMax?: unknown, minMass?: unknown, maxMass?: unknown) => {
      const fn = 'galaxyPairPopulation';
      const cosmo = cosmologyArg(cosmology, fn).model;
      const pair = objectOf<PairFractionValue>(pairFraction, 'pairFraction', fn, 'pairFraction').params;
      const time = objectOf<MergerTimeValue>(mergerTime, 'mergerTimeScale', fn, 'mergerTime').params;
      const rel = objectOf<RelationValue>(relation, 'bulgeRelation', fn, 'relation').relation;
      const fb = requireRange(scalarSI(bulgeFraction, 'dimensionless', fn, 'bulgeFraction'), fn, 'bulgeFraction', 0, 1, { loOpen: true });
      const zeta = relationZeta === undefined ? 0 : slopeArg(relationZeta, fn, 'relationZeta');
      const independent = flagArg(independentScatter, true, fn, 'independentScatter');
      const shift = flagArg(timeShift, true, fn, 'timeShift');
      const zm = zMax === undefined ? 5 : zMaxArg(zMax, fn);
      if (zm > 30) throw new BuiltinError(`${where(fn, 'zMax')} must be at most 30, got ${zm}`);
      const [x0, x1] = massLimits(minMass, maxMass, fn);
      const pop = galaxyPairRoutePopulation({
        massFunction: objectOf<MassFunctionValue>(massFunction, 'massFunction', fn, 'massFunction').params,
        pair,
        time,
        galaxyMassRatio: massRatioArg(galaxyQ, fn, 'galaxyQ'),
        bulgeFraction: fb,
        relation: rel,
        relationZeta: zeta,
        scatter: independent ? 'independent' : 'shared',
        timeShift: shift,
        zMax: zm,
        log10MMin: x0,
        log10MMax: x1,
        cosmology: cosmo,
      });
      return new PopulationValue(pop, 'galaxy pairs (mass-dependent pairs and time-scales)', { pairFraction0: pair.f0, mergerTime0_Gyr: time.tau0Gyr, bulgeFraction: fb, relationZeta: zeta, independentScatter: String(independent), timeShift: String(shift) }, cosmo);
    },
  },
];
