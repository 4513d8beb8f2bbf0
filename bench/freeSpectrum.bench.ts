// Speed of the free-spectrum likelihood and the (A, gamma) check (issue 12 targets: log-likelihood
// of a new model against 30 bins x 10,000 samples <= 20 us after set-up; set-up <= 200 ms; (A, gamma)
// fit and credible level <= 50 us). Data are invented Gaussian posteriors from the seeded generator.
import { bench, describe } from 'vitest';
import { YEAR_S, F_YR_HZ } from '../src/physics/constants';
import type { FreeSpectrumData } from '../src/statistics/freeSpectrum';
import { rhoFromStrain } from '../src/statistics/freeSpectrum';
import { buildFreeSpectrumLikelihood } from '../src/statistics/freeSpectrumLikelihood';
import { buildAmplitudeGammaRegion, sampledAmplitudeGamma } from '../src/statistics/amplitudeGammaPosterior';
import { fitEffectivePowerLaw } from '../src/statistics/effectivePowerLaw';
import { seededRandom } from '../src/statistics/prng';

const T = 15 * YEAR_S;
const f = Float64Array.from({ length: 30 }, (_, k) => (k + 1) / T);
const hcOf = (A: number, x: number) => A * (x / F_YR_HZ) ** (-2 / 3);
const rng = seededRandom(3);
const data: FreeSpectrumData = {
  quantity: 'log10Rho',
  frequencyHz: f,
  spanS: T,
  prior: { kind: 'uniform', lower: -10, upper: -4 },
  samples: Array.from(f, (x) => {
    const m = Math.log10(rhoFromStrain(hcOf(2.4e-15, x), x, T));
    return Float64Array.from({ length: 10_000 }, () => Math.min(-4, Math.max(-10, m + 0.2 * rng.normal())));
  }),
};
const like = buildFreeSpectrumLikelihood(data);
// A new model each call: amplitudes cycle over 64 values so nothing is cached.
const models = Array.from({ length: 64 }, (_, i) => Float64Array.from(f, (x) => hcOf(1.5e-15 + i * 3e-17, x)));
let m = 0;

const agA = new Float64Array(5000);
const agG = new Float64Array(5000);
for (let i = 0; i < 5000; i++) {
  const z1 = rng.normal();
  agA[i] = -14.6 + 0.1 * z1;
  agG[i] = 3.5 + 0.5 * (-0.8 * z1 + 0.6 * rng.normal());
}
const region = buildAmplitudeGammaRegion(sampledAmplitudeGamma(agA, agG));

describe('free-spectrum likelihood, 30 bins x 10,000 samples', () => {
  bench('log-likelihood of a new model spectrum (after set-up; target <= 20 us)', () => {
    like.logLikelihood(models[m++ & 63]);
  });
  bench('set-up: 30 KDE tables (target <= 200 ms)', () => {
    buildFreeSpectrumLikelihood(data);
  }, { iterations: 5, time: 0 });
});

describe('(A, gamma) check, 5,000 posterior samples', () => {
  bench('power-law fit over the lowest 5 bins and credible level of the point (target <= 50 us)', () => {
    const fit = fitEffectivePowerLaw(f, models[m++ & 63], F_YR_HZ, 5);
    region.credibleLevel(fit.log10A, fit.gamma);
  });
  bench('set-up: 2-D KDE table and sample densities', () => {
    buildAmplitudeGammaRegion(sampledAmplitudeGamma(agA, agG));
  }, { iterations: 5, time: 0 });
});
