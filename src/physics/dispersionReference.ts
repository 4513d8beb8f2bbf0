// The local black-hole mass function of the velocity-dispersion route (sigmaMassFunction.ts) as a reference
// for the mass-function check: the velocity-dispersion function of Sheth et al. 2003 (ApJ 594, 225) through
// the M-sigma relation of McConnell & Ma 2013 (ApJ 764, 184) with an intrinsic scatter, and a band from
// shifting the relation's normalisation by +-bandDex (the largest single lever on the counts above 1e9 Msun).
import { MCCONNELL_MA_2013_M_SIGMA, type MSigmaRelation } from './hostEnvironment';
import type { LocalMassFunction } from './massFunctionCheck';
import { checkSigmaMassFunction, dispersionNormalisation, sheth2003, sigmaMassDensity, sigmaMassFunctionPerDex, sigmaNumberAbove, type SigmaMassFunctionSpec } from './sigmaMassFunction';

export interface DispersionReferenceOptions {
  /** Hubble parameter h = H0 / (100 km/s/Mpc) for phi* of the dispersion function. */
  h: number;
  /** Intrinsic scatter of log10 M at fixed sigma, dex. */
  scatterDex: number;
  /** Shift of the M-sigma normalisation that bounds the band, dex (>= 0). */
  bandDex: number;
  mSigma?: MSigmaRelation;
}

export interface DispersionReference extends LocalMassFunction {
  spec: SigmaMassFunctionSpec;
  options: DispersionReferenceOptions;
  /** Mass density in black holes above 1e5 Msun, Msun Mpc^-3. */
  massDensity(): number;
}

/** References built lately, by their options: the counts are computed once per options and mass. */
const built = new Map<string, DispersionReference>();
const KEPT = 8;

/** The reference for these options (the same object, with its counts remembered, for the same options). */
export function dispersionReference(o: DispersionReferenceOptions): DispersionReference {
  const key = JSON.stringify([o.h, o.scatterDex, o.bandDex, o.mSigma?.norm, o.mSigma?.slope]);
  let ref = built.get(key);
  if (!ref) {
    ref = buildDispersionReference(o);
    if (built.size >= KEPT) built.delete(built.keys().next().value as string);
    built.set(key, ref);
  }
  return ref;
}

function buildDispersionReference(o: DispersionReferenceOptions): DispersionReference {
  if (!(o.h > 0 && o.h <= 2)) throw new RangeError(`Hubble parameter h must lie in (0, 2], got ${o.h}`);
  if (!(o.bandDex >= 0 && o.bandDex <= 2)) throw new RangeError(`band must lie in [0, 2] dex, got ${o.bandDex}`);
  const mSigma = { ...(o.mSigma ?? MCCONNELL_MA_2013_M_SIGMA) };
  const spec: SigmaMassFunctionSpec = { dispersion: sheth2003(o.h), mSigma, scatterDex: o.scatterDex };
  checkSigmaMassFunction(spec);
  const shifted = (d: number): SigmaMassFunctionSpec => ({ ...spec, mSigma: { norm: mSigma.norm + d, slope: mSigma.slope } });
  const c = dispersionNormalisation(spec.dispersion.alpha, spec.dispersion.beta);
  const counts = new Map<number, { value: number; low: number; high: number }>();
  return {
    label: `velocity-dispersion function of Sheth et al. 2003 (h = ${o.h}) through M-sigma ${mSigma.norm} + ${mSigma.slope} log10(sigma/200 km/s), scatter ${o.scatterDex} dex, band +-${o.bandDex} dex in the normalisation`,
    spec,
    options: { ...o, mSigma },
    phiPerDex: (m) => sigmaMassFunctionPerDex(Math.log10(m), spec, c),
    numberAbove: (m) => {
      let r = counts.get(m);
      if (!r) {
        const value = sigmaNumberAbove(m, spec);
        const a = o.bandDex === 0 ? value : sigmaNumberAbove(m, shifted(-o.bandDex));
        const b = o.bandDex === 0 ? value : sigmaNumberAbove(m, shifted(o.bandDex));
        r = { value, low: Math.min(a, b, value), high: Math.max(a, b, value) };
        counts.set(m, r);
      }
      return { ...r };
    },
    massDensity: () => sigmaMassDensity(spec),
  };
}
