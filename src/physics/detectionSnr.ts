// Expected signal-to-noise ratio of the optimal cross-correlation statistic for a Gaussian, isotropic
// background, and the observing span at which it first reaches a chosen threshold.
//
// Per frequency bin f_k = k/T and pulsar pair (I, J), with residual PSDs P_I, P_J (noise) and
// P_g = h_c^2/(12 pi^2 f^3) (signal), the cross-correlation of the two Fourier amplitudes has mean
// Gamma P_g and variance [(P_I + P_g)(P_J + P_g) + Gamma^2 P_g^2] / 2 (a bin's two real degrees of
// freedom together, Gaussian amplitudes), so each pair and bin adds mean^2/variance:
//   rho^2 = sum_k sum_{I<J} 2 Gamma_IJ^2 P_g^2 / [ (P_I + P_g)(P_J + P_g) + Gamma_IJ^2 P_g^2 ],
// the discrete-bin form (2 T Int df -> 2 sum_k) of the expected S/N of Siemens, Ellis, Jenet &
// Romano 2013, CQG 30, 224015 (arXiv:1305.3196: title, authors and abstract checked; unverified: the
// journal reference, which none of the reachable copies of the abstract states, and the variance term,
// which is beyond the abstract; searched again 2026-12-02),
// treating different pairs as independent, as the pair sum of Hazboun, Romano & Smith 2019, PRD 100,
// 104028 does (rho^2 = 2 T Int S_h^2/S_eff^2 df). Limits, each checked in test/arrayView:
//  - weak signal (P_g << P_I): rho^2 = 2 sum sum Gamma^2 P_g^2/(P_I P_J), so with white noise and
//    h_c = A (f/f_yr)^(-2/3) (gamma = 13/3): rho proportional to A^2 T^(13/3) N (for N >> 1) / sigma^2;
//  - strong signal (P_g >> P_I in all bins): rho^2 = 2 K sum_{I<J} Gamma^2/(1 + Gamma^2), independent
//    of the amplitude and growing as sqrt(K), i.e. as T^(1/2) for fixed cadence.
// Without sky positions the pair sum uses the expectation over isotropic positions of each pair's
// term (so the result is sqrt(E[rho^2]) over random skies), see pulsarPairs.ts.
import { frequencyBins, residualPsdFromStrain, shortestCadence, type PulsarArray } from './pulsarArray';
import { skyAverageRule } from './hellingsDowns';
import { memberNoise, pairLayout, type PairLayout } from './pulsarPairs';
import type { StrainModel } from './strainOnBins';
import { NO_TIME_CHECK, type TimeCheck } from './timeCheck';
import { brentRoot } from '../statistics/rootFinding';

export interface SnrResult {
  /** Expected S/N of the cross-correlation statistic. */
  snr: number;
  /** The weak-signal approximation of the same (signal left out of the variance). */
  weakSignalSnr: number;
  /** Frequency bins used, Hz. */
  frequencyHz: Float64Array;
  /** Each bin's contribution to rho^2. */
  binSnrSquared: Float64Array;
}

/** One pair's contribution to rho^2 in one bin (Siemens et al. 2013, CQG 30, 224015; form above). */
export function pairBinSnrSquared(gammaSq: number, pI: number, pJ: number, pg: number): number {
  if (pg === 0) return 0;
  const signalSq = gammaSq * pg * pg;
  return (2 * signalSq) / ((pI + pg) * (pJ + pg) + signalSq);
}

/** Expected S/N of the array for the background `model` (h_c at f), observed over `spanS`. */
export function detectionSnr(array: PulsarArray, model: StrainModel, spanS: number = array.spanS): SnrResult {
  const f = frequencyBins(spanS, shortestCadence(array));
  const layout = pairLayout(array);
  const noise = new Float64Array(layout.members.length);
  const binSnrSquared = new Float64Array(f.length);
  const sums = { full: 0, weak: 0 };
  let total = 0;
  let weak = 0;
  for (let k = 0; k < f.length; k++) {
    const pg = residualPsdFromStrain(model(f[k]), f[k]);
    if (pg === 0) continue;
    memberNoise(layout, f[k], noise);
    const s = pairSums(layout, noise, pg, sums);
    binSnrSquared[k] = s.full;
    total += s.full;
    weak += s.weak;
  }
  return { snr: Math.sqrt(total), weakSignalSnr: Math.sqrt(weak), frequencyHz: f, binSnrSquared };
}

/**
 * Sum over all pulsar pairs, in one bin, of pairBinSnrSquared (full) and of its weak-signal limit
 * 2 Gamma^2 P_g^2 / (P_I P_J) (weak). A tight loop without callbacks: with positions it runs over
 * N(N-1)/2 pairs per bin, the hot path of span scans.
 */
