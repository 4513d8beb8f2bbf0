// A measured (A, gamma) posterior of the power law h_c(f) = A (f/f_ref)^((3 - gamma)/2): samples of
// (log10 A, gamma), or a 2-D Gaussian in (log10 A, gamma) for quick use, at a reference frequency
// (f_yr unless stated). Where a point (a model's effective A, gamma) falls in it: the credible level
// of the highest-density region that just contains the point.
//   Samples: the fraction of samples whose 2-D KDE density exceeds the density at the point (the
//   sample estimate of the HPD mass above a density level; e.g. Hyndman 1996, Am. Stat. 50, 120).
//   Gaussian: 1 - exp(-d^2/2), d the Mahalanobis distance (chi-square cdf with 2 degrees of freedom).
import { F_YR_HZ } from '../physics/constants';
import { densityAtZ, KDE2D_GRID, type Kde2dTable, tabulateKde2d, whiten } from './gaussianKde2d';
import { NO_TIME_CHECK, type TimeCheck } from '../physics/timeCheck';
import { strainExponent } from './measurement';

export type AmplitudeGammaPosterior =
  | { kind: 'samples'; fRefHz: number; log10A: Float64Array; gamma: Float64Array }
  | { kind: 'gaussian'; fRefHz: number; log10AMean: number; gammaMean: number; log10ASigma: number; gammaSigma: number; correlation: number };

export const AMPLITUDE_GAMMA_MAX_SAMPLES = 20_000;

export function gaussianAmplitudeGamma(
  log10AMean: number,
  gammaMean: number,
  log10ASigma: number,
  gammaSigma: number,
  correlation: number,
  fRefHz: number = F_YR_HZ,
): AmplitudeGammaPosterior {
  for (const [n, v] of [['log10A mean', log10AMean], ['gamma mean', gammaMean]] as const) {
    if (!Number.isFinite(v)) throw new RangeError(`${n} must be a finite number, got ${v}`);
  }
  for (const [n, v] of [['log10A sigma', log10ASigma], ['gamma sigma', gammaSigma]] as const) {
    if (!(Number.isFinite(v) && v > 0)) throw new RangeError(`${n} must be positive, got ${v}`);
  }
  if (!(correlation > -1 && correlation < 1)) throw new RangeError(`the correlation must lie strictly between -1 and 1, got ${correlation}`);
  if (!(Number.isFinite(fRefHz) && fRefHz > 0)) throw new RangeError(`the reference frequency must be positive, got ${fRefHz} Hz`);
  return { kind: 'gaussian', fRefHz, log10AMean, gammaMean, log10ASigma, gammaSigma, correlation };
}

export function sampledAmplitudeGamma(log10A: ArrayLike<number>, gamma: ArrayLike<number>, fRefHz: number = F_YR_HZ): AmplitudeGammaPosterior {
  const n = log10A.length;
  if (gamma.length !== n) throw new RangeError(`${n} log10 A samples but ${gamma.length} gamma samples`);
  if (n < 10) throw new RangeError(`an (A, gamma) posterior needs at least 10 samples, got ${n}`);
  if (n > AMPLITUDE_GAMMA_MAX_SAMPLES) throw new RangeError(`too many (A, gamma) samples (${n}); at most ${AMPLITUDE_GAMMA_MAX_SAMPLES}`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(log10A[i]) || !Number.isFinite(gamma[i])) throw new RangeError(`sample ${i + 1} is not a pair of finite numbers (${log10A[i]}, ${gamma[i]})`);
  }
  if (!(Number.isFinite(fRefHz) && fRefHz > 0)) throw new RangeError(`the reference frequency must be positive, got ${fRefHz} Hz`);
  return { kind: 'samples', fRefHz, log10A: Float64Array.from(log10A), gamma: Float64Array.from(gamma) };
}

/** log10 A of the same power law quoted at another reference frequency (exact per sample). */
export function log10AmplitudeAt(log10A: number, gamma: number, fRefHz: number, fNewHz: number): number {
  return log10A + strainExponent(gamma) * Math.log10(fNewHz / fRefHz);
}

export interface AmplitudeGammaRegion {
  posterior: AmplitudeGammaPosterior;
  /** Credible level (0..1) of the highest-density region whose edge passes through the point. */
  credibleLevel(log10A: number, gamma: number): number;
  /** Density (per dex per unit gamma) at the point. */
  density(log10A: number, gamma: number): number;
  /** The density on the edge of the HPD region of the given level (for contours). */
  densityAtLevel(level: number): number;
  /** The KDE table (samples only). */
  table: Kde2dTable | null;
}

/** `checkTime` is called once per KDE grid row and per 1024 samples (TimeCheck). */
export function buildAmplitudeGammaRegion(posterior: AmplitudeGammaPosterior, checkTime: TimeCheck = NO_TIME_CHECK): AmplitudeGammaRegion {
  if (posterior.kind === 'gaussian') {
    const { log10AMean: m1, gammaMean: m2, log10ASigma: s1, gammaSigma: s2, correlation: r } = posterior;
    const det = 1 - r * r;
    const norm = 1 / (2 * Math.PI * s1 * s2 * Math.sqrt(det));
    const d2 = (a: number, g: number) => {
      const x = (a - m1) / s1;
      const y = (g - m2) / s2;
      return (x * x - 2 * r * x * y + y * y) / det;
    };
    return {
      posterior,
      table: null,
      // Mahalanobis d^2 is chi-square with 2 dof: P(d^2 < c) = 1 - exp(-c/2).
      credibleLevel: (a, g) => -Math.expm1(-0.5 * d2(a, g)),
      density: (a, g) => norm * Math.exp(-0.5 * d2(a, g)),
      densityAtLevel: (level) => norm * (1 - level),
    };
  }
  const t = tabulateKde2d(posterior.log10A, posterior.gamma, KDE2D_GRID, checkTime);
  const n = posterior.log10A.length;
  const jac = 1 / (t.chol[0] * t.chol[2]);
  const sampleDensity = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if ((i & 1023) === 0) checkTime();
    sampleDensity[i] = densityAtZ(t, t.zs1[i], t.zs2[i]);
  }
  sampleDensity.sort();
  const density = (a: number, g: number) => {
    const [z1, z2] = whiten(t, a, g);
    return densityAtZ(t, z1, z2);
  };
  return {
    posterior,
    table: t,
    credibleLevel(a, g) {
      const p = density(a, g);
      // Samples with density above p lie inside the region through the point.
      let lo = 0;
      let hi = n;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (sampleDensity[mid] <= p) lo = mid + 1;
        else hi = mid;
      }
      return (n - lo) / n;
    },
    density: (a, g) => density(a, g) * jac,
    densityAtLevel(level) {
      if (!(level > 0 && level < 1)) throw new RangeError(`credible level must lie in (0, 1), got ${level}`);
      const i = Math.min(n - 1, Math.max(0, Math.floor((1 - level) * n)));
      return sampleDensity[i] * jac;
    },
  };
}
