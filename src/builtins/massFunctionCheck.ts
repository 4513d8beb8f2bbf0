// Built-ins of the black-hole mass-function check: the remnant mass function a population implies at
// z = 0, the number of remnants above a mass, a reference local mass function, and the check of the
// remnants above 1e9 and 1e10 Msun against it (src/physics/massFunctionCheck.ts).
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { quantity } from '../sheet/mathInstance';
import type { SheetObject } from '../sheet/sheetObject';
import { MPC_M, M_SUN_KG } from '../physics/constants';
import { CHECK_MASSES, massFunctionCheck, type MassFunctionCheck, type ReferenceMassFunction } from '../physics/massFunctionCheck';
import { remnantMassFunction, remnantNumberAbove } from '../physics/remnantMassFunction';
import { objectOf, scalarSI, where } from './args';
import { elementwise, populationArg, positiveSI } from './physicsArgs';
import { threeSignificant as g } from './threeSignificant';

const TO_PER_MPC3 = MPC_M ** 3;
const REMNANTS = 'Phinney 2001, astro-ph/0108028 (n counts remnants per comoving volume); each merger leaves one remnant of the total mass, kept to z = 0';

class ReferenceMassFunctionValue implements SheetObject {
  readonly kind = 'referenceMassFunction';
  constructor(readonly ref: ReferenceMassFunction) {}
  describe(): string {
    const r = this.ref;
    return `reference mass function: Schechter per dex, Phi* = ${g(r.phiStar)} Mpc^-3, M* = ${g(r.mStar)} Msun, alpha = ${g(r.alpha)}, +-${g(r.uncertaintyDex)} dex, to ${g(Math.pow(10, r.log10MMax))} Msun`;
  }
  toJSON(): unknown {
    return { kind: this.kind, phiStar_Mpc3: this.ref.phiStar, mStar_Msun: this.ref.mStar, alpha: this.ref.alpha, uncertaintyDex: this.ref.uncertaintyDex, log10MMaxMsun: this.ref.log10MMax };
  }
}

class MassFunctionCheckValue implements SheetObject {
  readonly kind = 'massFunctionCheck';
  constructor(readonly check: MassFunctionCheck) {}
  describe(): string {
    const c = this.check;
    const rows = c.rows.map((r) => `n(>${r.massMsun.toExponential(0).replace('+', '')} Msun) = ${g(r.remnants)} Mpc^-3 vs ${g(r.reference)} (${g(r.referenceLow)} to ${g(r.referenceHigh)}), ratio ${g(r.ratio)}${r.remnants > r.referenceHigh ? ' (above the range)' : r.remnants < r.referenceLow ? ' (below the range)' : ''}`);
    const d = c.localMassDensity;
    return `remnants at z = 0: ${rows.join('; ')}; merged mass density ${g(c.mergedMassUpperBound)} Msun/Mpc^3 (upper bound on the remnants' density) vs local ${g(d.value)} (${g(d.low)} to ${g(d.high)}, ${d.source})`;
  }
  toJSON(): unknown {
    return { kind: this.kind, ...this.check };
  }
}

