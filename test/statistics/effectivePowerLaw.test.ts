// Effective (A, gamma) of a model spectrum (src/statistics/effectivePowerLaw.ts) and where it falls in
// a measured (A, gamma) posterior (src/statistics/amplitudeGammaPosterior.ts).
import { describe, expect, it } from 'vitest';
import { F_YR_HZ, YEAR_S } from '../../src/physics/constants';
import { fitEffectivePowerLaw } from '../../src/statistics/effectivePowerLaw';
import { buildAmplitudeGammaRegion, gaussianAmplitudeGamma, log10AmplitudeAt, sampledAmplitudeGamma } from '../../src/statistics/amplitudeGammaPosterior';
import { seededRandom } from '../../src/statistics/prng';

const T = 14 * YEAR_S;
const f = Float64Array.from({ length: 30 }, (_, k) => (k + 1) / T);

describe('power-law fit over the lowest bins', () => {
  it('a pure f^(-2/3) spectrum returns A_yr and gamma = 13/3 to 1e-9 (Phinney 2001, astro-ph/0108028: h_c ~ f^(-2/3))', () => {
    const A = 2.4e-15;
    const hc = Array.from(f, (x) => A * (x / F_YR_HZ) ** (-2 / 3));
    const fit = fitEffectivePowerLaw(f, hc, F_YR_HZ, 5);
    expect(Math.abs(10 ** fit.log10A - A) / A).toBeLessThan(1e-9);
    expect(Math.abs(fit.gamma - 13 / 3)).toBeLessThan(1e-9);
    expect(Math.abs(fit.covariance[2])).toBeLessThan(1e-20);
  });
  it('any pure power law returns its own (A, gamma), equal or noise weights (gamma = 3 - 2 alpha, Thrane & Romano 2013, PRD 88, 124032)', () => {
    for (const [A, gamma] of [[1e-15, 2], [5e-15, 5.5], [3e-16, 3.1]]) {
      const hc = Array.from(f, (x) => A * (x / F_YR_HZ) ** ((3 - gamma) / 2));
      const noise = Array.from(f, (x) => 1e-15 * (x * T) ** 1.5);
      for (const n of [2, 5, 14, 30]) {
        const fit = fitEffectivePowerLaw(f, hc, F_YR_HZ, n, n > 5 ? noise : undefined);
        expect(Math.abs(10 ** fit.log10A - A) / A, `A=${A} gamma=${gamma} N=${n}`).toBeLessThan(1e-9);
        expect(Math.abs(fit.gamma - gamma)).toBeLessThan(1e-9);
      }
    }
  });
  it('a bent spectrum gives a slope between its two slopes and a non-zero covariance', () => {
    const hc = Array.from(f, (x) => 2e-15 * (x / F_YR_HZ) ** (-2 / 3) / Math.sqrt(1 + (2e-9 / x) ** 2));
    const fit = fitEffectivePowerLaw(f, hc, F_YR_HZ, 5);
    expect(fit.gamma).toBeLessThan(13 / 3);
    expect(fit.covariance[0]).toBeGreaterThan(0);
    expect(fit.covariance[2]).toBeGreaterThan(0);
  });
  it('refuses too few bins and non-positive strain, naming the bin', () => {
    expect(() => fitEffectivePowerLaw(f, Array(30).fill(1e-15), F_YR_HZ, 1)).toThrow(/at least 2/);
    expect(() => fitEffectivePowerLaw(f, [1e-15, 0, 1e-15], F_YR_HZ, 3)).toThrow(/bin 2/);
  });
});

describe('credible level of the HPD region through a point', () => {
  it('2-D Gaussian: 1 - exp(-d^2/2) (chi-square with 2 dof; 0.3935 at d = 1, 0.8647 at d = 2)', () => {
    const post = buildAmplitudeGammaRegion(gaussianAmplitudeGamma(-14.6, 3.5, 0.1, 0.6, 0.5));
    expect(post.credibleLevel(-14.5, 3.5 + 0.3)).toBeCloseTo(1 - Math.exp(-0.5 * ((1 - 2 * 0.5 * 0.5 + 0.25) / 0.75)), 12);
    expect(post.credibleLevel(-14.6 + 0.1 / 1, 3.5 + 0.6 * 0.5)).toBeCloseTo(0.3935, 3); // on the conditional axis: d = 1
  });
  // Tolerance: the KDE density's relative scatter sqrt(R(K) / (n p)) with R(K) = 1/(4 pi f^2) for the
  // 2-D Gaussian kernel of width f (asymptotic KDE variance, Silverman 1986, Density Estimation for Statistics and Data Analysis; unverified: its section), which moves the
  // level L = 1 - p/p_max by (1 - L) times it; 4 of those plus 3 binomial sd of the sample fraction.
  it('samples from that Gaussian: the KDE level matches the closed form within 4 KDE sd + 3 binomial sd (5,000 samples)', () => {
    const rng = seededRandom(5);
    const n = 5000;
    const [m1, m2, s1, s2, r] = [-14.6, 3.5, 0.1, 0.6, -0.7];
    const a = new Float64Array(n);
    const g = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const z1 = rng.normal();
      const z2 = r * z1 + Math.sqrt(1 - r * r) * rng.normal();
      a[i] = m1 + s1 * z1;
      g[i] = m2 + s2 * z2;
    }
    const kde = buildAmplitudeGammaRegion(sampledAmplitudeGamma(a, g));
    const exact = buildAmplitudeGammaRegion(gaussianAmplitudeGamma(m1, m2, s1, s2, r));
    for (const [da, dg] of [[0, 0], [0.05, 0], [0, 0.6], [0.1, 0.3], [-0.15, 0.9], [0.2, -0.5]]) {
      const p = [m1 + da, m2 + dg];
      const L = exact.credibleLevel(p[0], p[1]);
      const f2 = n ** (-1 / 3);
      const tol = 4 * (1 - L) * Math.sqrt(1 / (2 * n * f2 * (1 - L))) + 3 * Math.sqrt((L * (1 - L)) / n);
      expect(Math.abs(kde.credibleLevel(p[0], p[1]) - L), `at ${p}, tolerance ${tol}`).toBeLessThan(tol);
    }
    expect(kde.credibleLevel(-10, 3)).toBe(1); // far outside: the whole posterior lies inside the region
  });
  it('moving log10 A to another reference frequency follows the power law', () => {
    expect(log10AmplitudeAt(-14.6, 13 / 3, F_YR_HZ, F_YR_HZ / 10)).toBeCloseTo(-14.6 + 2 / 3, 12);
  });
});
