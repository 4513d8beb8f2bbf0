// Built-ins of the black-hole mass-function check: the remnant mass function a population implies at
// z = 0, the number of remnants above a mass, a reference local mass function, and the check of the
// remnants above 1e9 and 1e10 Msun against it (src/physics/massFunctionCheck.ts).
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { quantity } from '../sheet/mathInstance';
import type { SheetObject } from '../sheet/sheetObject';
import { MPC_M, M_SUN_KG } from '../physics/constants';
import { CHECK_MASSES, massFunctionCheck, referencePerDex, type AnyReference, type MassFunctionCheck, type ReferenceMassFunction } from '../physics/massFunctionCheck';
import { dispersionReference, type DispersionReference } from '../physics/dispersionReference';
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

/** The velocity-dispersion route to the local mass function, chosen by name. */
class LocalMassFunctionValue implements SheetObject {
  readonly kind = 'referenceMassFunction';
  constructor(readonly ref: DispersionReference) {}
  describe(): string {
    return `reference mass function: ${this.ref.label}`;
  }
  toJSON(): unknown {
    const o = this.ref.options;
    return { kind: this.kind, name: 'velocityDispersion', h: o.h, scatterDex: o.scatterDex, bandDex: o.bandDex, mSigmaNorm: o.mSigma?.norm, mSigmaSlope: o.mSigma?.slope };
  }
}

type AnyReferenceValue = ReferenceMassFunctionValue | LocalMassFunctionValue;

const LOCAL_NAMES = ['velocityDispersion'] as const;
const LOCAL_SOURCE =
  'velocity-dispersion function of early-type galaxies, Sheth et al. 2003, ApJ 594, 225, eq. 4: (phi*, sigma*, alpha, beta) = (0.0020 h^3 Mpc^-3, 88.8 km/s, 6.5, 1.93) (unverified in the paper, whose abstract gives no numbers: the values as a summary of the paper gives them, the units of phi* not checked); M-sigma of McConnell & Ma 2013, ApJ 764, 184 (8.32 + 5.64 log10(sigma/200 km/s), their abstract, arXiv:1211.2816); default intrinsic scatter 0.38 dex (unverified: their abstract gives no scatter and their tables were not reachable); band from the normalisation shifted by +-bandDex (our choice)';

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
    name: 'localMassFunction',
    category: 'population',
    summary: 'A local black-hole mass function built from published relations, chosen by name, for massFunctionCheck and referencePhi. "velocityDispersion": the velocity-dispersion function of early-type galaxies carried through the M-sigma relation with log-normal intrinsic scatter, phi_BH(log10 M) = Int dln sigma phi(ln sigma) N(log10 M; a + b log10(sigma/200 km/s), eps); its band shifts the normalisation a by +-bandDex.',
    args: [
      { name: 'name', unit: 'text', description: '"velocityDispersion" (the only one so far)' },
      { name: 'scatterDex', unit: 'dimensionless', description: 'intrinsic scatter eps of log10 M at fixed sigma, in [0, 2] dex (default 0.38)', optional: true },
      { name: 'bandDex', unit: 'dimensionless', description: 'shift of the M-sigma normalisation that bounds the uncertainty band, in [0, 2] dex (default 0.1)', optional: true },
      { name: 'h', unit: 'dimensionless', description: 'Hubble parameter H0/(100 km/s/Mpc) for phi* (default 0.7)', optional: true },
    ],
    returns: { unit: 'referenceMassFunction', description: 'a reference mass function' },
    source: LOCAL_SOURCE,
    example: 'localMassFunction("velocityDispersion")',
    fn: (name: unknown, scatterDex?: unknown, bandDex?: unknown, h?: unknown) => {
      const fn = 'localMassFunction';
      if (typeof name !== 'string' || !(LOCAL_NAMES as readonly string[]).includes(name)) {
        throw new BuiltinError(`${where(fn, 'name')} must be one of ${LOCAL_NAMES.map((n) => `"${n}"`).join(', ')}, got ${typeof name === 'string' ? `"${name}"` : 'no text'}`);
      }
      const eps = scatterDex === undefined ? 0.38 : scalarSI(scatterDex, 'dimensionless', fn, 'scatterDex');
      if (!(eps >= 0 && eps <= 2)) throw new BuiltinError(`${where(fn, 'scatterDex')} must lie in [0, 2] dex, got ${eps}`);
      const band = bandDex === undefined ? 0.1 : scalarSI(bandDex, 'dimensionless', fn, 'bandDex');
      if (!(band >= 0 && band <= 2)) throw new BuiltinError(`${where(fn, 'bandDex')} must lie in [0, 2] dex, got ${band}`);
      const hh = h === undefined ? 0.7 : scalarSI(h, 'dimensionless', fn, 'h');
      if (!(hh > 0 && hh <= 2)) throw new BuiltinError(`${where(fn, 'h')} must lie in (0, 2], got ${hh}`);
      return new LocalMassFunctionValue(dispersionReference({ h: hh, scatterDex: eps, bandDex: band }));
    },
  },
  {
    name: 'referencePhi',
    category: 'population',
    summary: 'Value per dex of a reference local mass function (referenceMassFunction or localMassFunction) at the given black-hole masses.',
    args: [
      { name: 'reference', unit: 'referenceMassFunction', description: 'from referenceMassFunction or localMassFunction' },
      { name: 'mass', unit: 'Msun', description: 'mass > 0 (or a list)' },
    ],
    returns: { unit: 'Mpc^-3', description: 'black holes per comoving volume per dex of mass' },
    source: `Schechter 1976, ApJ 203, 297 (referenceMassFunction); ${LOCAL_SOURCE} (localMassFunction)`,
    example: 'referencePhi(localMassFunction("velocityDispersion"), [1e8, 1e9, 1e10] Msun)',
    fn: (reference: unknown, mass: unknown) => {
      const fn = 'referencePhi';
      const ref: AnyReference = objectOf<AnyReferenceValue>(reference, 'referenceMassFunction', fn, 'reference').ref;
      return elementwise(mass, 'mass', fn, 'mass', (m, arg) => {
        if (!(m > 0)) throw new BuiltinError(`${where(fn, arg)} must be positive`);
        return quantity(referencePerDex(ref, m / M_SUN_KG) / TO_PER_MPC3, 'Mpc^-3');
      });
    },
  },
  {
    name: 'massFunctionCheck',
    category: 'population',
    summary: 'Remnants of the population at z = 0 above 1e9 and 1e10 Msun against a reference local mass function and its range, and the merged mass density (an upper bound on the remnants\' mass density) against the local black-hole mass density.',
    args: [
      { name: 'population', unit: 'population', description: 'any population' },
      { name: 'reference', unit: 'referenceMassFunction', description: 'from referenceMassFunction or localMassFunction' },
    ],
    returns: { unit: 'massFunctionCheck', description: 'number densities, reference ranges and ratios, merged mass density' },
    source: `${REMNANTS}; local mass density 4.6 (+1.9, -1.4) x 1e5 Msun/Mpc^3 for h = 0.7 (Marconi et al. 2004, MNRAS 351, 169); how to read it in docs/massFunctionCheck.md`,
    example: 'massFunctionCheck(pop, referenceMassFunction(1e-3 Mpc^-3, 5e8 Msun, -0.5, 0.3))',
    fn: (population: unknown, reference: unknown) => {
      const fn = 'massFunctionCheck';
      const pop = populationArg(population, fn).population;
      const ref = objectOf<AnyReferenceValue>(reference, 'referenceMassFunction', fn, 'reference').ref;
      return new MassFunctionCheckValue(massFunctionCheck(pop, ref));
    },
  },
];