export const massFunctionCheckBuiltins: Builtin[] = [
  {
    name: 'remnantMassFunction',
    category: 'population',
    summary: 'Black-hole mass function per dex the population\'s mergers leave at z = 0: Int dz Int dq d^3n/(dz dlog10M dq) at total mass M (each merger counted once; black holes that never merged are missing).',
    args: [
      { name: 'population', unit: 'population', description: 'any population' },
      { name: 'mass', unit: 'Msun', description: 'remnant (total) mass > 0 (or a list)' },
    ],
    returns: { unit: 'Mpc^-3', description: 'remnants per comoving volume per dex of mass' },
    source: REMNANTS,
    example: 'remnantMassFunction(pop, [1e8, 1e9, 1e10] Msun)',
    fn: (population: unknown, mass: unknown) => {
      const fn = 'remnantMassFunction';
      const pop = populationArg(population, fn).population;
      return elementwise(mass, 'mass', fn, 'mass', (m, arg) => {
        if (!(m > 0)) throw new BuiltinError(`${where(fn, arg)} must be positive`);
        return quantity(remnantMassFunction(pop, Math.log10(m / M_SUN_KG)) / TO_PER_MPC3, 'Mpc^-3');
      });
    },
  },
  {
    name: 'remnantNumberAbove',
    category: 'population',
    summary: 'Number density of the population\'s merger remnants above a mass at z = 0 (a remnant that merges again is counted once per merger).',
    args: [
      { name: 'population', unit: 'population', description: 'any population' },
      { name: 'mass', unit: 'Msun', description: 'threshold mass > 0 (or a list)' },
    ],
    returns: { unit: 'Mpc^-3', description: 'remnants per comoving volume' },
    source: REMNANTS,
    example: 'remnantNumberAbove(pop, 1e9 Msun)',
    fn: (population: unknown, mass: unknown) => {
      const fn = 'remnantNumberAbove';
      const pop = populationArg(population, fn).population;
      return elementwise(mass, 'mass', fn, 'mass', (m, arg) => {
        if (!(m > 0)) throw new BuiltinError(`${where(fn, arg)} must be positive`);
        return quantity(remnantNumberAbove(pop, m / M_SUN_KG) / TO_PER_MPC3, 'Mpc^-3');
      });
    },
  },
  {
    name: 'referenceMassFunction',
    category: 'population',
    summary: 'A reference local black-hole mass function for massFunctionCheck: Schechter per dex, ln10 Phi* (M/M*)^(1+alpha) e^(-M/M*), with a 1-sigma uncertainty of log10 phi in dex.',
    args: [
      { name: 'phiStar', unit: 'Mpc^-3', description: 'normalisation Phi*, > 0' },
      { name: 'breakMass', unit: 'Msun', description: 'break mass M*, > 0' },
      { name: 'alpha', unit: 'dimensionless', description: 'low-mass slope' },
      { name: 'uncertaintyDex', unit: 'dimensionless', description: '1-sigma uncertainty of log10 phi, in [0, 3] dex' },
      { name: 'maxMass', unit: 'Msun', description: 'largest mass of the reference (default 1e12 Msun)', optional: true },
    ],
    returns: { unit: 'referenceMassFunction', description: 'a reference mass function' },
    source: 'Schechter 1976, ApJ 203, 297 (form, written per dex); take the parameters from a published local mass function and name it in the cell note',
    example: 'referenceMassFunction(1e-3 Mpc^-3, 5e8 Msun, -0.5, 0.3)',
    fn: (phiStar: unknown, breakMass: unknown, alpha: unknown, uncertaintyDex: unknown, maxMass?: unknown) => {
      const fn = 'referenceMassFunction';
      const phi = positiveSI(phiStar, 'numberDensity', fn, 'phiStar') * TO_PER_MPC3;
      const mStar = positiveSI(breakMass, 'mass', fn, 'breakMass') / M_SUN_KG;
      const a = scalarSI(alpha, 'dimensionless', fn, 'alpha');
      const u = scalarSI(uncertaintyDex, 'dimensionless', fn, 'uncertaintyDex');
      if (!(u >= 0 && u <= 3)) throw new BuiltinError(`${where(fn, 'uncertaintyDex')} must lie in [0, 3] dex, got ${u}`);
      const top = maxMass === undefined ? 1e12 : positiveSI(maxMass, 'mass', fn, 'maxMass') / M_SUN_KG;
      if (!(top > Math.max(...CHECK_MASSES))) throw new BuiltinError(`${where(fn, 'maxMass')} must exceed ${g(Math.max(...CHECK_MASSES))} Msun, got ${g(top)} Msun`);
      return new ReferenceMassFunctionValue({ phiStar: phi, mStar, alpha: a, uncertaintyDex: u, log10MMax: Math.log10(top) });
    },
  },
  {
    name: 'massFunctionCheck',
    category: 'population',
    summary: 'Remnants of the population at z = 0 above 1e9 and 1e10 Msun against a reference local mass function and its range, and the merged mass density (an upper bound on the remnants\' mass density) against the local black-hole mass density.',
    args: [
      { name: 'population', unit: 'population', description: 'any population' },
      { name: 'reference', unit: 'referenceMassFunction', description: 'from referenceMassFunction' },
    ],
    returns: { unit: 'massFunctionCheck', description: 'number densities, reference ranges and ratios, merged mass density' },
    source: `${REMNANTS}; local mass density 4.6 (+1.9, -1.4) x 1e5 Msun/Mpc^3 for h = 0.7 (Marconi et al. 2004, MNRAS 351, 169); how to read it in docs/massFunctionCheck.md`,
    example: 'massFunctionCheck(pop, referenceMassFunction(1e-3 Mpc^-3, 5e8 Msun, -0.5, 0.3))',
    fn: (population: unknown, reference: unknown) => {
      const fn = 'massFunctionCheck';
      const pop = populationArg(population, fn).population;
      const ref = objectOf<ReferenceMassFunctionValue>(reference, 'referenceMassFunction', fn, 'reference').ref;
      return new MassFunctionCheckValue(massFunctionCheck(pop, ref));
    },
  },
];

