// Redshift at which the universe had a given age, fast: a table of ln t(u), u = ln(1+z), with its exact
// derivative (Hogg 1999, eq. 30, via FlatLambdaCdm.ageS and dtdzS), inverted by cubic Hermite
// interpolation (relative error in z below 1e-11, tested). For populations that need z(t) at many
// (redshift, lifetime) pairs.
import { COSMOLOGY_Z_LIMIT, type FlatLambdaCdm } from './cosmology';

/** Table points in u = ln(1+z) from 0 to ln(1 + 1e4). */
const POINTS = 8192;

/**
 * The table of one cosmology. Entries are computed when first read (a search of it reads about 13 of
 * the 8192), each with the same expression, so every value is the one a full table would hold.
 */
class AgeTable {
  readonly step = Math.log1p(COSMOLOGY_Z_LIMIT) / (POINTS - 1);
  private readonly lnAgeAt = new Float64Array(POINTS); // decreasing in u
  private readonly slopeAt = new Float64Array(POINTS); // du / d ln t at each point
  private readonly done = new Uint8Array(POINTS);
  constructor(private readonly cosmo: FlatLambdaCdm) {}

  private fill(i: number): void {
    const z = Math.min(COSMOLOGY_Z_LIMIT, Math.expm1(i * this.step));
    const age = this.cosmo.ageS(z);
    this.lnAgeAt[i] = Math.log(age);
    // d ln t / du = -(1+z) |dt/dz| / t
    this.slopeAt[i] = -age / ((1 + z) * this.cosmo.dtdzS(z));
    this.done[i] = 1;
  }
  lnAge(i: number): number {
    if (this.done[i] === 0) this.fill(i);
    return this.lnAgeAt[i];
  }
  slope(i: number): number {
    if (this.done[i] === 0) this.fill(i);
    return this.slopeAt[i];
  }
}

const tables = new WeakMap<FlatLambdaCdm, AgeTable>();

function tableOf(cosmo: FlatLambdaCdm): AgeTable {
  let t = tables.get(cosmo);
  if (!t) {
    t = new AgeTable(cosmo);
    tables.set(cosmo, t);
  }
  return t;
}

/**
 * Redshift at which the universe was ageS old: NaN when ageS is not in (0, age today], Infinity when
 * that age lies beyond z = 1e4 (where the cosmology's tables stop), 0 at today's age.
 */
export function redshiftAtAge(cosmo: FlatLambdaCdm, ageS: number): number {
  const t = tableOf(cosmo);
  const step = t.step;
  if (!(ageS > 0)) return NaN;
  const L = Math.log(ageS);
  if (L > t.lnAge(0)) return ageS <= cosmo.ageS(0) ? 0 : NaN;
  if (L < t.lnAge(POINTS - 1)) return Infinity;
  // lnAge decreases: find i with lnAge[i] >= L >= lnAge[i+1].
  let lo = 0;
  let hi = POINTS - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t.lnAge(mid) >= L) lo = mid;
    else hi = mid;
  }
  // Cubic Hermite for u(L) on [lnAge[hi], lnAge[lo]].
  const L0 = t.lnAge(lo);
  const L1 = t.lnAge(hi);
  const h = L1 - L0;
  const s = (L - L0) / h;
  const h00 = (1 + 2 * s) * (1 - s) * (1 - s);
  const h10 = s * (1 - s) * (1 - s);
  const h01 = s * s * (3 - 2 * s);
  const h11 = s * s * (s - 1);
  const u = h00 * lo * step + h10 * h * t.slope(lo) + h01 * hi * step + h11 * h * t.slope(hi);
  return Math.min(COSMOLOGY_Z_LIMIT, Math.max(0, Math.expm1(u)));
}

/**
 * Age of the universe at redshift z, s, from the same table: cubic Hermite of ln t in u = ln(1+z) with
 * the exact slopes (Hogg 1999, eq. 30; relative error below 1e-12, tested against FlatLambdaCdm.ageS).
 */
export function ageAtRedshift(cosmo: FlatLambdaCdm, z: number): number {
  const t = tableOf(cosmo);
  const step = t.step;
  if (!(z >= 0 && z <= COSMOLOGY_Z_LIMIT)) throw new RangeError(`redshift must lie in [0, ${COSMOLOGY_Z_LIMIT}], got ${z}`);
  const x = Math.log1p(z) / step;
  const i = Math.min(POINTS - 2, Math.floor(x));
  const s = x - i;
  const h00 = (1 + 2 * s) * (1 - s) * (1 - s);
  const h10 = s * (1 - s) * (1 - s);
  const h01 = s * s * (3 - 2 * s);
  const h11 = s * s * (s - 1);
  // d ln t / du = 1 / slope
  return Math.exp(h00 * t.lnAge(i) + (h10 * step) / t.slope(i) + h01 * t.lnAge(i + 1) + (h11 * step) / t.slope(i + 1));
}
