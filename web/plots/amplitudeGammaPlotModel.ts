// The (A, gamma) plane as a PlotModel: the measured posterior's highest-density contours, the fitted
// (A, gamma) point of each model spectrum, and the cloud of fitted points from a Monte Carlo run.
// Contours: samples through the 2-D Gaussian KDE of src/statistics/gaussianKde2d.ts (scipy's
// gaussian_kde with Scott's rule), the level's density being the one exceeded by that fraction of the
// samples (Hyndman 1996, Am. Stat. 50, 120), traced by marching squares (d3-contour); a 2-D Gaussian
// gives closed-form ellipses, Mahalanobis d^2 = -2 ln(1 - level) (chi-square with 2 degrees of freedom).
import { contours } from 'd3-contour';
import { buildAmplitudeGammaRegion, type AmplitudeGammaPosterior, type AmplitudeGammaRegion } from '../../src/statistics/amplitudeGammaPosterior';
import { F_YR_HZ } from '../../src/physics/constants';
import type { PlotModel, PlotSeries } from './plotModel';
import { MEASURED_COLOR, curveColor } from './palette';

/** The Monte Carlo cloud: a light violet under the model points (drawn over it in their own colours). */
const CLOUD_COLOR = '#a99bd0';

/** Credible levels of the measured contours drawn. */
export const CONTOUR_LEVELS = [0.68, 0.95];
/** Grid points per axis on which the sampled posterior's density is contoured. */
export const CONTOUR_GRID = 160;

export interface FittedPoint {
  id: string;
  label: string;
  log10A: number;
  gamma: number;
  /** Index into the curve palette (the same colour as the curve on the spectrum plots). */
  colorIndex: number;
}

export interface FittedCloud {
  id: string;
  label: string;
  log10A: number[];
  gamma: number[];
}

export interface AmplitudeGammaPlotInput {
  label: string;
  posterior: AmplitudeGammaPosterior;
  points: FittedPoint[];
  clouds?: FittedCloud[];
  notes?: string[];
}

export interface ContourRing {
  gamma: number[];
  log10A: number[];
}

/** The highest-density contour of the given level: closed rings in (gamma, log10 A). */
export function posteriorContour(region: AmplitudeGammaRegion, level: number, grid = CONTOUR_GRID): ContourRing[] {
  const p = region.posterior;
  if (p.kind === 'gaussian') {
    // Boundary of {d^2 <= c}: mean + sqrt(c) L (cos t, sin t), L the Cholesky factor of the covariance.
    const c = -2 * Math.log(1 - level);
    const l11 = p.log10ASigma;
    const l21 = p.correlation * p.gammaSigma;
    const l22 = p.gammaSigma * Math.sqrt(1 - p.correlation * p.correlation);
    const ring: ContourRing = { gamma: [], log10A: [] };
    const n = 180;
    for (let i = 0; i <= n; i++) {
      const t = (2 * Math.PI * i) / n;
      const u = Math.sqrt(c) * Math.cos(t);
      const v = Math.sqrt(c) * Math.sin(t);
      ring.log10A.push(p.log10AMean + l11 * u);
      ring.gamma.push(p.gammaMean + l21 * u + l22 * v);
    }
    return [ring];
  }
  const [aLo, aHi] = paddedRange(p.log10A);
  const [gLo, gHi] = paddedRange(p.gamma);
  const values = new Float64Array(grid * grid);
  // Cell centres at (i + 0.5, j + 0.5) in d3-contour's grid coordinates.
  const gammaAt = (gx: number) => gLo + ((gHi - gLo) * (gx - 0.5)) / (grid - 1);
  const log10AAt = (gy: number) => aLo + ((aHi - aLo) * (gy - 0.5)) / (grid - 1);
  for (let j = 0; j < grid; j++) {
    for (let i = 0; i < grid; i++) values[i + grid * j] = region.density(log10AAt(j + 0.5), gammaAt(i + 0.5));
  }
  const threshold = region.densityAtLevel(level);
  const [shape] = contours().size([grid, grid]).thresholds([threshold])(Array.from(values));
  const rings: ContourRing[] = [];
  for (const polygon of shape?.coordinates ?? []) {
    for (const ring of polygon) rings.push({ gamma: ring.map(([gx]) => gammaAt(gx)), log10A: ring.map(([, gy]) => log10AAt(gy)) });
  }
  return rings;
}

