// Flat Lambda-CDM distances and times (Hogg 1999, astro-ph/9905116). Radiation (and neutrinos) are
// neglected: Omega_r = 0, so Omega_Lambda = 1 - Omega_m. SI throughout.
import { C_SI } from './constants';
import { gaussLegendreRule } from './gaussLegendre';

/** Width of one cached panel in ln(1+z). */
const PANEL_LN = 0.05;
/** Points per panel; 10-point Gauss-Legendre over ln(1+z) steps of 0.05 is exact to rounding here. */
const PANEL_ORDER = 10;
/** Largest redshift the tables are grown to. */
export const COSMOLOGY_Z_LIMIT = 1e4;

export interface FlatCosmologyParams {
  /** Hubble constant H0 in s^-1. */
  hubbleSI: number;
  /** Matter density today, Omega_m, in (0, 1]. */
  omegaM: number;
}

/**
 * A flat Lambda-CDM cosmology with cumulative tables: each quantity that is an integral over z is
 * summed panel by panel (10-point Gauss-Legendre per panel of 0.05 in ln(1+z)) and cached, so a call
 * costs one partial panel (10 evaluations of E) plus a table look-up.
 */
export class FlatLambdaCdm {
  readonly hubbleSI: number;
  readonly omegaM: number;
  readonly omegaL: number;
  /** Hubble distance D_H = c / H0, m (Hogg 1999, eq. 4). */
  readonly hubbleDistanceM: number;
  /** Hubble time t_H = 1 / H0, s (Hogg 1999, eq. 3). */
  readonly hubbleTimeS: number;
  // Cumulative integrals at panel edges z_k = exp(k * PANEL_LN) - 1, in units of D_H and t_H.
  private readonly comovingTable: number[] = [0];
  private readonly lookbackTable: number[] = [0];

  constructor(p: FlatCosmologyParams) {
    if (!(p.hubbleSI > 0) || !Number.isFinite(p.hubbleSI)) throw new RangeError(`H0 must be positive and finite, got ${p.hubbleSI} s^-1`);
    if (!(p.omegaM > 0 && p.omegaM <= 1)) throw new RangeError(`Omega_m must lie in (0, 1], got ${p.omegaM}`);
    this.hubbleSI = p.hubbleSI;
    this.omegaM = p.omegaM;
    this.omegaL = 1 - p.omegaM;
    this.hubbleDistanceM = C_SI / p.hubbleSI;
    this.hubbleTimeS = 1 / p.hubbleSI;
  }

  /** E(z) = sqrt(Omega_m (1+z)^3 + Omega_Lambda) (Hogg 1999, eq. 14 with Omega_k = 0). */
  E(z: number): number {
    const a = 1 + z;
    return Math.sqrt(this.omegaM * a * a * a + this.omegaL);
  }

  /** Line-of-sight comoving distance D_C = D_H Int_0^z dz'/E(z'), m (Hogg 1999, eq. 15). */
  comovingDistanceM(z: number): number {
    return this.hubbleDistanceM * this.cumulative(z, this.comovingTable, (x) => 1 / this.E(x));
  }

  /** Transverse comoving distance; equals D_C for a flat universe (Hogg 1999, eq. 16), m. */
  transverseComovingDistanceM(z: number): number {
    return this.comovingDistanceM(z);
  }

  /** Luminosity distance D_L = (1+z) D_C, m (Hogg 1999, eq. 21). */
  luminosityDistanceM(z: number): number {
    return (1 + z) * this.comovingDistanceM(z);
  }

  /** Angular-diameter distance D_A = D_C / (1+z), m (Hogg 1999, eq. 18). */
  angularDiameterDistanceM(z: number): number {
    return this.comovingDistanceM(z) / (1 + z);
  }

  /** Comoving volume element over the full sky, dV_c/dz = 4 pi D_H D_C^2 / E(z), m^3 (Hogg 1999, eq. 28). */
  comovingVolumeElementM3(z: number): number {
    const dc = this.comovingDistanceM(z);
    return (4 * Math.PI * this.hubbleDistanceM * dc * dc) / this.E(z);
  }

  /** Comoving volume inside redshift z, V_c = (4 pi / 3) D_C^3 (flat; Hogg 1999, eq. 29), m^3. */
  comovingVolumeM3(z: number): number {
    const dc = this.comovingDistanceM(z);
    return ((4 * Math.PI) / 3) * dc * dc * dc;
  }

  /** |dt/dz| = 1 / ((1+z) H0 E(z)), s (Hogg 1999, eq. 30 integrand). */
  dtdzS(z: number): number {
    return 1 / ((1 + z) * this.hubbleSI * this.E(z));
  }

  /** Lookback time t_L = t_H Int_0^z dz' / ((1+z') E(z')), s (Hogg 1999, eq. 30). */
  lookbackTimeS(z: number): number {
    return this.hubbleTimeS * this.cumulative(z, this.lookbackTable, (x) => 1 / ((1 + x) * this.E(x)));
  }

  /**
   * Age of the universe at redshift z, t_H Int_z^inf dz'/((1+z')E(z')), s (Hogg 1999, eq. 30 with
   * the upper limit at infinity), in closed form: with a = 1/(1+z) and y = a^(3/2) the integral is
   * (2/3) Int_0^y dy' / sqrt(Omega_m + Omega_Lambda y'^2) = 2 asinh(sqrt(Omega_Lambda/Omega_m) y) /
   * (3 sqrt(Omega_Lambda)), and (2/3) y / sqrt(Omega_m) when Omega_Lambda = 0.
   */
  ageS(z: number): number {
    checkRedshift(z);
    const y = Math.pow(1 + z, -1.5);
    if (this.omegaL === 0) return (this.hubbleTimeS * 2 * y) / (3 * Math.sqrt(this.omegaM));
    const rootL = Math.sqrt(this.omegaL);
    return (this.hubbleTimeS * 2 * Math.asinh((rootL / Math.sqrt(this.omegaM)) * y)) / (3 * rootL);
  }

  /** Int_0^z g(z') dz' using the cached panel sums in `table` (grown on demand). */
  private cumulative(z: number, table: number[], g: (z: number) => number): number {
    checkRedshift(z);
    if (z === 0) return 0;
    const u = Math.log1p(z);
    const k = Math.floor(u / PANEL_LN);
    while (table.length <= k) {
      const j = table.length - 1;
      table.push(table[j] + panelIntegral(g, Math.expm1(j * PANEL_LN), Math.expm1((j + 1) * PANEL_LN)));
    }
    return table[k] + panelIntegral(g, Math.expm1(k * PANEL_LN), z);
  }
}

function checkRedshift(z: number): void {
  if (!(z >= 0 && z <= COSMOLOGY_Z_LIMIT)) throw new RangeError(`redshift must lie in [0, ${COSMOLOGY_Z_LIMIT}], got ${z}`);
}

/** Int_a^b g dz by 10-point Gauss-Legendre in ln(1+z) (smooth for every z >= 0). */
function panelIntegral(g: (z: number) => number, a: number, b: number): number {
  if (b <= a) return 0;
  const rule = gaussLegendreRule(PANEL_ORDER);
  const ua = Math.log1p(a);
  const ub = Math.log1p(b);
  const mid = 0.5 * (ua + ub);
  const half = 0.5 * (ub - ua);
  let s = 0;
  for (let i = 0; i < PANEL_ORDER; i++) {
    const u = mid + half * rule.nodes[i];
    const onePlusZ = Math.exp(u);
    s += rule.weights[i] * g(onePlusZ - 1) * onePlusZ; // dz = (1+z) du
  }
  return half * s;
}
