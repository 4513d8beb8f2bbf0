// Summaries of realisations per frequency bin: mean, median and central bands of h_c, the probability
// that the loudest binary outshines the rest of its bin, and the median loudest strain.
import type { RealisationDraws } from '../physics/binaryRealisations';
import { NO_TIME_CHECK, type TimeCheck } from '../physics/timeCheck';
import { ONE_SIGMA_LEVEL, TWO_SIGMA_LEVEL, sortedQuantile } from './sampleSummary';

export interface RealisationSummary {
  realisations: number;
  /** Per bin: mean of h_c, sqrt of the mean of h_c^2 (with its Monte Carlo standard error, of h_c^2). */
  meanHc: Float64Array;
  rmsHc: Float64Array;
  meanHc2Error: Float64Array;
  /** Per bin: median and the 68.27% / 95.45% central intervals of h_c (Hyndman & Fan 1996 definition 7 quantiles). */
  medianHc: Float64Array;
  lower68: Float64Array;
  upper68: Float64Array;
  lower95: Float64Array;
  upper95: Float64Array;
  /** Per bin: fraction of realisations whose loudest binary has h^2 above the sum of all the others' h^2, and its binomial standard error. */
  outshineProbability: Float64Array;
  outshineError: Float64Array;
  /** Per bin: median strain of the loudest binary. */
  medianLoudestStrain: Float64Array;
}

/** Joins consecutive chunks of one run (given in any order) into one set of draws; they must tile a range of realisations. */
export function joinDraws(chunks: RealisationDraws[]): RealisationDraws {
  if (chunks.length === 0) throw new RangeError('no realisations to join');
  const sorted = [...chunks].sort((a, b) => a.first - b.first);
  const nb = sorted[0].bins;
  const first = sorted[0].first;
  let next = first;
  for (const c of sorted) {
    if (c.bins !== nb) throw new RangeError(`chunks disagree on the number of bins (${c.bins} vs ${nb})`);
    if (c.first !== next) throw new RangeError(`chunks do not tile the realisations: expected one starting at ${next}, got ${c.first}`);
    next += c.count;
  }
  const join = (pick: (c: RealisationDraws) => Float64Array): Float64Array => {
    const out = new Float64Array((next - first) * nb);
    for (const c of sorted) out.set(pick(c), (c.first - first) * nb);
    return out;
  };
  return {
    first,
    count: next - first,
    bins: nb,
    hc: join((c) => c.hc),
    loudestStrain: join((c) => c.loudestStrain),
    loudestChirpMassKg: join((c) => c.loudestChirpMassKg),
    loudestRedshift: join((c) => c.loudestRedshift),
    loudestMassRatio: join((c) => c.loudestMassRatio),
    outshines: join((c) => c.outshines),
    drawnBinaries: sorted.reduce((s, c) => s + c.drawnBinaries, 0),
  };
}

/** `checkTime` is called once per bin (TimeCheck). */
export function summariseRealisations(d: RealisationDraws, checkTime: TimeCheck = NO_TIME_CHECK): RealisationSummary {
  const nb = d.bins;
  const R = d.count;
  const per = () => new Float64Array(nb);
  const s: RealisationSummary = {
    realisations: R,
    meanHc: per(),
    rmsHc: per(),
    meanHc2Error: per(),
    medianHc: per(),
    lower68: per(),
    upper68: per(),
    lower95: per(),
    upper95: per(),
    outshineProbability: per(),
    outshineError: per(),
    medianLoudestStrain: per(),
  };
  const column = new Float64Array(R);
  const loud = new Float64Array(R);
  for (let k = 0; k < nb; k++) {
    checkTime();
    let sum = 0;
    let sum2 = 0;
    let sum4 = 0;
    let out = 0;
    for (let r = 0; r < R; r++) {
      const h = d.hc[r * nb + k];
      column[r] = h;
      loud[r] = d.loudestStrain[r * nb + k];
      sum += h;
      sum2 += h * h;
      sum4 += h * h * h * h;
      out += d.outshines[r * nb + k];
    }
    const mean2 = sum2 / R;
    s.meanHc[k] = sum / R;
    s.rmsHc[k] = Math.sqrt(mean2);
    s.meanHc2Error[k] = R > 1 ? Math.sqrt(Math.max(0, sum4 / R - mean2 * mean2) / (R - 1)) : NaN;
    column.sort();
    loud.sort();
    s.medianHc[k] = sortedQuantile(column, 0.5);
    s.lower68[k] = sortedQuantile(column, 0.5 - ONE_SIGMA_LEVEL / 2);
    s.upper68[k] = sortedQuantile(column, 0.5 + ONE_SIGMA_LEVEL / 2);
    s.lower95[k] = sortedQuantile(column, 0.5 - TWO_SIGMA_LEVEL / 2);
    s.upper95[k] = sortedQuantile(column, 0.5 + TWO_SIGMA_LEVEL / 2);
    const p = out / R;
    s.outshineProbability[k] = p;
    s.outshineError[k] = Math.sqrt((p * (1 - p)) / R);
    s.medianLoudestStrain[k] = sortedQuantile(loud, 0.5);
  }
  return s;
}