/** The samples' range widened by half its span on each side (room for the density's tails). */
function paddedRange(x: ArrayLike<number>): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < x.length; i++) {
    lo = Math.min(lo, x[i]);
    hi = Math.max(hi, x[i]);
  }
  const pad = 0.5 * (hi - lo || 1);
  return [lo - pad, hi + pad];
}

function percent(level: number): string {
  return `${Math.round(level * 1000) / 10}%`;
}

/** The amplitude axis's name: A_yr at f_yr, else A at the stated reference frequency. */
export function amplitudeAxisLabel(fRefHz: number): string {
  return Math.abs(fRefHz / F_YR_HZ - 1) < 1e-9 ? 'amplitude A_yr at f_yr = 1/yr' : `amplitude A at f_ref = ${Number((fRefHz * 1e9).toPrecision(4))} nHz`;
}

// The region (2-D KDE) and contours of a posterior are computed once per posterior object.
const regions = new WeakMap<AmplitudeGammaPosterior, AmplitudeGammaRegion>();
const contourCache = new WeakMap<AmplitudeGammaRegion, Map<number, ContourRing[]>>();

export function regionOf(posterior: AmplitudeGammaPosterior): AmplitudeGammaRegion {
  let r = regions.get(posterior);
  if (!r) regions.set(posterior, (r = buildAmplitudeGammaRegion(posterior)));
  return r;
}

function cachedContour(region: AmplitudeGammaRegion, level: number): ContourRing[] {
  let m = contourCache.get(region);
  if (!m) contourCache.set(region, (m = new Map()));
  let rings = m.get(level);
  if (!rings) m.set(level, (rings = posteriorContour(region, level)));
  return rings;
}

export function amplitudeGammaPlotModel(input: AmplitudeGammaPlotInput, region: AmplitudeGammaRegion = regionOf(input.posterior)): PlotModel {
  const series: PlotSeries[] = [];
  const levels = [...CONTOUR_LEVELS].sort((a, b) => b - a);
  for (const cloud of input.clouds ?? []) {
    series.push({ id: cloud.id, label: cloud.label, kind: 'points', x: cloud.gamma, y: cloud.log10A.map((a) => 10 ** a), color: CLOUD_COLOR, width: 0.6 });
  }
  levels.forEach((level, k) => {
    const x: number[] = [];
    const y: number[] = [];
    for (const ring of cachedContour(region, level)) {
      if (x.length) {
        x.push(NaN);
        y.push(NaN);
      }
      x.push(...ring.gamma);
      y.push(...ring.log10A.map((a) => 10 ** a));
    }
    series.push({
      id: `${input.label}:${level}`,
      label: `${input.label}: ${percent(level)} highest-density region`,
      kind: 'line',
      x,
      y,
      color: MEASURED_COLOR,
      dash: k === 0 ? [5, 3] : undefined,
      width: k === 0 ? 1.4 : 2.2,
    });
  });
  for (const p of input.points) {
    const lvl = region.credibleLevel(p.log10A, p.gamma);
    series.push({ id: p.id, label: `${p.label} (on the ${percent(lvl)} contour)`, kind: 'points', x: [p.gamma], y: [10 ** p.log10A], color: curveColor(p.colorIndex) });
  }
  const post = input.posterior;
  const notes = [
    post.kind === 'samples'
      ? `Contours: 2-D Gaussian KDE of ${post.log10A.length} samples of (log10 A, gamma) (Scott's rule); each encloses the stated share of the samples.`
      : 'Contours: the 2-D Gaussian in (log10 A, gamma), closed form.',
    ...(input.notes ?? []),
  ];
  return {
    id: 'amplitude-gamma',
    title: `(A, gamma) plane: ${input.label} and the models' effective power laws`,
    x: { label: 'spectral index gamma of the residual power', scale: 'linear' },
    y: { label: amplitudeAxisLabel(post.fRefHz), scale: 'log' },
    series,
    notes,
  };
}
