// The headline comparison across the band (src/statistics/bandComparison.ts) and the demo
// generator's injected model (scripts/generateDemoMeasurement.ts, invented data).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { F_YR_HZ, YEAR_S } from '../../src/physics/constants';
import { type FreeSpectrumData, rhoFromStrain } from '../../src/statistics/freeSpectrum';
import { buildFreeSpectrumLikelihood } from '../../src/statistics/freeSpectrumLikelihood';
import { compareAcrossBand } from '../../src/statistics/bandComparison';
import { buildAmplitudeGammaRegion, gaussianAmplitudeGamma } from '../../src/statistics/amplitudeGammaPosterior';
import { seededRandom } from '../../src/statistics/prng';
import { importFreeSpectrum } from '../../src/statistics/freeSpectrumImport';
import { TRUTH, truthStrain } from '../../scripts/generateDemoMeasurement';

const T = 15 * YEAR_S;
const f = Float64Array.from({ length: 14 }, (_, k) => (k + 1) / T);
const A = 2.4e-15;
// h_c = A (f/f_yr)^(-2/3) (Phinney 2001, astro-ph/0108028).
const powerLaw = (x: number) => A * (x / F_YR_HZ) ** (-2 / 3);

// Invented measurement: per-bin Gaussian posteriors in log10 rho centred on the power law, 0.1 dex wide.
function invented(seed: number): FreeSpectrumData {
  const rng = seededRandom(seed);
  return {
    quantity: 'log10Rho',
    frequencyHz: f,
    spanS: T,
    prior: { kind: 'uniform', lower: -10, upper: -4 },
    samples: Array.from(f, (x) => {
      const m = Math.log10(rhoFromStrain(powerLaw(x), x, T));
      return Float64Array.from({ length: 3000 }, () => m + 0.1 * rng.normal());
    }),
  };
}

describe('verdict across the band (rules stated in bandComparison.ts and docs/freeSpectrum.md)', () => {
  const like = buildFreeSpectrumLikelihood(invented(1));
  const region = buildAmplitudeGammaRegion(gaussianAmplitudeGamma(Math.log10(A), 13 / 3, 0.1, 0.5, -0.8));
  it('the model that made the data is consistent (every bin within 2 sigma, (A, gamma) inside)', () => {
    const c = compareAcrossBand(Array.from(f, powerLaw), like, region, 5);
    expect(c.verdict, c.reasons.join('; ')).toBe('consistent');
    expect(c.disagreeingBins).toEqual([]);
  });
  it('a model matched at f_yr but 5x low in the two lowest bins is inconsistent and names those bins', () => {
    const low = Array.from(f, (x, k) => (k < 2 ? powerLaw(x) / 5 : powerLaw(x)));
    const c = compareAcrossBand(low, like, region, 5);
    expect(c.verdict).toBe('inconsistent');
    expect(c.disagreeingBins.slice(0, 2)).toEqual([1, 2]);
    expect(c.reasons[0]).toMatch(/lowest bins rule it out: bin 1 .*5\.\dx below/);
    // Same amplitude at f_yr: the single-number comparison could not see this (independent arithmetic).
    expect(Math.abs(powerLaw(F_YR_HZ) - A) / A).toBeLessThan(1e-12);
  });
  it('a model 5x high in a middle bin only is in tension, not inconsistent, and the bin is named', () => {
    const mid = Array.from(f, (x, k) => (k === 8 ? powerLaw(x) * 5 : powerLaw(x)));
    const c = compareAcrossBand(mid, like, region, 5);
    expect(c.verdict).toBe('tension');
    expect(c.disagreeingBins).toEqual([9]);
  });
  it('an (A, gamma) point far outside the measured region makes the verdict inconsistent, with the region named', () => {
    const steep = Array.from(f, (x) => A * (x / F_YR_HZ) ** (-2 / 3 - 0.02));
    const tight = buildAmplitudeGammaRegion(gaussianAmplitudeGamma(Math.log10(A), 13 / 3, 0.01, 0.01, 0));
    const c = compareAcrossBand(steep, like, tight, 5);
    expect(c.verdict).toBe('inconsistent');
    expect(c.reasons.join(' ')).toMatch(/outside the 99.7% region/);
  });
});

describe("the demo generator's injected model has the highest likelihood among perturbed models", () => {
  const text = readFileSync(new URL('../../examples/data/heronsgate_free_spectrum.csv', import.meta.url), 'utf8');
  const r = importFreeSpectrum(text, 'heronsgate_free_spectrum.csv', { spanS: TRUTH.spanYears * YEAR_S });
  const like = buildFreeSpectrumLikelihood({ ...r.data, prior: { kind: 'uniform', lower: TRUTH.prior[0], upper: TRUTH.prior[1] } });
  const lnL = (t: typeof TRUTH) => like.logLikelihood(Array.from(like.frequencyHz, (x) => truthStrain(x, t)));
  const best = lnL(TRUTH);
  const perturbed: Array<[string, typeof TRUTH]> = [
    ['A x 0.5', { ...TRUTH, amplitude: TRUTH.amplitude * 0.5 }],
    ['A x 2', { ...TRUTH, amplitude: TRUTH.amplitude * 2 }],
    ['no bend', { ...TRUTH, fBendHz: 1e-12 }],
    ['bend x 2.5', { ...TRUTH, fBendHz: TRUTH.fBendHz * 2.5 }],
    ['bend x 0.4', { ...TRUTH, fBendHz: TRUTH.fBendHz * 0.4 }],
  ];
  for (const [name, t] of perturbed) {
    it(`truth beats ${name}`, () => expect(lnL(t), `${name}: ${lnL(t)} vs truth ${best}`).toBeLessThan(best));
  }
  it('the stored file is the invented one (its header says so)', () => expect(text.startsWith('# INVENTED')).toBe(true));
  it('frequencies are the bins k/T of the invented 14-yr span to 1e-9', () => {
    like.frequencyHz.forEach((x, k) => expect(Math.abs(x * TRUTH.spanYears * YEAR_S - (k + 1))).toBeLessThan(1e-8));
  });
});