function pairSums(layout: PairLayout, noise: Float64Array, pg: number, out: { full: number; weak: number }): { full: number; weak: number } {
  const { first, second, count, gamma } = layout;
  const pg2 = pg * pg;
  let full = 0;
  let weak = 0;
  if (gamma) {
    for (let k = 0; k < first.length; k++) {
      const pI = noise[first[k]];
      const pJ = noise[second[k]];
      const s2 = gamma[k] * gamma[k] * pg2;
      full += (2 * s2) / ((pI + pg) * (pJ + pg) + s2);
      weak += (2 * s2) / (pI * pJ);
    }
  } else {
    const rule = skyAverageRule();
    const g = rule.gamma;
    const w = rule.weight;
    for (let k = 0; k < first.length; k++) {
      const pI = noise[first[k]];
      const pJ = noise[second[k]];
      const both = (pI + pg) * (pJ + pg);
      let e = 0;
      let eWeak = 0;
      for (let r = 0; r < g.length; r++) {
        const s2 = g[r] * g[r] * pg2;
        e += (w[r] * 2 * s2) / (both + s2);
        eWeak += w[r] * 2 * s2;
      }
      full += count[k] * e;
      weak += (count[k] * eWeak) / (pI * pJ);
    }
  }
  out.full = full;
  out.weak = weak;
  return out;
}

export interface SpanResult {
  /** Shortest span at which the S/N reaches the threshold, s (NaN if not reached). */
  spanS: number;
  reached: boolean;
  /** S/N at the span found, or at the longest span searched when not reached. */
  snr: number;
  /** The span range searched, s. */
  searchedFromS: number;
  searchedToS: number;
}

/**
 * Shortest observing span at which the expected S/N reaches `threshold`: a scan over 48 spans spaced
 * evenly in log T from one bin (2 dt) to `maxSpanS`, then the first bracket is narrowed in log T to a
 * relative width of 1e-10 (spanCrossing). S/N(T) jumps up where a new bin k/T enters, so the answer
 * may sit on such a jump; with strong red pulsar noise S/N(T) need not be monotonic, and the first
 * crossing found on the scan is returned.
 */
export function detectionSpan(
  array: PulsarArray,
  model: StrainModel,
  threshold: number,
  maxSpanS: number,
  minSpanS: number = 2 * shortestCadence(array),
  checkTime: TimeCheck = NO_TIME_CHECK,
): SpanResult {
  // checkTime (TimeCheck) before each S/N of the scan and the bisection.
  const snrAt = (t: number) => (checkTime(), detectionSnr(array, model, t).snr);
  const steps = 48;
  const ratio = Math.pow(maxSpanS / minSpanS, 1 / (steps - 1));
  let previous = minSpanS;
  let sPrevious = 0;
  for (let i = 0; i < steps; i++) {
    const t = i === steps - 1 ? maxSpanS : minSpanS * Math.pow(ratio, i);
    const s = snrAt(t);
    if (s >= threshold) {
      if (i === 0) return { spanS: t, reached: true, snr: s, searchedFromS: minSpanS, searchedToS: maxSpanS };
      const c = spanCrossing(snrAt, threshold, previous, sPrevious, t, s);
      return { spanS: c.spanS, reached: true, snr: c.snr, searchedFromS: minSpanS, searchedToS: maxSpanS };
    }
    previous = t;
    sPrevious = s;
    if (i === steps - 1) return { spanS: NaN, reached: false, snr: s, searchedFromS: minSpanS, searchedToS: maxSpanS };
  }
  /* c8 ignore next */
  throw new Error('unreachable');
}

/**
 * Narrows a bracket [lo, hi] of spans with S/N(lo) < threshold <= S/N(hi) to a relative width below
 * 1e-10 and returns its upper end: Brent's method in log T (Brent 1973, Algorithms for Minimization
 * without Derivatives, Prentice-Hall; src/statistics/rootFinding.ts), superlinear where S/N(T) is
 * smooth, bisection steps at a jump (where a bin enters). Brent ends on an evaluated span and the
 * nearest evaluated span on the other side of the threshold, within 0.9e-10 + 4 eps |ln T| in ln T.
 */
function spanCrossing(snrAt: (t: number) => number, threshold: number, lo: number, sLo: number, hi: number, sHi: number): { spanS: number; snr: number } {
  const points = [
    { x: Math.log(lo), t: lo, s: sLo },
    { x: Math.log(hi), t: hi, s: sHi },
  ];
  const g = (x: number) => {
    const t = Math.exp(x);
    const s = snrAt(t);
    points.push({ x, t, s });
    return s - threshold;
  };
  const r = brentRoot(g, points[0].x, points[1].x, { fa: sLo - threshold, fb: sHi - threshold, xTol: 0.9e-10, relTol: Number.EPSILON });
  const best = points.find((p) => p.x === r.x) as { x: number; t: number; s: number };
  if (best.s >= threshold && r.fx === 0) return { spanS: best.t, snr: best.s };
  // the other end of Brent's last bracket: the nearest evaluated span on the other side
  let other = best;
  for (const p of points) if (p.s >= threshold !== best.s >= threshold && (other === best || Math.abs(p.x - r.x) < Math.abs(other.x - r.x))) other = p;
  const upper = best.s >= threshold ? best : other;
  return { spanS: upper.t, snr: upper.s };
}
