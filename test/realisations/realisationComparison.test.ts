// Realisations against a free spectrum: the realisation-averaged likelihood is the mean of the
// single-realisation likelihoods (checked against evaluating each one), and the measured spectrum's
// percentile among realisations against the normal cdf of Gaussian bin posteriors.
import { describe, expect, it } from 'vitest';
import { compareRealisations } from '../../src/statistics/realisationComparison';
import { buildFreeSpectrumLikelihood } from '../../src/statistics/freeSpectrumLikelihood';
import type { FreeSpectrumData } from '../../src/statistics/freeSpectrum';
import { seededRandom } from '../../src/statistics/prng';
import { normalCdf } from '../../src/statistics/normal';
import type { RealisationDraws } from '../../src/physics/binaryRealisations';

const YEAR = 365.25 * 86400;
const T = 15 * YEAR;
const freqs = Float64Array.from([1 / T, 2 / T]);
const mu = [-14.5, -14.8];
const sigma = 0.2;
const rng = seededRandom(3);
const data: FreeSpectrumData = {
  quantity: 'log10Hc',
  frequencyHz: freqs,
  spanS: T,
  samples: mu.map((m) => Float64Array.from({ length: 10000 }, () => m + sigma * rng.normal())),
  prior: { kind: 'none' },
};
const lik = buildFreeSpectrumLikelihood(data);

function draws(hcRows: number[][]): RealisationDraws {
  const R = hcRows.length;
  const z = () => new Float64Array(R * 2);
  return { first: 0, count: R, bins: 2, hc: Float64Array.from(hcRows.flat()), loudestStrain: z(), loudestChirpMassKg: z(), loudestRedshift: z(), loudestMassRatio: z(), outshines: z(), drawnBinaries: 0 };
}

describe('realisations against a free spectrum', () => {
  it('the averaged likelihood is ln of the mean of the realisations\' likelihoods (each evaluated alone)', () => {
    const rows = [
      [10 ** -14.4, 10 ** -14.9],
      [10 ** -14.7, 10 ** -14.6],
      [10 ** -14.5, 10 ** -14.8],
    ];
    const c = compareRealisations(lik, draws(rows), freqs);
    const each = rows.map((r) => lik.logLikelihood(r));
    const expected = Math.log(each.reduce((s, l) => s + Math.exp(l), 0) / rows.length);
    expect(Math.abs(c.averagedLogLikelihood - expected)).toBeLessThan(1e-12 * Math.max(1, Math.abs(expected)));
  });

  it('the measured percentile among identical realisations at m equals 1 - Phi((m - mu) / sigma) within 0.03 (Gaussian posterior, KDE smoothing)', () => {
    const m = [-14.3, -15.0];
    const c = compareRealisations(lik, draws([m.map((x) => 10 ** x), m.map((x) => 10 ** x)]), freqs);
    m.forEach((x, k) => expect(Math.abs(c.measuredPercentile[k] - (1 - normalCdf((x - mu[k]) / sigma))), `bin ${k + 1}`).toBeLessThan(0.03));
  });

  it('refuses realisations on other frequencies', () => {
    expect(() => compareRealisations(lik, draws([[1e-15, 1e-15]]), [1.1 / T, 2 / T])).toThrow(/bin 1/);
  });
});
