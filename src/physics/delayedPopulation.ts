// Binaries that coalesce a fixed total lifetime after their host galaxies merge. The timing-array
// population analyses of Agazie et al. 2023 (ApJL 952, L37) give each binary such a lifetime from
// formation to coalescence; here only the delay is modelled (the shape of the hardening, which bends the
// spectrum, belongs to the environment kernels). A binary formed at z_f coalesces when the universe is
// t(z_f) + tau old; one that would coalesce after today stalls and never contributes.
import { COSMOLOGY_Z_LIMIT, type FlatLambdaCdm } from './cosmology';
import { mergedNumberDensityBetween } from './populationSanity';
import type { BinaryPopulation } from './populationTypes';
import { separablePopulation } from './separablePopulation';

/**
 * Redshift at which the universe was `ageS` old (inverse of FlatLambdaCdm.ageS, Hogg 1999 eq. 30):
 * safeguarded Newton steps in u = ln(1+z) inside a bracket. NaN when ageS is not in (0, age today];
 * Infinity when the universe was that young only beyond z = 1e4, where the cosmology's tables stop.
 */
export function redshiftOfAge(cosmo: FlatLambdaCdm, ageS: number): number {
  const now = cosmo.ageS(0);
  if (!(ageS > 0 && ageS <= now)) return NaN;
  if (ageS === now) return 0;
  let lo = 0; // u with age(u) > ageS
  let hi = 1; // grow until age(hi) < ageS
  const uLimit = Math.log1p(COSMOLOGY_Z_LIMIT);
  while (cosmo.ageS(Math.expm1(hi)) > ageS) {
    lo = hi;
    hi *= 2;
    if (hi >= uLimit) {
      // The cosmology's tables stop at z = 1e4, older than any population reaches: Infinity beyond it.
      hi = uLimit;
      if (cosmo.ageS(COSMOLOGY_Z_LIMIT) > ageS) return Infinity;
      break;
    }
  }
  let u = 0.5 * (lo + hi);
  for (let i = 0; i < 100; i++) {
    const z = Math.expm1(u);
    const f = cosmo.ageS(z) - ageS; // decreasing in u
    if (f > 0) lo = u;
    else hi = u;
    if (Math.abs(f) <= 1e-14 * ageS || hi - lo < 1e-15) break;
    const slope = -(1 + z) * cosmo.dtdzS(z); // d age / du
    const next = u - f / slope;
    u = next > lo && next < hi ? next : 0.5 * (lo + hi);
  }
  return Math.expm1(u);
}

/**
 * Formation redshift of a binary that coalesces at zc after a lifetime tauS, or NaN when it would have
 * formed before the universe began.
 */
export function formationRedshift(cosmo: FlatLambdaCdm, zc: number, tauS: number): number {
  if (tauS === 0) return zc;
  return redshiftOfAge(cosmo, cosmo.ageS(zc) - tauS);
}

/**
 * The population by coalescence redshift: dn/dz_c = dn/dz_f * |dt/dz|(z_c) / |dt/dz|(z_f) at the z_f
 * that coalesces at z_c (the same binaries, counted per unit coalescence redshift, since dt_c = dt_f for
 * a fixed lifetime). The redshift limits become those of the coalescences of the first and last binaries
 * formed. A separable base stays separable (the lifetime does not depend on mass).
 */
export function delayedPopulation(base: BinaryPopulation, cosmo: FlatLambdaCdm, tauS: number): BinaryPopulation {
  if (!(tauS >= 0 && Number.isFinite(tauS))) throw new RangeError(`lifetime must be finite and >= 0, got ${tauS} s`);
  if (tauS === 0) return base;
  const cache = new Map<number, number>();
  const zOfFormation = (zc: number): number => {
    let zf = cache.get(zc);
    if (zf === undefined) {
      zf = formationRedshift(cosmo, zc, tauS);
      if (cache.size > 4096) cache.clear();
      cache.set(zc, zf);
    }
    return zf;
  };
  // Coalescence-redshift limits: the images of the formation limits, so that the integrators see a
  // smooth density with no jump inside their range. All binaries stall when the latest-formed reach today.
  const now = cosmo.ageS(0);
  const masses = { log10MMin: base.log10MMin, log10MMax: base.log10MMax, qMin: base.qMin, qMax: base.qMax, qBreaks: base.qBreaks };
  const tEarliest = cosmo.ageS(base.zMax) + tauS;
  const tLatest = cosmo.ageS(base.zMin) + tauS;
  if (!(tEarliest < now)) return { ...masses, zMin: base.zMin, zMax: base.zMax, density: () => 0, separable: { zMass: () => 0, massRatio: () => 0, redshift: () => 0, lnMass: () => -Infinity } };
  const limits = { ...masses, zMin: tLatest < now ? redshiftOfAge(cosmo, tLatest) : 0, zMax: redshiftOfAge(cosmo, tEarliest) };
  const clampZ = (zf: number) => Math.min(base.zMax, Math.max(base.zMin, zf));
  const ok = (zf: number) => !Number.isNaN(zf);
  const jacobian = (zc: number, zf: number) => cosmo.dtdzS(zc) / cosmo.dtdzS(zf);
  const sep = base.separable;
  if (sep?.redshift && sep.lnMass) {
    const zBase = sep.redshift;
    return separablePopulation(limits, {
      redshift: (zc) => {
        if (zc < limits.zMin || zc > limits.zMax) return 0;
        const zf = clampZ(zOfFormation(zc));
        return ok(zf) ? zBase(zf) * jacobian(zc, zf) : 0;
      },
      lnMass: sep.lnMass,
      massRatio: sep.massRatio,
    });
  }
  return {
    ...limits,
    density: (zc, log10M, q) => {
      if (zc < limits.zMin || zc > limits.zMax) return 0;
      const zf = clampZ(zOfFormation(zc));
      return ok(zf) ? base.density(zf, log10M, q) * jacobian(zc, zf) : 0;
    },
  };
}

/**
 * Fraction of the base population's binaries (by number) whose lifetime runs past today: those formed
 * at z_f below the redshift at which the universe was (age today - tau) old.
 */
export function stalledFraction(base: BinaryPopulation, cosmo: FlatLambdaCdm, tauS: number): number {
  const total = mergedNumberDensityBetween(base, base.zMin, base.zMax);
  if (!(total > 0)) return 0;
  if (tauS <= 0) return 0;
  const zStall = redshiftOfAge(cosmo, cosmo.ageS(0) - tauS);
  if (Number.isNaN(zStall)) return 1; // the lifetime exceeds the age of the universe
  return Math.min(1, mergedNumberDensityBetween(base, base.zMin, zStall) / total);
}
