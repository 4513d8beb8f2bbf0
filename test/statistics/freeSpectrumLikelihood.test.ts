// The free-spectrum likelihood (src/statistics/freeSpectrumLikelihood.ts): closed-form checks with
// Gaussian samples, the stated floor, prior division and percentiles.
import { describe, expect, it } from 'vitest';
import { F_YR_HZ, YEAR_S } from '../../src/physics/constants';
import { type FreeSpectrumData, FreeSpectrumError, log10RhoOffset, rhoFromStrain, strainFromRho, validateFreeSpectrum } from '../../src/statistics/freeSpectrum';
import { buildFreeSpectrumLikelihood, LOG_LIKELIHOOD_FLOOR_BELOW_PEAK } from '../../src/statistics/freeSpectrumLikelihood';
import { seededRandom } from '../../src/statistics/prng';

const T = 15 * YEAR_S;
const freqs = (n: number) => Float64Array.from({ length: n }, (_, k) => (k + 1) / T);

function gaussianData(n: number, means: number[], sd: number, seed: number, prior: FreeSpectrumData['prior'] = { kind: 'none' }): FreeSpectrumData {
  const rng = seededRandom(seed);
  return {
    quantity: 'log10Rho',
    frequencyHz: freqs(means.length),
    spanS: T,
    samples: means.map((m) => Float64Array.from({ length: n }, () => m + sd * rng.normal())),
    prior,
  };
}

const lnNormal = (x: number, m: number, s: number) => -0.5 * ((x - m) / s) ** 2 - Math.log(s * Math.sqrt(2 * Math.PI));

describe('conventions', () => {
  it('rho_k^2 = h_c^2 / (12 pi^2 f^3 T) (Thrane & Romano 2013, PRD 88, 124032 PSD times 1/T; Lamb, Taylor & van Haasteren 2023, PRD 108, 103019)', () => {
    const f = 3 / T;
    const hc = 2.4e-15;
    const rho = rhoFromStrain(hc, f, T);
    // Independent arithmetic: P = h^2/(12 pi^2 f^3) s^3, rho^2 = P / T.
    const p = (hc * hc) / (12 * Math.PI ** 2 * f ** 3);
    expect(Math.abs(rho * rho - p / T) / (p / T)).toBeLessThan(1e-14);
    expect(Math.abs(strainFromRho(rho, f, T) - hc) / hc).toBeLessThan(1e-14);
    expect(Math.abs(Math.log10(hc) + log10RhoOffset(f, T) - Math.log10(rho))).toBeLessThan(1e-13);
  });
});

describe('KDE log-likelihood against the closed-form normal log-likelihood', () => {
  // Samples N(m, s) in log10 rho, no prior: ln L_k(x) -> ln N(x; m, s) as n grows. Tolerance at z sigma:
  // the KDE's bias (its mean is N(m, s^2 (1 + f^2)), f = n^(-1/5) Scott: about f^2 (1 + z^2)/2 in ln p)
  // plus 4 times its relative scatter sqrt(R(K) / (n h p)), R(K) = 1/(2 sqrt(pi)) for the Gaussian kernel
  // (the asymptotic KDE variance f R(K)/(n h); Silverman 1986, Density Estimation for Statistics and Data Analysis;
  // unverified: the section of that book).
  const tolerance = (n: number, z: number) => {
    const f = n ** -0.2;
    const pTimesS = Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
    return (f * f * (1 + z * z)) / 2 + 4 * Math.sqrt(1 / (2 * Math.sqrt(Math.PI)) / (n * f * pTimesS));
  };
  for (const n of [100, 1000, 10000]) {
    it(`${n} samples: per-bin error within bias + 4 sd (${tolerance(n, 0).toFixed(3)} at the mean, ${tolerance(n, 2).toFixed(3)} at 2 sigma)`, () => {
      const means = [-6.5, -7.0, -7.4];
      const s = 0.2;
      const like = buildFreeSpectrumLikelihood(gaussianData(n, means, s, 11 + n));
      for (const z of [-2, -1, 0, 1, 2]) {
        const tol = tolerance(n, z);
        const x = means.map((m) => m + z * s);
        const hc = x.map((xk, k) => Math.pow(10, xk - log10RhoOffset(like.frequencyHz[k], T)));
        const per = like.binLogLikelihoods(hc);
        per.forEach((v, k) => {
          const want = lnNormal(x[k], means[k], s);
          expect(Math.abs(v - want), `n ${n}, bin ${k + 1}, z ${z}: ${v} vs ${want}`).toBeLessThan(tol);
        });
        const total = like.logLikelihood(hc);
        expect(Math.abs(total - per.reduce((a, b) => a + b, 0))).toBeLessThan(1e-12);
      }
    });
  }
});

