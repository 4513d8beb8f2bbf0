// The environment argument of the counting built-ins (binariesPerBin, longResidenceShare,
// thinnedSpectrum, loudestBinaryStrain) and of realiseBackground: a model whose effect on circular
// binaries is a residence factor R = (dt/dln f_r)_total / (dt/dln f_r)_GW (src/physics/residenceFactor.ts).
// Accepted: phenomHardening(...) or phenomEmission(...); hostEnvironment(...) or environmentEmission(env)
// without e0; stellarEmission(...) without e0. Eccentric or purely phenomenological bends are refused:
// their factor on the spectrum is not a residence-time ratio of circular binaries.
import { BuiltinError } from '../sheet/cellError';
import { isSheetObject } from '../sheet/sheetObject';
import { kindOf, where } from './args';
import { M_SUN_KG } from '../physics/constants';
import { massScaledEnvironment } from '../physics/hostEnvironment';
import { phenomResidenceFactor } from '../physics/phenomHardeningSpectrum';
import type { ResidenceFactor } from '../physics/residenceFactor';
import { stellarResidenceFactor } from '../physics/stellarHardening';
import type { EmissionModel } from './orbits';
import type { PhenomHardeningValue } from './phenomHardening';
import type { EnvironmentValue } from './hostEnvironment';
import { guardedPhysics } from './physicsArgs';

/** An environment's residence factor, with the sheet object it came from (for caches) and a label. */
export interface ResidenceModel {
  factor: ResidenceFactor;
  source: object;
  label: string;
}

/** One factor per sheet object, so that repeated counts reuse the model's tables. */
const factors = new WeakMap<object, ResidenceModel>();

export const RESIDENCE_ARG_HELP =
  'environment: phenomHardening, phenomEmission, hostEnvironment, or environmentEmission / stellarEmission without e0; the counts use the total residence time, the GW one times (dt/dln f)_total/(dt/dln f)_GW';

/** Is v a value the counting built-ins take as their environment? */
export function isResidenceValue(v: unknown): boolean {
  return isSheetObject(v) && (v.kind === 'phenomHardening' || v.kind === 'environment' || v.kind === 'emission');
}

export function residenceArg(v: unknown, fn: string, arg = 'environment'): ResidenceModel {
  if (!isSheetObject(v)) throw new BuiltinError(`${where(fn, arg)} must be a hardening model or a circular environment emission, got ${kindOf(v)}`, 'domain');
  const known = factors.get(v);
  if (known) return known;
  let model: ResidenceModel;
  if (v.kind === 'phenomHardening') {
    const h = v as unknown as PhenomHardeningValue;
    model = { factor: guardedPhysics(fn, () => phenomResidenceFactor(h.model, M_SUN_KG)), source: v, label: h.describe() };
  } else if (v.kind === 'environment') {
    const env = v as unknown as EnvironmentValue;
    model = { factor: guardedPhysics(fn, () => stellarResidenceFactor(massScaledEnvironment(env.scaled))), source: v, label: env.describe() };
  } else if (v.kind === 'emission') {
    const e = v as unknown as EmissionModel;
    if (!e.residence) {
      throw new BuiltinError(
        `${where(fn, arg)}: ${e.describe()} is not a residence-time factor of circular binaries; give phenomHardening, phenomEmission, hostEnvironment, or environmentEmission / stellarEmission without e0`,
        'domain',
      );
    }
    model = { factor: e.residence, source: v, label: e.describe() };
  } else {
    throw new BuiltinError(`${where(fn, arg)} must be a hardening model or a circular environment emission, got a ${v.kind}`, 'domain');
  }
  factors.set(v, model);
  return model;
}

/**
 * The optional trailing arguments of the counting built-ins: a cosmology and an environment, in either
 * order (a cosmology given where the environment may stand, and the other way round).
 */
export function cosmologyAndEnvironment(a: unknown, b: unknown, fn: string): { cosmology?: unknown; residence?: ResidenceModel } {
  let cosmology: unknown;
  let residence: ResidenceModel | undefined;
  for (const [v, arg] of [
    [a, 'cosmology'],
    [b, 'environment'],
  ] as const) {
    if (v === undefined) continue;
    if (isResidenceValue(v)) {
      if (residence) throw new BuiltinError(`${where(fn, arg)}: an environment is given twice`);
      residence = residenceArg(v, fn, 'environment');
    } else {
      // In the environment's place only a cosmology may stand instead.
      if (arg === 'environment' && !(isSheetObject(v) && v.kind === 'cosmology')) residenceArg(v, fn, 'environment');
      if (cosmology !== undefined) throw new BuiltinError(`${where(fn, arg)}: a cosmology is given twice`);
      cosmology = v;
    }
  }
  return { cosmology, residence };
}