describe('floor, prior and percentiles', () => {
  const data = gaussianData(2000, [-6.8, -7.1], 0.15, 3, { kind: 'uniform', lower: -9, upper: -5 });
  const like = buildFreeSpectrumLikelihood(data);
  const hcOf = (x: number[]) => x.map((xk, k) => Math.pow(10, xk - log10RhoOffset(like.frequencyHz[k], T)));
  it(`a model far outside the support gets the stated floor, peak - ${LOG_LIKELIHOOD_FLOOR_BELOW_PEAK}, never -Infinity`, () => {
    const per = like.binLogLikelihoods(hcOf([-5.2, -5.2]));
    per.forEach((v, k) => expect(v).toBeCloseTo(like.peak[k] - LOG_LIKELIHOOD_FLOOR_BELOW_PEAK, 12));
    expect(Number.isFinite(like.logLikelihood([0, 0]))).toBe(true); // h_c = 0: log10 = -Infinity, clamped to the prior edge
  });
  it('dividing a uniform prior on [a, b] adds ln(b - a) per bin (its density is 1/(b - a))', () => {
    const none = buildFreeSpectrumLikelihood({ ...data, prior: { kind: 'none' } });
    const hc = hcOf([-6.8, -7.0]);
    const d = like.binLogLikelihoods(hc);
    const e = none.binLogLikelihoods(hc);
    // Far from the edges (10 sd away) reflection adds nothing; the difference is ln 4.
    for (let k = 0; k < 2; k++) expect(Math.abs(d[k] - e[k] - Math.log(4))).toBeLessThan(1e-9);
  });
  it('percentiles follow the normal cdf of the samples (0.5 at the mean, 0.8413 at +1 sd; Abramowitz & Stegun 1964, table 26.1) within 0.03', () => {
    const p = like.percentiles(hcOf([-6.8, -7.1 + 0.15]));
    expect(Math.abs(p[0] - 0.5)).toBeLessThan(0.03);
    expect(Math.abs(p[1] - 0.8413)).toBeLessThan(0.03);
  });
  it('uses only the lowest bins when asked, and refuses a short model', () => {
    const one = buildFreeSpectrumLikelihood(data, { bins: 1 });
    expect(one.bins).toBe(1);
    expect(() => like.logLikelihood([1e-15])).toThrow(/needs h_c at 2 bins/);
    expect(() => buildFreeSpectrumLikelihood(data, { bins: 3 })).toThrow(/from 1 to 2/);
  });
  it('checks a free spectrum once: a bad one is refused when the likelihood is built, a checked one gives the likelihood of an unchecked copy', () => {
    const bad = gaussianData(50, [-7, -7.2], 0.1, 5);
    bad.samples[1][7] = NaN;
    expect(() => buildFreeSpectrumLikelihood(bad)).toThrow(FreeSpectrumError);
    expect(() => buildFreeSpectrumLikelihood(bad)).toThrow(/bin 2, sample 8: NaN is not a finite number/);
    const infinite = gaussianData(50, [-7, -7.2], 0.1, 5);
    infinite.samples[0][3] = -Infinity;
    expect(() => validateFreeSpectrum({ ...infinite, prior: { kind: 'none' } })).toThrow(/bin 1, sample 4: -Infinity is not a finite number/);
    expect(() => validateFreeSpectrum({ ...infinite, prior: { kind: 'uniform', lower: -10, upper: -4 } })).toThrow(/bin 1, sample 4: -Infinity is not a finite number/);
    const outside = gaussianData(50, [-7, -7.2], 0.1, 5);
    outside.samples[1][9] = -3.5;
    expect(() => validateFreeSpectrum({ ...outside, prior: { kind: 'uniform', lower: -10, upper: -4 } })).toThrow(/bin 2, sample 10: -3.5 lies outside the prior range -10 to -4/);
    const good = gaussianData(50, [-7, -7.2], 0.1, 5);
    const copy = { ...good, samples: good.samples.map((s) => Float64Array.from(s)) };
    expect(validateFreeSpectrum(good)).toBe(good);
    expect(validateFreeSpectrum(good)).toBe(good);
    const hc = hcOf([-6.95, -7.3]);
    expect(buildFreeSpectrumLikelihood(good).logLikelihood(hc)).toBe(buildFreeSpectrumLikelihood(copy).logLikelihood(hc));
  });
  it('f_yr constant used in fits is 1/(365.25 days) (IAU Julian year)', () => {
    expect(F_YR_HZ * 365.25 * 86400).toBeCloseTo(1, 15);
  });
});
